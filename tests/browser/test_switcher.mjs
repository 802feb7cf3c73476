// Browser tests of the header's system switcher with a farm's 33 systems (issue 15): the list
// scrolls by a finger's drag on a phone and by the wheel on a desktop until the 33rd system can
// be tapped, and a long name is cut with an ellipsis in the list and in the header; the Find
// field narrows the list with each character typed (a phone's keyboard and a desktop's), and its
// Cancel brings every system back.
//   node test_switcher.mjs [site-dir]      (default ../../build/web/site)
// Screenshots go to tests/browser/output/switcher-*.png.
import { resolve, join } from 'node:path';
import { startServer } from './serve.mjs';
import { launch, PHONE_1X as PHONE, DESKTOP, waitReady, state, widget, frames, flushed, check, OUTPUT, HERE, runTests, benign, watchErrors, openSeeded, tap, enter, FARM_LONG_NAME, farmOf33Systems } from './lib.mjs';

const site = resolve(process.argv[2] || join(HERE, '../../build/web/site'));
const server = await startServer(site);
const browser = await launch();
const tests = [];
const test = (name, fn) => tests.push({ name, fn });

const LONG = FARM_LONG_NAME;
const FARM = farmOf33Systems();

// Opens the app on the farm: the store as the older app kept it (IDBFS), imported on start.
const openFarm = (opts) => openSeeded(browser, server.url, opts, FARM);

// A press, a slow move and a release of one finger (Chromium's touch events become the
// pointer events the app reads).
async function drag(page, cdp, x, y0, y1) {
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchStart', touchPoints: [{ x, y: y0 }] });
  await frames(page, 1);
  for (let k = 1; k <= 6; k++) {
    await cdp.send('Input.dispatchTouchEvent', { type: 'touchMove', touchPoints: [{ x, y: y0 + (y1 - y0) * k / 6 }] });
    await frames(page, 1);
  }
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchEnd', touchPoints: [] });
  await frames(page, 3);
}

// After the text entry closes, a phone's page changes size back (the keyboard went away) and the
// canvas is cleared until the next frame after it: a screenshot taken then was blank, now and then.
async function afterEntry(page) {
  await page.waitForTimeout(300);
  await frames(page, 3);
}

async function press(page, w) {
  const touch = await page.evaluate(() => navigator.maxTouchPoints > 0);
  if (touch) await page.touchscreen.tap(w.x + w.w / 2, w.y + w.h / 2); else await page.mouse.click(w.x + w.w / 2, w.y + w.h / 2);
  await frames(page, 3);
}

for (const [label, opts] of [['phone', PHONE], ['desktop', DESKTOP]]) {
  test(`switcher: 33 systems scroll to the last, which can be tapped; long names cut with an ellipsis (${label})`, async () => {
    const { context, page, errors } = await openFarm(opts);
    const s = await state(page);
    check(s.systems.length === 33 && s.current_system === 2,
      `farm not loaded: ${s.systems.length} systems, current ${s.current_system} ${s.store.problem}`);
    const header = await widget(page, 'header.switch');
    // The header names the system in full where it fits (a desktop), else cut with an ellipsis.
    const shown = header.text.trim();
    const cut = shown.endsWith('\u2026') && LONG.startsWith(shown.slice(0, -1).trimEnd());
    check(opts.hasTouch ? cut : shown === LONG || cut, `the header shows "${header.text}"`);
    await press(page, header);
    const long = await widget(page, 'switch.2');
    check(long.found && long.text.endsWith('\u2026') && LONG.startsWith(long.text.slice(0, -1).trimEnd()),
      `the long name in the list reads "${long.text}"`);
    const first = await widget(page, 'switch.1');
    check(first.visible && first.text === 'Rack 01', `first row: ${JSON.stringify(first)}`);
    let last = await widget(page, 'switch.33');
    check(last.found && !last.visible, `system 33 is on screen before any scrolling: ${JSON.stringify(last)}`);
    await page.screenshot({ path: join(OUTPUT, `switcher-${label}-open.png`) });
    // Scroll the list only as a user would: drag it up (phone) or turn the wheel over it (desktop).
    const cdp = opts.hasTouch ? await context.newCDPSession(page) : null;
    for (let i = 0; i < 20 && !last.visible; i++) {
      const x = first.x + first.w / 2;
      if (cdp) {
        await drag(page, cdp, x, first.y + 5 * first.h, first.y + first.h);  // inside the list's box
      } else {
        await page.mouse.move(x, first.y + 2 * first.h);
        await page.mouse.wheel(0, 300);
        await frames(page, 4);
      }
      last = await widget(page, 'switch.33');
    }
    check(last.visible, 'system 33 never came into view by scrolling');
    // Let the list glide to a stop (a drag keeps a little momentum), as a user waits to aim.
    for (let i = 0; i < 40; i++) {
      await frames(page, 3);
      const now = await widget(page, 'switch.33');
      const still = Math.abs(now.y - last.y) < 0.5;
      last = now;
      if (still) break;
    }
    check(last.visible, 'system 33 glided out of view');
    check((await state(page)).current_system === 2, 'scrolling the list chose a system');
    await page.screenshot({ path: join(OUTPUT, `switcher-${label}-scrolled.png`) });
    await press(page, last);
    const after = await state(page);
    check(after.current_system === 33, `tapping system 33 made ${after.current_system} current`);
    check((await widget(page, 'header.switch')).text.startsWith('Rack 33'), 'the header does not name Rack 33');
    await context.close();
    // The blank same-origin page used to seed the older store asks for /favicon.ico (a 404).
    const real = errors.filter((e) => !benign(e) && !/status of 404/.test(e));
    check(real.length === 0, `console errors: ${real.join(' | ')}`);
  });
}

