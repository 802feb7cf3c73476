// Browser test of the Plan's named pumps (issue 15) on the demo reef, in headless Chromium at
// phone size (390x844):
//  - the alkalinity pump starts with the name and calibration of the demo's running soda-ash
//    schedule; it is renamed "Left doser" and given calibration 0.9; the day table's column and
//    legend name it, and every dose's amount to set is the dose / 0.9;
//  - a calibration of 2.0, an empty name and a name of 61 characters are refused with the
//    accepted range, and what was stored stays;
//  - a reload keeps the name and calibration; the command line, on the same journal and the
//    app's own plan input, gives the same amounts to set, dose for dose;
//  - "Adopt this plan": the journal's new schedules of the Left doser carry its name, calibration
//    0.9 and set amounts of the plan's dose / 0.9 on the pump's 0.1 mL step.
//   node test_pumps.mjs [site-dir]      (default ../../build/web/site)
// The command line: TW_CLI, else ../../build/native/shell/tidewright.
//  - a magnesium stock and pump set by taps (the demo's hand-dosed magnesium chloride is the
//    default): Epsom salt shows its sulfate caution, a strength over the solubility is refused
//    with field and range, a name another pump has is refused; each pump's own doses a day and
//    largest dose (alkalinity 2 a day, calcium 6) show in the legend and the day's doses; a
//    reload keeps them; the command line's plan of the same input gives the same doses, the
//    magnesium pump's too; adopting writes the three schedules;
//  - an old saved store with one doses a day and largest dose for both pumps gives each pump those;
//  - a refused doses a day or largest dose on each of the three cards names the pump (its role,
//    name and chemical) with the field and the accepted range, and changes nothing;
//  - the day table's headings name each pump, its chemical and the unit, wrapped inside their
//    columns, none overlapping the next (phone and desktop).
// Screenshots: tests/browser/output/pumps-phone-plan.png (the pump section),
// pumps-phone-magnesium.png (the magnesium card), pumps-phone-days.png (the day table).
import { resolve, join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { startServer } from './serve.mjs';
import { launch, PHONE_1X as PHONE, DESKTOP, waitReady, editSavedSettings, state, widget, tap, enter, frames, flushed, check, OUTPUT, HERE, openApp, runTests, cliDemoDatabase, demoFreshTime,
  benign, messageGone, reveal, downloadPlan } from './lib.mjs';

const site = resolve(process.argv[2] || join(HERE, '../../build/web/site'));
const cli = process.env.TW_CLI || join(HERE, '../../build/native/shell/tidewright');
// The app's "now" (and the command line's --at): the demo reef's plan holds then at any hour
// the suite runs (lib.mjs demoFreshTime says why).
const NOW = demoFreshTime();
const server = await startServer(site);
const browser = await launch();
const tests = [];
const test = (name, fn) => tests.push({ name, fn });

// Saved, reloaded, and back on the Plan (a reload opens the screen the address names): its state.
async function reloadToPlan(page) {
  await flushed(page);
  await page.reload();
  await waitReady(page);
  await frames(page, 3);
  let s = await state(page);
  if (!s.plan) {
    await tap(page, 'tab.plan');
    s = await state(page);
  }
  return s;
}

async function type(page, name, text) {
  await tap(page, name);
  await enter(page, text);
}

// A typed value the app refuses: an error message matching `pattern` (each pattern names what
// only its own refusal says, so a message left from the one before cannot pass it).
async function refused(page, name, text, pattern, what) {
  await type(page, name, text);
  const s = await state(page);
  check(s.message_is_error && pattern.test(s.message), `${what}: not refused with the range: "${s.message}"`);
  return s;
}

// The command line's plan of the app's plan input on the same journal (the demo moved forward
// as the app moved it when it loaded it), as JSON.
function cliPlan(shiftS, planInput, atMs) {
  const dir = mkdtempSync(join(tmpdir(), 'tw-pumps-'));
  try {
    const db = cliDemoDatabase(cli, dir, shiftS);
    const input = join(dir, 'input.json');
    writeFileSync(input, JSON.stringify(planInput));
    // Exit 0 (holds) or 3 (cannot hold: the plan is still written); the app's verdict is compared.
    const r = spawnSync(cli, ['plan', input, '--journal', db, '--system', 'Living room reef', '--json',
      '--at', new Date(atMs).toISOString()]);
    check(r.status === 0 || r.status === 3, `the command line's plan: exit ${r.status}: ${String(r.stderr).trim()}`);
    return JSON.parse(String(r.stdout));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

// Each dose of pump 0 (the alkalinity pump): its amount to set is the dose / calibration.
function checkSetAmounts(plan, calibration) {
  const alk = plan.doses.filter((d) => d.pump === 0);
  check(alk.length > 0, 'the plan gives the alkalinity pump no dose');
  for (const d of alk) {
    check(Math.abs(d.amount_set - d.amount / calibration) < 1e-9,
          `day ${d.day} ${d.minute} min: set ${d.amount_set} for ${d.amount} at calibration ${calibration}`);
  }
  return alk;
}

test('pumps: name and calibration of the alkalinity pump on the Plan, refused values, a reload, the command line, adopting (phone)', async () => {
  const { context, page, errors } = await openApp(browser, server.url, PHONE, { fixedTime: NOW });
  let s = await state(page);
  check(s.systems.find((x) => x.id === s.current_system)?.name === 'Living room reef', 'the demo reef is not the current system');
  const shift = s.demo_shift_s;  // how far the app moved the demo when it loaded it (not kept over a reload)
  const demoPump = s.schedules.find((e) => e.additive === 'sodium_carbonate');
  check(demoPump, 'the demo reef has no soda-ash schedule');
  await tap(page, 'tab.plan');
  s = await state(page);
  // Not set by the keeper: the demo's running schedule names the pump.
  let pump = s.plan_basis.pumps[0];
  check(pump.name === demoPump.device && pump.calibration === demoPump.calibration && pump.from_schedule,
        `default alkalinity pump ${JSON.stringify(pump)}, schedule ${demoPump.device} ${demoPump.calibration}`);
  check(s.dosing_forms.plan.alkalinity_pump_name === null, 'a name is stored before the keeper set one');
  // Not set by the keeper: the stocks' strengths are those the log's pumps dose (issue 15: the
  // calcium stock was planned at the starting 200 g/L while the pump doses 250 g/L).
  const demoCalcium = s.schedules.find((e) => e.additive === 'calcium_chloride_dihydrate');
  check(demoCalcium && s.plan_basis.calcium_g_per_l === demoCalcium.stock_g_per_l && s.plan_basis.alkalinity_g_per_l === demoPump.stock_g_per_l,
        `planned strengths ${s.plan_basis.alkalinity_g_per_l} and ${s.plan_basis.calcium_g_per_l} g/L; the log's pumps dose ${demoPump.stock_g_per_l} and ${demoCalcium && demoCalcium.stock_g_per_l}`);
  check(s.dosing_forms.plan.calcium_stock_g_per_l === null, 'a calcium strength is stored before the keeper set one');
  // The demo's soda-ash pump doses twice a day (its schedule, so the plan's default); at that
  // the largest change of alkalinity from one dose holds doses back and the plan cannot hold
  // (the next test shows it). Four a day, as the keeper's own, holds.
  check(s.plan_basis.pumps[0].doses_per_day === demoPump.doses_per_day, `alkalinity pump doses a day ${s.plan_basis.pumps[0].doses_per_day}, schedule ${demoPump.doses_per_day}`);
  await type(page, 'plan.alk_pump.doses_per_day', '4');

  await type(page, 'plan.alk_pump.name', '  Left doser ');
  await type(page, 'plan.alk_pump.calibration', '0.9');
  s = await state(page);
  check(!s.message_is_error, `refused: ${s.message}`);
  check(s.dosing_forms.plan.alkalinity_pump_name === 'Left doser', `stored name "${s.dosing_forms.plan.alkalinity_pump_name}"`);
  check(s.dosing_forms.plan.alkalinity_pump_calibration === 0.9, `stored calibration ${s.dosing_forms.plan.alkalinity_pump_calibration}`);
  check(s.plan && s.plan.pumps[0].device === 'Left doser' && s.plan.pumps[0].calibration === 0.9,
        `the plan's pump ${JSON.stringify(s.plan && s.plan.pumps[0])}`);
  check(s.plan.day_columns[0] === 'Left doser, Na\u2082CO\u2083, mL set', `day table column "${s.plan.day_columns[0]}"`);
  check(s.plan.day_columns[1] === 'pump 2, CaCl\u2082, mL', `calcium column "${s.plan.day_columns[1]}"`);
  check(/^Left doser: .*calibration 0\.9/.test(s.plan.legend), `legend "${s.plan.legend}"`);
  checkSetAmounts(s.plan, 0.9);
  check(s.plan.check_ok, `the independent check failed: ${s.plan.check_problems.join('; ')}`);

  // Refused: what is stored stays.
  await refused(page, 'plan.alk_pump.calibration', '2.0', /\b2\b.*0\.5.*1\.5/, 'calibration 2.0');
  await refused(page, 'plan.alk_pump.name', ' ', /1 to 60 characters \(it has 0\)/, 'an empty name');
  await refused(page, 'plan.alk_pump.name', 'x'.repeat(61), /1 to 60 characters \(it has 61\)/, 'a name of 61 characters');
  await refused(page, 'plan.alk_pump.name', 'pump 2', /other pump/, "the calcium pump's name");
  s = await state(page);
  check(s.dosing_forms.plan.alkalinity_pump_calibration === 0.9 && s.dosing_forms.plan.alkalinity_pump_name === 'Left doser',
        `after the refusals: ${s.dosing_forms.plan.alkalinity_pump_name} ${s.dosing_forms.plan.alkalinity_pump_calibration}`);

  // The pump section as a phone shows it.
  await reveal(page, 'plan.alk_strength');
  await frames(page, 4);
  await page.screenshot({ path: join(OUTPUT, 'pumps-phone-plan.png') });

  // A reload keeps them.
  s = await reloadToPlan(page);
  check(s.dosing_forms.plan.alkalinity_pump_name === 'Left doser' && s.dosing_forms.plan.alkalinity_pump_calibration === 0.9,
        `after a reload: ${s.dosing_forms.plan.alkalinity_pump_name} ${s.dosing_forms.plan.alkalinity_pump_calibration}`);
  check(s.plan && s.plan.pumps[0].device === 'Left doser' && s.plan.pumps[0].calibration === 0.9, 'the plan after a reload');

  // The command line on the app's own plan input: the same amounts to set, dose for dose.
  const app = JSON.parse(await downloadPlan(page, 3));
  check(app.input.additives[0].device === 'Left doser' && app.input.additives[0].calibration === 0.9,
        `the download's input: ${JSON.stringify(app.input.additives[0]).slice(0, 200)}`);
  const other = cliPlan(shift, app.input, NOW);
  check(other.doses.length === app.doses.length, `doses: app ${app.doses.length}, command line ${other.doses.length}`);
  let largest = 0;
  for (let i = 0; i < Math.min(app.doses.length, other.doses.length); ++i) {
    const a = app.doses[i], b = other.doses[i];
    largest = Math.max(largest, Math.abs(a.amount_set - b.amount_set));
    // As test_schedules.mjs: the two read "now" seconds apart, so the levels differ by a few
    // seconds of consumption.
    check(a.additive === b.additive && Math.abs(a.amount_set - b.amount_set) <= 0.01 + 0.01 * Math.abs(b.amount_set),
          `dose ${i} (${b.additive}, day ${b.day}): set ${a.amount_set} in the app, ${b.amount_set} on the command line`);
  }
  console.log(`     app vs command line: ${other.doses.length} doses, largest difference of an amount to set ${largest.toFixed(4)} mL`);

  // Adopt: the Left doser's schedules carry its name, its calibration and the amounts to set.
  await messageGone(page);
  s = await state(page);
  const planned = checkSetAmounts(s.plan, 0.9);
  const perDose = new Map();  // day -> the plan's dose / 0.9 on the 0.1 mL step
  for (const d of [...new Set(planned.map((x) => x.day))]) {
    const day = planned.filter((x) => x.day === d);
    perDose.set(d, Math.round(day.reduce((t, x) => t + x.amount, 0) / day.length / 0.9 * 10) / 10);
  }
  await reveal(page, 'plan.adopt');
  await tap(page, 'plan.adopt');
  s = await state(page);
  check(!s.message_is_error && /Left doser \(calibration 0\.9\)/.test(s.message), `adopt: "${s.message}"`);
  const adopted = s.schedules.filter((e) => e.device === 'Left doser');
  check(adopted.length >= 1, `no Left doser schedule: ${s.schedules.map((e) => e.device).join(', ')}`);
  const first = adopted.reduce((a, b) => (Date.parse(a.time) <= Date.parse(b.time) ? a : b));
  check(Math.abs(first.amount - perDose.get(1)) < 1e-9, `day 1: set ${first.amount}, the plan's dose / 0.9 is ${perDose.get(1)}`);
  for (const e of adopted) {
    check(e.calibration === 0.9, `schedule ${e.id} calibration ${e.calibration}`);
    check(e.additive === 'sodium_carbonate', `schedule ${e.id} gives ${e.additive}`);
    check([...perDose.values()].some((v) => Math.abs(v - e.amount) < 1e-9), `schedule ${e.id} sets ${e.amount} mL, no day's dose / 0.9`);
  }
  const calcium = s.schedules.filter((e) => e.additive === 'calcium_chloride_dihydrate' && Date.parse(e.time) > NOW);
  check(calcium.length >= 1 && calcium.every((e) => e.device === 'pump 2' && e.calibration === 1),
        `calcium schedules ${JSON.stringify(calcium.map((e) => [e.device, e.calibration]))}`);
  await context.close();
  const real = errors.filter((e) => !benign(e));
  check(real.length === 0, `console errors: ${real.join(' | ')}`);
});

// The app's doses against the command line's on the app's own input, dose for dose; returns
// the largest difference of an amount to set, over all pumps and over the pump `only`.
function compareWithCli(app, other, only) {  // only: a test of the additive's name
  check(other.doses.length === app.doses.length, `doses: app ${app.doses.length}, command line ${other.doses.length}`);
  let largest = 0, largestOnly = 0, countOnly = 0;
  for (let i = 0; i < Math.min(app.doses.length, other.doses.length); ++i) {
    const a = app.doses[i], b = other.doses[i];
    const diff = Math.abs(a.amount_set - b.amount_set);
    largest = Math.max(largest, diff);
    if (only.test(b.additive)) {
      largestOnly = Math.max(largestOnly, diff);
      ++countOnly;
    }
    check(a.additive === b.additive && diff <= 0.01 + 0.01 * Math.abs(b.amount_set),
          `dose ${i} (${b.additive}, day ${b.day}): set ${a.amount_set} in the app, ${b.amount_set} on the command line`);
  }
  return { largest, largestOnly, countOnly };
}

test('pumps: a magnesium stock and pump by taps, each pump its own doses a day and largest dose, a reload, the command line, adopting three (phone)', async () => {
  const { context, page, errors } = await openApp(browser, server.url, PHONE, { fixedTime: NOW });
  let s = await state(page);
  const shift = s.demo_shift_s;
  await tap(page, 'tab.plan');
  s = await state(page);
  // The demo reef doses magnesium chloride by hand: the magnesium card starts with it, from the log.
  check(s.plan_basis.magnesium === 'magnesium_chloride_hexahydrate' && s.plan_basis.magnesium_from_log,
        `default magnesium ${s.plan_basis.magnesium} (from the log: ${s.plan_basis.magnesium_from_log})`);
  check(s.dosing_forms.plan.magnesium_from === null, 'a magnesium choice is stored before the keeper made one');
  // Each pump's program starts from its schedule: the demo's pumps dose twice a day.
  check(s.plan_basis.pumps[0].doses_per_day === 2 && s.plan_basis.pumps[0].program_from_schedule,
        `alkalinity pump program ${JSON.stringify(s.plan_basis.pumps[0])}`);
  check(s.plan_basis.pumps[2].doses_per_day === 4 && s.plan_basis.pumps[2].max_dose_ml === 50 && !s.plan_basis.pumps[2].program_from_schedule,
        `magnesium pump program ${JSON.stringify(s.plan_basis.pumps[2])}`);

  // Epsom salt: its sulfate caution shows on the card and among the plan's cautions.
  await reveal(page, 'plan.magnesium.1');
  await tap(page, 'plan.magnesium.1');
  s = await state(page);
  check(s.dosing_forms.plan.magnesium_from === 'magnesium_sulfate_heptahydrate', `after the tap: ${s.dosing_forms.plan.magnesium_from}`);
  check((await widget(page, 'plan.mg_cautions')).found, 'no caution on the magnesium card');
  check(s.plan && s.plan.pumps.some((p) => /sulfate/i.test(p.additive)), `no sulfate pump: ${JSON.stringify(s.plan && s.plan.pumps)}`);
  await tap(page, 'plan.magnesium.0');

  // A strength over the solubility is refused with the field and its range; the one kept stays.
  await refused(page, 'plan.mg_strength', '2000', /^Magnesium stock strength 2000 g\/L is outside the accepted range 1 to 10\d\d g\/L/, 'magnesium 2000 g/L');
  await type(page, 'plan.mg_strength', '250');
  await type(page, 'plan.mg_pump.name', 'Mg doser');
  await type(page, 'plan.mg_pump.calibration', '0.95');
  await type(page, 'plan.mg_pump.doses_per_day', '3');
  await type(page, 'plan.mg_pump.max_dose', '20');
  await refused(page, 'plan.mg_pump.name', 'pump 2', /Magnesium pump name: "pump 2" already names another pump/, "the calcium pump's name");
  await refused(page, 'plan.mg_pump.doses_per_day', '300', /Doses per day 300 .*1 to 288/, 'magnesium 300 doses a day');
  // Two pumps on different programs: alkalinity 2 a day (its schedule's), calcium 6.
  await type(page, 'plan.alk_pump.doses_per_day', '2');
  await type(page, 'plan.alk_pump.max_dose', '60');
  await type(page, 'plan.ca_pump.doses_per_day', '6');
  await type(page, 'plan.ca_pump.max_dose', '30');
  s = await state(page);
  const f = s.dosing_forms.plan;
  check(f.magnesium_from === 'magnesium_chloride_hexahydrate' && f.magnesium_stock_g_per_l === 250, `magnesium stored ${f.magnesium_from} ${f.magnesium_stock_g_per_l}`);
  check(s.plan, `no plan: ${s.plan_basis.error}`);
  const devices = s.plan.pumps.map((p) => p.device);
  check(JSON.stringify(devices) === JSON.stringify(['pump 1', 'pump 2', 'Mg doser']), `pumps ${devices}`);
  check(JSON.stringify(s.plan.pumps.map((p) => p.doses_per_day)) === '[2,6,3]', `doses a day ${s.plan.pumps.map((p) => p.doses_per_day)}`);
  check(JSON.stringify(s.plan.pumps.map((p) => p.max_dose)) === '[60,30,20]', `largest doses ${s.plan.pumps.map((p) => p.max_dose)}`);
  check(s.plan.day_columns[2] === 'Mg doser, MgCl\u2082, mL set', `magnesium column "${s.plan.day_columns[2]}"`);
  check(/pump 1: .*, 2 doses a day; pump 2: .*, 6 doses a day; Mg doser: Magnesium chloride hexahydrate 250 g\/L, calibration 0\.95: amounts to set, 3 doses a day$/.test(s.plan.legend),
        `legend "${s.plan.legend}"`);
  // The day's doses follow each pump's own program: never more a day than it is set to.
  for (const [pump, n] of [[0, 2], [1, 6], [2, 3]]) {
    for (const day of [...new Set(s.plan.doses.map((d) => d.day))]) {
      const count = s.plan.doses.filter((d) => d.day === day && d.pump === pump && d.amount > 0).length;
      check(count <= n, `pump ${pump} day ${day}: ${count} doses, set to ${n}`);
    }
  }
  const day1 = (pump) => s.plan.doses.filter((d) => d.day === 1 && d.pump === pump && d.amount > 0).length;
  console.log(`     2 and 6 a day: day 1 doses alkalinity ${day1(0)}, calcium ${day1(1)}, magnesium ${day1(2)}; holds: ${s.plan.verdict.holds}`);
  check(day1(0) === 2 && day1(1) === 6, `day 1: alkalinity ${day1(0)} doses (2 a day), calcium ${day1(1)} (6 a day)`);
  check(s.plan.doses.some((d) => d.pump === 2 && d.amount > 0), 'the magnesium pump gives no dose');
  for (const d of s.plan.doses.filter((x) => x.pump === 2)) {
    check(Math.abs(d.amount_set - d.amount / 0.95) < 1e-9 && d.amount_set <= 20 + 1e-9, `magnesium dose set ${d.amount_set} for ${d.amount}`);
  }
  await reveal(page, 'plan.mg_strength');
  await frames(page, 4);
  await page.screenshot({ path: join(OUTPUT, 'pumps-phone-magnesium.png') });
  await reveal(page, 'plan.days');
  await frames(page, 4);
  await page.screenshot({ path: join(OUTPUT, 'pumps-phone-days.png') });
  // Twice a day, the largest change of alkalinity from one dose holds the soda ash back (the
  // verdict says so); four a day holds, and the rest of the test adopts that.
  if (!s.plan.verdict.holds) check(/largest change of alkalinity from one dose/.test(s.plan.verdict.headline), `verdict: ${s.plan.verdict.headline}`);
  await type(page, 'plan.alk_pump.doses_per_day', '4');

  // A reload keeps every pump's own settings.
  s = await reloadToPlan(page);
  const g = s.dosing_forms.plan;
  const kept = [g.alkalinity_doses_per_day, g.calcium_doses_per_day, g.magnesium_doses_per_day,
                g.alkalinity_max_dose_ml, g.calcium_max_dose_ml, g.magnesium_max_dose_ml];
  check(JSON.stringify(kept) === '[4,6,3,60,30,20]', `after a reload: ${kept}`);
  check(g.magnesium_pump_name === 'Mg doser' && g.magnesium_pump_calibration === 0.95 && g.magnesium_stock_g_per_l === 250,
        `magnesium pump after a reload: ${g.magnesium_pump_name} ${g.magnesium_pump_calibration} ${g.magnesium_stock_g_per_l}`);
  check(s.plan && JSON.stringify(s.plan.pumps.map((p) => p.doses_per_day)) === '[4,6,3]', 'the plan after a reload');

  // The command line on the app's own input: the same doses, the magnesium pump's included.
  const app = JSON.parse(await downloadPlan(page, 3));
  check(app.input.additives.length === 3 && app.input.additives[2].device === 'Mg doser' && app.input.additives[2].calibration === 0.95 &&
        app.input.additives[2].doses_per_day === 3, `the download's magnesium pump: ${JSON.stringify(app.input.additives[2]).slice(0, 300)}`);
  const other = cliPlan(shift, app.input, NOW);
  const { largest, largestOnly, countOnly } = compareWithCli(app, other, /^Magnesium/);
  check(countOnly > 0, 'the command line gives the magnesium pump no dose');
  console.log(`     app vs command line, three pumps: ${other.doses.length} doses, largest difference of an amount to set ${largest.toFixed(4)} mL; ` +
              `magnesium pump ${countOnly} doses, largest difference ${largestOnly.toFixed(4)} mL`);

  // Adopt: three schedules, each pump's name, calibration, doses a day and the amounts to set.
  await messageGone(page);
  s = await state(page);
  check(s.plan.verdict.holds, `the plan cannot hold: ${s.plan.verdict.headline}`);
  const planned3 = s.plan;  // as adopted
  const mgDay1 = planned3.doses.filter((d) => d.day === 1 && d.pump === 2 && d.amount > 0);
  await reveal(page, 'plan.adopt');
  await tap(page, 'plan.adopt');
  s = await state(page);
  check(!s.message_is_error && /pump 1, pump 2 and Mg doser \(calibration 0\.95\)/.test(s.message), `adopt: "${s.message}"`);
  const from = (device) => s.schedules.filter((e) => e.device === device && Date.parse(e.time) > NOW);
  const firstOf = (list) => list.reduce((a, b) => (Date.parse(a.time) <= Date.parse(b.time) ? a : b));
  for (const [device, additive, n, k] of [['pump 1', 'sodium_carbonate', 4, 1], ['pump 2', 'calcium_chloride_dihydrate', 6, 1],
                                          ['Mg doser', 'magnesium_chloride_hexahydrate', 3, 0.95]]) {
    const list = from(device);
    check(list.length >= 1, `no schedule of ${device}: ${s.schedules.map((e) => e.device).join(', ')}`);
    for (const e of list) {
      check(e.additive === additive && e.calibration === k && e.doses_per_day <= n,
            `${device} schedule ${e.id}: ${e.additive}, calibration ${e.calibration}, ${e.doses_per_day} a day`);
    }
  }
  const mgFirst = firstOf(from('Mg doser'));
  const mgExpected = Math.round(mgDay1.reduce((t, x) => t + x.amount, 0) / mgDay1.length / 0.95 * 10) / 10;
  check(mgFirst.doses_per_day === mgDay1.length && Math.abs(mgFirst.amount - mgExpected) < 1e-9 && mgFirst.stock_g_per_l === 250,
        `Mg doser day 1: ${mgFirst.doses_per_day} x ${mgFirst.amount} mL of ${mgFirst.stock_g_per_l} g/L, the plan's ${mgDay1.length} x ${mgExpected}`);
  const day1Of = (pump) => planned3.doses.filter((d) => d.day === 1 && d.pump === pump && d.amount > 0).length;
  check(firstOf(from('pump 1')).doses_per_day === day1Of(0) && firstOf(from('pump 2')).doses_per_day === day1Of(1),
        `the first schedules of pumps 1 and 2: ${firstOf(from('pump 1')).doses_per_day}, ${firstOf(from('pump 2')).doses_per_day} a day`);
  await context.close();
  const real = errors.filter((e) => !benign(e));
  check(real.length === 0, `console errors: ${real.join(' | ')}`);
});

test("pumps: an old saved store's one doses a day and largest dose go to both stock pumps (phone)", async () => {
  const { context, page, errors } = await openApp(browser, server.url, PHONE, { fixedTime: NOW });
  let s = await state(page);
  const id = s.current_system;
  await tap(page, 'tab.plan');
  await type(page, 'plan.horizon', '10');  // something saved for the system
  await flushed(page);
  // As the store was before each pump had its own: shared values, no per-pump keys.
  const old = { 'plan.doses_per_day': 3, 'plan.max_dose_ml': 25 };
  for (const p of ['alkalinity', 'calcium', 'magnesium']) {
    old[`plan.${p}_doses_per_day`] = null;
    old[`plan.${p}_max_dose_ml`] = null;
  }
  await editSavedSettings(page, id, old);
  await page.reload();
  await waitReady(page);
  await frames(page, 3);
  s = await state(page);
  check(!s.message_is_error, `refused: ${s.message}`);
  const f = s.dosing_forms.plan;
  check(f.alkalinity_doses_per_day === 3 && f.calcium_doses_per_day === 3 && f.alkalinity_max_dose_ml === 25 &&
        f.calcium_max_dose_ml === 25 && f.horizon_days === 10, `read back: ${JSON.stringify(f)}`);
  check(f.magnesium_doses_per_day === null, `the magnesium pump did not exist then: ${f.magnesium_doses_per_day}`);
  if (!s.plan) {
    await tap(page, 'tab.plan');
    s = await state(page);
  }
  check(s.plan && s.plan.pumps[0].doses_per_day === 3 && s.plan.pumps[1].doses_per_day === 3 && s.plan.pumps[0].max_dose === 25,
        `the plan's pumps: ${JSON.stringify(s.plan && s.plan.pumps)}`);
  await context.close();
  const real = errors.filter((e) => !benign(e));
  check(real.length === 0, `console errors: ${real.join(' | ')}`);
});

test('pumps: a refused doses a day or largest dose names its pump and chemical with the field and range, on each of three cards (phone)', async () => {
  const { context, page, errors } = await openApp(browser, server.url, PHONE, { fixedTime: NOW });
  await tap(page, 'tab.plan');
  let s = await state(page);
  check(s.plan && s.plan.pumps.length === 3, `not three pumps: ${JSON.stringify(s.plan && s.plan.pumps)}`);
  await type(page, 'plan.mg_pump.name', 'Mg doser');
  const kept = (await state(page)).plan.pumps.map((p) => [p.doses_per_day, p.max_dose]);
  const cards = [['alk_pump', /^Alkalinity pump "pump 1", Sodium carbonate \(soda ash\): /],
                 ['ca_pump', /^Calcium pump "pump 2", Calcium chloride dihydrate: /],
                 ['mg_pump', /^Magnesium pump "Mg doser", Magnesium chloride hexahydrate: /]];
  // Each message differs from the one before (pump, field), so a message left over cannot pass.
  for (const [card, pump] of cards) {
    s = await refused(page, `plan.${card}.doses_per_day`, '300', new RegExp(pump.source + /Doses per day 300 is outside the accepted range 1 to 288/.source),
      `${card} 300 doses a day`);
    s = await refused(page, `plan.${card}.max_dose`, '200000', new RegExp(pump.source + /Largest dose \(set\) 200000 mL is outside the accepted range 0\.001 to 100000 mL/.source),
      `${card} largest dose 200000 mL`);
  }
  // The range's ends are shown as they are, not at the field's whole mL: 0 is refused, and the
  // message does not call 0 the lowest accepted value.
  s = await refused(page, 'plan.alk_pump.max_dose', '0', /Largest dose \(set\) 0 mL is outside the accepted range 0\.001 to 100000 mL/,
    'alk_pump largest dose 0 mL');
  await page.screenshot({ path: join(OUTPUT, 'pumps-phone-refused.png') });
  s = await state(page);
  check(JSON.stringify(s.plan.pumps.map((p) => [p.doses_per_day, p.max_dose])) === JSON.stringify(kept),
        `a refused value changed a pump: ${JSON.stringify(s.plan.pumps)}`);
  await context.close();
  const real = errors.filter((e) => !benign(e));
  check(real.length === 0, `console errors: ${real.join(' | ')}`);
});

for (const [label, opts] of [['phone', PHONE], ['desktop', DESKTOP]]) {
  test(`pumps: the day table's headings name each pump and its chemical in full, side by side without overlapping (${label})`, async () => {
    const { context, page, errors } = await openApp(browser, server.url, opts, { fixedTime: NOW });
    await tap(page, 'tab.plan');
    await type(page, 'plan.mg_pump.name', 'Mg doser');
    const s = await state(page);
    check(s.plan && s.plan.pumps.length === 3, `not three pumps: ${JSON.stringify(s.plan && s.plan.pumps)}`);
    await reveal(page, 'plan.days');
    await frames(page, 4);
    const heads = [];
    for (let k = 0; ; k++) {
      const w = await widget(page, `plan.days.head.${k}`);
      if (!w.found) break;
      heads.push(w);
    }
    // Day, three pumps, dKH, Ca and Mg at the day's end.
    check(heads.length === 7, `${heads.length} headings`);
    const pumps = [['pump 1', 'Na\u2082CO\u2083'], ['pump 2', 'CaCl\u2082'], ['Mg doser', 'MgCl\u2082']];
    pumps.forEach(([name, formula], i) => {
      const lines = heads[i + 1].text.split('\n');
      check(lines[0] === name && lines[1] === formula && lines[2] === 'mL', `pump column ${i + 1} reads ${JSON.stringify(heads[i + 1].text)}`);
    });
    const table = await widget(page, 'plan.days');
    for (let k = 0; k < heads.length; k++) {
      const h = heads[k];
      check(h.visible && h.x >= table.x - 0.5 && h.x + h.w <= table.x + table.w + 0.5 && h.x + h.w <= opts.viewport.width,
        `heading ${k} outside the table or the screen: ${JSON.stringify(h)} in ${JSON.stringify(table)}`);
      if (k > 0) check(heads[k - 1].x + heads[k - 1].w <= h.x + 0.5, `headings ${k - 1} and ${k} overlap: ${JSON.stringify(heads[k - 1])} ${JSON.stringify(h)}`);
    }
    console.log(`     headings: ${heads.map((h) => `${h.text.replace(/\n/g, '/')} ${Math.round(h.w)}x${Math.round(h.h)}px`).join(' | ')}`);
    // On a desktop every heading line fits whole (screen_plan.cpp day_column_weights); a phone
    // wraps between words. A one-line heading is as tall as "Day"; a heading of n lines (one
    // text item each) is n lines and the n - 1 gaps between items, each gap under 0.9 of a line
    // here, so one wrapped line anywhere makes it taller than that.
    if (!opts.hasTouch) {
      const line = heads[0].h;
      heads.forEach((h, k) => {
        const lines = h.text.split('\n').length;
        const most = lines === 1 ? line + 0.5 : lines * line + (lines - 1) * 0.9 * line;
        check(h.h <= most, `heading ${k} (${JSON.stringify(h.text)}) wraps on a desktop: ${h.h}px for ${lines} line(s) of ${line}px`);
      });
    }
    await page.screenshot({ path: join(OUTPUT, `pumps-${label}-day-headings.png`) });
    await context.close();
    const real = errors.filter((e) => !benign(e));
    check(real.length === 0, `console errors: ${real.join(' | ')}`);
  });
}

await runTests(tests, browser, server);
