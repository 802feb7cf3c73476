// Shared helpers of the browser tests and the benchmark: Chromium (Debian's, through
// playwright-core), the app's test interface (Module.ccall('tw_test_*')) and taps by widget name.
import { chromium } from 'playwright-core';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { execFileSync } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { inflateSync } from 'node:zlib';

export const HERE = dirname(fileURLToPath(import.meta.url));
export const OUTPUT = join(HERE, 'output');
mkdirSync(OUTPUT, { recursive: true });

export const CHROMIUM_ARGS = ['--no-sandbox', '--disable-gpu-sandbox', '--use-gl=swiftshader', '--enable-unsafe-swiftshader',
  '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync',
  // More flags for an experiment, e.g. TW_CHROMIUM_FLAGS='--js-flags=--no-wasm-lazy-compilation'.
  ...(process.env.TW_CHROMIUM_FLAGS || '').split(' ').filter(Boolean)];

export function launch() {
  return chromium.launch({ executablePath: '/usr/bin/chromium', headless: true, args: CHROMIUM_ARGS });
}

export const PHONE = { viewport: { width: 390, height: 844 }, deviceScaleFactor: 3, hasTouch: true, isMobile: true };
// The same phone at one device pixel per CSS pixel, for suites that test behaviour, not looks:
// Chromium draws the canvas with software WebGL (SwiftShader) here, and at 3x each frame has
// 9x the pixels, which made a tap (a few frames) take 2-3 s on the 2-core CI machine.
export const PHONE_1X = { ...PHONE, deviceScaleFactor: 1 };
// A phone's first visit over a slow link: Lighthouse's default mobile preset (latency 150 ms,
// 1.6 Mbps down, 750 kbps up; Lighthouse docs/throttling.md, "The mobile network throttling
// preset", also called "Slow 4G"), for CDP Network.emulateNetworkConditions. 1.6 Mbps is taken
// as 1,600,000 bit/s = 200,000 bytes/s.
export const PHONE_LINK = { offline: false, latency: 150, downloadThroughput: 1600000 / 8, uploadThroughput: 750000 / 8 };
export const DESKTOP = { viewport: { width: 1280, height: 800 }, deviceScaleFactor: 1, hasTouch: false };

// Collects console errors and page errors of a page.
export function watchErrors(page) {
  const errors = [];
  page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
  page.on('pageerror', (e) => errors.push(String(e)));
  return errors;
}

export async function waitReady(page, timeout = 30000) {
  await page.waitForFunction(() => window.__twFirstFrameMs !== undefined, null, { timeout });
}

export async function state(page) {
  return JSON.parse(await page.evaluate(() => Module.ccall('tw_test_state', 'string', [], [])));
}

export async function widget(page, name) {
  return JSON.parse(await page.evaluate((n) => Module.ccall('tw_test_widget', 'string', ['string'], [n]), name));
}

// Draws n more frames and waits for them.
export async function frames(page, n = 3) {
  const start = (await state(page)).frames;
  await page.evaluate((k) => Module.ccall('tw_test_animate', null, ['number'], [k]), n + 2);
  await page.waitForFunction((s) => JSON.parse(Module.ccall('tw_test_state', 'string', [], [])).frames >= s,
    start + n, { timeout: 30000 });
}

// Taps (touch) or clicks (mouse) the centre of a named widget, scrolling it into view first.
// The tap waits until the widget stays where it is from one frame to the next: a screen's
// remembered scroll position is put back over a few frames after a tab is opened, a message
// strip comes and goes, and a tap aimed at the old place misses (it did, now and then, once
// the phone suites ran at 1x and frames came faster than the scroll settled).
export async function tap(page, name) {
  let w;
  for (let attempt = 0; ; attempt++) {
    w = await widget(page, name);
    for (let i = 0; i < 4 && (!w.found || !w.visible); i++) {
      await page.evaluate((n) => Module.ccall('tw_test_reveal', null, ['string'], [n]), name);
      await frames(page, 3);
      w = await widget(page, name);
    }
    if (!w.found || !w.visible) throw new Error(`widget ${name} not on screen: ${JSON.stringify(w)}`);
    await frames(page, 1);
    const again = await widget(page, name);
    // A message strip about to go moved a widget at the page's end under the tap, before the
    // app kept the strip's room (app.cpp message_room): let it go first, and aim again.
    if (again.message_ms_left > 0 && again.message_ms_left < 1500) {
      await messageGone(page);
      continue;
    }
    if (again.visible && Math.abs(again.x - w.x) < 0.5 && Math.abs(again.y - w.y) < 0.5) break;
    if (attempt === 5) throw new Error(`widget ${name} keeps moving: ${JSON.stringify(w)} -> ${JSON.stringify(again)}`);
  }
  const x = w.x + w.w / 2, y = w.y + w.h / 2;
  const touch = await page.evaluate(() => navigator.maxTouchPoints > 0);
  if (touch) await page.touchscreen.tap(x, y); else await page.mouse.click(x, y);
  await frames(page, 3);
}

