// Browser tests of the farm views of the Systems screen (issue 15) on a farm of 30 systems with
// about a year of tests and a running pump schedule each: the overview lists all 30 (scrolled to
// the last), flags a system out of band and one whose tests are old, first and in words; a
// system's daily use equals what its Demand screen shows; the round of tests saves several
// systems' values with one tap, refuses an out-of-range value naming the system, the field and
// the range while saving nothing, and what it saved survives a reload. Prints the time the app
// took to build the overview.
//   node test_farm.mjs [site-dir]      (default ../../build/web/site)
// Screenshots go to tests/browser/output/farm-*.png.
import { resolve, join } from 'node:path';
import { startServer } from './serve.mjs';
import { launch, PHONE_1X as PHONE, DESKTOP, waitReady, state, widget, frames, flushed, check, OUTPUT, HERE, runTests, benign, watchErrors, openSeeded, tap, enter } from './lib.mjs';

const site = resolve(process.argv[2] || join(HERE, '../../build/web/site'));
const server = await startServer(site);
const browser = await launch();
const tests = [];
const test = (name, fn) => tests.push({ name, fn });

// ---------------------------------------------------------------- the farm (invented)
const SYSTEMS = 30;
const LOW_CALCIUM = 5;  // its newest calcium test is below the band
const OLD_TESTS = 7;    // tested last 40 days ago
const MEQ = 9;          // its keeper reads alkalinity in meq/L
const DAY = 86400e3;
const iso = (ms) => new Date(Math.floor(ms / 1000) * 1000).toISOString().replace('.000Z', 'Z');
const units = { alkalinity: 'dKH', calcium_magnesium: 'mg/L', temperature: 'C', ph_scale: 'nbs', volume: 'L' };
const targets = { alkalinity_dkh: 8.0, calcium_mg_l: 430, magnesium_mg_l: 1350 };

function makeFarm(now) {
  const systems = [], events = [];
  let id = SYSTEMS + 1;
  const start = now - 365 * DAY;
  for (let s = 1; s <= SYSTEMS; s++) {
    systems.push({ id: s, name: s === 2 ? 'North greenhouse grow-out raceway for the soft coral frags' : `Rack ${String(s).padStart(2, '0')}`,
      kind: 'coral_grow_out', volume_l: 400, default_salinity: 35, default_temperature_c: 25,
      units: s === MEQ ? { ...units, alkalinity: 'meq/L' } : units, targets });
    events.push({ id: id++, system_id: s, time: iso(start), type: 'schedule', additive: 'sodium_carbonate', amount: 20,
      amount_unit: 'mL', calibration: 1.0, device: 'alkalinity pump', doses_per_day: 4, stock_g_per_l: 100,
      stock_name: 'soda ash 100 g/L' });
    const last = s === OLD_TESTS ? now - 40 * DAY : now - 3 * 3600e3;
    // Deterministic wobble around the targets, within a kit's precision.
    const wob = (k, amp) => amp * Math.sin(k * 1.7 + s);
    for (let k = 0; k * 2 * DAY <= last - start; k++) {
      const t = last - k * 2 * DAY;
      events.push({ id: id++, system_id: s, time: iso(t), type: 'test', parameter: 'alkalinity', unit: 'dKH', value: +(8 + wob(k, 0.15)).toFixed(2) });
      if (k % 2 === 0) {
        const ca = s === LOW_CALCIUM && k === 0 ? 380 : Math.round(430 + wob(k, 6));
        events.push({ id: id++, system_id: s, time: iso(t + 600e3), type: 'test', parameter: 'calcium', unit: 'mg/L', value: ca });
      }
      if (k % 4 === 0) {
        events.push({ id: id++, system_id: s, time: iso(t + 1200e3), type: 'test', parameter: 'magnesium', unit: 'mg/L', value: Math.round(1350 + wob(k, 15)) });
      }
    }
  }
  events.sort((a, b) => (a.time < b.time ? -1 : a.time > b.time ? 1 : a.id - b.id));
  return {
    format: 'tidewright-journal', schema_version: 3, next_id: id, description: 'a farm of 30 systems (test)', systems, events,
    app: { schema_version: 1, current_system: 1, demo_system_ids: [], settings: { text_size: 1.0, room_co2_ppm: 600 } },
  };
}

