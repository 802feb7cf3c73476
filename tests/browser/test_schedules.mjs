// Browser tests of standing dose schedules (issue 11) on the demo data, in headless Chromium at
// phone (390x844) and desktop (1280x800) sizes:
//  - the hobbyist's walk: the demo reef's pumps dose on their schedule (no alkalinity dose is
//    logged; the app moves the demo forward to today when it loads it); today's alkalinity test of 7.4 dKH is logged, then Demand shows no flag on
//    it and the Plan starts from it (within kit precision) with no dose that overshoots the
//    target band; the Plan's JSON download is the command line's `tidewright plan --journal
//    ... --json` on the same journal, number for number: the water's conditions, the demand,
//    every limit, each day's levels and every dose;
//  - "Adopt this plan" turns the plan into the pumps' schedules (shown on the Log screen), a
//    schedule is changed and one stopped, a missed and an extra dose are logged against one.
//   node test_schedules.mjs [site-dir]      (default ../../build/web/site)
// The command line: TW_CLI, else ../../build/native/shell/tidewright.
// Prints one line per test and "N passed, M failed"; exits non-zero on any failure.
// Screenshots go to tests/browser/output/schedules-*.png.
import { resolve, join } from 'node:path';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { startServer } from './serve.mjs';
import { launch, PHONE_1X as PHONE, DESKTOP, state, widget, tap, enter, frames, check, OUTPUT, HERE, openApp, runTests, cliDemoDatabase, benign, reveal, downloadPlan } from './lib.mjs';

const site = resolve(process.argv[2] || join(HERE, '../../build/web/site'));
const cli = process.env.TW_CLI || join(HERE, '../../build/native/shell/tidewright');
const server = await startServer(site);
const browser = await launch();

const open = (opts) => openApp(browser, server.url, opts);

async function shot(page, name) {
  await frames(page, 2);
  await page.screenshot({ path: join(OUTPUT, `schedules-${name}.png`) });
}

// Logs today's alkalinity test on the demo reef through the Log screen.
async function logTodaysTest(page, value) {
  let s = await state(page);
  const reef = s.systems.find((x) => x.name === 'Living room reef');
  check(reef && s.current_system === reef.id, 'the demo reef is not the current system');
  check(reef.units.alkalinity === 'dKH', `the demo reef logs alkalinity in ${reef.units.alkalinity}`);
  await tap(page, 'tab.log');
  await tap(page, 'log.kind.0');
  await tap(page, 'log.parameter.0');
  await tap(page, 'log.value');
  await enter(page, String(value));
  await tap(page, 'log.save');
  s = await state(page);
  check(!s.message_is_error, `test refused: ${s.message}`);
  const t = [...s.recent_events].reverse().find((e) => e.type === 'test');
  check(t && t.parameter === 'alkalinity' && t.value === value, `stored ${JSON.stringify(t)}`);
  return t;
}