// Scrolls a named widget into view and returns where it is drawn.
export async function reveal(page, name) {
  await page.evaluate((n) => Module.ccall('tw_test_reveal', null, ['string'], [n]), name);
  await frames(page, 4);
  return widget(page, name);
}

// The Plan's download in one of its formats (index as on the screen: 0 CSV, 1 iCalendar,
// 2 text, 3 JSON), its text read back; a tap that missed the format fails here, by name, not as
// a parse error further on.
const PLAN_FORMATS = ['.csv', '.ics', '.txt', '.json'];
export async function downloadPlan(page, format) {
  await reveal(page, `plan.export_format.${format}`);
  await tap(page, `plan.export_format.${format}`);
  await reveal(page, 'plan.export');
  const [download] = await Promise.all([page.waitForEvent('download', { timeout: 10000 }), tap(page, 'plan.export')]);
  const name = download.suggestedFilename();
  check(name.endsWith(PLAN_FORMATS[format]), `the Plan's download is ${name}, not the ${PLAN_FORMATS[format]} chosen`);
  return readFileSync(await download.path(), 'utf8');
}

// Waits until the app's message strip (shown for a few seconds after an action) has gone and
// the page is drawn without it (the strip takes height from the page; app.cpp message_room).
export async function messageGone(page, timeout = 30000) {
  await page.evaluate(() => Module.ccall('tw_test_animate', null, ['number'], [2]));
  await page.waitForFunction(() => JSON.parse(Module.ccall('tw_test_state', 'string', [], [])).message === '',
    null, { timeout });
  await frames(page, 2);
}

// Types into the app's text entry field (opened by tapping a field) and confirms.
export async function enter(page, text) {
  await page.waitForSelector('#entry.open', { timeout: 5000 });
  await page.fill('#entry-input', text);
  await page.press('#entry-input', 'Enter');
  await frames(page, 3);
}

// Waits until the browser copy of the store is flushed into IndexedDB.
export async function flushed(page) {
  await page.waitForFunction(() => !Module.tw.flushing(), null, { timeout: 10000 });
}

export function check(cond, what) {
  if (!cond) throw new Error(what);
}

// Chromium's own notices about software WebGL are not app errors.
export const benign = (t) => /GL Driver Message|GPU stall|WebGL/.test(t);

// A fresh browser context (no storage, no cache) with the app loaded and drawn.
// fixedTime (ms since 1970): the page's Date reads that moment all along (its timers run as
// usual), for a test that needs a known "now".
export async function openApp(browser, url, opts, { fixedTime } = {}) {
  const context = await browser.newContext({ ...opts, acceptDownloads: true });
  if (fixedTime !== undefined) await context.clock.setFixedTime(fixedTime);
  const page = await context.newPage();
  const errors = watchErrors(page);
  await page.goto(url);
  await waitReady(page);
  await frames(page, 3);
  return { context, page, errors };
}

// Runs tests ([{name, fn}]) in order: one "ok"/"FAIL" line each, then "N passed, M failed";
// closes the browser and the server and exits non-zero on any failure.
// TW_ONLY=text runs only the tests whose name contains it.
export async function runTests(tests, browser, server) {
  let passed = 0, failed = 0;
  for (const t of tests.filter((x) => !process.env.TW_ONLY || x.name.includes(process.env.TW_ONLY))) {
    const t0 = Date.now();
    try {
      await t.fn();
      passed++;
      console.log(`ok   ${t.name} (${Date.now() - t0} ms)`);
    } catch (e) {
      failed++;
      console.log(`FAIL ${t.name}: ${e.message.split('\n')[0]}`);
    }
  }
  await browser.close();
  await server.close();
  console.log(`${passed} passed, ${failed} failed`);
  process.exit(failed ? 1 : 0);
}

// Goes offline once the service worker controls the page, and reloads from its cache.
export async function reloadOffline(page, context) {
  await page.evaluate(() => navigator.serviceWorker.ready.then(() => true));
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null, null, { timeout: 10000 });
  await context.setOffline(true);
  await page.reload();
  await waitReady(page);
  await frames(page, 2);
}

// Writes `text` as the older store of the app (a journal file in Emscripten's IDBFS database, as
// the app kept it before its IndexedDB store), from a page of the same origin with no app
// running; the app imports it once on its next start.
// A farm of 33 systems and no entries (the switcher's and the import's tests), system 2 with
// a name too long for any screen (FARM_LONG_NAME), system 2 current.
export const FARM_LONG_NAME = 'North greenhouse quarantine and grow-out raceway for the soft coral frags';
export function farmOf33Systems() {
  const units = { alkalinity: 'dKH', calcium_magnesium: 'mg/L', temperature: 'C', ph_scale: 'nbs', volume: 'L' };
  return {
    format: 'tidewright-journal', schema_version: 3, next_id: 34, description: 'a farm of 33 systems (test)',
    systems: Array.from({ length: 33 }, (_, i) => ({
      id: i + 1, name: i === 1 ? FARM_LONG_NAME : `Rack ${String(i + 1).padStart(2, '0')}`, kind: 'coral_grow_out', volume_l: 400,
      default_salinity: 35, default_temperature_c: 25, units, targets: {} })),
    events: [],
    app: { schema_version: 1, current_system: 2, demo_system_ids: [], settings: { text_size: 1.0, room_co2_ppm: 600 } },
  };
}