const FARM = makeFarm(Date.now());
console.log(`farm: ${SYSTEMS} systems, ${FARM.events.length} events over 365 days`);

// Opens the app on the farm: the store as the older app kept it (IDBFS), imported on start.
async function openFarm(opts) {
  const t0 = Date.now();
  const { context, page, errors } = await openSeeded(browser, server.url, opts, FARM);
  console.log(`     the farm's store imported and the app started in ${Date.now() - t0} ms`);
  return { context, page, errors };
}

// Shows the overview and waits until it is built (it is spread over frames).
async function showOverview(page) {
  await tap(page, 'tab.systems');
  await tap(page, 'systems.view.1');
  await overviewBuilt(page);
  return state(page);
}

function noErrors(errors) {
  // The blank same-origin page used to seed the older store asks for /favicon.ico (a 404).
  const real = errors.filter((e) => !benign(e) && !/status of 404/.test(e));
  check(real.length === 0, `console errors: ${real.join(' | ')}`);
}

// Waits until the overview is built (it is spread over frames after a change).
async function overviewBuilt(page) {
  await page.waitForFunction(() => {
    const s = JSON.parse(Module.ccall('tw_test_state', 'string', [], []));
    return s.farm && !s.farm_building;
  }, null, { timeout: 30000 });
  await frames(page, 2);
}

// The two phone tests share one session: the second starts where the first left off.
let phone = null;

test('farm overview: 30 systems listed to the last, the flagged first and in words; demand as on the Demand screen (phone)', async () => {
  phone = await openFarm(PHONE);
  const { page, errors } = phone;
  const s0 = await state(page);
  check(s0.systems.length === SYSTEMS && s0.events === FARM.events.length,
    `farm not loaded: ${s0.systems.length} systems, ${s0.events} events ${s0.store.problem}`);
  const s = await showOverview(page);
  check(s.systems_view === 1 && s.farm, 'the farm overview is not shown');
  console.log(`     overview of ${SYSTEMS} systems x ${FARM.events.length} events: ${s.farm.build_ms.toFixed(1)} ms of computing ` +
    `over ${s.farm.frames} frames (${(s.farm.build_ms / s.farm.frames).toFixed(1)} ms a frame), ${s.farm.wall_ms.toFixed(0)} ms from start to end`);
  const t1 = Date.now();
  check(s.farm.rows.length === SYSTEMS, `the overview lists ${s.farm.rows.length} systems`);
  // The two systems needing a look come first, each saying why.
  const flagged = s.farm.rows.slice(0, s.farm.needing_attention).map((r) => r.id);
  check(s.farm.needing_attention === 2 && flagged.includes(LOW_CALCIUM) && flagged.includes(OLD_TESTS),
    `flagged first: ${JSON.stringify(flagged)} of ${JSON.stringify(s.farm.rows.map((r) => [r.id, r.attention]))}`);
  const low = (await widget(page, `farm.attention.${LOW_CALCIUM}`)).text;
  check(/Calcium 380 mg\/L is below its band 410 to 450 mg\/L/.test(low), `system ${LOW_CALCIUM} says "${low}"`);
  check((await widget(page, `farm.level.${LOW_CALCIUM}.1`)).text.startsWith('380 mg/L low'), 'the low calcium is not marked in words');
  const old = (await widget(page, `farm.attention.${OLD_TESTS}`)).text;
  check(/Alkalinity: last test 40 d ago, too old/.test(old), `system ${OLD_TESTS} says "${old}"`);
  check(s.farm.rows.every((r) => r.due === 1), 'every system has its running schedule due today');
  const meq = (await widget(page, `farm.level.${MEQ}.0`)).text;
  const meqUse = (await widget(page, `farm.demand.${MEQ}.0`)).text;
  check(/^2\.\d+ meq\/L, \d+ h ago$/.test(meq) && meqUse.endsWith(' meq/L'), `system ${MEQ} (meq/L) shows "${meq}", uses "${meqUse}"`);
  await page.screenshot({ path: join(OUTPUT, 'farm-phone-overview.png') });
  // Drawing more frames does not build it again (cached on the journal's revision).
  await frames(page, 10);
  check((await state(page)).farm.computed_count === s.farm.computed_count, 'the overview was rebuilt with no change');
  // Scrolled to the last system (the test interface's reveal: the wheel or a finger's drag
  // scroll the same page, as the switcher's test shows, but take a minute in software WebGL).
  const lastId = s.farm.rows[SYSTEMS - 1].id;
  check(!(await widget(page, `farm.open.${lastId}`)).visible, 'the last system is on screen before scrolling');
  await page.evaluate((n) => Module.ccall('tw_test_reveal', null, ['string'], [n]), `farm.open.${lastId}`);
  await frames(page, 3);
  const last = await widget(page, `farm.open.${lastId}`);
  check(last.visible && last.text.startsWith('Rack'), `the last system (${lastId}) is not in view: ${JSON.stringify(last)}`);
  console.log(`     scrolled to the last in ${Date.now() - t1} ms`);
  await page.screenshot({ path: join(OUTPUT, 'farm-phone-last.png') });
  // One system's daily use, here and on its Demand screen (alkalinity, then calcium).
  const id = 3;
  const farmAlk = (await widget(page, `farm.demand.${id}.0`)).text;
  const farmCa = (await widget(page, `farm.demand.${id}.1`)).text;
  check(farmAlk !== '' && farmCa !== '', `system ${id} shows no demand: "${farmAlk}" "${farmCa}"`);
  await tap(page, `farm.open.${id}`);
  const d = await state(page);
  check(d.screen === 'demand' && d.current_system === id, `tapping system ${id} opened ${d.screen} of ${d.current_system}`);
  const shownAlk = (await widget(page, 'demand.consumption')).text;
  await tap(page, 'demand.param.1');
  const shownCa = (await widget(page, 'demand.consumption')).text;
  console.log(`     system ${id}: alkalinity ${farmAlk}/day (Demand screen ${shownAlk}), calcium ${farmCa}/day (${shownCa})`);
  check(farmAlk === `${shownAlk} dKH` && farmCa === `${shownCa} mg/L`, `overview ${farmAlk} / ${farmCa}, Demand screen ${shownAlk} / ${shownCa}`);
  // Back through the Systems tab: the overview is one tap away, and the Water button opens Water.
  await tap(page, 'tab.systems');
  check((await state(page)).systems_view === 1, 'the Systems tab did not come back to the overview');
  await overviewBuilt(page);  // choosing system 3 made a new revision
  await tap(page, `farm.water.${LOW_CALCIUM}`);
  const w = await state(page);
  check(w.screen === 'water' && w.current_system === LOW_CALCIUM, `Water button opened ${w.screen} of ${w.current_system}`);
  noErrors(errors);
});

