// Browser tests of the Plan and Hatchery settings kept per system in the saved store (issue 15):
// set on two systems by taps, both come back after a reload; a damaged saved value is refused
// with a message naming the setting and its range, and its default is used.
//   node test_saved_settings.mjs [site-dir]      (default ../../build/web/site)
// Screenshots go to tests/browser/output/saved-*.png.
import { resolve, join } from 'node:path';
import { startServer } from './serve.mjs';
import { launch, PHONE_1X as PHONE, DESKTOP, waitReady, state, tap, enter, frames, flushed, check, OUTPUT, HERE, openApp, runTests, benign, messageGone, editSavedSettings } from './lib.mjs';

const site = resolve(process.argv[2] || join(HERE, '../../build/web/site'));
const server = await startServer(site);
const browser = await launch();
const tests = [];
const test = (name, fn) => tests.push({ name, fn });

async function switchTo(page, id) {
  await tap(page, 'header.switch');
  await tap(page, `switch.${id}`);
  check((await state(page)).current_system === id, `system ${id} not chosen`);
}

async function type(page, name, text) {
  await tap(page, name);
  await enter(page, text);
}

async function reload(page) {
  await flushed(page);
  await page.reload();
  await waitReady(page);
  await frames(page, 3);
}

// What a test sets on a system, and how to find it in the forms the app shows.
const SETTINGS = [
  { plan: { doses: '6', strength: '123', horizon: '21' }, hatchery: { batch: false, stock: '120', flow: '250' } },
  { plan: { doses: '3', strength: '90', horizon: '10' }, hatchery: { batch: true, volume: '500' } },
];

async function setOn(page, s) {
  await tap(page, 'tab.plan');
  await type(page, 'plan.alk_pump.doses_per_day', s.plan.doses);
  await type(page, 'plan.alk_strength', s.plan.strength);
  await type(page, 'plan.horizon', s.plan.horizon);
  await tap(page, 'tab.hatchery');
  if (s.hatchery.batch) {
    await tap(page, 'hatchery.mode.1');
    await type(page, 'hatchery.volume', s.hatchery.volume);
  } else {
    await type(page, 'hatchery.stock_strength', s.hatchery.stock);
    await type(page, 'hatchery.flow', s.hatchery.flow);
  }
}

function expectForms(f, s, who) {
  const near = (a, b) => Math.abs(a - Number(b)) < 1e-6;
  check(near(f.plan.alkalinity_doses_per_day, s.plan.doses), `${who}: doses per day ${f.plan.alkalinity_doses_per_day}, expected ${s.plan.doses}`);
  check(near(f.plan.alkalinity_stock_g_per_l, s.plan.strength), `${who}: stock ${f.plan.alkalinity_stock_g_per_l}`);
  check(near(f.plan.horizon_days, s.plan.horizon), `${who}: horizon ${f.plan.horizon_days}`);
  check(f.hatchery.mode === (s.hatchery.batch ? 'batch' : 'flow_through'), `${who}: hatchery mode ${f.hatchery.mode}`);
  if (s.hatchery.batch) {
    check(f.hatchery.volume_l !== null && Math.abs(f.hatchery.volume_l - Number(s.hatchery.volume)) < 0.5,
      `${who}: hatchery volume ${f.hatchery.volume_l}`);
    check(f.hatchery.stock_g_per_l === null, `${who}: a stock strength that was never set: ${f.hatchery.stock_g_per_l}`);
  } else {
    check(f.hatchery.stock_g_per_l !== null && near(f.hatchery.stock_g_per_l, s.hatchery.stock),
      `${who}: hatchery stock ${f.hatchery.stock_g_per_l}`);
    check(near(f.hatchery.flow_l_per_min, s.hatchery.flow), `${who}: hatchery flow ${f.hatchery.flow_l_per_min}`);
  }
}

