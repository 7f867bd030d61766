import { test } from '@playwright/test';
import { shot, signIn } from './helpers';
import { demoIds, pageUrls } from './pages';

test('phone widths', async ({ page, browser }) => {
  test.setTimeout(600_000);
  const ids = await demoIds(browser);
  console.log(JSON.stringify(ids));
  for (const who of ['technician', 'operator'] as const) {
    await signIn(page, who);
    await page.setViewportSize({ width: 390, height: 844 });
    for (const { route, url } of pageUrls(ids)) {
      if (route === '/signout' || route === '/signin') continue;
      const res = await page.goto(url);
      const w = await page.evaluate(() => ({ sw: document.documentElement.scrollWidth, cw: document.documentElement.clientWidth }));
      console.log(who, res?.status(), route, w.sw, w.cw, w.sw > w.cw ? 'WIDE' : '');
      if (who === 'technician') await shot(page, `x390${route.replace(/[\/\[\]]/g, '_')}`);
    }
  }
});
