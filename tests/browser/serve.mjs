// Tiny static server for the built app (tests, benchmark, scripts/serve.sh).
// Listens on 127.0.0.1 only; correct MIME types (application/wasm for .wasm); no caching, so
// tests always see the current build.   node serve.mjs <site-dir> [port]
import { createServer } from 'node:http';
import { readFile, stat } from 'node:fs/promises';
import { extname, join, normalize, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';

const MIME = {
  '.html': 'text/html; charset=utf-8', '.js': 'text/javascript; charset=utf-8', '.mjs': 'text/javascript; charset=utf-8',
  '.wasm': 'application/wasm', '.json': 'application/json; charset=utf-8', '.webmanifest': 'application/manifest+json',
  '.png': 'image/png', '.svg': 'image/svg+xml', '.ico': 'image/x-icon', '.css': 'text/css; charset=utf-8',
  '.data': 'application/octet-stream', '.txt': 'text/plain; charset=utf-8',
};

export function startServer(root, port = 0) {
  const base = resolve(root);
  const server = createServer(async (req, res) => {
    try {
      const url = new URL(req.url, 'http://127.0.0.1');
      let path = normalize(join(base, decodeURIComponent(url.pathname)));
      if (path !== base && !path.startsWith(base + sep)) { res.writeHead(403).end('forbidden'); return; }
      let info = await stat(path).catch(() => null);
      if (info && info.isDirectory()) { path = join(path, 'index.html'); info = await stat(path).catch(() => null); }
      if (!info) { res.writeHead(404, { 'Content-Type': 'text/plain' }).end('not found'); return; }
      const body = await readFile(path);
      res.writeHead(200, { 'Content-Type': MIME[extname(path)] || 'application/octet-stream',
        'Content-Length': body.length, 'Cache-Control': 'no-store' });
      res.end(req.method === 'HEAD' ? undefined : body);
    } catch (e) {
      res.writeHead(500, { 'Content-Type': 'text/plain' }).end(String(e));
    }
  });
  return new Promise((ok) => server.listen(port, '127.0.0.1', () => ok({ server, port: server.address().port,
    url: `http://127.0.0.1:${server.address().port}/`, close: () => new Promise((done) => server.close(done)) })));
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const dir = process.argv[2];
  if (!dir) { console.error('usage: node serve.mjs <site-dir> [port]'); process.exit(2); }
  const s = await startServer(dir, Number(process.argv[3] || 8080));
  console.log(`serving ${resolve(dir)} at ${s.url}`);
}