for (const [label, opts] of [['phone', PHONE], ['desktop', DESKTOP]]) {
  test(`Plan and Hatchery settings of two systems each come back after a reload (${label})`, async () => {
    const { context, page, errors } = await openApp(browser, server.url, opts);
    const ids = (await state(page)).systems.map((s) => s.id);
    check(ids.length >= 2, `the demo has ${ids.length} systems`);
    for (let i = 0; i < 2; i++) {
      await switchTo(page, ids[i]);
      await setOn(page, SETTINGS[i]);
    }
    // The hatchery result uses the typed strength (it was fixed by the default before).
    await switchTo(page, ids[0]);
    await tap(page, 'tab.hatchery');
    const before = await state(page);
    check(before.hatchery.error === '', `hatchery refused the typed stock: ${before.hatchery.error}`);
    await reload(page);
    const s = await state(page);
    check(s.current_system === ids[0], `after reload the current system is ${s.current_system}`);
    expectForms(s.dosing_forms, SETTINGS[0], `system ${ids[0]}`);
    await tap(page, 'tab.hatchery');
    await page.evaluate((n) => Module.ccall('tw_test_reveal', null, ['string'], [n]), 'hatchery.stock_strength');
    await frames(page, 4);
    await page.screenshot({ path: join(OUTPUT, `saved-${label}-hatchery.png`) });
    await switchTo(page, ids[1]);
    expectForms((await state(page)).dosing_forms, SETTINGS[1], `system ${ids[1]}`);
    await tap(page, 'tab.plan');
    await page.evaluate((n) => Module.ccall('tw_test_reveal', null, ['string'], [n]), 'plan.alk_pump.doses_per_day');
    await frames(page, 4);
    await page.screenshot({ path: join(OUTPUT, `saved-${label}-plan.png`) });
    // A third system was never changed: it shows the defaults.
    if (ids.length > 2) {
      await switchTo(page, ids[2]);
      const f = (await state(page)).dosing_forms;
      check(f.plan.alkalinity_doses_per_day === null && f.hatchery.stock_g_per_l === null, `untouched system: ${JSON.stringify(f.plan)}`);
    }
    await context.close();
    const real = errors.filter((e) => !benign(e));
    check(real.length === 0, `console errors: ${real.join(' | ')}`);
  });
}

test('a damaged saved setting is refused with its name and range; the default is used; nothing else is lost', async () => {
  const { context, page, errors } = await openApp(browser, server.url, PHONE);
  const ids = (await state(page)).systems.map((s) => s.id);
  await switchTo(page, ids[0]);
  await setOn(page, SETTINGS[0]);
  await flushed(page);
  const events = (await state(page)).events;
  // Change the stored record by hand, as a damaged or hand-edited store would have it.
  // The calcium stock is inside the range table (up to 1500 g/L) but past its solubility.
  await editSavedSettings(page, ids[0], { 'plan.alkalinity_doses_per_day': 999, 'hatchery.stock_g_per_l': 'strong',
    'plan.calcium_stock_g_per_l': 1490 });
  await page.reload();
  await waitReady(page);
  await frames(page, 3);
  const s = await state(page);
  check(s.message_is_error && /Alkalinity pump doses per day 999/.test(s.message) && /1 to 288/.test(s.message),
    `no refusal naming the setting and its range: "${s.message}"`);
  check(/and 2 more/.test(s.message), `the other two refused values are not counted: "${s.message}"`);
  check(s.dosing_forms.plan.calcium_stock_g_per_l === null, `a calcium stock past its solubility kept: ${s.dosing_forms.plan.calcium_stock_g_per_l}`);
  check(s.dosing_forms.plan.alkalinity_doses_per_day === null, `doses per day not back to its default: ${s.dosing_forms.plan.alkalinity_doses_per_day}`);
  check(s.dosing_forms.hatchery.stock_g_per_l === null, `stock strength not back to its default`);
  check(Math.abs(s.dosing_forms.plan.alkalinity_stock_g_per_l - 123) < 1e-9, 'a good setting beside the bad one was lost');
  check(s.events === events, `events ${events} -> ${s.events}`);
  await page.screenshot({ path: join(OUTPUT, 'saved-phone-refused.png') });
  await messageGone(page);
  // The cleaned settings are what is stored now: no refusal on the next start.
  await reload(page);
  const again = await state(page);
  check(!again.message_is_error, `refused again on the next start: "${again.message}"`);
  await context.close();
  const real = errors.filter((e) => !benign(e));
  check(real.length === 0, `console errors: ${real.join(' | ')}`);
});

await runTests(tests, browser, server);
