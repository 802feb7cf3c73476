// Browser tests of Settings' import with a preview and the log's CSV export (issue 15): a CSV
// of test results in wide and in long form into a chosen system, the preview's counts before
// anything changes, the same file again adding nothing, a refused row shown with its line, field
// and range, Cancel changing and saving nothing, dates like 03/04/2026 read in the order the
// keeper picks, a Tidewright file added (only what is new) or replacing everything after a
// second tap, and the app's CSV export equal to `tidewright log export` of the same journal.
// Also: a winter and a summer row stored at the same UTC times as `tidewright log import` stores
// them under TZ=Europe/Berlin (each date in its own offset); a column the core does not know read
// as alkalinity (dKH) through "Read as…", and a meaning it refuses shown with its message; on a
// farm of 33 systems, the rows sent to Rack 31 found by typing in the list (phone and desktop).
//   node test_import.mjs [site-dir]      (default ../../build/web/site)
// The command line: TW_CLI, else ../../build/native/shell/tidewright.
// Screenshots: tests/browser/output/phone-import-csv-preview.png, phone-import-read-as*.png,
// {phone,desktop}-import-system-{list,found}.png.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { resolve, join } from 'node:path';
import { startServer } from './serve.mjs';
import { launch, PHONE_1X as PHONE, DESKTOP, state, tap, frames, flushed, check, OUTPUT, HERE, openApp, runTests, benign, messageGone, widget, enter, waitReady, watchErrors, openSeeded, FARM_LONG_NAME, farmOf33Systems } from './lib.mjs';

const site = resolve(process.argv[2] || join(HERE, '../../build/web/site'));
const cli = process.env.TW_CLI || join(HERE, '../../build/native/shell/tidewright');
const server = await startServer(site);
const browser = await launch();
const tests = [];
const test = (name, fn) => tests.push({ name, fn });
// Local time an hour ahead of UTC in November and December: a time without a zone in a CSV is
// local, so 08:00 must be stored as 07:00Z.
const ZONE = 'Europe/Berlin';

const journal = async (page) => JSON.parse(await page.evaluate(() => Module.ccall('tw_test_journal', 'string', [], [])));

// The file goes through the page's own file input, as a picked file does.
async function pick(page, name, text, mimeType = 'text/csv') {
  await page.evaluate(() => { document.getElementById('import-file').value = ''; });
  await page.setInputFiles('#import-file', { name, mimeType, buffer: Buffer.from(text, 'utf8') });
  await page.waitForFunction(() => JSON.parse(Module.ccall('tw_test_state', 'string', [], [])).import.kind !== 'none',
    null, { timeout: 10000 }).catch(() => { throw new Error(`${name}: no preview`); });
  await frames(page, 3);
  return (await state(page)).import;
}

const testsOf = (j, systemId) => j.events.filter((e) => e.system_id === systemId && e.type === 'test');

// After the text entry closes, a phone's page changes size back (the keyboard went away) and the
// canvas is cleared until the next frame after it: a screenshot taken then was blank, now and then.
async function afterEntry(page) {
  await page.waitForTimeout(300);
  await frames(page, 3);
}

let shared;  // one phone context for the tests in order