// The command line on the same journal: the demo moved forward as the app moved it when it
// loaded it (whole days, demo_shift_s), imported, and the same test at the same time; the plan
// input is the app's own (its pumps, stocks and settings: the "input" of its JSON download).
function cliPlan(testEvent, shiftS, planInput) {
  const dir = mkdtempSync(join(tmpdir(), 'tw-sched-'));
  try {
    const db = cliDemoDatabase(cli, dir, shiftS);
    execFileSync(cli, ['log', '--journal', db, 'add', 'test', '--system', 'Living room reef', '--parameter', 'alkalinity',
                       '--value', String(testEvent.value), '--unit', 'dKH', '--precision', String(testEvent.precision ?? 0.2),
                       '--time', testEvent.time], { stdio: 'pipe' });
    const input = join(dir, 'input.json');
    writeFileSync(input, JSON.stringify(planInput));
    const out = execFileSync(cli, ['plan', input, '--journal', db, '--system', 'Living room reef', '--json'],
                             { stdio: ['ignore', 'pipe', 'pipe'] }).toString();
    return JSON.parse(out);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

// The app's plan and the command line's, number for number. The two read "now" a few seconds
// apart, and the levels are carried to now with the pumps' doses, so the levels (and what follows
// from them) may differ by what a few seconds of consumption move: far under a kit's precision.
function comparePlans(app, cli) {
  const near = (what, a, b, abs, rel = 0) => {
    check(typeof a === 'number' && typeof b === 'number' && Math.abs(a - b) <= abs + rel * Math.abs(b),
          `${what}: app ${a}, command line ${b}`);
  };
  for (const k of ['volume_l', 'salinity', 'temperature_c', 'room_co2_ppm']) near(`water.${k}`, app.water[k], cli.water[k], 1e-9);
  for (const k of ['alkalinity_meq', 'calcium_mg', 'magnesium_mg']) {
    near(`demand_per_day.${k}`, app.demand_per_day[k], cli.demand_per_day[k], 1e-9, 1e-6);
  }
  for (const k of Object.keys(cli.limits)) {
    near(`limits.${k}`, app.limits[k].value, cli.limits[k].value, 1e-9, 1e-3);
    near(`limits.${k}.as_set`, app.limits[k].as_set, cli.limits[k].as_set, 1e-9);
  }
  const tol = { alkalinity_dkh: 0.01, calcium_mg_l: 0.1, magnesium_mg_l: 0.1 };
  check(app.days.length === cli.days.length, `days: app ${app.days.length}, command line ${cli.days.length}`);
  for (let i = 0; i < Math.min(app.days.length, cli.days.length); ++i) {
    for (const end of ['start', 'end']) {
      for (const k of Object.keys(tol)) near(`day ${i + 1} ${end} ${k}`, app.days[i][end][k], cli.days[i][end][k], tol[k]);
    }
  }
  check(app.doses.length === cli.doses.length, `doses: app ${app.doses.length}, command line ${cli.doses.length}`);
  let largest = 0;
  for (let i = 0; i < Math.min(app.doses.length, cli.doses.length); ++i) {
    const a = app.doses[i], b = cli.doses[i];
    largest = Math.max(largest, Math.abs(a.amount - b.amount));
    check(a.day === b.day && a.minute === b.minute && a.additive === b.additive && a.unit === b.unit,
          `dose ${i}: app ${a.additive} day ${a.day} ${a.minute} min, command line ${b.additive} day ${b.day} ${b.minute} min`);
    near(`dose ${i} (${b.additive}, day ${b.day}) amount`, a.amount, b.amount, 0.01, 0.01);
  }
  check(app.verdict.holds === cli.verdict.holds, `verdict: app holds ${app.verdict.holds}, command line ${cli.verdict.holds}`);
  console.log(`     app vs command line: ${cli.doses.length} doses over ${cli.days.length} days, largest dose difference ${largest.toFixed(4)} mL or g`);
}

const tests = [];

// Each Plan pump starts with its schedule's doses a day: the demo's soda-ash pump doses twice a
// day, at which the largest change of alkalinity from one dose holds the plan back (it cannot
// hold; test_pumps.mjs). These tests are about the schedules, so the keeper sets four a day.
async function alkalinityFourADay(page) {
  await page.evaluate((n) => Module.ccall('tw_test_reveal', null, ['string'], [n]), 'plan.alk_pump.doses_per_day');
  await frames(page, 4);
  await tap(page, 'plan.alk_pump.doses_per_day');
  await enter(page, '4');
  const s = await state(page);
  check(!s.message_is_error && s.dosing_forms.plan.alkalinity_doses_per_day === 4, `four a day not taken: ${s.message}`);
}
const test = (name, fn) => tests.push({ name, fn });

for (const [label, opts] of [['phone', PHONE], ['desktop', DESKTOP]]) {
  test(`schedules: today's 7.4 dKH test, pumps on schedules and no alkalinity dose logged: no flag, plan starts from it, the command line's plan number for number (${label})`, async () => {
    const { context, page, errors } = await open(opts);
    let s = await state(page);
    check(s.schedules.length >= 1, 'the demo reef has no pump schedule running');
    const shift = s.demo_shift_s;
    const logged = await logTodaysTest(page, 7.4);
    await tap(page, 'tab.demand');
    await tap(page, 'demand.param.0');
    s = await state(page);
    const alk = s.demand.parameters[0];
    check(alk.ok && alk.scheduled, `demand: ok ${alk.ok}, scheduled ${alk.scheduled}`);
    const testDay = Date.parse(logged.time) / 86400000;
    check(Math.abs(alk.last_test_days - testDay) < 1e-6, `the newest test the estimate used is at ${alk.last_test_days}, not ${testDay}`);
    check(!alk.flagged_days.some((d) => Math.abs(d - testDay) < 1e-6), "today's test is flagged as an outlier");
    // The level saw-tooths with the pump: one dose of the demo's soda-ash pump (47.5 mL of
    // 80 g/L in 380 L, make_demo_journal.py) is about 0.53 dKH, so the estimate at a test taken
    // just before a dose sits below a reading taken after one. Allowed: the kit's 95 % (0.4 dKH)
    // plus one dose.
    const near = 0.4 + 0.53;
    check(Math.abs(alk.level - 7.4) <= near, `Demand level ${alk.level} dKH, more than ${near} from today's 7.4`);
    await shot(page, `${label}-demand`);
    await tap(page, 'tab.plan');
    await alkalinityFourADay(page);
    s = await state(page);
    check(s.plan && s.plan.start, `no plan: ${JSON.stringify(s.plan_basis)}`);
    const start = s.plan.start.alkalinity_dkh;
    check(Math.abs(start - 7.4) <= near, `the plan starts at ${start} dKH, more than ${near} from today's 7.4`);
    const high = s.plan.target_alkalinity_dkh + 0.5;
    check(s.plan.max_alkalinity_dkh <= high + 1e-6, `the plan takes alkalinity to ${s.plan.max_alkalinity_dkh} dKH, over the band's ${high}`);
    check(s.plan.check_ok, 'the independent check failed');
    // The command line, same journal, same rule: the app's JSON download against `plan --json`.
    const app = JSON.parse(await downloadPlan(page, 3));
    check(app.input && app.input.additives.length >= 1, 'the JSON download has no plan input');
    comparePlans(app, cliPlan(logged, shift, app.input));
    await reveal(page, 'plan.verdict');
    await shot(page, `${label}-plan`);
    await reveal(page, 'plan.adopt');
    await shot(page, `${label}-plan-adopt`);
    await context.close();
    const real = errors.filter((e) => !benign(e));
    check(real.length === 0, `console errors: ${real.join(' | ')}`);
  });

  test(`schedules: adopt the plan, change and stop a schedule, log a missed and an extra dose (${label})`, async () => {
    const { context, page, errors } = await open(opts);
    let s = await state(page);
    const running = s.schedules.map((e) => e.id);
    check(running.length >= 1, 'no running schedule on the demo reef');
    // A missed and an extra dose against the running soda-ash pump, from the Log screen.
    await tap(page, 'tab.log');
    const pump = s.schedules.find((e) => e.additive === 'sodium_carbonate');
    check(pump, 'no soda ash schedule in the demo');
    await reveal(page, `log.schedule.${pump.id}`);
    await shot(page, `${label}-log-schedules`);
    const before = s.events;
    await tap(page, `log.schedule.missed.${pump.id}`);
    await tap(page, `log.schedule.extra.${pump.id}`);
    s = await state(page);
    check(!s.message_is_error, `mark refused: ${s.message}`);
    check(s.events === before + 2, `events ${before} -> ${s.events}`);
    const marks = s.recent_events.filter((e) => e.type === 'dose' && e.schedule_id === pump.id).map((e) => e.mark);
    check(marks.includes('missed') && marks.includes('extra'), `marks logged: ${JSON.stringify(marks)}`);
    // Change the calcium pump from now: 25 mL a dose.
    const ca = s.schedules.find((e) => e.additive !== 'sodium_carbonate');
    check(ca, 'no second schedule in the demo');
    await tap(page, `log.schedule.change.${ca.id}`);
    await tap(page, `log.schedule.amount.${ca.id}`);
    await enter(page, '25');
    await shot(page, `${label}-log-change`);
    await tap(page, `log.schedule.save.${ca.id}`);
    s = await state(page);
    check(!s.message_is_error, `change refused: ${s.message}`);
    const changed = s.schedules.find((e) => e.device === ca.device);
    check(changed && changed.id !== ca.id && changed.amount === 25, `after the change: ${JSON.stringify(changed)}`);
    // Adopt the plan: the pumps' schedules now follow it (from tomorrow).
    await tap(page, 'tab.plan');
    await alkalinityFourADay(page);
    s = await state(page);
    check(s.plan && s.plan.verdict.holds, `the plan does not hold: ${s.plan && s.plan.verdict.headline}`);
    await reveal(page, 'plan.adopt');
    await tap(page, 'plan.adopt');
    s = await state(page);
    check(!s.message_is_error && /Adopted/.test(s.message), `adopt: ${s.message}`);
    const later = s.schedules.filter((e) => Date.parse(e.time) > Date.now());
    check(later.length >= 2, `adopted schedules starting tomorrow: ${later.length}`);
    check(later.some((e) => e.device === 'pump 1') && later.some((e) => e.device === 'pump 2'),
          `adopted devices ${later.map((e) => e.device).join(', ')}`);
    const old = s.schedules.filter((e) => Date.parse(e.time) <= Date.now());
    check(old.every((e) => e.stop), 'a pump schedule from before the plan was not stopped where the plan starts');
    await tap(page, 'tab.log');
    await reveal(page, `log.schedule.${later[0].id}`);
    await shot(page, `${label}-log-adopted`);
    // Stop the soda-ash pump's old schedule now instead of at the plan's start (two taps).
    await reveal(page, `log.schedule.stop.${pump.id}`);
    await tap(page, `log.schedule.stop.${pump.id}`);
    await shot(page, `${label}-log-stop`);
    await tap(page, `log.schedule.stop_confirm.${pump.id}`);
    s = await state(page);
    check(!s.message_is_error, `stop refused: ${s.message}`);
    check(!s.schedules.some((e) => e.id === pump.id), 'the stopped schedule is still listed');
    await context.close();
    const real = errors.filter((e) => !benign(e));
    check(real.length === 0, `console errors: ${real.join(' | ')}`);
  });
}

await runTests(tests, browser, server);
