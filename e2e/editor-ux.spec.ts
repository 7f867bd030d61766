import { test, expect, type Locator, type Page } from '@playwright/test';
import { shot } from './helpers';
import { announcer, dndRegion, mouseDrag, openEditor, slot } from './editor-helpers';

/**
 * The editor as a user meets it: mouse drops land under the pointer even when the page scrolls
 * during the drag, a drop where nothing fits says so, and after a keyboard drop the focus is
 * where the selection (and the part) went.
 */

const palettePart = (page: Page, pn: string): Locator => page.getByTestId('palette').locator(`[data-part="${pn}"]`);
const centre = async (l: Locator) => {
  const b = (await l.boundingBox())!;
  return { x: b.x + b.width / 2, y: b.y + b.height / 2 };
};

test.describe('editor: mouse drops land where the pointer is', () => {
  test('with the parts list scrolled, a left cover plate lands on the left cage top and a discharge bar on row 1, position 4', async ({
    page,
  }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await openEditor(page, 'operator', 'North Quarter');
    const cover = palettePart(page, 'CW-CP-L-04');
    await cover.scrollIntoViewIfNeeded();
    expect(await page.evaluate(() => window.scrollY)).toBeGreaterThan(200);
    const target = slot(page, 'cover:2:left');
    await expect(target).toHaveAttribute('aria-label', /: empty/);
    // The cage top sits near the top of the window, where dragging scrolls the page.
    await mouseDrag(page, cover, target);
    await expect(target).toHaveAttribute('aria-label', /left cover plate, CW-CP-L-04/);
    await expect(announcer(page)).toContainText('Placed left cover plate');

    const bar = palettePart(page, 'CW-BR-DC-04');
    await bar.scrollIntoViewIfNeeded();
    const from = await centre(bar);
    await page.mouse.move(from.x, from.y);
    await page.mouse.down();
    await page.mouse.move(from.x + 14, from.y + 4, { steps: 4 });
    const to = await centre(slot(page, 'bar:1:4'));
    await page.mouse.move(to.x, to.y, { steps: 12 });
    // The highlight is on the slot under the pointer, and that is the one announced.
    await expect(dndRegion(page)).toContainText('Over rotor row 1, position 4');
    const over = page.getByTestId('drop-highlights').locator('rect[stroke-width="4"]');
    await expect(over).toHaveCount(1);
    const hb = (await over.boundingBox())!;
    const now = await centre(slot(page, 'bar:1:4'));
    expect(now.y).toBeGreaterThan(hb.y);
    expect(now.y).toBeLessThan(hb.y + hb.height);
    await page.mouse.up();
    await expect(slot(page, 'bar:1:4')).toHaveAttribute('aria-label', /discharge bar, CW-BR-DC-04/);
    await expect(slot(page, 'bar:2:4')).toHaveAttribute('aria-label', /: rasp bar, CW-BR-RS-04/);
    await expect(announcer(page)).toContainText('Placed discharge bar at rotor row 1, position 4');
  });

  test('the page scrolled with the wheel during a drag: the part still lands under the pointer', async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await openEditor(page, 'operator', 'North Quarter');
    const bar = palettePart(page, 'CW-BR-ST-04');
    await bar.scrollIntoViewIfNeeded();
    const from = await centre(bar);
    await page.mouse.move(from.x, from.y);
    await page.mouse.down();
    await page.mouse.move(from.x + 14, from.y + 4, { steps: 4 });
    const before = await page.evaluate(() => window.scrollY);
    await page.mouse.wheel(0, -150);
    await expect.poll(() => page.evaluate(() => window.scrollY)).toBeLessThan(before - 100);
    const to = await centre(slot(page, 'bar:3:2'));
    await page.mouse.move(to.x, to.y, { steps: 10 });
    await page.mouse.up();
    await expect(slot(page, 'bar:3:2')).toHaveAttribute('aria-label', /straight bar, CW-BR-ST-04/);
    for (const other of ['bar:2:2', 'bar:4:2', 'bar:3:1', 'bar:3:3'])
      await expect(slot(page, other)).not.toHaveAttribute('aria-label', /straight bar/);
  });

  test('a drop where nothing fits says so and changes nothing', async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await openEditor(page, 'operator', 'North Quarter');
    const was = await slot(page, 'element:2:left').getAttribute('aria-label');
    const cover = palettePart(page, 'CW-CP-L-04');
    await cover.scrollIntoViewIfNeeded();
    await mouseDrag(page, cover, slot(page, 'element:2:left'));
    await expect(announcer(page)).toContainText('Nothing placed. Position 2, left does not take a left cover plate');
    await expect(slot(page, 'element:2:left')).toHaveAttribute('aria-label', was!);
    await expect(page.getByTestId('save-status')).not.toContainText('Unsaved');

    // Dropped on the page beside the drawing.
    await mouseDrag(page, palettePart(page, 'CW-BR-DC-04'), page.getByRole('heading', { level: 1 }));
    await expect(announcer(page)).toContainText('Nothing placed. Not over a slot that takes the discharge bar');
    await expect(page.getByTestId('save-status')).not.toContainText('Unsaved');
  });
});

