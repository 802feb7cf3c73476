// Where the app's start goes: one fresh first visit at phone size, with a timeline (requests,
// IndexedDB opened, wasm instantiated, WebGL context, first frame) and a CPU profile of the
// main thread (self time, and the callees of main and app_frame). A tool for finding what
// delays the first frame, not a test: it prints figures and always exits 0.
//   node profile_start.mjs [site-dir] [--throttled] [--under REGEX]
// --throttled uses the benchmark's phone link (lib.mjs PHONE_LINK). Wasm functions have names
// only in a build linked with --profiling-funcs (cmake -DTW_WEB_PROFILING_FUNCS=ON); the
// site a normal build makes shows them as wasm-function[N].
import { join, resolve } from 'node:path';
import { startServer } from './serve.mjs';
import { launch, PHONE, PHONE_LINK, waitReady, HERE } from './lib.mjs';

const args = process.argv.slice(2);
const flag = (name) => args.includes(name);
const option = (name) => { const i = args.indexOf(name); return i >= 0 ? args[i + 1] : undefined; };
const site = resolve(args.find((a, i) => !a.startsWith('--') && !(i > 0 && args[i - 1] === '--under')) || join(HERE, '../../build/web/site'));
const under = [/^main$/, /^twapp::app_frame/];
if (option('--under')) under.push(new RegExp(option('--under')));

const server = await startServer(site);
const browser = await launch();
const context = await browser.newContext(PHONE);
// Marks from inside the page: the calls the start makes, timed where they happen.
await context.addInitScript(() => {
  window.__twMarks = [];
  const mark = (what) => window.__twMarks.push([what, performance.now()]);
  const instantiate = WebAssembly.instantiateStreaming;
  WebAssembly.instantiateStreaming = function (...a) {
    mark('wasm: instantiateStreaming called');
    return instantiate.apply(this, a).then((r) => { mark('wasm: instantiated'); return r; });
  };
  const open = indexedDB.open.bind(indexedDB);
  indexedDB.open = (...a) => { mark(`IndexedDB: open ${a[0]}`); return open(...a); };
  const getContext = HTMLCanvasElement.prototype.getContext;
  HTMLCanvasElement.prototype.getContext = function (...a) {
    const t = performance.now();
    const r = getContext.apply(this, a);
    window.__twMarks.push([`canvas: getContext ${a[0]} (${(performance.now() - t).toFixed(0)} ms, ${this.width}x${this.height})`, t]);
    return r;
  };
});
const page = await context.newPage();
const cdp = await context.newCDPSession(page);
if (flag('--throttled')) {
  await cdp.send('Network.enable');
  await cdp.send('Network.emulateNetworkConditions', PHONE_LINK);
}
await cdp.send('Profiler.enable');
await cdp.send('Profiler.setSamplingInterval', { interval: 100 });
await cdp.send('Profiler.start');
await page.goto(server.url, { timeout: 120000 });
await waitReady(page, 120000);
const nowAtStop = await page.evaluate(() => performance.now());
const { profile } = await cdp.send('Profiler.stop');
const first = await page.evaluate(() => window.__twFirstFrameMs);
const marks = await page.evaluate(() => window.__twMarks);
const resources = await page.evaluate(() => performance.getEntriesByType('resource')
  .map((e) => [e.name.split('/').pop(), e.startTime, e.responseEnd]));
await browser.close();
await server.close();

console.log(`${flag('--throttled') ? 'throttled' : 'local'} first visit, ${site}`);
const timeline = [...marks, ['first frame drawn', first],
  ...resources.map(([n, s, e]) => [`request ${n} (${s.toFixed(0)} -> ${e.toFixed(0)} ms)`, e])];
for (const [what, t] of timeline.sort((a, b) => a[1] - b[1])) console.log(`${t.toFixed(0).padStart(7)} ms  ${what}`);

// The profile's clock: its last sample is about when it stopped (nowAtStop, page time).
const byId = new Map(profile.nodes.map((n) => [n.id, n]));
const parent = new Map();
for (const n of profile.nodes) for (const c of n.children || []) parent.set(c, n.id);
const name = (id) => byId.get(id).callFrame.functionName || `(${byId.get(id).callFrame.url.split('/').pop() || 'anonymous'})`;
const self = new Map(), inclusive = new Map();
let t = profile.endTime;
for (let i = profile.samples.length - 1; i >= 0; i--) {
  const at = (t - profile.endTime) / 1000 + nowAtStop;
  t -= profile.timeDeltas[i];
  if (at > first) continue;  // up to the first frame only
  const ms = profile.timeDeltas[i] / 1000;
  const leaf = profile.samples[i];
  self.set(name(leaf), (self.get(name(leaf)) || 0) + ms);
  for (let id = leaf; id !== undefined; id = parent.get(id)) inclusive.set(id, (inclusive.get(id) || 0) + ms);
}
const top = (m, n) => [...m].sort((a, b) => b[1] - a[1]).slice(0, n);
console.log('\nmain thread until the first frame, self time:');
for (const [k, v] of top(self, 20)) console.log(`${v.toFixed(1).padStart(8)} ms  ${k.slice(0, 130)}`);
for (const root of under) {
  const callees = new Map();
  for (const n of profile.nodes) {
    if (!root.test(n.callFrame.functionName)) continue;
    for (const c of n.children || []) callees.set(name(c), (callees.get(name(c)) || 0) + (inclusive.get(c) || 0));
  }
  if (!callees.size) continue;
  console.log(`\ncallees of ${root.source} (inclusive):`);
  for (const [k, v] of top(callees, 15)) console.log(`${v.toFixed(1).padStart(8)} ms  ${k.slice(0, 130)}`);
}
