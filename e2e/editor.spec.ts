import { test, expect } from '@playwright/test';
import { shot, signIn } from './helpers';
import { announcer, findingCount, mouseDrag, openEditor, slot } from './editor-helpers';

/**
 * The cage editor: placing parts with the mouse and with the keyboard only, the live region and
 * the findings following every change, undo, the hand finding pinned to its place, saving, and
 * a stale save meeting the conflict dialog.
 */

test.describe('cage editor', () => {
  test('desktop: the editor shows the layout, its findings and settings', async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await openEditor(page, 'operator', 'North Quarter');
    await expect(page.getByRole('heading', { level: 1 })).toContainText('wheat setup');
    // Every half-position of the four-position cage is drawn, with its hand in its name.
    for (const p of [1, 2, 3, 4])
      for (const side of ['left', 'right'])
        await expect(slot(page, `element:${p}:${side}`)).toHaveAttribute('aria-label', new RegExp(`^Position ${p}, ${side}: `));
    await expect(slot(page, 'element:1:left')).toHaveAttribute('aria-label', /left-hand fine-wire element/);
    await expect(page.getByTestId('tip-speed')).toContainText('m/s');
    // Pointing at a slot shows its part, opening and how the crop's kernel passes.
    await slot(page, 'element:1:left').hover();
    const details = page.getByTestId('slot-details');
    await expect(details).toContainText('Position 1, left: left-hand fine-wire element');
    await expect(details).toContainText('opening 5.0 mm × 25.0 mm · open area 38 %');
    await expect(details).toContainText(
      /Wheat kernels pass by their smallest size \([\d.]+ mm\); the larger ones \(about [\d.]+ mm\) pass with [\d.]+ mm to spare/,
    );
    await page.mouse.move(5, 5);
    await shot(page, 'editor-desktop', false);
    await shot(page, 'editor-desktop-full');
  });

  test('tablet: the drawing comes first, palette and settings below', async ({ page }) => {
    await page.setViewportSize({ width: 820, height: 1180 });
    await openEditor(page, 'operator', 'North Quarter');
    const diagram = (await page.getByTestId('diagram-pane').boundingBox())!;
    const palette = (await page.getByTestId('palette').boundingBox())!;
    expect(diagram.y).toBeLessThan(palette.y);
    expect(diagram.width).toBeGreaterThan(700);
    await shot(page, 'editor-tablet', false);
    await shot(page, 'editor-tablet-full');
  });

  test('mouse: drag a part from the palette onto a half-position; findings follow; undo restores', async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await openEditor(page, 'operator2', 'Bean Runner');
    const before = await findingCount(page);
    const target = slot(page, 'element:1:right');
    const was = (await target.getAttribute('aria-label'))!;
    expect(was).not.toContain('fine-wire');

    await page.getByLabel('Type', { exact: true }).selectOption('fine-wire');
    await page.getByLabel('Hand', { exact: true }).selectOption('right');
    const item = page.getByTestId('palette').locator('[data-part="CW-FW-R-04"]');
    await mouseDrag(page, item, target);

    await expect(target).toHaveAttribute('aria-label', /right-hand fine-wire element, CW-FW-R-04/);
    await expect(announcer(page)).toContainText('Placed fine-wire element at position 1, right');
    // Fine wires in soybeans: the kernel does not pass and the element rubs too hard.
    await expect(announcer(page)).toContainText('Hurts the crop');
    await expect(target).toHaveAttribute('aria-label', /Hurts the crop: /);
    await expect(page.getByTestId('findings').locator('[data-code="CROP_AGGRESSIVE_FRAGILE"]')).toContainText('position 1, right');
    expect(await findingCount(page)).toBeGreaterThan(before);
    await expect(page.getByTestId('save-status')).toContainText('Unsaved changes');
    await shot(page, 'editor-after-mouse-drop', false);

    await page.getByRole('button', { name: 'Undo' }).click();
    await expect(target).toHaveAttribute('aria-label', was);
    await expect(announcer(page)).toContainText('Undone');
    expect(await findingCount(page)).toBe(before);
    await expect(page.getByTestId('save-status')).not.toContainText('Unsaved');

    await page.keyboard.press('Control+Shift+Z');
    await expect(target).toHaveAttribute('aria-label', /CW-FW-R-04/);
  });

  test('keyboard only: Space, arrows, Space places a left-hand element on a right half and the hand finding shows there', async ({
    page,
  }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await openEditor(page, 'operator', 'North Quarter');
    await page.getByLabel('Search parts').fill('CW-WW-L-04');
    const item = page.getByTestId('palette').locator('[data-part="CW-WW-L-04"]');
    await expect(item).toHaveCount(1);
    await item.focus();
    await page.keyboard.press('Space');
    await expect(page.locator('[id^="DndLiveRegion"]')).toContainText('Picked up left-hand wide-wire element');
    // Right: the first element slot (position 1, left), then along the rotor to position 3;
    // Down: the right half under it.
    await page.keyboard.press('ArrowRight');
    await expect(page.locator('[id^="DndLiveRegion"]')).toContainText('Over position 1, left');
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('ArrowRight');
    await expect(page.locator('[id^="DndLiveRegion"]')).toContainText('Over position 3, left');
    await page.keyboard.press('ArrowDown');
    await expect(page.locator('[id^="DndLiveRegion"]')).toContainText('Over position 3, right');
    await page.keyboard.press('Space');

    const target = slot(page, 'element:3:right');
    await expect(announcer(page)).toContainText('Placed wide-wire element at position 3, right');
    await expect(announcer(page)).toContainText('Blocks fit: Left-hand element in the right half');
    await expect(target).toHaveAttribute('aria-label', /Blocks fit: Left-hand element in the right half/);
    const finding = page.getByTestId('findings').locator('[data-code="FIT_HAND_MISMATCH"]');
    await expect(finding).toContainText('position 3, right');

    // Choosing the finding puts focus on its place in the drawing.
    await finding.click();
    await expect(target).toBeFocused();
    await expect(finding).toContainText('Use the right-hand version');
    await shot(page, 'editor-hand-finding', false);

    // Keyboard only from the drawing: Delete takes it off, Ctrl+Z puts it back.
    await page.keyboard.press('Delete');
    await expect(announcer(page)).toContainText('Removed wide-wire element from position 3, right');
    await expect(target).toHaveAttribute('aria-label', /: empty/);
    await page.keyboard.press('Control+z');
    await expect(target).toHaveAttribute('aria-label', /Blocks fit: Left-hand element/);
  });

  test('keyboard: move a placed part along the drawing swaps it with its neighbour', async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await openEditor(page, 'operator', 'North Quarter');
    const from = slot(page, 'element:2:left');
    const to = slot(page, 'element:3:left');
    await from.focus();
    // Quick keys: the arrow may come before dnd-kit listens for keys; the editor passes it on.
    await page.keyboard.press('Space');
    await page.keyboard.press('ArrowRight');
    await expect(page.locator('[id^="DndLiveRegion"]')).toContainText('Over position 3, left, holding a wide-wire element');
    await page.keyboard.press('Space');
    await expect(announcer(page)).toContainText(
      'Swapped: fine-wire element now at position 3, left; wide-wire element now at position 2, left',
    );
    await expect(to).toHaveAttribute('aria-label', /fine-wire element/);
    await expect(from).toHaveAttribute('aria-label', /wide-wire element/);

    // Leaving with the swap unsaved asks first (the browser's own question).
    await expect(page.getByTestId('save-status')).toContainText('Unsaved changes');
    const asked = new Promise<string>((resolve) => page.once('dialog', (d) => void d.dismiss().then(() => resolve(d.type()))));
    await page.close({ runBeforeUnload: true });
    expect(await asked).toBe('beforeunload');
  });

  test('mouse: a placed part dragged onto the palette comes off, and the empty half is a finding', async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await openEditor(page, 'operator2', 'Bean Runner');
    const from = slot(page, 'element:4:right');
    await mouseDrag(page, from, page.getByTestId('palette').getByRole('heading', { name: 'Parts' }));
    await expect(from).toHaveAttribute('aria-label', /: empty\. Blocks fit: Nothing at position 4, right/);
    await expect(announcer(page)).toContainText('Removed');
    await expect(page.getByTestId('findings').locator('[data-code="FIT_EMPTY_POSITION"]')).toContainText('position 4, right');
  });

  test('settings: rotor speed updates tip speed and findings; units switch to inches and is kept', async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await openEditor(page, 'operator', 'North Quarter');
    const rpm = page.getByLabel('Rotor speed');
    const tip = await page.getByTestId('tip-speed').innerText();
    await rpm.fill('400');
    await rpm.press('Enter');
    await expect(page.getByTestId('tip-speed')).not.toHaveText(tip);
    await expect(page.getByTestId('findings').locator('[data-code="CROP_RPM_OUTSIDE_WINDOW"]')).toBeVisible();
    await expect(page.getByText('Below the window')).toBeVisible();

    await page.getByRole('radio', { name: 'in (imperial)' }).check({ force: true });
    await expect(page.getByLabel('Concave clearance')).toHaveValue(/^0\.\d\d$/);
    await expect(slot(page, 'element:1:left')).toContainText(' in');
    // The choice is stored for the user.
    await expect.poll(async () => (await (await page.request.get('/api/me')).json()).unitSystem).toBe('imperial');
    await page.getByRole('radio', { name: 'mm (metric)' }).check({ force: true });
    await expect.poll(async () => (await (await page.request.get('/api/me')).json()).unitSystem).toBe('metric');
  });

  test('save, then reload: the same layout comes back as the next version', async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    const { layoutId } = await openEditor(page, 'operator', 'North Quarter');
    const start = (await (await page.request.get(`/api/layouts/${layoutId}`)).json()).layout.currentVersion as number;
    await page.getByLabel('Type', { exact: true }).selectOption('round-bar');
    await page.getByLabel('Hand', { exact: true }).selectOption('left');
    await mouseDrag(page, page.getByTestId('palette').locator('[data-part="CW-RB-L-04"]'), slot(page, 'element:4:left'));
    await expect(slot(page, 'element:4:left')).toHaveAttribute('aria-label', /round-bar element/);
    await page.getByLabel('Vane setting').selectOption('slow');
    await page.getByTestId('save-note').fill('Round bar at the rear, slower vanes');
    await page.getByRole('button', { name: 'Save version' }).click();
    await expect(page.getByTestId('save-status')).toContainText(`Saved · version ${start + 1}`);
    await expect(announcer(page)).toContainText(`Saved as version ${start + 1}`);

    await page.reload();
    await expect(page.locator('astro-island[ssr]')).toHaveCount(0);
    await expect(slot(page, 'element:4:left')).toHaveAttribute('aria-label', /left-hand round-bar element, CW-RB-L-04/);
    await expect(page.getByLabel('Vane setting')).toHaveValue('slow');
    await expect(page.getByTestId('save-status')).toContainText(`Version ${start + 1}`);
    const saved = await (await page.request.get(`/api/layouts/${layoutId}`)).json();
    expect(saved.current.note).toBe('Round bar at the rear, slower vanes');
    expect(saved.current.body.elements).toContainEqual({ position: 4, side: 'left', partNumber: 'CW-RB-L-04' });
  });

  test('a stale save shows the newer version; load it (edits one Undo away) or save a copy', async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    const { layoutId, machineId } = await openEditor(page, 'operator2', 'Bean Runner');
    // Someone else saves meanwhile.
    const cur = await (await page.request.get(`/api/layouts/${layoutId}`)).json();
    const theirs = structuredClone(cur.current.body);
    theirs.rotorRpm = theirs.rotorRpm + 20;
    const put = await page.request.put(`/api/layouts/${layoutId}`, {
      data: { baseVersion: cur.layout.currentVersion, body: theirs, note: 'Changed elsewhere' },
    });
    expect(put.status()).toBe(201);

    // Here: an edit, then save (Bean Runner's vanes are bolt-set: slow, medium or fast).
    expect(theirs.vaneSetting).not.toBe('slow');
    await page.getByLabel('Vane setting').selectOption('slow');
    await page.getByRole('button', { name: 'Save version' }).click();
    const dialog = page.getByTestId('conflict-dialog');
    await expect(dialog).toBeVisible();
    await expect(dialog).toContainText(`Version ${cur.layout.currentVersion + 1} was saved`);
    await expect(dialog).toContainText('Changed elsewhere');
    await expect(dialog.getByTestId('cage-diagram')).toBeVisible();
    await shot(page, 'editor-conflict', false);

    // Load theirs: their speed shows, and Undo brings our vane setting back.
    await dialog.getByRole('button', { name: /Load version/ }).click();
    await expect(dialog).toBeHidden();
    await expect(page.getByLabel('Rotor speed')).toHaveValue(String(theirs.rotorRpm));
    await expect(page.getByLabel('Vane setting')).toHaveValue(theirs.vaneSetting);
    await page.getByRole('button', { name: 'Undo' }).click();
    await expect(page.getByLabel('Vane setting')).toHaveValue('slow');

    // Someone saves again; this time keep ours as a copy.
    const again = await (await page.request.get(`/api/layouts/${layoutId}`)).json();
    const put2 = await page.request.put(`/api/layouts/${layoutId}`, {
      data: { baseVersion: again.layout.currentVersion, body: { ...again.current.body, clearanceMm: 21 }, note: 'Again' },
    });
    expect(put2.status()).toBe(201);
    await page.getByRole('button', { name: 'Save version' }).click();
    await expect(dialog).toBeVisible();
    await dialog.getByLabel('Name of the new layout').fill('Slow vanes trial');
    await dialog.getByRole('button', { name: 'Save as a new layout' }).click();
    await expect(page).toHaveURL(new RegExp(`/machines/${machineId}/layouts/(?!${layoutId})[0-9a-f-]{36}$`));
    await expect(page.getByRole('heading', { level: 1 })).toHaveText('Slow vanes trial');
    await expect(page.getByLabel('Vane setting')).toHaveValue('slow');
  });

  test('trainer sees the layout read only', async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await openEditor(page, 'trainer', 'Creekside');
    await expect(page.getByText('Read only').first()).toBeVisible();
    await expect(page.getByRole('button', { name: 'Save version' })).toHaveCount(0);
    await expect(page.getByLabel('Crop')).toBeDisabled();
    await expect(page.getByTestId('palette').locator('[data-part]').first()).toBeDisabled();
  });

  test('another organisation’s layout is not found', async ({ page }) => {
    const { machineId, layoutId } = await openEditor(page, 'operator2', 'Creekside');
    await page.getByRole('link', { name: 'Sign out' }).click();
    await page.getByRole('button', { name: 'Sign out' }).click();
    await signIn(page, 'operator');
    const res = await page.goto(`/machines/${machineId}/layouts/${layoutId}`);
    expect(res!.status()).toBe(404);
    await expect(page.getByRole('heading', { name: 'Layout not found' })).toBeVisible();
  });
});