// A new browser context (opts: viewport, time zone...) opened on the app over a store as the
// older app kept it (seedOlderStore), imported on start: the farms of the browser tests.
export async function openSeeded(browser, url, opts, doc) {
  const context = await browser.newContext({ ...opts });
  const page = await context.newPage();
  const errors = watchErrors(page);
  await seedOlderStore(page, url, JSON.stringify(doc));
  await page.goto(url);
  await waitReady(page, 60000);
  await flushed(page);
  await frames(page, 3);
  return { context, page, errors };
}

export async function seedOlderStore(page, url, text) {
  await page.goto(url + 'manifest.webmanifest');
  await page.evaluate((t) => new Promise((ok, fail) => {
    const r = indexedDB.open('/persist', 21);  // as Emscripten's IDBFS creates it
    r.onupgradeneeded = () => r.result.createObjectStore('FILE_DATA').createIndex('timestamp', 'timestamp', { unique: false });
    r.onerror = () => fail(r.error);
    r.onsuccess = () => {
      const tx = r.result.transaction('FILE_DATA', 'readwrite');
      const s = tx.objectStore('FILE_DATA');
      s.put({ timestamp: new Date(), mode: 16893 }, '/persist');
      s.put({ timestamp: new Date(), mode: 33206, contents: new TextEncoder().encode(t) }, '/persist/tidewright.json');
      tx.oncomplete = () => { r.result.close(); ok(); };
    };
  }), text);
}

// The colour of one page pixel (CSS px), [r, g, b]: a 1x1 screenshot's PNG, decoded here (8-bit
// RGB or RGBA, one scanline with its filter byte, which for one pixel leaves it as stored).
export async function pixelAt(page, x, y) {
  const png = await page.screenshot({ clip: { x, y, width: 1, height: 1 }, scale: 'css' });
  const channels = png[25] === 6 ? 4 : 3;  // IHDR colour type: 6 RGBA, 2 RGB
  const chunks = [];
  for (let at = 8; at < png.length;) {
    const length = png.readUInt32BE(at);
    const type = png.toString('ascii', at + 4, at + 8);
    if (type === 'IDAT') chunks.push(png.subarray(at + 8, at + 8 + length));
    at += 12 + length;
  }
  const row = inflateSync(Buffer.concat(chunks));
  return [row[1], row[2], row[3]].slice(0, channels >= 3 ? 3 : channels);
}

// Changes a system's saved Plan or Hatchery settings in the app's IndexedDB record by hand, as a
// damaged or hand-edited store would hold them: edits maps "plan.doses_per_day" to a value.
export async function editSavedSettings(page, systemId, edits) {
  await page.evaluate(([id, changes]) => new Promise((ok, fail) => {
    const r = indexedDB.open('tidewright');
    r.onerror = () => fail(r.error);
    r.onsuccess = () => {
      const tx = r.result.transaction('settings', 'readwrite');
      const st = tx.objectStore('settings');
      st.get('app').onsuccess = (e) => {
        const app = e.target.result;
        for (const [path, value] of Object.entries(changes)) {
          const [form, field] = path.split('.');
          app.dosing_by_system[String(id)][form][field] = value;
        }
        st.put(app, 'app');
      };
      tx.oncomplete = () => { r.result.close(); ok(); };
      tx.onerror = () => fail(tx.error);
    };
  }), [systemId, edits]);
}

// The demo journal as the app loaded it (moved forward by whole days: the app's demo_shift_s),
// imported by the command line `cli` into a new database in `dir`; returns the database's path.
// For tests that compare the app with the command line on the same data.
// One minute after the demo's last entry, on the day the app moves the demo to (ms since 1970).
// The app carries the demo's levels from its last tests to now, and late in the demo's day
// they have fallen by most of a day's use: the demo reef's plan can then no longer hold its
// floors. A test that needs it to hold pins the app's clock here (openApp's fixedTime) and the
// command line's with --at.
export function demoFreshTime() {
  const doc = JSON.parse(readFileSync(join(HERE, '../../assets/demo/demo_journal.json'), 'utf8'));
  const last = Math.max(...doc.events.map((e) => Date.parse(e.time)));
  const day = 86400000;
  return last + Math.floor((Date.now() - last) / day) * day + 60000;
}

export function cliDemoDatabase(cli, dir, shiftS) {
  const doc = JSON.parse(readFileSync(join(HERE, '../../assets/demo/demo_journal.json'), 'utf8'));
  const moved = (iso) => new Date(Date.parse(iso) + shiftS * 1000).toISOString().replace('.000Z', 'Z');
  for (const e of doc.events) {
    e.time = moved(e.time);
    if (e.stop) e.stop = moved(e.stop);
  }
  const shifted = join(dir, 'demo.json');
  writeFileSync(shifted, JSON.stringify(doc));
  const db = join(dir, 'j.db');
  execFileSync(cli, ['log', '--journal', db, 'import', shifted], { stdio: 'pipe' });
  return db;
}