for (const [label, opts] of [['phone', PHONE], ['desktop', DESKTOP]]) {
  test(`switcher: typing part of a name keeps the systems that hold it; one of them is tapped (${label})`, async () => {
    const { context, page, errors } = await openFarm(opts);
    await press(page, await widget(page, 'header.switch'));
    await tap(page, 'switch.find');
    await enter(page, 'rack 3');  // Rack 30 to 33, in any case (Rack 03 reads 'rack 03')
    const found = await widget(page, 'switch.31'), gone = await widget(page, 'switch.12');
    check(found.visible && found.text === 'Rack 31', `Rack 31 after typing: ${JSON.stringify(found)}`);
    check(!gone.found, 'Rack 12 is still listed');
    const listed = Object.keys(JSON.parse(await page.evaluate(() => Module.ccall('tw_test_widgets', 'string', [], []))))
      .filter((n) => /^switch\.\d+$/.test(n)).sort();
    check(listed.join(' ') === 'switch.30 switch.31 switch.32 switch.33', `listed ${listed.join(' ')}`);
    await afterEntry(page);
    await page.screenshot({ path: join(OUTPUT, `switcher-${label}-found.png`) });
    await press(page, found);
    check((await state(page)).current_system === 31, 'tapping Rack 31 did not make it current');
    await context.close();
    const real = errors.filter((e) => !benign(e) && !/status of 404/.test(e));
    check(real.length === 0, `console errors: ${real.join(' | ')}`);
  });
}

// The names of the systems listed now (switch.<id> widgets drawn this frame).
async function listed(page) {
  return Object.keys(JSON.parse(await page.evaluate(() => Module.ccall('tw_test_widgets', 'string', [], []))))
    .filter((n) => /^switch\.\d+$/.test(n));
}

for (const [label, opts] of [['phone', PHONE], ['desktop', DESKTOP]]) {
  test(`switcher: the list narrows with each character typed, before Enter; Cancel brings every system back (${label})`, async () => {
    const { context, page, errors } = await openFarm(opts);
    await press(page, await widget(page, 'header.switch'));
    check((await listed(page)).length === 33, 'the list does not start with all 33 systems');
    await tap(page, 'switch.find');
    await page.waitForSelector('#entry.open', { timeout: 5000 });
    // A phone's keyboard gives the page text without key events (insertText sends only the
    // 'input' event); a desktop's keyboard sends keys.
    const counts = [];
    for (const ch of 'Rack 3') {
      if (opts.hasTouch) await page.keyboard.insertText(ch); else await page.keyboard.type(ch);
      await frames(page, 4);
      counts.push((await listed(page)).length);
    }
    // "r", "ra", "rac" also match the long name's "raceway"; "rack" leaves the 32 racks, "rack 3"
    // Rack 30 to 33.
    check(counts.join(',') === '33,33,33,32,32,4', `listed after each character: ${counts.join(',')}`);
    const s = await state(page);
    check(s.entry_open && await page.isVisible('#entry.open'), 'the field closed while typing');
    check((await listed(page)).sort().join(' ') === 'switch.30 switch.31 switch.32 switch.33', 'not Rack 30 to 33');
    check((await widget(page, 'switch.find')).text === 'Rack 3', `the Find field shows "${(await widget(page, 'switch.find')).text}"`);
    await page.screenshot({ path: join(OUTPUT, `switcher-${label}-typing.png`) });
    await page.click('#entry-cancel');
    await afterEntry(page);
    check((await listed(page)).length === 33, `after Cancel ${(await listed(page)).length} systems are listed`);
    const find = await widget(page, 'switch.find');
    check(find.text === 'Tap to enter', `the Find field shows "${find.text}" after Cancel`);
    check((await state(page)).current_system === 2, 'typing or Cancel chose a system');
    await page.screenshot({ path: join(OUTPUT, `switcher-${label}-cancelled.png`) });
    await context.close();
    const real = errors.filter((e) => !benign(e) && !/status of 404/.test(e));
    check(real.length === 0, `console errors: ${real.join(' | ')}`);
  });
}

await runTests(tests, browser, server);