test.describe('editor: focus follows the selection after a keyboard drop', () => {
  test('carried from right position 1 to right position 3, focus is on position 3; Delete takes off what has focus', async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await openEditor(page, 'operator', 'North Quarter');
    const from = slot(page, 'element:1:right');
    const to = slot(page, 'element:3:right');
    await from.focus();
    await page.keyboard.press('Space');
    await expect(dndRegion(page)).toContainText('Picked up');
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('ArrowRight');
    await expect(dndRegion(page)).toContainText('Over position 3, right');
    await page.keyboard.press('Space');
    await expect(announcer(page)).toContainText('Swapped: fine-wire element now at position 3, right');
    await expect(to).toBeFocused();
    await expect(to).toHaveAttribute('aria-pressed', 'true');
    await expect(from).toHaveAttribute('aria-pressed', 'false');
    // Still there a moment later (nothing puts focus back on the source).
    await page.waitForTimeout(150);
    await expect(to).toBeFocused();

    await page.keyboard.press('Delete');
    await expect(announcer(page)).toContainText('Removed fine-wire element from position 3, right');
    await expect(to).toHaveAttribute('aria-label', /: empty/);
    await expect(from).toHaveAttribute('aria-label', /wide-wire element/);
  });

  test('a part carried from the palette with the keys: focus lands on the slot it went to; Escape puts it back and focus stays in the palette', async ({
    page,
  }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await openEditor(page, 'operator', 'North Quarter');
    const item = palettePart(page, 'CW-RB-L-04');
    await item.focus();
    await page.keyboard.press('Space');
    await expect(dndRegion(page)).toContainText('Picked up left-hand round-bar element');
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('ArrowRight');
    await expect(dndRegion(page)).toContainText('Over position 2, left');
    await page.keyboard.press('Space');
    const target = slot(page, 'element:2:left');
    await expect(target).toHaveAttribute('aria-label', /round-bar element/);
    await expect(target).toBeFocused();
    await expect(target).toHaveAttribute('aria-pressed', 'true');

    const other = palettePart(page, 'CW-PF-L-04');
    await other.focus();
    await page.keyboard.press('Space');
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('Escape');
    await expect(dndRegion(page)).toContainText('Put back');
    await expect(other).toBeFocused();
    await shot(page, 'editor-focus-after-drop', false);
  });
});

test.describe('editor: keyboard users reach the drawing quickly', () => {
  test('a skip link to the drawing is the second stop on the page and lands on a slot', async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await openEditor(page, 'operator', 'North Quarter');
    await page.locator('body').focus();
    await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
    await page.keyboard.press('Tab');
    await expect(page.locator(':focus')).toHaveText('Skip to content');
    await page.keyboard.press('Tab');
    const skip = page.getByRole('link', { name: 'Skip to the drawing' });
    await expect(skip).toBeFocused();
    await expect(skip).toBeVisible();
    await page.keyboard.press('Enter');
    await expect(slot(page, 'element:1:left')).toBeFocused();
    // From there the arrows walk the drawing.
    await page.keyboard.press('ArrowRight');
    await expect(slot(page, 'element:2:left')).toBeFocused();
  });

  test('the parts list is one tab stop; the arrow keys move inside it', async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await openEditor(page, 'operator', 'North Quarter');
    const list = page.getByTestId('palette-list');
    await expect(list).toHaveAttribute('role', 'listbox');
    const options = list.getByRole('option');
    const n = await options.count();
    expect(n).toBeGreaterThan(20);
    // Exactly one option is in the tab order.
    await expect(list.locator('[role="option"][tabindex="0"]')).toHaveCount(1);
    await page.getByLabel('Hand', { exact: true }).focus();
    await page.keyboard.press('Tab');
    await expect(options.first()).toBeFocused();
    await page.keyboard.press('ArrowDown');
    await page.keyboard.press('ArrowDown');
    await expect(options.nth(2)).toBeFocused();
    await expect(options.nth(2)).toHaveAttribute('aria-selected', 'true');
    await page.keyboard.press('End');
    await expect(options.last()).toBeFocused();
    await page.keyboard.press('Tab');
    // One Tab leaves the whole list.
    expect(await page.evaluate(() => !!document.activeElement?.closest('[role="listbox"]'))).toBe(false);
    await page.keyboard.press('Shift+Tab');
    await expect(options.last()).toBeFocused();
    await page.keyboard.press('Home');
    await expect(options.first()).toBeFocused();

    // Counted from the top of the page, the drawing is a few Tabs away even without the skip link.
    await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
    let presses = 0;
    while (presses < 60) {
      await page.keyboard.press('Tab');
      presses++;
      if (await page.evaluate(() => !!document.activeElement?.closest('[data-testid="diagram-pane"] [data-place]'))) break;
    }
    expect(presses).toBeLessThanOrEqual(25);
  });
});

test.describe('editor: words a farmer reads without help', () => {
  test('stock badges say where the parts are; no internal source marker reaches the screen', async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await openEditor(page, 'operator', 'North Quarter');
    await expect(palettePart(page, 'CW-FW-R-04').getByTestId('stock-badge')).toHaveText('1 on the farm · 2 at the dealer');
    await expect(palettePart(page, 'CW-WW-L-04').getByTestId('stock-badge')).toHaveText('4 at the dealer');
    await expect(palettePart(page, 'CW-SW-R-04').getByTestId('stock-badge')).toHaveText('to order');
    // Corn's advice has a value kept without a published source: said in words, never as a marker.
    await page.getByLabel('Crop').selectOption('corn');
    await expect(page.getByTestId('cage-editor')).toContainText('Clearance about the cob diameter');
    expect(await page.locator('body').innerText()).not.toMatch(/\[[a-z]+\]/i);
  });
});
