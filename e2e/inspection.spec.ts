import { test, expect } from '@playwright/test';
import sharp from 'sharp';
import { shot, signIn } from './helpers';

/** A small real photo stand-in: bars with a dent, drawn as an image. */
async function picture(): Promise<Buffer> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="320" height="240"><rect width="320" height="240" fill="#2b3036"/>
    ${[40, 100, 160, 220].map((y) => `<path d="M0 ${y} L120 ${y} Q160 ${y + 18} 200 ${y} L320 ${y}" stroke="#aab3bc" stroke-width="8" fill="none"/>`).join('')}</svg>`;
  return sharp(Buffer.from(svg)).png().toBuffer();
}

test('a technician inspects on a phone: flags an element, attaches a photo, finishes, and finds the replacement on a parts request', async ({
  page,
}) => {
  await page.setViewportSize({ width: 390, height: 844 });
  await signIn(page, 'technician', '/inspections');
  await expect(page.getByRole('heading', { name: 'Inspections', level: 1 })).toBeVisible();

  // Start a checklist for Haldane's modular machine.
  const value = await page.locator('#machineId option', { hasText: 'Bean Runner' }).getAttribute('value');
  await page.getByLabel('Machine', { exact: true }).selectOption(value!);
  await page.getByLabel(/Title/).fill('Before edible beans');
  await page.getByRole('button', { name: 'Start the checklist' }).click();
  await expect(page).toHaveURL(/\/inspections\/[0-9a-f-]{36}$/);
  await expect(page.getByRole('heading', { name: /Before edible beans: Bean Runner/ })).toBeVisible();
  // The cautions come first, every time.
  await expect(page.getByRole('heading', { name: 'Safety before you work on the cage' })).toBeVisible();
  await expect(page.getByText(/rotor has stopped/)).toBeVisible();

  const line = page.getByTestId('inspection-line').filter({ hasText: 'Position 1, left' });
  const partNumber = ((await line.getByText(/^Part number /).textContent()) ?? '').replace('Part number ', '').trim();
  expect(partNumber).toMatch(/^CW-[A-Z]{2}-L-04$/);

  await line.getByRole('checkbox', { name: /Bent bars/ }).check();
  await line.getByLabel(/Bar wear under a straight edge/).fill('7');
  await expect(line.getByText(/Past the replacement point/)).toBeVisible();
  // The wear suggests replacing; take the suggestion.
  await line.getByRole('button', { name: 'Mark “Replace”' }).click();
  await expect(line.getByRole('radio', { name: 'Replace' })).toBeChecked();
  await line.getByLabel('Note').fill('Two bars pushed in at the front edge.');

  // A text file passed off as a photo is refused, with the server's words.
  const chooser1 = page.waitForEvent('filechooser');
  await line.getByText('Take or add a photo').click();
  await (await chooser1).setFiles({ name: 'notes.jpg', mimeType: 'image/jpeg', buffer: Buffer.from('not a picture at all') });
  await expect(line.getByRole('alert')).toContainText('not a JPEG, PNG or WebP');

  // A real photo through the file chooser.
  const chooser2 = page.waitForEvent('filechooser');
  await line.getByText('Take or add a photo').click();
  await (await chooser2).setFiles({ name: 'bent-bars.png', mimeType: 'image/png', buffer: await picture() });
  const thumb = line.getByRole('img', { name: /^Photo 1 of Position 1, left/ });
  await expect(thumb).toBeVisible();
  // The thumbnail really decodes (lazy images load once in view).
  await thumb.scrollIntoViewIfNeeded();
  await expect.poll(() => thumb.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBeGreaterThan(0);
  await expect(page.getByTestId('save-state')).toHaveText('All changes saved');
  await expect(page.getByTestId('counts')).toContainText('1 photo');
  await line.scrollIntoViewIfNeeded();
  await shot(page, 'inspection-line-phone', false);

  // A reading off by more than the tolerance shows up in the survey.
  await page.getByLabel('Left front (mm)').first().fill('20');
  await page.getByLabel('Right front (mm)').first().fill('27');
  await expect(page.getByTestId('survey-findings')).toContainText('Position 1, front end: left and right differ by 7.0 mm');

  // Finish: the flagged element goes on a draft parts request.
  await page.getByRole('button', { name: 'Finish inspection…' }).click();
  await expect(page.getByText(`These parts go on a draft parts request for Bean Runner`)).toBeVisible();
  // The survey is uneven but still marked serviceable: finishing waits for a conscious choice.
  const disagree = page.getByTestId('survey-disagrees');
  await expect(disagree).toContainText('finds an uneven clearance, but its verdict is “serviceable”');
  await expect(page.getByRole('button', { name: 'Finish and request the parts' })).toBeDisabled();
  await shot(page, 'inspection-survey-choice-phone', false);
  await disagree.getByRole('checkbox', { name: /Finish with the survey marked serviceable/ }).check();
  await page.getByRole('button', { name: 'Finish and request the parts' }).click();
  await expect(page.getByRole('heading', { name: /Inspection finished/ })).toBeFocused();
  await expect(page.getByTestId('replacements')).toContainText(`1 × ${partNumber}`);
  await expect(page.getByTestId('replacements')).toContainText('left hand');
  // Closed: no more inputs.
  await expect(page.getByText('Take or add a photo')).toHaveCount(0);
  await expect(page.getByLabel(/Bar wear under a straight edge/)).toHaveCount(0);
  await shot(page, 'inspection-finished-phone', false);

  await page.getByRole('link', { name: 'draft parts request' }).click();
  await expect(page).toHaveURL(/\/parts-requests\/[0-9a-f-]{36}$/);
  await expect(page.locator('main')).toContainText(partNumber);
  await shot(page, 'inspection-parts-request');

  // The printable report carries the photo and the replacement.
  await page.goBack();
  await page.getByRole('link', { name: 'Open the printable report' }).click();
  await page.setViewportSize({ width: 1280, height: 900 });
  const report = page.getByTestId('inspection-report');
  await expect(report.getByRole('heading', { name: 'Replacements requested' })).toBeVisible();
  await expect(report.getByRole('cell', { name: partNumber, exact: true })).toBeVisible();
  await expect(report.getByRole('img', { name: /Photo 1 of Position 1, left/ })).toBeVisible();
  await expect(report.getByRole('heading', { name: 'Safety before you work on the cage' })).toBeVisible();
  // The report shows both: what the readings find, and the verdict chosen.
  await expect(report.getByTestId('survey-result')).toContainText('The readings find an uneven clearance');
  await expect(report.getByTestId('survey-result')).toContainText('marked the survey serviceable although the readings are uneven');
  await shot(page, 'inspection-report');
});

test('the demo inspection shows its flagged elements and photos; history per machine; another farm cannot open it', async ({
  page,
  browser,
}) => {
  await signIn(page, 'operator', '/inspections');
  // North Quarter's newest inspection is the demo's flagged one (older ones carry its wear history).
  const row = page.getByTestId('inspection-row').filter({ hasText: 'North Quarter' }).first();
  await expect(row).toContainText('Finished');
  await shot(page, 'inspections-list');
  await row.getByRole('link', { name: 'Open' }).click();
  await expect(page.getByTestId('counts')).toContainText('Replace: 2');
  const photos = page.getByRole('img', { name: /^Photo \d of / });
  expect(await photos.count()).toBeGreaterThanOrEqual(2);
  await shot(page, 'inspection-demo');
  const url = page.url();

  await page.goto('/inspections');
  await page
    .getByRole('link', { name: /^North Quarter/ })
    .last()
    .click();
  await expect(page).toHaveURL(/\/inspections\/history\//);
  await expect(page.getByRole('heading', { name: 'Inspections of North Quarter' })).toBeVisible();

  const other = await browser.newPage();
  await signIn(other, 'operator2');
  const res = await other.goto(url);
  expect(res?.status()).toBe(404);
  await expect(other.getByRole('heading', { name: 'No such inspection' })).toBeVisible();
  await other.close();
});
