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
// Screenshot: tests/browser/output/pumps-phone-plan.png (the pump section).
import { resolve, join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { startServer } from './serve.mjs';
import { launch, PHONE_1X as PHONE, waitReady, state, widget, tap, enter, frames, flushed, check, OUTPUT, HERE, openApp, runTests, cliDemoDatabase,
  benign, messageGone } from './lib.mjs';

const site = resolve(process.argv[2] || join(HERE, '../../build/web/site'));
const cli = process.env.TW_CLI || join(HERE, '../../build/native/shell/tidewright');
const server = await startServer(site);
const browser = await launch();
const tests = [];
const test = (name, fn) => tests.push({ name, fn });

async function reveal(page, name) {
  await page.evaluate((n) => Module.ccall('tw_test_reveal', null, ['string'], [n]), name);
  await frames(page, 4);
  return widget(page, name);
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
function cliPlan(shiftS, planInput) {
  const dir = mkdtempSync(join(tmpdir(), 'tw-pumps-'));
  try {
    const db = cliDemoDatabase(cli, dir, shiftS);
    const input = join(dir, 'input.json');
    writeFileSync(input, JSON.stringify(planInput));
    // Exit 0 (holds) or 3 (cannot hold: the plan is still written); the app's verdict is compared.
    const r = spawnSync(cli, ['plan', input, '--journal', db, '--system', 'Living room reef', '--json']);
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
  const { context, page, errors } = await openApp(browser, server.url, PHONE);
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

  await type(page, 'plan.alk_pump.name', '  Left doser ');
  await type(page, 'plan.alk_pump.calibration', '0.9');
  s = await state(page);
  check(!s.message_is_error, `refused: ${s.message}`);
  check(s.dosing_forms.plan.alkalinity_pump_name === 'Left doser', `stored name "${s.dosing_forms.plan.alkalinity_pump_name}"`);
  check(s.dosing_forms.plan.alkalinity_pump_calibration === 0.9, `stored calibration ${s.dosing_forms.plan.alkalinity_pump_calibration}`);
  check(s.plan && s.plan.pumps[0].device === 'Left doser' && s.plan.pumps[0].calibration === 0.9,
        `the plan's pump ${JSON.stringify(s.plan && s.plan.pumps[0])}`);
  check(s.plan.day_columns[0] === 'Left doser, mL set', `day table column "${s.plan.day_columns[0]}"`);
  check(s.plan.day_columns[1] === 'pump 2, mL', `calcium column "${s.plan.day_columns[1]}"`);
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
  await flushed(page);
  await page.reload();
  await waitReady(page);
  await frames(page, 3);
  s = await state(page);
  if (!s.plan) {
    await tap(page, 'tab.plan');
    s = await state(page);
  }
  check(s.dosing_forms.plan.alkalinity_pump_name === 'Left doser' && s.dosing_forms.plan.alkalinity_pump_calibration === 0.9,
        `after a reload: ${s.dosing_forms.plan.alkalinity_pump_name} ${s.dosing_forms.plan.alkalinity_pump_calibration}`);
  check(s.plan && s.plan.pumps[0].device === 'Left doser' && s.plan.pumps[0].calibration === 0.9, 'the plan after a reload');

  // The command line on the app's own plan input: the same amounts to set, dose for dose.
  await reveal(page, 'plan.export_format.3');
  await tap(page, 'plan.export_format.3');
  await reveal(page, 'plan.export');
  const [download] = await Promise.all([page.waitForEvent('download', { timeout: 10000 }), tap(page, 'plan.export')]);
  const app = JSON.parse(readFileSync(await download.path(), 'utf8'));
  check(app.input.additives[0].device === 'Left doser' && app.input.additives[0].calibration === 0.9,
        `the download's input: ${JSON.stringify(app.input.additives[0]).slice(0, 200)}`);
  const other = cliPlan(shift, app.input);
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
  const calcium = s.schedules.filter((e) => e.additive === 'calcium_chloride_dihydrate' && Date.parse(e.time) > Date.now());
  check(calcium.length >= 1 && calcium.every((e) => e.device === 'pump 2' && e.calibration === 1),
        `calcium schedules ${JSON.stringify(calcium.map((e) => [e.device, e.calibration]))}`);
  await context.close();
  const real = errors.filter((e) => !benign(e));
  check(real.length === 0, `console errors: ${real.join(' | ')}`);
});

await runTests(tests, browser, server);
