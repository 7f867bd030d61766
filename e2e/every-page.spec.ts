import { test, expect, type Page } from '@playwright/test';
import AxeBuilder from '@axe-core/playwright';
import { shot, signIn, type DEMO } from './helpers';
import { demoIds, pageUrls, type DemoIds } from './pages';

/**
 * Every page from src/pages (see ./pages.ts), signed out and as each role: it fits a phone
 * (no sideways scrolling of the page at 390 CSS px; a drawing scrolls in its own box and says
 * so), and axe-core finds no serious or critical accessibility violation at phone and desktop
 * widths. Pages a role may not open are checked as they show (the refusal page).
 */

type Who = keyof typeof DEMO | 'signed out';
const WHO: Who[] = ['signed out', 'operator', 'technician', 'trainer', 'dealerAdmin', 'instanceAdmin'];

let ids: DemoIds;
test.beforeAll(async ({ browser }) => {
  ids = await demoIds(browser);
});

async function axeProblems(page: Page): Promise<string[]> {
  const result = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'best-practice']).analyze();
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map(
      (v) =>
        `${v.impact} ${v.id}: ${v.help} — ${v.nodes
          .slice(0, 3)
          .map((n) => n.target.join(' '))
          .join(' | ')}`,
    );
}

for (const who of WHO) {
  test(`every page, ${who}: fits 390 px and has no serious or critical axe violation`, async ({ page }) => {
    test.setTimeout(600_000);
    if (who !== 'signed out') await signIn(page, who);
    const problems: string[] = [];
    for (const { route, url } of pageUrls(ids)) {
      // Signing out is a form that posts; the page itself is checked like any other.
      await page.setViewportSize({ width: 390, height: 844 });
      const res = await page.goto(url);
      expect(res, url).toBeTruthy();
      await page.waitForLoadState('load');
      // Islands hydrate (those shown only when scrolled to may stay as drawn on the server).
      await page
        .locator('astro-island[ssr]:not([client="visible"])')
        .first()
        .waitFor({ state: 'detached', timeout: 15_000 })
        .catch(() => undefined);
      const w = await page.evaluate(() => ({ sw: document.documentElement.scrollWidth, cw: document.documentElement.clientWidth }));
      if (w.sw > w.cw) problems.push(`${route}: the page scrolls sideways at 390 px (${w.sw} > ${w.cw})`);
      for (const p of await axeProblems(page)) {
        problems.push(`${route} at 390 px: ${p}`);
        console.log(`[${who}] ${route} at 390 px: ${p}`);
      }
      if (who === 'technician') await shot(page, `page-390${route.replace(/[/[\]]+/g, '-')}`, false);
      await page.setViewportSize({ width: 1440, height: 900 });
      for (const p of await axeProblems(page)) problems.push(`${route} at 1440 px: ${p}`);
      if (who === 'technician') await shot(page, `page-1440${route.replace(/[/[\]]+/g, '-')}`, false);
    }
    for (const p of problems) console.log(`[${who}] ${p}`);
    expect(problems).toEqual([]);
  });
}

test('the top navigation collapses into a menu on a phone', async ({ page }) => {
  await signIn(page, 'technician');
  await page.setViewportSize({ width: 390, height: 844 });
  await page.goto('/machines');
  const menu = page.getByTestId('site-menu');
  await expect(menu).toBeVisible();
  const nav = page.getByRole('navigation', { name: 'Main' });
  await expect(nav).toHaveCount(0);
  await menu.getByText('Menu').click();
  await expect(nav).toHaveCount(1);
  await expect(nav.getByRole('link', { name: 'Machines' })).toHaveAttribute('aria-current', 'page');
  await shot(page, 'nav-menu-390', false);
  await nav.getByRole('link', { name: 'Inspections' }).click();
  await expect(page).toHaveURL(/\/inspections$/);
  await page.setViewportSize({ width: 1440, height: 900 });
  await expect(page.getByTestId('site-menu')).toBeHidden();
  await expect(page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Machines' })).toBeVisible();
});

test('the share page shows every column of the parts list on a phone', async ({ page }) => {
  await page.setViewportSize({ width: 390, height: 844 });
  await page.goto(`/share/${ids.shareToken}`);
  const table = page.getByTestId('parts-table');
  await expect(table).toBeVisible();
  const heads = await table.locator('thead th').allInnerTexts();
  expect(heads).toContain('Weight each');
  const cells = await table
    .locator('tbody tr')
    .first()
    .locator('td')
    .evaluateAll((tds) =>
      tds.map((td) => {
        const r = td.getBoundingClientRect();
        return {
          label: td.getAttribute('data-label'),
          left: r.left,
          right: r.right,
          h: r.height,
          before: getComputedStyle(td, '::before').content,
        };
      }),
    );
  expect(cells.map((c) => c.label)).toEqual(['Part number', 'Part', 'Hand', 'Qty', 'Weight each', 'Unit price', 'Where']);
  for (const c of cells) {
    expect(c.h, c.label!).toBeGreaterThan(0);
    expect(c.left, c.label!).toBeGreaterThanOrEqual(0);
    expect(c.right, c.label!).toBeLessThanOrEqual(390);
    expect(c.before).toContain(c.label!);
  }
  await shot(page, 'share-390');
  await page.setViewportSize({ width: 1440, height: 900 });
  await shot(page, 'share-1440');
});
