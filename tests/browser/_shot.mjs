import { startServer } from './serve.mjs';
import { launch, PHONE, DESKTOP, waitReady, tap, frames } from './lib.mjs';
const server = await startServer(process.argv[2]);
const browser = await launch();
const sizes = { phone: PHONE, desktop: DESKTOP };
for (const spec of process.argv.slice(3)) {
  const [label, tab, huge] = spec.split(':');
  const context = await browser.newContext(sizes[label]);
  const page = await context.newPage();
  await page.goto(server.url); await waitReady(page); await frames(page, 3);
  if (huge) { await tap(page, 'tab.settings'); await tap(page, 'settings.text_size.3'); await frames(page, 4); }
  await tap(page, 'tab.' + tab); await frames(page, 4);
  await page.screenshot({ path: `/tmp/shot_${label}_${tab}${huge ? '_huge' : ''}.png` });
  await context.close();
}
await browser.close(); await server.close();
