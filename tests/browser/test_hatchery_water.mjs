// Browser tests of the Hatchery screen with water that is not open-ocean seawater (issue 18):
// measured total boron, measured magnesium with the Mg/Ca correction of the constants (and its
// refusal without measured calcium and magnesium), the line from the intake to the tanks
// (checked against the command line's `buffer line --json`: one truth), and these settings
// kept per system across a reload. Headless Chromium at 390x844 and 1280x800.
//   node test_hatchery_water.mjs [site-dir]      (default ../../build/web/site)
// TW_CLI names the command line (default ../../build/native/shell/tidewright).
// Screenshots go to tests/browser/output/hatchery-water-*.png.
import { resolve, join } from 'node:path';
import { execFileSync } from 'node:child_process';
import { startServer } from './serve.mjs';
import { launch, PHONE_1X as PHONE, DESKTOP, waitReady, state, widget, tap, enter, frames, flushed, check, OUTPUT, HERE, openApp, runTests, benign, editSavedSettings } from './lib.mjs';

const site = resolve(process.argv[2] || join(HERE, '../../build/web/site'));
const cli = process.env.TW_CLI || join(HERE, '../../build/native/shell/tidewright');
const server = await startServer(site);
const browser = await launch();
const tests = [];
const test = (name, fn) => tests.push({ name, fn });

async function shot(page, label, name, widgetName) {
  if (widgetName) await page.evaluate((n) => Module.ccall('tw_test_reveal', null, ['string'], [n]), widgetName);
  await frames(page, 4);
  await page.screenshot({ path: join(OUTPUT, `hatchery-water-${label}-${name}.png`) });
}

async function type(page, name, text) {
  await tap(page, name);
  await enter(page, text);
}

const hatchery = async (page) => (await state(page)).hatchery;

function noErrors(errors) {
  const real = errors.filter((e) => !benign(e));
  check(real.length === 0, `console errors: ${real.join(' | ')}`);
}

