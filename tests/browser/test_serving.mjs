// Tests of how the app is served (tests/browser/serve.mjs, issue 15): compression chosen by
// Accept-Encoding, the headers of a static app, revalidation that picks up an update, and the
// app starting, taking an entry, exporting and reloading offline under the content security
// policy with no violation; and the page's word when the browser takes the display (the WebGL
// context) away, the app taking taps meanwhile, and drawing again when the browser gives it back.
//   node test_serving.mjs [site-dir]      (default ../../build/web/site)
import { request } from 'node:http';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, utimesSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { brotliDecompressSync, gunzipSync, brotliCompressSync } from 'node:zlib';
import { startServer, chooseEncoding, CSP } from './serve.mjs';
import { reloadOffline, launch, PHONE, waitReady, state, widget, tap, enter, frames, flushed, check, HERE, runTests, benign, watchErrors, messageGone, pixelAt } from './lib.mjs';

const site = resolve(process.argv[2] || join(HERE, '../../build/web/site'));
const server = await startServer(site);
const browser = await launch();
const tests = [];
const test = (name, fn) => tests.push({ name, fn });

// One request with the given method and headers: status, headers and the body's bytes.
function get(url, headers = {}, method = 'GET') {
  return new Promise((ok, fail) => {
    request(url, { method, headers }, (res) => {
      const parts = [];
      res.on('data', (c) => parts.push(c));
      res.on('end', () => ok({ status: res.statusCode, headers: res.headers, body: Buffer.concat(parts) }));
    }).on('error', fail).end();
  });
}

const wasm = readFileSync(join(site, 'tidewright.wasm'));

test('wasm goes out as brotli, gzip or as it is, as the request allows', async () => {
  const br = await get(server.url + 'tidewright.wasm', { 'Accept-Encoding': 'gzip, deflate, br' });
  check(br.status === 200 && br.headers['content-encoding'] === 'br', `br: ${br.status} ${br.headers['content-encoding']}`);
  check(Number(br.headers['content-length']) === br.body.length, 'br: Content-Length is not the compressed length');
  check(br.body.length < wasm.length / 2, `br: ${br.body.length} bytes of ${wasm.length}`);
  check(brotliDecompressSync(br.body).equals(wasm), 'br: does not decompress to the wasm');
  const gz = await get(server.url + 'tidewright.wasm', { 'Accept-Encoding': 'gzip' });
  check(gz.headers['content-encoding'] === 'gzip' && gunzipSync(gz.body).equals(wasm), 'gzip: wrong encoding or body');
  for (const ae of [undefined, 'identity', 'br;q=0, gzip;q=0']) {
    const plain = await get(server.url + 'tidewright.wasm', ae ? { 'Accept-Encoding': ae } : {});
    check(plain.headers['content-encoding'] === undefined && plain.body.equals(wasm), `Accept-Encoding ${ae}: sent encoded`);
    check(Number(plain.headers['content-length']) === wasm.length, `Accept-Encoding ${ae}: Content-Length`);
  }
  for (const r of [br, gz]) {
    check(r.headers.vary === 'Accept-Encoding', `Vary: ${r.headers.vary}`);
    check(r.headers['content-type'] === 'application/wasm', `Content-Type: ${r.headers['content-type']}`);
  }
  check(br.headers.etag !== gz.headers.etag, 'one ETag for two encodings');
  const head = await get(server.url + 'tidewright.wasm', { 'Accept-Encoding': 'br' }, 'HEAD');
  check(head.status === 200 && head.body.length === 0 && head.headers['content-length'] === br.headers['content-length']
    && head.headers['content-encoding'] === 'br', 'HEAD differs from GET');
  check(chooseEncoding('br;q=0.5, gzip;q=1') === 'br' && chooseEncoding('*') === 'br' && chooseEncoding('gzip, *;q=0') === 'gzip'
    && chooseEncoding('') === 'identity', 'Accept-Encoding parsing');
  const png = await get(server.url + 'icons/icon-192.png', { 'Accept-Encoding': 'br' });
  check(png.headers['content-encoding'] === undefined, 'an image was compressed again');
});

