// Static server for the built app (tests, benchmark, scripts/serve.sh). Listens on 127.0.0.1
// only.   node serve.mjs <site-dir> [port]
//
// Sections: 1. headers every response carries   2. caching   3. compression   4. the server
//
// 1. Headers. A content security policy that allows only the app's own origin: scripts, styles,
//    images, fetches, the service worker and the manifest from 'self', nothing inline (the page
//    keeps its script and styles in page.js and page.css for this), no plugins, no framing, no
//    <base>, no form posts. 'wasm-unsafe-eval' is the one exception: under a script-src without
//    it a browser refuses to compile any WebAssembly (the keyword is CSP Level 3's; Chromium has
//    it since version 97, Firefox since 102, from memory). Then the usual companions: nosniff,
//    no referrer, no framing for browsers older than frame-ancestors, a browsing context and
//    resources of our own.
//
// 2. Caching. Every file is sent with `Cache-Control: no-cache` and a strong ETag (a hash of
//    the bytes sent); a request that repeats the ETag gets 304 Not Modified with no body. So the
//    browser may keep a copy but asks before each use, and an update is picked up by the next
//    load, by the tests as much as by a phone. The service worker agrees: it fetches network
//    first (through this same revalidation) and falls back to its own cache only offline; its
//    cache name carries a hash of the build, and its install revalidates (cache: 'no-cache'). A
//    stale tidewright.js can therefore never meet a new tidewright.wasm. Revalidation costs one
//    small round trip per file on a repeat visit, which the network-first worker makes anyway;
//    long-lived caching would need versioned file names (tidewright.<hash>.wasm) from the build.
//
// 3. Compression. A request whose Accept-Encoding allows it gets brotli (preferred) or gzip;
//    otherwise the file as it is. The build writes tidewright.wasm.br/.gz and
//    tidewright.js.br/.gz at the highest settings once per build (web/cmake/precompress.mjs:
//    brotli quality 11 makes the wasm 10 % smaller than quality 9 but takes about 6 s of CPU,
//    too long to pay in every test run's server). A sibling is sent only while it is at least as
//    new as its source, so a rebuilt file never goes out with an old sibling. Any other file,
//    and a site without siblings, is compressed here on first request at a fast setting (brotli
//    quality 5, gzip 6) and kept in memory, keyed by path, size, inode and modification time.
//    Images are compressed already and go out as they are. Compressible responses carry
//    Vary: Accept-Encoding.
import { createServer } from 'node:http';
import { createHash } from 'node:crypto';
import { readFile, stat } from 'node:fs/promises';
import { brotliCompressSync, gzipSync, constants as Z } from 'node:zlib';
import { extname, join, normalize, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';

const MIME = {
  '.html': 'text/html; charset=utf-8', '.js': 'text/javascript; charset=utf-8', '.mjs': 'text/javascript; charset=utf-8',
  '.wasm': 'application/wasm', '.json': 'application/json; charset=utf-8', '.webmanifest': 'application/manifest+json',
  '.png': 'image/png', '.svg': 'image/svg+xml', '.ico': 'image/x-icon', '.css': 'text/css; charset=utf-8',
  '.data': 'application/octet-stream', '.txt': 'text/plain; charset=utf-8',
};
const COMPRESSIBLE = new Set(['.html', '.js', '.mjs', '.wasm', '.json', '.webmanifest', '.svg', '.css', '.data', '.txt']);

// ---------------------------------------------------------------- 1. headers
export const CSP = ["default-src 'self'", "script-src 'self' 'wasm-unsafe-eval'", "style-src 'self'", "img-src 'self'",
  "connect-src 'self'", "worker-src 'self'", "manifest-src 'self'", "object-src 'none'", "base-uri 'none'",
  "form-action 'none'", "frame-ancestors 'none'"].join('; ');
const COMMON = {
  'Content-Security-Policy': CSP, 'X-Content-Type-Options': 'nosniff', 'Referrer-Policy': 'no-referrer',
  'X-Frame-Options': 'DENY', 'Cross-Origin-Opener-Policy': 'same-origin', 'Cross-Origin-Resource-Policy': 'same-origin',
};

// ---------------------------------------------------------------- 3. compression
// The encoding to send: br, then gzip, when Accept-Encoding lists it with a q above 0.
export function chooseEncoding(acceptEncoding) {
  const q = new Map();
  for (const part of String(acceptEncoding || '').toLowerCase().split(',')) {
    const [name, ...params] = part.trim().split(';').map((s) => s.trim());
    if (!name) continue;
    const qp = params.find((p) => p.startsWith('q='));
    q.set(name, qp ? Number(qp.slice(2)) || 0 : 1);
  }
  const ok = (e) => (q.has(e) ? q.get(e) > 0 : q.has('*') && q.get('*') > 0);
  return ok('br') ? 'br' : ok('gzip') ? 'gzip' : 'identity';
}

const files = new Map();  // path -> { key, body, tag, mtime, variants: Map(encoding[:sibling] -> { body, tag }) }

const hash = (bytes) => createHash('sha256').update(bytes).digest('base64url').slice(0, 22);

async function load(path, info) {
  const key = `${info.size}:${info.ino}:${info.mtimeMs}`;
  let f = files.get(path);
  if (!f || f.key !== key) {
    const body = await readFile(path);
    f = { key, body, tag: hash(body), mtime: info.mtime,
      variants: new Map() };
    files.set(path, f);
  }
  return f;
}

// The body in an encoding: the build's sibling while it is fresh (looked for on every request,
// so one written after the first request is still picked up), else compressed here once.
async function variant(path, info, f, encoding) {
  if (encoding === 'identity') return { body: f.body, tag: f.tag };
  const sibling = `${path}.${encoding === 'br' ? 'br' : 'gz'}`;
  const s = await stat(sibling).catch(() => null);
  const fresh = s && s.isFile() && s.mtimeMs >= info.mtimeMs;
  const key = fresh ? `${encoding}:${s.size}:${s.ino}` : encoding;
  let v = f.variants.get(key);
  if (v) return v;
  let body;
  if (fresh) body = await readFile(sibling);
  else if (encoding === 'br') body = brotliCompressSync(f.body, { params: { [Z.BROTLI_PARAM_QUALITY]: 5, [Z.BROTLI_PARAM_SIZE_HINT]: f.body.length } });
  else body = gzipSync(f.body, { level: 6 });
  v = { body, tag: `${encoding}-${hash(body)}` };
  f.variants.set(key, v);
  return v;
}

// ---------------------------------------------------------------- 2. caching
// True when the request's validators match what would be sent (RFC 9110 section 13.1).
function notModified(req, etag, mtime) {
  const inm = req.headers['if-none-match'];
  if (inm !== undefined) {
    return inm.trim() === '*' || inm.split(',').map((t) => t.trim().replace(/^W\//, '')).includes(etag);
  }
  const ims = Date.parse(req.headers['if-modified-since'] || '');
  return !Number.isNaN(ims) && Math.floor(mtime.getTime() / 1000) * 1000 <= ims;
}

// ---------------------------------------------------------------- 4. the server
export function startServer(root, port = 0) {
  const base = resolve(root);
  const server = createServer(async (req, res) => {
    try {
      if (req.method !== 'GET' && req.method !== 'HEAD') {
        res.writeHead(405, { ...COMMON, Allow: 'GET, HEAD', 'Content-Type': 'text/plain' }).end('method not allowed');
        return;
      }
      const url = new URL(req.url, 'http://127.0.0.1');
      let path = normalize(join(base, decodeURIComponent(url.pathname)));
      if (path !== base && !path.startsWith(base + sep)) { res.writeHead(403, COMMON).end('forbidden'); return; }
      let info = await stat(path).catch(() => null);
      if (info && info.isDirectory()) { path = join(path, 'index.html'); info = await stat(path).catch(() => null); }
      if (!info || !info.isFile()) { res.writeHead(404, { ...COMMON, 'Content-Type': 'text/plain' }).end('not found'); return; }
      const f = await load(path, info);
      const compressible = COMPRESSIBLE.has(extname(path));
      const encoding = compressible ? chooseEncoding(req.headers['accept-encoding']) : 'identity';
      const v = await variant(path, info, f, encoding);
      const etag = `"${v.tag}"`;  // strong: a hash of exactly the bytes sent
      const headers = { ...COMMON, 'Content-Type': MIME[extname(path)] || 'application/octet-stream',
        'Cache-Control': 'no-cache', ETag: etag, 'Last-Modified': f.mtime.toUTCString() };
      if (compressible) headers.Vary = 'Accept-Encoding';
      if (notModified(req, etag, f.mtime)) { res.writeHead(304, headers).end(); return; }
      const body = v.body;
      if (encoding !== 'identity') headers['Content-Encoding'] = encoding;
      headers['Content-Length'] = body.length;
      res.writeHead(200, headers);
      res.end(req.method === 'HEAD' ? undefined : body);
    } catch (e) {
      res.writeHead(500, { ...COMMON, 'Content-Type': 'text/plain' }).end(String(e));
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
