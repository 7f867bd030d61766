/**
 * Settings findings on screen: concave clearance, vanes against their control, the start speed,
 * in the editor and on a share page.
 */
import { expect, test } from '@playwright/test';
import { openEditor } from './editor-helpers';
import { shot } from './helpers';

test('editor: clearance below the minimum blocks fit; bolt-set vanes offer no "very slow"; the start speed is named', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 1000 });
  await openEditor(page, 'operator2', 'Bean Runner');
  // A new demo layout starts slow and wide: soybeans at the wide end of their clearance window.
  await expect(page.getByTestId('clearance-window')).toContainText('start at the wide end');
  await expect(page.getByTestId('rpm-start')).toContainText('Start at');
  await expect(page.getByLabel('Concave clearance')).toHaveValue('30');
  // Bolt-set vanes cannot take very slow: the option is there but cannot be chosen.
  await expect(page.getByLabel('Vane control')).toHaveValue('fixed');
  await expect(page.locator('#setting-vaneSetting option[value="very-slow"]')).toBeDisabled();
  await expect(page.getByTestId('vane-how')).toContainText('in the shop');

  const clearance = page.getByLabel('Concave clearance');
  await clearance.fill('1');
  await clearance.press('Enter');
  const findings = page.getByTestId('findings');
  await expect(findings.locator('[data-code="FIT_CLEARANCE_BELOW_MINIMUM"]')).toBeVisible();
  await clearance.fill('50');
  await clearance.press('Enter');
  await expect(findings.locator('[data-code="CROP_CLEARANCE_OUTSIDE_WINDOW"]')).toContainText(/too wide/i);
  await shot(page, 'settings-editor-clearance');
});

test('share page: a shared version shows the clearance and vane findings', async ({ page }) => {
  await page.setViewportSize({ width: 1280, height: 1000 });
  const { layoutId } = await openEditor(page, 'operator', 'North Quarter');
  const cur = await (await page.request.get(`/api/layouts/${layoutId}`)).json();
  const body = { ...cur.current.body, clearanceMm: 40, vaneSetting: 'fast' as const, crop: 'wheat' };
  const saved = await page.request.put(`/api/layouts/${layoutId}`, {
    data: { baseVersion: cur.layout.currentVersion, body, note: 'wide concave test' },
  });
  expect(saved.status()).toBe(201);
  const version = (await saved.json()).version.version as number;
  const link = await page.request.post('/api/share-links', { data: { layoutId, version, label: 'settings check' } });
  expect(link.status()).toBe(201);
  const { path } = await link.json();
  await page.goto(path);
  await expect(page.getByText('Concave too wide for wheat').first()).toBeVisible();
  await shot(page, 'settings-share');
});
