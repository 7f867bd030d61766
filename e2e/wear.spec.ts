import { test, expect, type Page } from '@playwright/test';
import { shot, signIn } from './helpers';

/**
 * Shop work (wear): a technician opens a part's wear chart from the machine page (phone and
 * desktop widths, screenshots to look at), records hour meters with the keyboard (a lower reading
 * refused with the field named, then accepted as a correction), and the dealer's administrator
 * reads the before-the-season list.
 */

async function noSidewaysScroll(page: Page) {
  const w = await page.evaluate(() => ({ sw: document.documentElement.scrollWidth, cw: document.documentElement.clientWidth }));
  expect(w.sw, 'the page scrolls sideways').toBeLessThanOrEqual(w.cw);
}

test('a technician opens a part’s wear chart from the machine page', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 900 });
  await signIn(page, 'technician');
  await page.goto('/machines?q=North%20Quarter');
  await page.getByRole('link', { name: 'North Quarter' }).first().click();
  await expect(page.getByTestId('machine-heading')).toHaveText('North Quarter');
  const history = page.getByTestId('part-history');
  await expect(history.getByRole('heading', { name: 'Part history and wear' })).toBeVisible();
  await expect(page.getByTestId('last-hours')).toContainText('separator');
  // The worn front element is due now; its neighbour has hours left.
  await expect(history.locator('tr[data-part-place="element:1:left"]')).toHaveAttribute('data-status', 'now');
  await shot(page, 'wear-machine-1440');

  await history.getByRole('link', { name: 'Position 1, right' }).click();
  await expect(page.getByTestId('part-heading')).toContainText('Position 1, right');
  await expect(page.getByTestId('forecast-status')).toHaveAttribute('data-status', 'ahead');
  await expect(page.getByTestId('forecast-status')).toContainText(/h left · around/);
  await expect(page.getByTestId('trend')).toContainText('per 100 h');
  const chart = page.getByTestId('wear-chart').locator('svg[role="img"]:visible');
  await expect(chart).toHaveCount(1);
  await expect(chart).toHaveAttribute('aria-label', /fitted line and the wear limit/);
  await expect(chart).toContainText('wear limit');
  await expect(page.getByTestId('measurements').locator('tbody tr')).toHaveCount(4);
  await expect(page.getByRole('heading', { name: 'Safety before you work on the cage' })).toBeVisible();
  await noSidewaysScroll(page);
  await shot(page, 'wear-part-1440');

  await page.setViewportSize({ width: 390, height: 844 });
  await expect(page.getByTestId('wear-chart').locator('svg[role="img"]:visible')).toHaveCount(1);
  await noSidewaysScroll(page);
  await shot(page, 'wear-part-390');
});

test('hour meters by keyboard: a lower reading is refused with the field named, a correction with a reason is kept', async ({ page }) => {
  await page.setViewportSize({ width: 390, height: 844 });
  await signIn(page, 'technician');
  await page.goto('/machines?q=Bean%20Runner');
  await page.getByRole('link', { name: 'Bean Runner' }).first().click();
  await expect(page.getByTestId('machine-heading')).toHaveText('Bean Runner');
  const block = page.getByTestId('machine-hours');
  const summary = block.getByText('Record a reading…');
  await summary.focus();
  await page.keyboard.press('Enter');
  const form = block.getByTestId('hours-form');
  await form.getByLabel('Engine hours').focus();
  await page.keyboard.type('3120');
  await page.keyboard.press('Tab');
  await page.keyboard.type('2410');
  await page.keyboard.press('Enter');
  await expect(page.getByRole('status')).toHaveText('Hours recorded.');
  await expect(page.getByTestId('last-hours')).toContainText('3,120 h');

  // Lower than the last reading, no reason: refused on the hours page, the field named and marked.
  await page.getByTestId('machine-hours').getByText('Record a reading…').click();
  const again = page.getByTestId('machine-hours').getByTestId('hours-form');
  await again.getByLabel('Engine hours').fill('3100');
  await again.getByLabel('Separator hours').fill('2400');
  await again.getByLabel('Separator hours').press('Enter');
  await expect(page.getByTestId('hours-errors')).toContainText('engineHours');
  await expect(page.getByTestId('hours-form').getByLabel('Engine hours')).toHaveAttribute('aria-invalid', 'true');
  await shot(page, 'wear-hours-refused-390');
  await page
    .getByTestId('hours-form')
    .getByLabel(/Correction reason/)
    .fill('last reading mistyped: 3120 was 3012');
  await page
    .getByTestId('hours-form')
    .getByLabel(/Correction reason/)
    .press('Enter');
  await expect(page.getByRole('status')).toHaveText('Hours recorded.');
  await expect(page.getByTestId('last-hours')).toContainText('3,100 h');
  await page.goto(page.url().replace(/\?.*$/, '') + '/hours');
  await expect(page.getByTestId('hours-table')).toContainText('correction: last reading mistyped');
});

test('the dealer’s administrator reads the before-the-season list', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 900 });
  await signIn(page, 'dealerAdmin');
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Season parts' }).click();
  await expect(page.getByRole('heading', { name: 'Before the season', level: 1 })).toBeVisible();
  await expect(page.getByTestId('stock-table')).toContainText('CW-FW-L-04');
  await expect(page.locator('article', { hasText: 'North Quarter' })).toContainText('at the wear limit now');
  await expect(page.locator('article', { hasText: 'Creekside' })).toBeVisible();
  await shot(page, 'wear-season-1440');
  await page.setViewportSize({ width: 390, height: 844 });
  await noSidewaysScroll(page);
  await shot(page, 'wear-season-390');
});