test('salt mix: measured boron and the Mg/Ca correction change the dose and are said; the correction refused without Ca and Mg; kept after a reload (phone)', async () => {
  const { context, page, errors } = await openApp(browser, server.url, PHONE);
  await tap(page, 'tab.hatchery');
  let h = await hatchery(page);
  check(h.error === '' && h.added_alkalinity_umol_kg > 0, `no dose on the default intake: ${h.error}`);
  check(/total boron from salinity/.test(h.boron_source), `boron source not said: ${h.boron_source}`);
  const scaledDose = h.added_alkalinity_umol_kg;
  // Boron above seawater's (about 4.5 mg/L at S 33): more of the alkalinity is borate, less
  // carbonate, so the same reading needs a larger dose.
  await type(page, 'hatchery.boron', '6');
  h = await hatchery(page);
  check(h.total_boron_mg_l === 6 && /total boron as measured/.test(h.boron_source), `measured boron not used: ${h.boron_source}`);
  check(h.added_alkalinity_umol_kg > scaledDose, `measured boron did not raise the dose: ${h.added_alkalinity_umol_kg} <= ${scaledDose}`);
  check((await widget(page, 'hatchery.boron_source')).found, 'the boron sentence is not drawn');
  // The correction without measured calcium and magnesium: refused, naming both fields and ranges.
  await tap(page, 'hatchery.mg_ca.1');
  h = await hatchery(page);
  check(/Correct for Mg and Ca/.test(h.error) && /Calcium \(measured\), accepted 0 to 1000 mg\/L/.test(h.error) &&
    /Magnesium \(measured\), accepted 0 to 2500 mg\/L/.test(h.error), `refusal does not name the fields and ranges: "${h.error}"`);
  check(h.total_boron_mg_l === 6 && h.mg_ca_correction === true, 'the refusal lost what was typed');
  check((await widget(page, 'hatchery.error')).found, 'the refusal is not drawn');
  await shot(page, 'phone', 'refused', 'hatchery.error');
  await type(page, 'hatchery.calcium', '380');
  h = await hatchery(page);
  check(/Magnesium \(measured\)/.test(h.error) && !/Calcium \(measured\)/.test(h.error), `calcium given, still refused for it: "${h.error}"`);
  await type(page, 'hatchery.magnesium', '1100');
  h = await hatchery(page);
  check(h.error === '', `refused with Ca and Mg measured: ${h.error}`);
  const applied = (h.warnings || []).find((w) => /Mg\/Ca correction of the constants applied/.test(w));
  check(applied, `the correction is not said: ${JSON.stringify(h.warnings)}`);
  const onDose = h.added_alkalinity_umol_kg;
  await shot(page, 'phone', 'corrected', 'hatchery.boron_source');
  await tap(page, 'hatchery.mg_ca.0');
  h = await hatchery(page);
  check(h.error === '' && !(h.warnings || []).some((w) => /Mg\/Ca correction/.test(w)), 'correction still said when off');
  check(Math.abs(h.added_alkalinity_umol_kg - onDose) > 0.5, `the correction did not change the dose: ${onDose} vs ${h.added_alkalinity_umol_kg}`);
  console.log(`     dose umol/kg: scaled boron ${scaledDose.toFixed(1)}, boron 6 mg/L + Ca 380 ${h.added_alkalinity_umol_kg.toFixed(1)}, + Mg 1100 corrected ${onDose.toFixed(1)}`);
  await tap(page, 'hatchery.mg_ca.1');
  // Kept for this system after a reload.
  await flushed(page);
  await page.reload();
  await waitReady(page);
  await frames(page, 3);
  const f = (await state(page)).dosing_forms.hatchery;
  check(f.total_boron_mg_l === 6 && f.magnesium_mg_l === 1100 && f.calcium_mg_l === 380 && f.mg_ca_correction === true,
    `salt mix not kept: ${JSON.stringify(f)}`);
  await tap(page, 'tab.hatchery');
  h = await hatchery(page);
  check(h.error === '' && Math.abs(h.added_alkalinity_umol_kg - onDose) < 1e-9, `dose after the reload ${h.added_alkalinity_umol_kg}, before ${onDose}`);
  await context.close();
  noErrors(errors);
});

// The same intake and conditioning through the command line.
// With flow (L/min at the intake), its pump rates for the conditioned water too.
function cliLine(tankC, fraction, flow) {
  const out = execFileSync(cli, ['buffer', 'line', '--salinity', '33', '--temperature', '18', '--alkalinity', '6.2',
    '--alkalinity-unit', 'dKH', '--ph', '7.75', '--ph-scale', 'total', '--target-omega', '2', '--tank-temperature', String(tankC),
    '--mix-fraction', String(fraction), '--mix-salinity', '0', '--mix-temperature', '20', '--json',
    ...(flow ? ['--flow', String(flow)] : [])], { encoding: 'utf8' });
  return JSON.parse(out);
}