test('round of tests: several systems in one save, an out-of-range value refused with nothing saved, kept after a reload (phone)', async () => {
  const { context, page, errors } = phone || await openFarm(PHONE);
  phone = null;
  await tap(page, 'tab.systems');
  await tap(page, 'systems.view.2');
  const before = (await state(page)).events;
  const typed = [[1, 'alk', '8.3'], [1, 'ca', '425'], [2, 'mg', '1340'], [3, 'ph', '8.12'], [4, 'ca', '1200']];
  for (const [sys, field, text] of typed) {
    await tap(page, `round.${sys}.${field}`);
    await enter(page, text);
  }
  await tap(page, 'round.save');
  const refused = await state(page);
  const err = (await widget(page, 'round.error')).text;
  console.log(`     refused: ${err}`);
  check(refused.events === before, `a refused round saved ${refused.events - before} events`);
  check(err.startsWith('Rack 04, Calcium:') && /1200 mg\/L is outside the accepted range \d+ to \d+ mg\/L/.test(err),
    `the refusal reads "${err}"`);
  check((await widget(page, 'round.1.alk')).text === '8.3', 'the typed values were lost by the refusal');
  await page.screenshot({ path: join(OUTPUT, 'farm-phone-round-refused.png') });
  // Put right: the bad value emptied (not tested), then one Save logs the other four.
  await tap(page, 'round.4.ca');
  await enter(page, '');
  await tap(page, 'round.save');
  const saved = await state(page);
  check(saved.events === before + 4, `the round saved ${saved.events - before} events, not 4`);
  const mine = saved.recent_events.filter((e) => e.type === 'test').slice(-4);
  const got = mine.map((e) => `${e.system_id}:${e.parameter}=${e.value}`).sort().join(' ');
  check(got === '1:alkalinity=8.3 1:calcium=425 2:magnesium=1340 3:ph=8.12', `saved ${got}`);
  check(new Set(mine.map((e) => e.time)).size === 1, 'the round\'s tests do not share one time');
  await flushed(page);
  await page.reload();
  await waitReady(page, 60000);
  await frames(page, 3);
  const after = await state(page);
  check(after.events === before + 4, `after a reload ${after.events - before} of the round's 4 tests are there`);
  const kept = after.recent_events.filter((e) => e.type === 'test').slice(-4).map((e) => `${e.system_id}:${e.parameter}=${e.value}`).sort().join(' ');
  check(kept === got, `after a reload: ${kept}`);
  await context.close();
  noErrors(errors);
});