test('a wide CSV is previewed, nothing added until confirmed, then goes to the chosen system', async () => {
  shared = await openApp(browser, server.url, { ...PHONE, timezoneId: ZONE });
  const { page } = shared;
  await tap(page, 'tab.settings');
  const accept = await page.getAttribute('#import-file', 'accept');
  check(/\.csv/.test(accept) && /\.txt/.test(accept) && /\.json/.test(accept) && /text\/csv/.test(accept), `file input accepts ${accept}`);
  const before = await state(page);
  const target = before.systems[1];
  check(before.current_system !== target.id, 'the chosen system is already the current one');
  const wide = 'Date,Alkalinity (dKH),Calcium (mg/L),Magnesium (mg/L),Tester\r\n' +
    '2026-11-02 08:00,8.1,420,1300,Ann\r\n' +
    '2026-11-03 08:00,8.0,415,1290,Ann\r\n';
  let p = await pick(page, 'wide.csv', wide);
  check(p.kind === 'csv' && p.error === '', `preview: ${JSON.stringify(p)}`);
  check(p.csv.added === 6 && p.csv.duplicates === 0 && p.csv.refused.length === 0, `counts ${JSON.stringify(p.csv)}`);
  check(p.csv.unused_columns.some((c) => c.name === 'Tester'), `unused columns ${JSON.stringify(p.csv.unused_columns)}`);
  check(p.csv_system === before.current_system, `rows go to ${p.csv_system} by default, not the current system`);
  let now = await state(page);
  check(now.events === before.events && now.store.saves === before.store.saves, 'the preview changed or saved the journal');
  check(now.screen === 'settings' && (await widget(page, 'import.preview')).visible, 'preview not on screen');
  await tap(page, `import.system.${target.id}`);
  p = (await state(page)).import;
  check(p.csv_system === target.id && p.csv.added === 6, `system choice: ${p.csv_system}, ${p.csv.added}`);
  await page.screenshot({ path: join(OUTPUT, 'phone-import-csv-preview-top.png') });
  await page.evaluate(() => Module.ccall('tw_test_reveal', null, ['string'], ['import.add']));
  await frames(page, 3);
  await page.screenshot({ path: join(OUTPUT, 'phone-import-csv-preview.png') });
  // Phone: Add and Cancel side by side as halves of the card, inside the screen.
  const add = await widget(page, 'import.add'), cancel = await widget(page, 'import.cancel');
  check(add.visible && cancel.visible && add.x + add.w <= cancel.x && cancel.x + cancel.w <= 390 && Math.abs(add.w - cancel.w) < 2,
    `buttons ${JSON.stringify([add, cancel])}`);
  await tap(page, 'import.add');
  now = await state(page);
  check(now.import.kind === 'none', 'preview still open after Add');
  check(now.events === before.events + 6, `events ${before.events} -> ${now.events}`);
  const j = await journal(page);
  const added = testsOf(j, target.id).filter((e) => e.time === '2026-11-02T07:00:00Z' || e.time === '2026-11-03T07:00:00Z');
  const values = added.map((e) => `${e.parameter}=${e.value}`).sort().join(' ');
  check(values === 'alkalinity=8 alkalinity=8.1 calcium=415 calcium=420 magnesium=1290 magnesium=1300', `added ${values}`);
  // The same file again into the same system: nothing to add, all six already there.
  p = await pick(page, 'wide.csv', wide);
  check(p.csv.added === 6, `into the current system again: ${JSON.stringify(p.csv)}`);
  await tap(page, `import.system.${target.id}`);
  p = (await state(page)).import;
  check(p.csv.added === 0 && p.csv.duplicates === 6, `again: ${JSON.stringify(p.csv)}`);
  check(!(await widget(page, 'import.add')).found, 'an Add button for nothing');
  await tap(page, 'import.cancel');
  check((await state(page)).events === now.events, 'the second import changed the log');
});

test('a long CSV (the command line columns): rows without a system go to the chosen one', async () => {
  const { page } = shared;
  const before = await state(page);
  const target = before.systems[1];
  const j0 = await journal(page);
  const long = 'time,system,type,parameter,value,unit,additive,amount,amount_unit,stock_g_per_l,note\n' +
    `2026-11-04T09:00:00Z,${before.systems[0].name},test,alkalinity,7.9,dKH,,,,,\n` +
    '2026-11-04T09:30:00Z,,dose,,,,sodium_carbonate,20,mL,80,\n' +
    '2026-11-04T10:00:00Z,,note,,,,,,,,from the long form\n';
  let p = await pick(page, 'long.csv', long);
  await tap(page, `import.system.${target.id}`);
  p = (await state(page)).import;
  check(p.csv_system === target.id && p.csv.added === 3 && p.csv.refused.length === 0, `preview ${JSON.stringify(p.csv)}`);
  await tap(page, 'import.add');
  const j = await journal(page);
  check(j.events.length === j0.events.length + 3, `events ${j0.events.length} -> ${j.events.length}`);
  const at = (t) => j.events.filter((e) => e.time === t);
  check(at('2026-11-04T09:00:00Z').some((e) => e.system_id === before.systems[0].id && e.value === 7.9), 'the test of the named system');
  check(at('2026-11-04T09:30:00Z').some((e) => e.system_id === target.id && e.type === 'dose' && e.amount === 20), 'the dose');
  check(at('2026-11-04T10:00:00Z').some((e) => e.system_id === target.id && e.text === 'from the long form'), 'the note');
});