test('every response carries the policy, nosniff and no-cache with a validator', async () => {
  for (const f of ['', 'index.html', 'page.js', 'page.css', 'tidewright.js', 'sw.js', 'manifest.webmanifest', 'nothing-here']) {
    const r = await get(server.url + f, { 'Accept-Encoding': 'br' });
    check(r.headers['content-security-policy'] === CSP, `${f || '/'}: CSP ${r.headers['content-security-policy']}`);
    check(r.headers['x-content-type-options'] === 'nosniff', `${f || '/'}: nosniff missing`);
    if (r.status === 200) {
      check(r.headers['cache-control'] === 'no-cache' && r.headers.etag && r.headers['last-modified'], `${f || '/'}: caching headers`);
    }
  }
  check(/script-src 'self' 'wasm-unsafe-eval'(;|$)/.test(CSP) && !CSP.includes('unsafe-inline') && /default-src 'self'/.test(CSP),
    `policy allows more than the origin: ${CSP}`);
  const page = readFileSync(join(site, 'index.html'), 'utf8');
  check(!/<script>|<style>|\son[a-z]+=/.test(page), 'index.html has an inline script, style or handler');
});

test('a repeated ETag gets 304; a changed file gets its new bytes and a new ETag', async () => {
  const r = await get(server.url + 'tidewright.js', { 'Accept-Encoding': 'br' });
  const again = await get(server.url + 'tidewright.js', { 'Accept-Encoding': 'br', 'If-None-Match': r.headers.etag });
  check(again.status === 304 && again.body.length === 0, `revalidation: ${again.status}`);
  // An update in a small site of our own: the server notices the new file at once, and a
  // compressed sibling left from the old build is not sent.
  const dir = mkdtempSync(join(tmpdir(), 'tw-serve-'));
  const s = await startServer(dir);
  try {
    writeFileSync(join(dir, 'a.js'), 'var build = 1;'.repeat(200));
    const first = await get(s.url + 'a.js', { 'Accept-Encoding': 'br' });
    writeFileSync(join(dir, 'a.js.br'), brotliCompressSync(Buffer.from('var build = 1;'.repeat(200))));
    const past = new Date(Date.now() - 10000);
    utimesSync(join(dir, 'a.js.br'), past, past);  // left from the build before
    writeFileSync(join(dir, 'a.js'), 'var build = 22;'.repeat(200));  // another size: file times are coarse
    const second = await get(s.url + 'a.js', { 'Accept-Encoding': 'br', 'If-None-Match': first.headers.etag });
    check(second.status === 200 && second.headers.etag !== first.headers.etag, `after the update: ${second.status}`);
    check(brotliDecompressSync(second.body).toString().startsWith('var build = 22;'), 'old bytes sent after the update');
    // The build's precompressed siblings (web/cmake/precompress.mjs) are what goes out.
    execFileSync(process.execPath, [join(HERE, '../../web/cmake/precompress.mjs'), dir, 'a.js'], { stdio: 'ignore' });
    for (const [ae, ext] of [['br', 'br'], ['gzip', 'gz']]) {
      const third = await get(s.url + 'a.js', { 'Accept-Encoding': ae });
      check(third.body.equals(readFileSync(join(dir, `a.js.${ext}`))), `${ae}: the precompressed file was not sent`);
    }
  } finally {
    await s.close();
    rmSync(dir, { recursive: true, force: true });
  }
});

// Collects the page's policy violations (the event) besides console errors ("Refused to ...").
async function openWatched(context) {
  await context.addInitScript(() => {
    window.__cspViolations = [];
    document.addEventListener('securitypolicyviolation', (e) => window.__cspViolations.push(`${e.violatedDirective} ${e.blockedURI}`));
  });
  const page = await context.newPage();
  const errors = watchErrors(page);
  return { page, errors };
}
async function noViolations(page, errors, when) {
  const v = await page.evaluate(() => window.__cspViolations);
  check(v.length === 0, `${when}: policy violations: ${v.join(' | ')}`);
  const real = errors.filter((e) => !benign(e));
  check(real.length === 0, `${when}: console errors: ${real.join(' | ')}`);
}

