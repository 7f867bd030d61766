import { expect, test } from '@playwright/test';
import { announcer, dndRegion, openEditor, slot } from './editor-helpers';

// The frame that shows a drop holds the part and its findings and nothing that can wait: the
// palette hint, the slot details, the computed figures and the editor's own announcement follow
// in a later commit, and keyboard focus moves to the dropped part after that frame is painted
// (not in its animation frame, where restyling for focus would delay the paint).
test('a keyboard drop commits the part and its findings first; hint, details, words and focus follow after the frame', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 900 });
  await openEditor(page, 'operator', 'North Quarter');
  const item = page.getByTestId('palette').locator('[data-part="CW-WW-L-04"]');
  await item.focus();
  await page.keyboard.press('Space');
  await expect(dndRegion(page)).toContainText('Picked up');
  for (const [key, where] of [
    ['ArrowRight', 'position 1, left'],
    ['ArrowRight', 'position 2, left'],
    ['ArrowRight', 'position 3, left'],
    ['ArrowDown', 'position 3, right'],
  ] as const) {
    await page.keyboard.press(key);
    await expect(dndRegion(page)).toContainText(`Over ${where},`);
  }

  // What the document holds when the finding first appears in it (the drop's commit), and in an
  // animation frame registered then (the frame that paints it, before its paint).
  await page.evaluate(() => {
    const w = window as unknown as { __frame: Record<string, unknown> };
    const list = document.querySelector('[data-testid="findings"]')!;
    const state = () => ({
      finding: !!list.querySelector('[data-code="FIT_HAND_MISMATCH"]'),
      slotLabel: document.querySelector('[data-testid="diagram-pane"] [data-place="element:3:right"]')?.getAttribute('aria-label') ?? '',
      hint: document.querySelector('[data-testid="palette-hint"]')?.textContent ?? '',
      announcer: document.querySelector('[data-testid="editor-announcer"]')?.textContent ?? '',
      details: document.querySelector('[data-testid="slot-details"]')?.getAttribute('data-detail-of') ?? null,
      focused: document.activeElement?.getAttribute('data-place') ?? document.activeElement?.getAttribute('data-part') ?? null,
    });
    w.__frame = { before: state() };
    const obs = new MutationObserver(() => {
      if (!list.querySelector('[data-code="FIT_HAND_MISMATCH"]')) return;
      obs.disconnect();
      w.__frame.commit = state();
      requestAnimationFrame(() => (w.__frame.frame = state()));
    });
    obs.observe(list, { subtree: true, childList: true, characterData: true });
  });
  await page.keyboard.press('Space');
  await expect.poll(() => page.evaluate(() => !!(window as unknown as { __frame: { frame?: unknown } }).__frame.frame)).toBe(true);
  const f = await page.evaluate(() => (window as unknown as { __frame: Record<string, Record<string, unknown>> }).__frame);

  // The drop's commit: the part and its finding are there, in the list and on the slot.
  expect(f.commit!.finding).toBe(true);
  expect(f.commit!.slotLabel).toMatch(/Blocks fit: Left-hand element in the right half/);
  // What can wait has not changed in that commit.
  expect(f.commit!.hint).toBe(f.before!.hint);
  expect(f.commit!.announcer).toBe(f.before!.announcer);
  expect(f.commit!.details).toBe(f.before!.details);
  // Focus is still where the part was picked up while the frame is made.
  expect(f.frame!.focused).toBe('CW-WW-L-04');

  // Then everything follows.
  const target = slot(page, 'element:3:right');
  await expect(target).toBeFocused();
  await expect(announcer(page)).toContainText('Placed wide-wire element at position 3, right');
  await expect(page.getByTestId('slot-details')).toHaveAttribute('data-detail-of', 'element:3:right');
  await expect(page.getByTestId('palette-hint')).toContainText('Click a part to put it at position 3, right');
});
