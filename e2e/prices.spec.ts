import { test, expect } from '@playwright/test';
import { shot, signIn } from './helpers';

test('the dealer administrator keeps the price list: a bad import is named by row and column, a price is saved', async ({ page }) => {
  await signIn(page, 'dealerAdmin', '/admin/prices');
  await page.goto('/admin/prices');
  await expect(page.getByRole('heading', { name: /Price list · Kestrel Valley Implement/ })).toBeVisible();
  const row = page.getByTestId('price-table').locator('tr[data-part="CW-RB-L-04"]');
  await expect(row).toBeVisible();

  await page.getByLabel('…or paste it').fill('part number,price\nCW-RB-L-04,1200.00\nCW-NONE-X-00,3.00\nCW-RB-R-04,cheap');
  await page.getByRole('button', { name: 'Import prices' }).click();
  const errors = page.getByTestId('import-errors');
  await expect(errors).toContainText('Row 3, column part number');
  await expect(errors).toContainText('Row 4, column price');
  await expect(row.getByRole('textbox')).toHaveValue('1310.00');
  await shot(page, 'prices-import-errors');

  await row.getByRole('textbox').fill('1250.00');
  await page.getByRole('button', { name: 'Save prices' }).click();
  await expect(page.getByRole('status')).toContainText('1 price changed');
  await expect(page.getByTestId('price-table').locator('tr[data-part="CW-RB-L-04"]').getByRole('textbox')).toHaveValue('1250.00');
  await shot(page, 'prices-saved');
});

test('the instance administrator keeps the catalog and takes backups, but sees no price list or machines', async ({ page }) => {
  await signIn(page, 'instanceAdmin', '/');
  await expect(page.getByTestId('instance-glance')).toContainText('Dealers');
  await shot(page, 'home-instance-admin');
  await page.goto('/admin/backup');
  await shot(page, 'admin-backup');
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download a backup' }).click()]);
  expect(download.suggestedFilename()).toMatch(/^cagewright-.*\.tar\.gz$/);
  await download.delete();
  const res = await page.goto('/admin/prices');
  expect(res?.status()).toBe(403);
});
