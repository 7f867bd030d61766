import { test, expect } from '@playwright/test';
import { shot, signIn } from './helpers';
import { demoIds } from './pages';

/** The classroom stage: the keys help and the slide overview never leave the slide half seen. */
test('the keys help sits over a corner (the drawing stays put) and the overview hides the slide beneath', async ({ page, browser }) => {
  const ids = await demoIds(browser);
  await page.setViewportSize({ width: 1920, height: 1080 });
  await signIn(page, 'trainer');
  await page.goto(`/classroom/${ids.deckId}/present`);
  const stage = page.getByTestId('stage-audience');
  await expect(stage).toBeVisible();
  await expect(page.locator('astro-island[ssr]')).toHaveCount(0);
  const slide = page.locator('#main');
  const before = (await slide.boundingBox())!;
  await page.getByRole('button', { name: /^Keys/ }).click();
  await expect(page.getByTestId('key-help')).toBeVisible();
  const after = (await slide.boundingBox())!;
  expect(after.y).toBe(before.y);
  expect(after.height).toBe(before.height);
  await shot(page, 'classroom-keys-1920', false);
  await page.getByRole('button', { name: /^Keys/ }).click();

  await page.getByRole('button', { name: /^Overview/ }).click();
  const overview = page.getByTestId('overview');
  await expect(overview).toBeVisible();
  const bg = await overview.evaluate((el) => getComputedStyle(el).backgroundColor);
  // Fully opaque: rgb(...) or rgba(..., 1).
  expect(bg).not.toMatch(/rgba\([^)]*,\s*0?\.\d+\)/);
  await shot(page, 'classroom-overview-1920', false);
});
