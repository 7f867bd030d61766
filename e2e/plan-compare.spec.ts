import { expect, test, type Page } from '@playwright/test';
import AxeBuilder from '@axe-core/playwright';
import { shot, signIn } from './helpers';

/**
 * The dealer's administrator keeps shelf quantities and lead times; the operator's planner shows
 * both ways of a crop change side by side with each purchase on the dealer's shelf or to order
 * and when the work can start. Quantities and lead times are invented test data.
 */
async function setStock(page: Page, pn: string, quantity: string, leadDays: string) {
  await page.getByLabel(`On the shelf: ${pn}`).fill(quantity);
  await page.getByLabel(`Order lead time in days: ${pn}`).fill(leadDays);
}

test('dealer stock and lead times feed both plans, shown side by side and stacked on a phone', async ({ browser }) => {
  const adminCtx = await browser.newContext();
  const admin = await adminCtx.newPage();
  await signIn(admin, 'dealerAdmin', '/admin/stock');
  await admin.goto('/admin/stock');
  await expect(admin.getByRole('heading', { name: 'Dealer stock' })).toBeVisible();
  // A bad lead time is refused and named; nothing is saved.
  await setStock(admin, 'CW-RB-R-04', '0', 'soon');
  await admin.getByRole('button', { name: 'Save stock' }).click();
  await expect(admin.getByTestId('stock-errors')).toContainText('CW-RB-R-04: lead time');
  await setStock(admin, 'CW-RB-L-04', '6', '4');
  await setStock(admin, 'CW-RB-R-04', '0', '9');
  await admin.getByRole('button', { name: 'Save stock' }).click();
  await expect(admin.getByRole('status')).toContainText('changed');
  await expect(admin.getByLabel('Order lead time in days: CW-RB-R-04')).toHaveValue('9');
  await shot(admin, 'dealer-stock', false);
  await adminCtx.close();

  const ctx = await browser.newContext({ viewport: { width: 1440, height: 900 } });
  const page = await ctx.newPage();
  await signIn(page, 'operator', '/planner');
  await page.goto('/planner');
  await page.getByLabel('Machine').selectOption({ label: 'North Quarter · Tamarack M4' });
  await page.getByLabel('Next crop').selectOption({ label: 'Field peas' });
  await page.getByRole('button', { name: 'Plan the change' }).click();

  const program = page.getByTestId('compare-program');
  const onHand = page.getByTestId('compare-on-hand');
  await expect(program.getByRole('heading', { name: 'Follow the crop program' })).toBeVisible();
  await expect(onHand.getByRole('heading', { name: 'Use what is on hand' })).toBeVisible();
  const purchases = program.getByTestId('compare-purchases');
  await expect(purchases.locator('li', { hasText: 'CW-RB-L-04' })).toContainText('on the dealer’s shelf');
  await expect(purchases.locator('li', { hasText: 'CW-RB-R-04' })).toContainText('to order, about 9 days');
  await expect(program.getByTestId('compare-start')).toContainText('From about');
  await expect(program.getByTestId('compare-start')).toContainText('(about 9 days)');
  for (const card of [program, onHand]) {
    await expect(card.getByTestId('compare-cost')).toBeVisible();
    await expect(card.getByTestId('compare-effort')).toContainText('handled');
    await expect(card.getByTestId('compare-findings')).toBeVisible();
  }
  await expect(page.getByTestId('plan-start')).toContainText('Work can start from about');
  await expect(page.getByTestId('plan-purchases')).toContainText('to order, about 9 days');

  // Side by side at 1440 px.
  let a = (await program.boundingBox())!;
  let b = (await onHand.boundingBox())!;
  expect(Math.abs(a.y - b.y)).toBeLessThan(2);
  expect(b.x).toBeGreaterThan(a.x + a.width - 1);
  await page.getByTestId('plan-compare').scrollIntoViewIfNeeded();
  await shot(page, 'plan-compare-1440', false);
  const axe = await new AxeBuilder({ page }).include('[data-testid="plan-compare"]').analyze();
  expect(axe.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => v.id)).toEqual([]);

  // Stacked at 390 px, nothing wider than the screen.
  await page.setViewportSize({ width: 390, height: 844 });
  a = (await program.boundingBox())!;
  b = (await onHand.boundingBox())!;
  expect(b.y).toBeGreaterThanOrEqual(a.y + a.height);
  expect(a.width).toBeLessThanOrEqual(390);
  await program.scrollIntoViewIfNeeded();
  await shot(page, 'plan-compare-390', false);

  // Keyboard: the other way is a link reached with Tab and followed with Enter.
  const link = onHand.getByRole('link', { name: 'Show this one in full' });
  await page.getByRole('heading', { name: 'Two ways to do it' }).click();
  for (let i = 0; i < 10 && !(await link.evaluate((el) => el === document.activeElement)); i++) await page.keyboard.press('Tab');
  await expect(link).toBeFocused();
  await page.keyboard.press('Enter');
  await expect(page).toHaveURL(/mode=on-hand/);
  await expect(page.getByTestId('compare-on-hand')).toContainText('Shown in full below');
  await ctx.close();
});