test('the app starts, takes an entry, exports and reloads offline with no policy violation', async () => {
  const context = await browser.newContext({ ...PHONE, acceptDownloads: true });
  const { page, errors } = await openWatched(context);
  const resp = await page.goto(server.url);
  check((await resp.allHeaders())['content-security-policy'] === CSP, 'page without the policy');
  await waitReady(page);
  await frames(page, 3);
  // The wasm arrived compressed: fewer bytes on the wire than it holds.
  const entry = await page.evaluate(() => performance.getEntriesByType('resource').filter((e) => e.name.endsWith('tidewright.wasm'))
    .map((e) => ({ encoded: e.encodedBodySize, decoded: e.decodedBodySize }))[0]);
  check(entry && entry.encoded > 0 && entry.encoded < entry.decoded / 2, `wasm transfer ${JSON.stringify(entry)}`);
  // A typed entry (the form's submit) and an export (a download from a blob: URL).
  await tap(page, 'tab.log');
  await tap(page, 'log.parameter.0');
  await tap(page, 'log.unit.0');
  await tap(page, 'log.value');
  await enter(page, '8.6');
  await tap(page, 'log.save');
  await flushed(page);
  await messageGone(page);
  const events = (await state(page)).events;
  await tap(page, 'tab.settings');
  const [download] = await Promise.all([page.waitForEvent('download'), tap(page, 'settings.export')]);
  check(download.suggestedFilename().endsWith('.json'), `download ${download.suggestedFilename()}`);
  await noViolations(page, errors, 'online');
  // Offline reload from the service worker's cache, still under the policy.
  await reloadOffline(page, context);
  check((await state(page)).events === events, 'offline reload lost the entry');
  await noViolations(page, errors, 'offline');
  await context.setOffline(false);
  await context.close();
});

test('a lost WebGL context is said on the page, taps still work, and the app draws again when it is given back', async () => {
  const context = await browser.newContext({ ...PHONE });
  const { page, errors } = await openWatched(context);
  await page.goto(server.url);
  await waitReady(page);
  await frames(page, 3);
  // The extension WebGL gives for testing this sends the same events a browser sends on its
  // own. (A context the browser has already taken away gives no extension: wait until it is back.)
  await page.waitForFunction(() => !Module.canvas.getContext('webgl2').isContextLost(), null, { timeout: 30000 });
  // A pixel of the Log tab as drawn while Log is open, to compare with after the restore.
  await tap(page, 'tab.log');
  const t = await widget(page, 'tab.log');
  const [x, y] = [Math.round(t.x + t.w / 2), Math.round(t.y + t.h / 4)];
  const drawn = await pixelAt(page, x, y);
  await tap(page, 'tab.systems');
  await page.evaluate(() => {
    window.__twLose = Module.canvas.getContext('webgl2').getExtension('WEBGL_lose_context');
    window.__twLose.loseContext();
  });
  await page.waitForFunction(() => document.getElementById('loading').classList.contains('lost'), null, { timeout: 10000 });
  const said = await page.textContent('#loading-msg');
  check(/display away/.test(said) && /Your data is saved/.test(said), `the page says: ${said}`);
  check(await page.evaluate(() => getComputedStyle(document.querySelector('#loading .bar')).display === 'none'),
        'the loading bar is shown with the message');
  // The app goes on underneath: a tap goes through the notice and opens Log.
  await tap(page, 'tab.log');
  check((await state(page)).screen === 'log', `a tap while the display was away did not open Log: ${(await state(page)).screen}`);
  await page.evaluate(() => window.__twLose.restoreContext());
  await page.waitForFunction(() => document.getElementById('loading').classList.contains('gone'), null, { timeout: 30000 });
  await frames(page, 4);
  const again = await pixelAt(page, x, y);
  check(again.join() === drawn.join(), `the Log tab is not drawn as before the loss: ${drawn} -> ${again}`);
  check((await state(page)).screen === 'log', 'the restore changed the screen');
  await noViolations(page, errors.filter((e) => !/CONTEXT_LOST|context lost/i.test(e)), 'after the restore');
  await context.close();
});

await runTests(tests, browser, server);
