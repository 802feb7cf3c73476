// Writes <file>.br (brotli, quality 11) and <file>.gz (gzip, level 9) next to each named file
// of the built site, once per build. A server sends such a sibling only while it is at least as
// new as its source (tests/browser/serve.mjs does so; so can a static server's "precompressed"
// option), so a file rebuilt later never goes out with an old compressed copy. Run by
// web/CMakeLists.txt after the link.   node precompress.mjs <site-dir> <file>...
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { brotliCompressSync, gzipSync, constants as Z } from 'node:zlib';

const [dir, ...names] = process.argv.slice(2);
if (!dir || names.length === 0) {
  console.error('usage: node precompress.mjs <site-dir> <file>...');
  process.exit(2);
}
for (const name of names) {
  const path = join(dir, name);
  const body = readFileSync(path);
  const br = brotliCompressSync(body, { params: { [Z.BROTLI_PARAM_QUALITY]: 11, [Z.BROTLI_PARAM_SIZE_HINT]: body.length } });
  const gz = gzipSync(body, { level: 9 });
  writeFileSync(`${path}.br`, br);
  writeFileSync(`${path}.gz`, gz);
  console.log(`precompressed ${name}: ${body.length} bytes, brotli ${br.length}, gzip ${gz.length}`);
}
