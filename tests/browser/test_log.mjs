// Browser tests of the Log screen on the demo data, in headless Chromium at phone size
// (390x844) and desktop size (1280x800): a dose dated a day earlier, a water change, a
// specific-gravity reading, editing a logged entry, refusals of a bad time and a time in the
// future (nothing stored), and reload keeping it all.
//   node test_log.mjs [site-dir]      (default ../../build/web/site)
// Prints one line per test and "N passed, M failed"; exits non-zero on any failure.
// Screenshots go to tests/browser/output/log-*.png.
import { resolve, join } from 'node:path';
import { startServer } from './serve.mjs';
import { launch, PHONE_1X as PHONE, DESKTOP, waitReady, state, tap, enter, frames, flushed, check, OUTPUT, HERE, openApp, runTests, benign } from './lib.mjs';

const site = resolve(process.argv[2] || join(HERE, '../../build/web/site'));
const server = await startServer(site);
const browser = await launch();

const open = (opts) => openApp(browser, server.url, opts);

const shot = (page, name) => page.screenshot({ path: join(OUTPUT, `log-${name}.png`) });
const newest = (s, type) => [...s.recent_events].reverse().find((e) => e.type === type);
const unixOf = (iso) => Date.parse(iso) / 1000;
// "YYYY-MM-DD HH:MM" in the browser's local time (the format the app shows and reads).
const localText = (ms) => {
  const d = new Date(ms), p = (n) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())} ${p(d.getHours())}:${p(d.getMinutes())}`;
};

const tests = [];
const test = (name, fn) => tests.push({ name, fn });

for (const [label, opts] of [['phone', PHONE], ['desktop', DESKTOP]]) {
  test(`log: dose a day earlier, water change, edit, bad and future times refused, reload keeps all (${label})`, async () => {
    const { context, page, errors } = await open(opts);
    await tap(page, 'tab.log');
    // A dose of 12 mL sodium carbonate stock (80 g/L), dated one day before now.
    await tap(page, 'log.kind.1');
    await tap(page, 'log.dose.compound.0');
    await tap(page, 'log.dose.form.0');
    await tap(page, 'log.dose.amount');
    await enter(page, '12');
    await tap(page, 'log.when.1');
    await tap(page, 'log.time.day_earlier');
    await shot(page, `${label}-dose`);
    const before = await state(page);
    await tap(page, 'log.save');
    let s = await state(page);
    check(!s.message_is_error, `dose refused: ${s.message}`);
    check(s.events === before.events + 1, `events ${before.events} -> ${s.events}`);
    const dose = newest(s, 'dose');
    check(dose && dose.additive === 'sodium_carbonate' && dose.amount === 12 && dose.amount_unit === 'mL' &&
          dose.stock_g_per_l === 80, `dose stored as ${JSON.stringify(dose)}`);
    const ago = Date.now() / 1000 - unixOf(dose.time);
    check(Math.abs(ago - 86400) < 180, `dose dated ${ago} s ago, wanted a day`);
    check(s.log_form.when_s === null, 'the form did not go back to "now" after saving');

    // Water change of 20 L with the new water's alkalinity.
    await tap(page, 'log.kind.2');
    await tap(page, 'log.change.volume');
    await enter(page, '20');
    await tap(page, 'log.change.alkalinity');
    await enter(page, '8.5');
    await tap(page, 'log.save');
    s = await state(page);
    check(!s.message_is_error, `water change refused: ${s.message}`);
    const change = newest(s, 'water_change');
    check(change && change.volume_l === 20 && change.new_water && change.new_water.alkalinity_dkh === 8.5, `water change stored as ${JSON.stringify(change)}`);
    const nowDated = Date.now() / 1000 - unixOf(change.time);
    check(nowDated >= -5 && nowDated < 120, `water change dated ${nowDated} s ago, wanted now`);

    // A time that is not a time, then one in the future: both refused, nothing stored.
    await tap(page, 'log.kind.3');
    await tap(page, 'log.topoff.volume');
    await enter(page, '2');
    await tap(page, 'log.when.1');
    await tap(page, 'log.time');
    await enter(page, 'yesterday');
    s = await state(page);
    check(s.message_is_error && /time/.test(s.message), `no clear refusal of "yesterday": ${s.message}`);
    await tap(page, 'log.time');
    await enter(page, localText(Date.now() + 2 * 86400 * 1000));
    const beforeFuture = (await state(page)).events;
    await tap(page, 'log.save');
    s = await state(page);
    check(s.message_is_error && /future/.test(s.message), `no refusal of a future time: ${s.message}`);
    check(s.events === beforeFuture, 'a future entry was stored');
    await shot(page, `${label}-future-refused`);

    // A negative alkalinity is refused in the field with the core's range in the unit shown
    // (ranges.hpp: 0 to 25 dKH), not saved as 0; nothing is stored.
    await tap(page, 'log.kind.0');
    await tap(page, 'log.parameter.0');
    const storedBefore = (await state(page)).events;
    await tap(page, 'log.value');
    await enter(page, '-3');
    s = await state(page);
    check(s.message_is_error && /0(\.0+)? to 25(\.0+)? dKH/.test(s.message), `no refusal of -3 dKH with the range: "${s.message}"`);
    check(s.events === storedBefore, `events ${storedBefore} -> ${s.events} after a refused value`);

    // A refractometer reading: specific gravity 1.0264 is kept as read, and the Water screen
    // takes salinity 35.04 from it (EOS-80 at 25/25 C; the CLI `tidewright salinity --sg 1.0264`
    // gives the same figure).
    await tap(page, 'log.kind.0');
    await tap(page, 'log.when.0');
    await tap(page, 'log.parameter.5');
    await tap(page, 'log.value');
    await enter(page, '1.0264');
    await shot(page, `${label}-sg`);
    await tap(page, 'log.save');
    s = await state(page);
    const sg = newest(s, 'test');
    check(sg && sg.parameter === 'specific_gravity' && sg.value === 1.0264, `SG stored as ${JSON.stringify(sg)}`);
    await tap(page, 'tab.water');
    s = await state(page);
    check(Math.abs(s.latest.salinity - 35.04) < 0.01, `salinity from SG 1.0264: ${s.latest.salinity}`);
    await tap(page, 'tab.log');

    // Edit the dose: 12 -> 15 mL, same id, same time, no new event.
    await tap(page, `log.edit.${dose.id}`);
    s = await state(page);
    check(s.log_form.editing === dose.id && s.log_form.kind === 1, `edit form: ${JSON.stringify(s.log_form)}`);
    await tap(page, 'log.dose.amount');
    await enter(page, '15');
    await shot(page, `${label}-edit`);
    const beforeEdit = s.events;
    await tap(page, 'log.save');
    s = await state(page);
    const edited = s.recent_events.find((e) => e.id === dose.id);
    check(edited && edited.amount === 15 && edited.time === dose.time, `edited dose: ${JSON.stringify(edited)}`);
    check(s.events === beforeEdit, `editing changed the number of events ${beforeEdit} -> ${s.events}`);
    check(s.log_form.editing === 0, 'the form is still editing after saving');
    await shot(page, `${label}-history`);

    await flushed(page);
    await page.reload();
    await waitReady(page);
    await frames(page, 3);
    s = await state(page);
    const kept = s.recent_events.find((e) => e.id === dose.id);
    check(kept && kept.amount === 15, `after reload the dose is ${JSON.stringify(kept)}`);
    check(newest(s, 'water_change') && newest(s, 'water_change').id === change.id, 'after reload the water change is gone');
    await context.close();
    const real = errors.filter((e) => !benign(e));
    check(real.length === 0, `console errors: ${real.join(' | ')}`);
  });
}

// The kit precision of a test (issue 15): filled with the typical precision of the parameter in
// the unit chosen (the core's table), editable, saved with the test; out of range refused with
// the field's name and range.
for (const [label, opts] of [['phone', PHONE], ['desktop', DESKTOP]]) {
  test(`log: a test carries the kit precision entered; out of range refused (${label})`, async () => {
    const { context, page, errors } = await open(opts);
    await tap(page, 'tab.log');
    await tap(page, 'log.kind.0');
    await tap(page, 'log.parameter.0');
    await tap(page, 'log.unit.0');
    let s = await state(page);
    check(Math.abs(s.log_form.precision - 0.2) < 1e-9, `alkalinity kit default ${s.log_form.precision}, expected 0.2 dKH`);
    await tap(page, 'log.unit.1');
    s = await state(page);
    check(Math.abs(s.log_form.precision - 0.2 * 0.356652) < 1e-4, `in meq/L the default is ${s.log_form.precision}`);
    await tap(page, 'log.unit.0');
    await tap(page, 'log.precision');
    await enter(page, '20');
    s = await state(page);
    check(s.message_is_error && /Kit precision/.test(s.message) && /0\.00 to 12\.50 dKH/.test(s.message),
      `20 dKH not refused with the field and its range: "${s.message}"`);
    check(Math.abs(s.log_form.precision - 0.2) < 1e-9, `the refused value changed the form: ${s.log_form.precision}`);
    await tap(page, 'log.precision');
    await enter(page, '0.35');
    await tap(page, 'log.value');
    await enter(page, '8.3');
    await shot(page, `${label}-precision`);
    await tap(page, 'log.save');
    s = await state(page);
    check(!s.message_is_error, `test refused: ${s.message}`);
    const t = newest(s, 'test');
    check(t && t.parameter === 'alkalinity' && Math.abs(t.value - 8.3) < 1e-9 && Math.abs(t.precision - 0.35) < 1e-9,
      `test stored as ${JSON.stringify(t)}`);
    await flushed(page);
    await page.reload();
    await waitReady(page);
    await frames(page, 3);
    const again = newest(await state(page), 'test');
    check(again && again.id === t.id && Math.abs(again.precision - 0.35) < 1e-9, `after reload: ${JSON.stringify(again)}`);
    await context.close();
    const real = errors.filter((e) => !benign(e));
    check(real.length === 0, `console errors: ${real.join(' | ')}`);
  });
}

await runTests(tests, browser, server);