test('a row out of range is shown with its line, field and range; only the good rows are added', async () => {
  const { page } = shared;
  const before = await state(page);
  const bad = 'Date,Calcium (mg/L)\n2026-11-05 08:00,430\n2026-11-06 08:00,5000\n2026-11-07 08:00,425\n';
  const p = await pick(page, 'bad.csv', bad);
  check(p.csv.added === 2 && p.csv.refused.length === 1, `counts ${JSON.stringify(p.csv)}`);
  const r = p.csv.refused[0];
  check(r.line === 3, `refused line ${r.line}`);
  check(r.field !== '' && /calcium|value/i.test(r.field), `refused field ${r.field}`);
  check(/\d+(\.\d+)? to \d+/.test(r.reason) && /mg\/L/.test(r.reason), `reason names no range: ${r.reason}`);
  check((await widget(page, 'import.refused.0')).found, 'the refused row is not on screen');
  await tap(page, 'import.add');
  const j = await journal(page);
  check((await state(page)).events === before.events + 2, 'not exactly the two good rows added');
  check(!j.events.some((e) => e.value === 5000), 'the refused value is in the log');
  check(j.events.some((e) => e.time === '2026-11-07T07:00:00Z' && e.value === 425), 'a good row after the bad one is missing');
});

test('Cancel changes nothing and saves nothing', async () => {
  const { page } = shared;
  await messageGone(page);
  await flushed(page);
  const before = await state(page);
  const j0 = await journal(page);
  const p = await pick(page, 'cancel.csv', 'Date,Alkalinity (dKH)\n2026-11-08 08:00,8.4\n');
  check(p.csv.added === 1, `preview ${JSON.stringify(p.csv)}`);
  await tap(page, 'import.cancel');
  await frames(page, 3);
  const after = await state(page);
  check(after.import.kind === 'none', 'preview still open');
  check(after.store.saves === before.store.saves, `saved ${after.store.saves - before.store.saves} times`);
  check(JSON.stringify(await journal(page)) === JSON.stringify(j0), 'the journal changed');
});

test('dates like 03/04/2026: the keeper picks the order and the preview is made again', async () => {
  const { page } = shared;
  const before = await state(page);
  let p = await pick(page, 'dates.csv', 'Date,Alkalinity (dKH)\n03/04/2026 12:00,8.2\n05/06/2026 12:00,8.3\n');
  check(p.csv.added === 0 && p.csv.refused.length === 2 && p.csv.refused[0].field === 'time', `unordered: ${JSON.stringify(p.csv)}`);
  await tap(page, 'import.date_order.0');  // day first
  p = (await state(page)).import;
  check(p.csv.added === 2 && p.csv.refused.length === 0, `day first: ${JSON.stringify(p.csv)}`);
  await tap(page, 'import.date_order.1');  // month first: 4 March, 6 May
  p = (await state(page)).import;
  check(p.csv.added === 2, `month first: ${JSON.stringify(p.csv)}`);
  await tap(page, 'import.date_order.0');
  await tap(page, 'import.add');
  const j = await journal(page);
  const new8 = j.events.filter((e) => e.value === 8.2 || e.value === 8.3).map((e) => e.time.slice(0, 10)).sort();
  check(new8.includes('2026-04-03') && new8.includes('2026-06-05'), `dates ${new8}`);
  check((await state(page)).events === before.events + 2, 'not two entries');
});