test('round of tests: only the systems due a test, or a chosen rack kept after a reload; a typed value is never hidden (phone)', async () => {
  const { context, page, errors } = await openFarm(PHONE);
  await tap(page, 'tab.systems');
  await tap(page, 'systems.view.2');
  const listed = async () => {
    const out = [];
    for (let sys = 1; sys <= SYSTEMS; sys++) if ((await widget(page, `round.${sys}.alk`)).found) out.push(sys);
    return out;
  };
  check((await listed()).length === SYSTEMS, 'the round does not list every system at first');
  // Due a test: the one system whose tests are 40 days old (the others were tested 3 h ago).
  await tap(page, 'round.scope.1');
  await page.waitForFunction(() => !/Reading the logs/.test(JSON.parse(Module.ccall('tw_test_widget', 'string', ['string'], ['round.listed'])).text),
    null, { timeout: 60000 });
  await frames(page, 2);
  let shown = await listed();
  console.log(`     due a test: ${shown.join(', ')}; "${(await widget(page, 'round.listed')).text}"`);
  check(shown.length === 1 && shown[0] === OLD_TESTS, `due a test lists ${shown}, expected only ${OLD_TESTS}`);
  // A value typed for a system, then a choice that leaves it out: it stays listed (and says why).
  await tap(page, 'round.7.alk');
  await enter(page, '7.9');
  await tap(page, 'round.scope.2');  // chosen: none yet, so the list to choose opens
  check((await widget(page, 'round.choose.3')).found, 'choosing nothing yet did not open the list to choose');
  await tap(page, 'round.choose.3');
  await tap(page, 'round.choose.28');
  check((await widget(page, 'round.choose.28')).text === 'chosen', 'a tapped system is not marked chosen');
  await page.screenshot({ path: join(OUTPUT, 'farm-phone-round-choosing.png') });
  await tap(page, 'round.choose.done');
  shown = await listed();
  check(shown.join(',') === '3,7,28', `chosen 3 and 28 with a value typed for 7: listed ${shown}`);
  check(/only because values are typed/.test((await widget(page, 'round.listed')).text), 'the typed-only system is not explained');
  await page.screenshot({ path: join(OUTPUT, 'farm-phone-round-chosen.png') });
  await tap(page, 'round.3.ca');
  await enter(page, '431');
  const before = (await state(page)).events;
  await tap(page, 'round.save');
  const saved = await state(page);
  check(saved.events === before + 2, `saved ${saved.events - before} tests, expected 2 (systems 3 and 7)`);
  // Saved: system 7 is no longer typed, so only the chosen two remain; the choice survives a reload.
  shown = await listed();
  check(shown.join(',') === '3,28', `after the save listed ${shown}`);
  await flushed(page);
  await page.reload();
  await waitReady(page, 60000);
  await frames(page, 3);
  await tap(page, 'tab.systems');
  await tap(page, 'systems.view.2');
  shown = await listed();
  check(shown.join(',') === '3,28', `after a reload listed ${shown}`);
  check((await state(page)).events === saved.events, 'the saved round is not all there after a reload');
  await context.close();
  noErrors(errors);
});

test('farm overview on a desktop (1280x800): the flagged systems first, readable', async () => {
  const { context, page, errors } = await openFarm(DESKTOP);
  const s = await showOverview(page);
  check(s.farm && s.farm.rows.length === SYSTEMS && s.farm.needing_attention === 2, 'the overview is not complete');
  const first = await widget(page, `farm.open.${s.farm.rows[0].id}`);
  check(first.visible, 'the first flagged system is not on screen');
  await page.screenshot({ path: join(OUTPUT, 'farm-desktop-overview.png') });
  await context.close();
  noErrors(errors);
});

await runTests(tests, browser, server);
