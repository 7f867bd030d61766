import { test, expect } from '@playwright/test';
import { shot, signIn } from './helpers';

test('the instance administrator adds a part through the form: bad input is named in the browser, then saved and listed', async ({
  page,
}) => {
  await signIn(page, 'instanceAdmin', '/admin/catalog');
  await page.goto('/admin/catalog');
  const parts = page.getByTestId('parts-table');
  await expect(parts.getByRole('link', { name: 'CW-BL-L-04' })).toBeVisible();
  await expect(page.getByTestId('parts-count')).toContainText('page 1 of');
  await page.getByRole('button', { name: 'Next' }).click();
  await expect(parts.getByRole('link', { name: 'CW-FW-L-04' })).toBeVisible();
  await expect(page.getByTestId('families-table')).toContainText('Tamarack M4');
  await shot(page, 'catalog-admin');

  // Sort by price, then filter to cover plates.
  await parts.getByRole('button', { name: /List price/ }).click();
  await page.getByLabel('Kind').selectOption('cover-plate');
  await expect(parts.locator('tbody tr')).toHaveCount(4);

  await page.getByRole('link', { name: 'Add a part' }).click();
  const form = page.getByTestId('part-form');
  await form.getByLabel('Machine family').selectOption({ label: 'Sedge S6' });
  await expect(form.getByLabel('Fit group')).toHaveValue('sedge');
  await form.getByLabel('Kind').selectOption('rotor-bar');
  await form.getByLabel('Part number').fill('cw-br-xx');
  await form.getByLabel('Name').fill('Rasp bar, heavy duty, Sedge S6');
  await form.getByLabel('Mass, kg').fill('-3');
  await form.getByLabel(/List price, cents/).fill('9900');
  await form.getByLabel('Bar kind').selectOption('rasp');
  await form.getByRole('button', { name: 'Add part' }).click();
  await expect(page.getByRole('alert')).toContainText('check the marked fields');
  await expect(form).toContainText('part.partNumber:');
  await expect(form).toContainText('part.massKg:');
  await shot(page, 'catalog-part-errors');

  await form.getByLabel('Part number').fill('CW-BR-HD-06');
  await form.getByLabel('Mass, kg').fill('7.9');
  await form.getByRole('button', { name: 'Add part' }).click();
  await expect(page).toHaveURL(/\/admin\/catalog\?saved=CW-BR-HD-06/);
  await expect(page.getByRole('status')).toContainText('Part CW-BR-HD-06 saved');
  await page.getByLabel('Search').fill('HD-06');
  await expect(page.getByTestId('parts-table').getByRole('link', { name: 'CW-BR-HD-06' })).toBeVisible();
});

test('the instance administrator cannot strand machines by removing a drum their family has; the server names the field', async ({
  page,
}) => {
  await signIn(page, 'instanceAdmin', '/admin/catalog/families/tamarack-m4');
  await page.goto('/admin/catalog/families/tamarack-m4');
  const form = page.getByTestId('family-form');
  await expect(form.getByLabel('Name', { exact: true })).toHaveValue('Tamarack M4');
  await shot(page, 'catalog-family-form');
  await form.getByRole('button', { name: 'Remove drum option 2' }).click();
  await form.getByRole('button', { name: 'Save family' }).click();
  await expect(page.getByRole('alert')).toContainText('drumOptions');
  await expect(page.getByRole('alert')).toContainText('slim drum');
  // A schema error is caught in the browser before anything is sent.
  await page.reload();
  await form.getByRole('textbox', { name: 'Name', exact: true }).fill('');
  await form.getByRole('button', { name: 'Save family' }).click();
  await expect(form).toContainText('name:');
});

test('technician reads the catalog but cannot change it; an operator is refused', async ({ page }) => {
  await signIn(page, 'technician', '/admin/catalog');
  await page.goto('/admin/catalog');
  await expect(page.getByTestId('parts-count')).toContainText('read only');
  await expect(page.getByRole('link', { name: 'Add a part' })).toHaveCount(0);
  await page.goto('/admin/catalog/parts/CW-FW-L-04');
  await expect(page.getByRole('button', { name: 'Save part' })).toHaveCount(0);
  await expect(page.getByTestId('part-form').getByLabel('Mass, kg')).toBeDisabled();
  await expect(page.getByTestId('part-form').getByLabel('Mass, kg')).toHaveValue('44.9');
  expect((await page.goto('/admin/catalog/parts/new'))!.status()).toBe(403);
  await page.context().clearCookies();
  await signIn(page, 'operator', '/');
  expect((await page.goto('/admin/catalog'))!.status()).toBe(403);
});
