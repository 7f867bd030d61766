import { test, expect, type Page } from '@playwright/test';
import { shot } from './helpers';
import { announcer, openEditor, slot } from './editor-helpers';

/** The editor on a phone (390 CSS px): drawing first and legible, parts in a sheet, tap then tap. */

test.use({ viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true });

/** Visible words in the editor smaller than `min` CSS px (SVG text measured at the drawing's scale). */
async function smallText(page: Page, min: number) {
  return page.getByTestId('cage-editor').evaluate((root, min) => {
    const out: string[] = [];
    const walker = document.createTreeWalker(root, NodeFilter.SHOW_TEXT);
    for (let n = walker.nextNode(); n; n = walker.nextNode()) {
      const text = n.textContent?.trim();
      const el = n.parentElement ?? (n.parentNode as Element | null);
      if (!text || !el) continue;
      const box = el.getBoundingClientRect();
      if (box.width < 2 || box.height < 2) continue; // screen-reader-only and hidden words
      if (el.closest('[hidden], .sr-only, [aria-hidden="true"] .sr-only')) continue;
      const style = getComputedStyle(el);
      if (style.visibility === 'hidden' || style.display === 'none') continue;
      let px = parseFloat(style.fontSize);
      const svg = el.closest('svg');
      if (svg && svg.viewBox.baseVal && svg.viewBox.baseVal.width) px *= svg.getBoundingClientRect().width / svg.viewBox.baseVal.width;
      if (px < min - 0.01) out.push(`${text.slice(0, 30)} (${px.toFixed(1)} px)`);
    }
    return out;
  }, min);
}

test.describe('editor on a phone', () => {
  test('the drawing comes first and is legible; the page does not scroll sideways, the drawing says it does', async ({ page }) => {
    await openEditor(page, 'operator', 'North Quarter');
    const pane = (await page.getByTestId('diagram-pane').boundingBox())!;
    const findings = (await page.getByTestId('findings').boundingBox())!;
    expect(pane.y).toBeLessThan(findings.y);
    // The parts are in a sheet, not 21 entries to scroll past.
    await expect(page.getByTestId('palette')).toBeHidden();
    await expect(page.getByTestId('parts-sheet-open')).toBeVisible();
    expect(pane.y).toBeLessThan(844);
    expect(await smallText(page, 11)).toEqual([]);
    const widths = await page.evaluate(() => ({ sw: document.documentElement.scrollWidth, cw: document.documentElement.clientWidth }));
    expect(widths.sw).toBeLessThanOrEqual(widths.cw);
    const scroller = page.getByTestId('drawing-scroll');
    expect(await scroller.evaluate((el) => el.scrollWidth > el.clientWidth)).toBe(true);
    await expect(page.getByTestId('drawing-scroll-hint')).toBeVisible();
    await shot(page, 'editor-phone-390', false);
    await shot(page, 'editor-phone-390-full');
  });

  test('tap a part in the sheet, then tap a slot: the part is placed there', async ({ page }) => {
    await openEditor(page, 'operator', 'North Quarter');
    await page.getByTestId('parts-sheet-open').tap();
    const sheet = page.getByTestId('palette');
    await expect(sheet).toBeVisible();
    expect(await smallText(page, 11)).toEqual([]);
    await shot(page, 'editor-phone-390-sheet', false);
    await sheet.locator('[data-part="CW-RB-L-04"]').tap();
    await expect(sheet).toBeHidden();
    await expect(page.getByTestId('chosen-part')).toContainText('Round-bar');
    await expect(announcer(page)).toContainText('Chosen: left-hand round-bar element');
    // A slot that does not take it says so and keeps the choice.
    await slot(page, 'bar:1:1').tap();
    await expect(announcer(page)).toContainText('does not take a round-bar element');
    await expect(page.getByTestId('chosen-part')).toBeVisible();
    await slot(page, 'element:4:left').tap();
    await expect(slot(page, 'element:4:left')).toHaveAttribute('aria-label', /left-hand round-bar element, CW-RB-L-04/);
    await expect(announcer(page)).toContainText('Placed round-bar element at position 4, left');
    await expect(page.getByTestId('chosen-part')).toHaveCount(0);
    await expect(page.getByTestId('save-status')).toContainText('Unsaved changes');
    await shot(page, 'editor-phone-390-placed', false);
  });
});

test('desktop at 1440: the palette is beside the drawing, no sheet button', async ({ browser }) => {
  const context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
  const page = await context.newPage();
  await openEditor(page, 'operator', 'North Quarter');
  await expect(page.getByTestId('palette')).toBeVisible();
  await expect(page.getByTestId('parts-sheet-open')).toBeHidden();
  await expect(page.getByTestId('drawing-scroll-hint')).toBeHidden();
  // Click a part, then click a slot: the same choice works with a mouse.
  await page.getByTestId('palette').locator('[data-part="CW-PF-R-04"]').click();
  await slot(page, 'element:3:right').click();
  await expect(slot(page, 'element:3:right')).toHaveAttribute('aria-label', /right-hand perforated plate element/);
  await shot(page, 'editor-desktop-1440', false);
  await context.close();
});