test('times cross daylight saving as on the command line: a winter and a summer row, each in its own offset', async () => {
  const { page } = shared;
  await messageGone(page);
  const before = await state(page);
  const sys = before.systems.find((x) => x.id === before.current_system);
  // Berlin: +01:00 in January, +02:00 in July; 08:00 local is 07:00Z and 06:00Z.
  const csv = 'Date,Alkalinity (dKH)\n2025-01-15 08:00,7.1\n2025-07-15 08:00,7.2\n';
  const p = await pick(page, 'dst.csv', csv);
  check(p.csv.added === 2 && p.csv.refused.length === 0, `preview ${JSON.stringify(p.csv)}`);
  await tap(page, 'import.add');
  const j = await journal(page);
  const appTimes = j.events.filter((e) => e.type === 'test' && e.system_id === sys.id && e.time.startsWith('2025-0'))
    .map((e) => `${e.value}@${e.time}`).sort();
  check(appTimes.join(' ') === '7.1@2025-01-15T07:00:00Z 7.2@2025-07-15T06:00:00Z', `the app stored ${appTimes.join(' ')}`);
  // The command line reads the same file in the same zone.
  const dir = mkdtempSync(join(tmpdir(), 'tw-dst-'));
  try {
    const db = join(dir, 'j.db'), file = join(dir, 'dst.csv');
    writeFileSync(file, csv);
    const env = { ...process.env, TZ: ZONE };
    execFileSync(cli, ['log', '--journal', db, 'add', 'system', '--name', 'Berlin reef', '--volume', '300'], { stdio: 'pipe', env });
    execFileSync(cli, ['log', '--journal', db, 'import', file, '--system', 'Berlin reef'], { stdio: 'pipe', env });
    const out = JSON.parse(execFileSync(cli, ['log', '--journal', db, 'export', '--format', 'json'], { encoding: 'utf8', env }));
    const cliTimes = out.events.filter((e) => e.type === 'test').map((e) => `${e.value}@${e.time}`).sort();
    check(cliTimes.join(' ') === appTimes.join(' '), `command line ${cliTimes.join(' ')}, app ${appTimes.join(' ')}`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
});

test('an unused column read as alkalinity (dKH) through Read as: the preview and the entries follow', async () => {
  const { page } = shared;
  await messageGone(page);
  const before = await state(page);
  const sys = before.current_system;
  const csv = 'Date,Alk reading,Calcium (mg/L),Tester\n2025-11-20 08:00,8.4,430,Ann\n2025-11-21 08:00,8.6,435,Ann\n';
  let p = await pick(page, 'alk.csv', csv);
  check(p.csv.added === 2 && p.csv.unused_columns.some((c) => c.name === 'Alk reading'), `before: ${JSON.stringify(p.csv)}`);
  const reason = p.csv.unused_columns.find((c) => c.name === 'Alk reading').reason;
  check(!/mapping|--map/.test(reason), `the reason asks for what the app has no way to do: ${reason}`);
  await tap(page, 'import.map.Alk reading');
  p = (await state(page)).import;
  check(p.mapping_open === 'Alk reading', `the list is not open: ${p.mapping_open}`);
  check((await widget(page, 'import.meaning.alkalinity dKH')).found && (await widget(page, 'import.meaning.skip')).found,
    'the list lacks alkalinity dKH or skip');
  await page.evaluate(() => Module.ccall('tw_test_reveal', null, ['string'], ['import.meaning.alkalinity dKH']));
  await frames(page, 3);
  await page.screenshot({ path: join(OUTPUT, 'phone-import-read-as.png') });
  await tap(page, 'import.meaning.alkalinity dKH');
  p = (await state(page)).import;
  check(p.mappings.length === 1 && p.mappings[0].header === 'Alk reading' && p.mappings[0].meaning === 'alkalinity dKH',
    `mappings ${JSON.stringify(p.mappings)}`);
  check(p.csv.added === 4 && !p.csv.unused_columns.some((c) => c.name === 'Alk reading'), `after: ${JSON.stringify(p.csv)}`);
  check((await widget(page, 'import.mapped.Alk reading')).found, 'the reading chosen is not shown');
  check((await state(page)).events === before.events, 'the choice changed the log');
  // A meaning the core does not read: its message (the column, the accepted forms), nothing kept.
  await tap(page, 'import.map.Tester');
  await tap(page, 'import.meaning_typed');
  await enter(page, 'alkalinity furlongs');
  p = (await state(page)).import;
  check(/Tester/.test(p.mapping_error) && /accepted/.test(p.mapping_error) && /alkalinity dKH/.test(p.mapping_error),
    `refusal: ${p.mapping_error}`);
  check((await widget(page, 'import.mapping_error')).found, 'the refusal is not on screen');
  check(p.mappings.length === 1 && p.csv.added === 4, `after the refusal: ${JSON.stringify(p.mappings)} ${p.csv.added}`);
  await page.evaluate(() => Module.ccall('tw_test_reveal', null, ['string'], ['import.mapping_error']));
  await afterEntry(page);
  await page.screenshot({ path: join(OUTPUT, 'phone-import-read-as-refused.png') });
  await tap(page, 'import.add');
  const j = await journal(page);
  const alk = j.events.filter((e) => e.system_id === sys && e.type === 'test' && e.parameter === 'alkalinity' && e.time.startsWith('2025-11-2'))
    .map((e) => `${e.time}=${e.value} ${e.unit}`).sort();
  check(alk.join(', ') === '2025-11-20T07:00:00Z=8.4 dKH, 2025-11-21T07:00:00Z=8.6 dKH', `alkalinity added: ${alk.join(', ')}`);
  check((await state(page)).events === before.events + 4, 'not four entries');
});

test('a Tidewright file is added: only what is new, a second time nothing', async () => {
  const { page } = shared;
  const before = await state(page);
  const file = await journal(page);
  const reef = file.systems[0];
  let id = file.next_id;
  const quarantine = { ...reef, id: id++, name: 'Quarantine tank', volume_l: 90 };
  delete quarantine.volume_parts;  // the reef's parts would not add up to 90 L
  file.systems.push(quarantine);
  file.events.push({ id: id++, system_id: quarantine.id, time: '2026-11-09T08:00:00Z', type: 'test', parameter: 'alkalinity', value: 7.7, unit: 'dKH' });
  file.events.push({ id: id++, system_id: reef.id, time: '2026-11-09T09:00:00Z', type: 'note', text: 'only in the file' });
  file.next_id = id;
  const text = JSON.stringify(file);
  let p = await pick(page, 'mine.json', text, 'application/json');
  check(p.kind === 'journal' && p.file_systems === before.systems.length + 1 && p.file_events === before.events + 2, `file ${JSON.stringify(p)}`);
  check(p.merge.entries_added === 2 && p.merge.systems_added === 1 && p.merge.duplicates === before.events &&
    p.merge.systems_matched === before.systems.length, `merge preview ${JSON.stringify(p.merge)}`);
  check((await state(page)).events === before.events, 'the preview changed the log');
  await tap(page, 'import.add');
  const after = await state(page);
  check(after.events === before.events + 2 && after.systems.length === before.systems.length + 1, `after: ${after.events}, ${after.systems.length}`);
  check(after.systems.some((s) => s.name === 'Quarantine tank' && s.volume_l === 90), 'the new system');
  p = await pick(page, 'mine.json', text, 'application/json');
  check(p.merge.entries_added === 0 && p.merge.systems_added === 0 && p.merge.duplicates === before.events + 2, `again ${JSON.stringify(p.merge)}`);
  await tap(page, 'import.cancel');
});

test('the log exported as CSV is what `tidewright log export` writes for the same journal', async () => {
  const { page } = shared;
  await messageGone(page);
  await tap(page, 'settings.csv_scope.1');  // all systems
  const [download] = await Promise.all([page.waitForEvent('download'), tap(page, 'settings.export_csv')]);
  const appCsv = readFileSync(await download.path(), 'utf8');
  check(/\.csv$/.test(download.suggestedFilename()), `file name ${download.suggestedFilename()}`);
  const dir = mkdtempSync(join(tmpdir(), 'tw-import-'));
  try {
    const file = join(dir, 'journal.json'), db = join(dir, 'journal.db');
    writeFileSync(file, JSON.stringify(await journal(page)));
    execFileSync(cli, ['log', '--journal', db, 'import', file], { stdio: 'pipe' });
    const cliCsv = execFileSync(cli, ['log', '--journal', db, 'export', '--format', 'csv'], { encoding: 'utf8' });
    check(appCsv.length > 1000, `the app's CSV is ${appCsv.length} bytes`);
    if (appCsv !== cliCsv) {
      const a = appCsv.split('\r\n'), b = cliCsv.split('\r\n');
      const i = a.findIndex((line, k) => line !== b[k]);
      throw new Error(`differs at line ${i + 1}: app "${a[i]}", command line "${b[i]}" (${a.length} and ${b.length} lines)`);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
});

test('Replace everything asks first, names what goes, and replaces on the second tap', async () => {
  const { page } = shared;
  const before = await state(page);
  const small = {
    format: 'tidewright-journal', schema_version: 3, next_id: 4, description: 'one small tank',
    systems: [{ id: 1, name: 'Nano', kind: 'reef_display', volume_l: 40, default_salinity: 35, default_temperature_c: 25,
      units: { alkalinity: 'dKH', calcium_magnesium: 'mg/L', temperature: 'C', ph_scale: 'nbs', volume: 'L' }, targets: {} }],
    events: [
      { id: 2, system_id: 1, time: '2026-11-10T08:00:00Z', type: 'test', parameter: 'alkalinity', value: 8.5, unit: 'dKH' },
      { id: 3, system_id: 1, time: '2026-11-11T08:00:00Z', type: 'test', parameter: 'alkalinity', value: 8.6, unit: 'dKH' }],
  };
  let p = await pick(page, 'nano.json', JSON.stringify(small), 'application/json');
  check(p.merge.systems_added === 1 && p.merge.entries_added === 2, `merge preview ${JSON.stringify(p.merge)}`);
  await tap(page, 'import.replace');
  p = (await state(page)).import;
  check(p.confirm_replace && (await widget(page, 'import.replace_warning')).found, 'no second step before replacing');
  check((await state(page)).events === before.events, 'replaced on the first tap');
  await tap(page, 'import.replace_back');
  check(!(await state(page)).import.confirm_replace && (await state(page)).events === before.events, 'Back did not go back');
  await tap(page, 'import.replace');
  await tap(page, 'import.replace_confirm');
  const after = await state(page);
  check(after.systems.length === 1 && after.systems[0].name === 'Nano' && after.events === 2, `after ${after.systems.length} systems, ${after.events} events`);
  await flushed(page);
  await page.reload();
  await page.waitForFunction(() => window.__twFirstFrameMs !== undefined, null, { timeout: 30000 });
  await frames(page, 3);
  const reloaded = await state(page);
  check(reloaded.systems.length === 1 && reloaded.events === 2, `after a reload ${reloaded.systems.length} systems, ${reloaded.events} events`);
  await shared.context.close();
  const real = shared.errors.filter((e) => !benign(e));
  check(real.length === 0, `console errors: ${real.join(' | ')}`);
});

test('desktop: the preview fits the column, Add and Cancel side by side', async () => {
  const { context, page } = await openApp(browser, server.url, DESKTOP);
  await tap(page, 'tab.settings');
  const p = await pick(page, 'wide.csv', 'Date,Alkalinity (dKH),Alk reading\n2026-11-02 08:00,8.1,\n');
  check(p.csv.added === 1, `preview ${JSON.stringify(p.csv)}`);
  await page.evaluate(() => Module.ccall('tw_test_reveal', null, ['string'], ['import.add']));
  await frames(page, 3);
  const add = await widget(page, 'import.add'), cancel = await widget(page, 'import.cancel'), card = await widget(page, 'import.counts');
  check(add.visible && cancel.visible && Math.abs(add.y - cancel.y) < 1 && add.x + add.w <= cancel.x && cancel.x + cancel.w <= 1280,
    `buttons ${JSON.stringify([add, cancel])}`);
  check(card.found && card.x >= add.x - 1, `counts ${JSON.stringify(card)}`);
  await page.screenshot({ path: join(OUTPUT, 'desktop-import-csv-preview.png') });
  await tap(page, 'import.map.Alk reading');
  const item = await widget(page, 'import.meaning.alkalinity dKH'), box = await widget(page, 'import.meaning_typed');
  check(item.found && item.x + item.w <= 1280 && box.found, `the Read as list: ${JSON.stringify([item, box])}`);
  await page.evaluate(() => Module.ccall('tw_test_reveal', null, ['string'], ['import.meaning.alkalinity dKH']));
  await frames(page, 3);
  await page.screenshot({ path: join(OUTPUT, 'desktop-import-read-as.png') });
  await context.close();
});

// A farm of 33 systems (lib.mjs), opened from the older store.
const LONG = FARM_LONG_NAME;
const FARM = farmOf33Systems();

for (const [label, opts] of [['phone', PHONE], ['desktop', DESKTOP]]) {
  test(`33 systems: the rows go to Rack 31, found by typing in the list (${label})`, async () => {
    const { context, page, errors } = await openSeeded(browser, server.url, { ...opts, timezoneId: ZONE }, FARM);
    check((await state(page)).systems.length === 33, 'the farm is not loaded');
    await tap(page, 'tab.settings');
    let p = await pick(page, 'farm.csv', 'Date,Calcium (mg/L)\n2025-11-22 08:00,440\n2025-11-23 08:00,445\n');
    check(p.csv_system === 2 && p.csv.added === 2, `preview ${JSON.stringify(p)}`);
    // The current system is chosen and in view; the list is a box that scrolls, not a grid of 33.
    const current = await widget(page, 'import.system.2'), r31 = await widget(page, 'import.system.31');
    const cut = current.text.endsWith('\u2026') && LONG.startsWith(current.text.slice(0, -1).trimEnd());
    check(current.found && (opts.hasTouch ? cut : cut || current.text === LONG), `the long name reads "${current.text}"`);
    check(r31.found && !r31.visible, `Rack 31 shown before scrolling or finding: ${JSON.stringify(r31)}`);
    const vw = opts.viewport.width;
    check(current.x >= 0 && current.x + current.w <= vw, `the list runs off the screen: ${JSON.stringify(current)}`);
    await page.evaluate(() => Module.ccall('tw_test_reveal', null, ['string'], ['import.system.find']));
    await frames(page, 3);
    await page.screenshot({ path: join(OUTPUT, `${label}-import-system-list.png`) });
    await tap(page, 'import.system.find');
    await enter(page, '31');
    p = (await state(page)).import;
    check(p.system_filter === '31', `filter ${p.system_filter}`);
    const shown = Object.keys(JSON.parse(await page.evaluate(() => Module.ccall('tw_test_widgets', 'string', [], []))))
      .filter((n) => /^import\.system\.\d+$/.test(n));
    const found = await widget(page, 'import.system.31'), other = await widget(page, 'import.system.30');
    check(found.visible && found.text === 'Rack 31', `Rack 31 after typing: ${JSON.stringify(found)}`);
    check(!other.found || !other.visible, `Rack 30 still listed after typing 31 (${shown.length} names recorded)`);
    await afterEntry(page);
    await page.screenshot({ path: join(OUTPUT, `${label}-import-system-found.png`) });
    await tap(page, 'import.system.31');
    p = (await state(page)).import;
    check(p.csv_system === 31 && p.csv.added === 2, `chosen ${p.csv_system}, ${p.csv.added}`);
    await tap(page, 'import.add');
    const j = await journal(page);
    const ca = j.events.filter((e) => e.parameter === 'calcium').map((e) => `${e.system_id}:${e.value}`).sort();
    check(ca.join(' ') === '31:440 31:445', `calcium went to ${ca.join(' ')}`);
    await context.close();
    const real = errors.filter((e) => !benign(e) && !/status of 404/.test(e));
    check(real.length === 0, `console errors: ${real.join(' | ')}`);
  });
}

await runTests(tests, browser, server);