for (const [label, opts] of [['phone', PHONE], ['desktop', DESKTOP]]) {
  test(`the line: four points, the typed tank temperature, pH and Omega as the command line gives them${label === 'phone' ? '; kept after a reload, a damaged stored share refused' : ''} (${label})`, async () => {
    const { context, page, errors } = await openApp(browser, server.url, opts);
    await tap(page, 'tab.hatchery');
    check((await hatchery(page)).line.length === 0, 'the line is computed while hidden');
    await tap(page, 'hatchery.line.show');
    await type(page, 'hatchery.line.tank_temperature', '24');
    await type(page, 'hatchery.line.mix_fraction', '0.2');
    const h = await hatchery(page);
    check(h.line_error === '' && h.line.length === 4, `line: ${h.line_error} ${h.line.length} points`);
    check(h.line[1].temperature_c === 24, `conditioned temperature ${h.line[1].temperature_c}, typed 24`);
    check(h.line[1].salinity < h.line[0].salinity, 'mixing with fresh water did not lower the salinity');
    const full = cliLine(24, 0.2, 100);  // the form's intake flow, 100 L/min
    const ref = full.points;
    check(ref.length === 4, `the command line gave ${ref.length} points`);
    // The pump rates follow the line: the conditioned water at the intake flow plus the fresh
    // water mixed in (100 / 0.8 L/min), as the command line's `buffer line --flow` gives them.
    check(Math.abs(h.dosed_flow_l_per_min - 125) < 1e-9 && Math.abs(full.dosed_flow_l_per_min - 125) < 1e-9,
      `dosed flow: app ${h.dosed_flow_l_per_min}, command line ${full.dosed_flow_l_per_min}, expected 125 L/min`);
    check(h.pumps.length === full.lines.length && h.pumps.length > 0, `pumps: app ${JSON.stringify(h.pumps)}, command line ${full.lines.length}`);
    for (let i = 0; i < h.pumps.length; i++) {
      const a = h.pumps[i], b = full.lines[i];
      check(a.formula === b.formula && Math.abs(a.pump_ml_per_min - b.pump_ml_per_min) < 1e-9 && Math.abs(a.grams_per_hour - b.grams_per_hour) < 1e-9,
        `pump ${i}: app ${JSON.stringify(a)} vs command line ${b.formula} ${b.pump_ml_per_min} mL/min ${b.grams_per_hour} g/h`);
    }
    console.log(`     pump through the line: ${h.pumps.map((p) => `${p.formula} ${p.pump_ml_per_min.toFixed(2)} mL/min`).join(', ')} at ${h.dosed_flow_l_per_min} L/min (command line ${full.lines.map((p) => p.pump_ml_per_min.toFixed(2)).join(', ')})`);
    for (let i = 0; i < 4; i++) {
      const a = h.line[i], b = ref[i];
      check(a.omega_aragonite.toFixed(2) === b.state.omega_aragonite.toFixed(2) && a.ph_total.toFixed(2) === b.state.ph_total.toFixed(2) &&
        a.temperature_c.toFixed(1) === b.temperature_c.toFixed(1) && a.salinity.toFixed(1) === b.salinity.toFixed(1),
        `point ${i} (${b.point}): app ${JSON.stringify(a)} vs command line ${JSON.stringify(b.state.omega_aragonite)} ${b.state.ph_total}`);
    }
    console.log(`     Omega ar along the line: ${h.line.map((p) => p.omega_aragonite.toFixed(2)).join(' -> ')} (command line ${ref.map((p) => p.state.omega_aragonite.toFixed(2)).join(' -> ')})`);
    const table = await widget(page, 'hatchery.line.table');
    check(table.found && table.w <= opts.viewport.width, `line table ${JSON.stringify(table)} wider than the screen`);
    await shot(page, label, 'line', 'hatchery.line.dose');
    if (label !== 'phone') return context.close().then(() => noErrors(errors));  // the reload is the phone's
    await flushed(page);
    await page.reload();
    await waitReady(page);
    await frames(page, 3);
    const f = (await state(page)).dosing_forms.hatchery;
    check(f.line_shown === true && f.line_tank_temperature_c === 24 && f.mix_fraction === 0.2, `line settings not kept: ${JSON.stringify(f)}`);
    await tap(page, 'tab.hatchery');
    check((await hatchery(page)).line.length === 4, 'the line is not shown after the reload');
    // A damaged stored share is refused with its name and range (ranges.hpp); the rest is kept.
    await flushed(page);
    await editSavedSettings(page, (await state(page)).dosing_forms.system, { 'hatchery.mix_fraction': 5 });
    await page.reload();
    await waitReady(page);
    await frames(page, 3);
    const d = await state(page);
    check(d.message_is_error && /Other water mixed in, share by volume 5/.test(d.message) && /0 to 1/.test(d.message),
      `no refusal naming the share and its range: "${d.message}"`);
    check(d.dosing_forms.hatchery.mix_fraction === null && d.dosing_forms.hatchery.line_tank_temperature_c === 24,
      `refused share not back to its default, or the tank temperature lost: ${JSON.stringify(d.dosing_forms.hatchery)}`);
    await context.close();
    noErrors(errors);
  });
}

await runTests(tests, browser, server);
