// Web benchmark: bytes on the wire (as the server sends them, compressed when it compresses),
// navigation to first drawn frame locally and over a throttled phone link, frame CPU time at
// phone size, memory. Prints figures against the targets; exit status is always 0 (figures,
// not a pass/fail test).   node bench.mjs [site-dir]
//
// The throttled link is lib.mjs PHONE_LINK (Lighthouse's default mobile preset), applied per
// request by Chromium's DevTools throttling. Each throttled run uses a fresh browser context
// (empty HTTP cache, no service worker), as on a phone's first visit. Where the time of a start
// goes: profile_start.mjs.
import { request } from 'node:http';
import { join, resolve } from 'node:path';
import { startServer } from './serve.mjs';
import { launch, PHONE, PHONE_LINK, waitReady, tap, frames, HERE } from './lib.mjs';

const site = resolve(process.argv[2] || join(HERE, '../../build/web/site'));
const RUNS = 3;
const LINK = PHONE_LINK;

// One GET as a browser sends it (Accept-Encoding: gzip, deflate, br): bytes of the body on the
// wire and the encoding the server chose.
function onWire(url) {
  return new Promise((ok, fail) => {
    request(url, { headers: { 'Accept-Encoding': 'gzip, deflate, br' } }, (res) => {
      let n = 0;
      res.on('data', (c) => { n += c.length; });
      res.on('end', () => ok({ status: res.statusCode, bytes: n, encoding: res.headers['content-encoding'] || 'identity' }));
    }).on('error', fail).end();
  });
}

const median = (v) => [...v].sort((a, b) => a - b)[Math.floor(v.length / 2)];
const kb = (n) => (n / 1024).toFixed(1);

const server = await startServer(site);
const files = ['index.html', 'page.css', 'page.js', 'tidewright.js', 'tidewright.wasm', 'sw.js', 'manifest.webmanifest'];
let total = 0;
for (const f of files) {
  const w = await onWire(server.url + f);
  if (w.status !== 200) continue;  // page.css and page.js: only in builds since issue 15
  total += w.bytes;
  console.log(`  ${f.padEnd(22)} ${kb(w.bytes).padStart(7)} KB on the wire (${w.encoding})`);
}
console.log(`transfer size as served:     ${(total / 1024).toFixed(0)} KB   (target < 800 KB)`);

const browser = await launch();

// Local: no throttling; the last run also measures frame CPU time and memory.
const firsts = [];
let stats = null, heap = 0, jsHeap = 0;
for (let run = 0; run < RUNS; run++) {
  const context = await browser.newContext(PHONE);
  const page = await context.newPage();
  await page.goto(server.url);
  await waitReady(page, 60000);
  firsts.push(await page.evaluate(() => window.__twFirstFrameMs));
  if (run === RUNS - 1) {
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
console.log(`navigation to first frame:   ${firsts.map((v) => v.toFixed(0)).join(', ')} ms, median ${median(firsts).toFixed(0)} ms   (target < 1500 ms)`);

// Throttled: the same navigation over the phone link; bytes received per file as Chromium
// counted them (Network.loadingFinished encodedDataLength: headers and body as sent).
const slow = [], wasmEnd = [];
let received = null;
for (let run = 0; run < RUNS; run++) {
  const context = await browser.newContext(PHONE);
  const page = await context.newPage();
  const cdp = await context.newCDPSession(page);
  await cdp.send('Network.enable');
  await cdp.send('Network.emulateNetworkConditions', LINK);
  const urls = new Map(), bytes = new Map();
  cdp.on('Network.requestWillBeSent', (e) => urls.set(e.requestId, new URL(e.request.url).pathname.slice(1) || 'index.html'));
  cdp.on('Network.loadingFinished', (e) => {
    const name = urls.get(e.requestId);
    if (name) bytes.set(name, (bytes.get(name) || 0) + e.encodedDataLength);
  });
  await page.goto(server.url, { timeout: 120000 });
  await waitReady(page, 120000);
  slow.push(await page.evaluate(() => window.__twFirstFrameMs));
  wasmEnd.push(await page.evaluate(() => performance.getEntriesByType('resource')
    .filter((e) => e.name.endsWith('/tidewright.wasm')).map((e) => e.responseEnd)[0] || NaN));
  received = bytes;
  await context.close();
}
console.log(`throttled link: ${LINK.latency} ms latency, ${(LINK.downloadThroughput * 8 / 1e6).toFixed(1)} Mbps down, ${(LINK.uploadThroughput * 8 / 1e3).toFixed(0)} kbps up (Lighthouse's mobile preset)`);
for (const [name, n] of [...received].sort((a, b) => b[1] - a[1])) console.log(`  ${name.padEnd(22)} ${kb(n).padStart(7)} KB received`);
console.log(`throttled first frame:       ${slow.map((v) => v.toFixed(0)).join(', ')} ms, median ${median(slow).toFixed(0)} ms   (target < 3000 ms)`);
console.log(`  of which the wasm's last byte came at median ${median(wasmEnd).toFixed(0)} ms (the rest: compiling, starting, drawing)`);
console.log(`frame CPU time (390x844 @3x, ${stats.frames} frames): median ${stats.median_ms.toFixed(2)} ms, p95 ${stats.p95_ms.toFixed(2)} ms, worst ${stats.worst_ms.toFixed(2)} ms   (target median < 8 ms)`);
console.log(`memory: WASM heap ${(heap / 1048576).toFixed(1)} MB, JS heap ${(jsHeap / 1048576).toFixed(1)} MB   (target < 64 MB)`);
await browser.close();
await server.close();
