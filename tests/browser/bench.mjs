// Web benchmark: download size (gzipped), navigation to first drawn frame, frame CPU time at
// phone size, memory. Prints figures against the targets; exit status is always 0 (figures,
// not a pass/fail test).   node bench.mjs [site-dir]
import { readFileSync } from 'node:fs';
import { gzipSync } from 'node:zlib';
import { join, resolve } from 'node:path';
import { startServer } from './serve.mjs';
import { launch, PHONE, waitReady, state, tap, frames, HERE } from './lib.mjs';

const site = resolve(process.argv[2] || join(HERE, '../../build/web/site'));
const files = ['tidewright.wasm', 'tidewright.js', 'index.html', 'sw.js', 'manifest.webmanifest'];
let total = 0;
for (const f of files) {
  const gz = gzipSync(readFileSync(join(site, f)), { level: 9 }).length;
  total += gz;
  console.log(`  ${f.padEnd(22)} ${(gz / 1024).toFixed(1).padStart(7)} KB gzipped`);
}
console.log(`transfer size (gzipped):     ${(total / 1024).toFixed(0)} KB   (target < 800 KB)`);

const server = await startServer(site);
const browser = await launch();
const firsts = [];
let stats = null, heap = 0, jsHeap = 0;
for (let run = 0; run < 3; run++) {
  const context = await browser.newContext(PHONE);
  const page = await context.newPage();
  await page.goto(server.url);
  await waitReady(page, 60000);
  firsts.push(await page.evaluate(() => window.__twFirstFrameMs));
  if (run === 2) {
    // Frame CPU time: walk the screens, scroll the Water screen, redraw many frames.
    await page.evaluate(() => Module.ccall('tw_test_reset_stats', null, [], []));
    for (const t of ['tab.water', 'tab.log', 'tab.systems', 'tab.settings', 'tab.water']) await tap(page, t);
    for (let i = 0; i < 10; i++) {
      await page.mouse.move(195, 500);
      await page.mouse.wheel(0, i < 5 ? 300 : -300);
      await frames(page, 6);
    }
    await frames(page, 60);
    stats = JSON.parse(await page.evaluate(() => Module.ccall('tw_test_frame_stats', 'string', [], [])));
    heap = await page.evaluate(() => Module.ccall('tw_test_heap_bytes', 'number', [], []));
    jsHeap = await page.evaluate(() => (performance.memory ? performance.memory.usedJSHeapSize : 0));
  }
  await context.close();
}
firsts.sort((a, b) => a - b);
console.log(`navigation to first frame:   ${firsts.map((v) => v.toFixed(0)).join(', ')} ms, median ${firsts[1].toFixed(0)} ms   (target < 1500 ms)`);
console.log(`frame CPU time (390x844 @3x, ${stats.frames} frames): median ${stats.median_ms.toFixed(2)} ms, p95 ${stats.p95_ms.toFixed(2)} ms, worst ${stats.worst_ms.toFixed(2)} ms   (target median < 8 ms)`);
console.log(`memory: WASM heap ${(heap / 1048576).toFixed(1)} MB, JS heap ${(jsHeap / 1048576).toFixed(1)} MB   (target < 64 MB)`);
await browser.close();
await server.close();
