import { test, expect, type Page } from '@playwright/test';
import AxeBuilder from '@axe-core/playwright';
import { execFileSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { shot, signIn } from './helpers';

/** Serious or critical accessibility problems axe finds on the page (none expected). */
async function axeProblems(page: Page) {
  const r = await new AxeBuilder({ page }).analyze();
  return r.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

/** Waits until the page's islands have hydrated (typing before that would be lost). */
async function hydrated(page: Page) {
  const islands = page.locator('astro-island');
  await expect(islands.first()).toBeAttached();
  for (const island of await islands.all()) await expect(island).not.toHaveAttribute('ssr');
}

test('an operator on a phone records a loss check, sees the verdict, and opens the season chart', async ({ page }) => {
  await page.setViewportSize({ width: 390, height: 844 });
  await signIn(page, 'operator');
  // The home page's promise of a loss check leads to it.
  await expect(page.getByTestId('home-loss-check')).toHaveAttribute('href', '/field-check');
  await page.getByRole('link', { name: /Check losses/ }).click();
  await expect(page.getByRole('heading', { name: 'Field check', level: 1 })).toBeVisible();
  const card = page.getByTestId('field-machines').locator('li').filter({ hasText: 'North Quarter' });
  await card.getByRole('link', { name: 'Loss check' }).click();
  await expect(page.getByRole('heading', { name: 'Loss check: North Quarter' })).toBeVisible();
  await hydrated(page);

  // Olive works in metric: a 0.25 m² frame, widths in metres, yield in kg/ha.
  await page.getByLabel('Field').fill('Ridge quarter');
  await expect(page.getByLabel('Crop')).toHaveValue('wheat');
  await page.getByTestId('counts-preHarvest').getByLabel('Frame 1').fill('1');
  await page.getByTestId('counts-preHarvest').getByRole('button', { name: '+ Frame' }).click();
  await page.getByTestId('counts-preHarvest').getByLabel('Frame 2').fill('0');
  await page.getByTestId('counts-header').getByLabel('Frame 1').fill('4');
  await page.getByTestId('counts-behindMachine').getByLabel('Frame 1').fill('30');
  await page.getByLabel(/Cut width/).fill('12');
  await page.getByLabel(/Spread width/).fill('15');
  await page.getByLabel(/Expected yield/).fill('4200');
  // Every input field is big enough for gloves.
  const box = await page.getByLabel(/Expected yield/).boundingBox();
  expect(box!.height).toBeGreaterThanOrEqual(48);

  // A spread wider than the cut is refused with the field named, and nothing is saved.
  await page.getByTestId('save-check').click();
  await expect(page.getByTestId('loss-error')).toContainText(/spreadWidth.*cannot be wider than the cut/);
  await expect(page.getByText('the spread width cannot be wider than the cut width').first()).toBeVisible();
  await expect(page.getByLabel(/Spread width/)).toHaveAttribute('aria-invalid', 'true');
  await page.getByLabel(/Spread width/).fill('4');

  // The result shows while typing: the basis is the published count for wheat, named.
  await expect(page.getByTestId('loss-basis')).toContainText('Published count');
  await expect(page.getByTestId('loss-basis')).toContainText('smallgrains.org');
  await page.getByLabel(/Heads or pods with grain/).check();
  await page.getByTestId('save-check').click();
  await expect(page.getByRole('heading', { name: 'Saved to the season log' })).toBeVisible();
  const verdict = page.getByTestId('loss-verdict');
  await expect(verdict).toBeVisible();
  await expect(verdict).toHaveAttribute('data-verdict', /within|over/);
  await expect(verdict).toContainText(/Harvest loss .* of the expected yield/);
  await expect(page.getByTestId('loss-advice')).toContainText(/concave clearance/);
  await shot(page, 'field-check-verdict');
  expect(await axeProblems(page)).toEqual([]);

  await page.getByTestId('open-season').click();
  await expect(page.getByTestId('season-heading')).toContainText('North Quarter');
  const chart = page.getByTestId('chart-time');
  await chart.scrollIntoViewIfNeeded();
  await expect(chart.locator('svg[role="img"]:visible')).toBeVisible();
  await expect(page.getByTestId('chart-rpm').locator('svg:visible')).toBeVisible();
  await expect(page.getByTestId('season-table')).toContainText('Ridge quarter');
  await shot(page, 'field-check-season');
  expect(await axeProblems(page)).toEqual([]);
});

test('the season charts and table are there without JavaScript', async ({ browser }) => {
  const context = await browser.newContext({ javaScriptEnabled: false, viewport: { width: 1280, height: 900 } });
  const page = await context.newPage();
  await signIn(page, 'trainer', '/field-check');
  await page.goto('/field-check');
  // Trainers read: no loss-check button, but the season log opens.
  const card = page.getByTestId('field-machines').locator('li').filter({ hasText: 'North Quarter' });
  await expect(card.getByRole('link', { name: 'Loss check' })).toHaveCount(0);
  await card.getByRole('link', { name: 'Season log' }).click();
  await expect(page.getByTestId('chart-time').locator('svg path').first()).toBeAttached();
  await expect(page.getByTestId('season-table').locator('tbody tr')).not.toHaveCount(0);
  await shot(page, 'field-check-season-nojs');
  await context.close();
});

test('the printed settings card fits one A4 and one Letter page, with the QR code and the starting values', async ({ page }) => {
  await page.setViewportSize({ width: 1280, height: 900 });
  await signIn(page, 'technician', '/field-check');
  await page.goto('/field-check');
  const card = page.getByTestId('field-machines').locator('li').filter({ hasText: 'North Quarter' });
  await card.getByRole('link', { name: 'Settings card' }).click();
  await expect(page.getByTestId('settings-card')).toBeVisible();
  await expect(page.getByTestId('card-caution')).toContainText('operator’s manual comes first');
  await expect(page.getByTestId('invented-mark')).toContainText('invented');
  await expect(page.getByTestId('card-last-check')).toContainText(/harvest loss/);
  await page.getByTestId('add-qr').click();
  await expect(page.getByTestId('card-qr').locator('svg[role="img"]')).toBeVisible();

  await page.emulateMedia({ media: 'print' });
  mkdirSync('e2e/screenshots', { recursive: true });
  for (const [format, widthMm, heightMm] of [
    ['A4', 210, 297],
    ['Letter', 215.9, 279.4],
  ] as const) {
    // The printable box at 10 mm margins, in CSS pixels (96 per inch).
    const px = (mmv: number) => Math.floor(((mmv - 20) / 25.4) * 96);
    await page.setViewportSize({ width: px(widthMm), height: px(heightMm) });
    const fits = await page.evaluate(() => {
      const el = document.querySelector('[data-testid="settings-card"]') as HTMLElement;
      const r = el.getBoundingClientRect();
      const clipped = [...el.querySelectorAll('*')].filter((n) => {
        const b = (n as HTMLElement).getBoundingClientRect();
        return b.width > 0 && (b.right > r.right + 1 || b.left < r.left - 1);
      }).length;
      return { bottom: r.bottom + window.scrollY, width: r.width, overflowX: el.scrollWidth > el.clientWidth + 1, clipped };
    });
    expect(fits.overflowX).toBe(false);
    expect(fits.clipped).toBe(0);
    expect(fits.bottom).toBeLessThanOrEqual(px(heightMm));
    const pdf = await page.pdf({ format, margin: { top: '10mm', bottom: '10mm', left: '10mm', right: '10mm' }, printBackground: true });
    const pages = (pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g) ?? []).length;
    expect(pages, `${format} pages`).toBe(1);
    const file = `e2e/screenshots/settings-card-${format.toLowerCase()}.pdf`;
    writeFileSync(file, pdf);
    try {
      execFileSync('pdftoppm', ['-png', '-r', '60', '-singlefile', file, file.replace('.pdf', '')]);
    } catch {
      // pdftoppm is only there to make a picture to look at.
    }
  }
});
