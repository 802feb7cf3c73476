import { launch, PHONE, DESKTOP, state, widget, tap, frames, openApp } from './lib.mjs';
import { startServer } from './serve.mjs';
const server = await startServer(process.argv[2]);
const browser = await launch();
const which = process.argv[3] || 'phone';
const opts = which === 'phone' ? { ...PHONE, deviceScaleFactor: 1 } : DESKTOP;
const { context, page } = await openApp(browser, server.url, opts);
const screens = (process.argv[4] || 'plan').split(',');
for (const s of screens) {
  await tap(page, `tab.${s}`);
  await frames(page, 4);
  for (let i = 0; i < (Number(process.argv[5]) || 1); i++) {
    await page.screenshot({ path: `/tmp/shot-${which}-${s}-${i}.png` });
    if (opts.hasTouch) {
      const h = opts.viewport.height;
      await page.touchscreen.tap(5, 5).catch(() => {});
      // drag up by 600 px
      const cdp = await context.newCDPSession(page);
      await cdp.send('Input.dispatchTouchEvent', { type: 'touchStart', touchPoints: [{ x: 200, y: 700 }] });
      for (let k = 1; k <= 10; k++) await cdp.send('Input.dispatchTouchEvent', { type: 'touchMove', touchPoints: [{ x: 200, y: 700 - k * 60 }] });
      await cdp.send('Input.dispatchTouchEvent', { type: 'touchEnd', touchPoints: [] });
    } else {
      await page.mouse.move(640, 400);
      await page.mouse.wheel(0, 700);
    }
    await frames(page, 10);
    await page.waitForTimeout(300);
  }
}
await browser.close(); await server.close();
