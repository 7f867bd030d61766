import { test, expect, type Page } from '@playwright/test';
import { shot, signIn } from './helpers';

// The classroom journey at projector size: build a deck of three slides, present it with the
// keyboard (and a presenter's window kept in step), compare two slides with the differences
// marked, and open the deck's share link without signing in.

test.use({ viewport: { width: 1920, height: 1080 } });

/** Waits until the page's islands (all, or those holding `within`) have hydrated. */
async function hydrated(page: Page, within?: ReturnType<Page['locator']>) {
  const islands = within ? page.locator('astro-island', { has: within }) : page.locator('astro-island');
  await expect(islands.first()).toBeAttached();
  for (const island of await islands.all()) await expect(island).not.toHaveAttribute('ssr');
}

async function addSlide(page: Page, title: string, source: { version: RegExp } | { family: string; crop: string }, notes = '') {
  const panel = page.getByTestId('add-slide');
  await panel.getByLabel('Slide title').fill(title);
  if ('version' in source) {
    await panel.getByLabel('A layout on a machine').check();
    const select = panel.getByTestId('source-version');
    const value = await select.locator('option', { hasText: source.version }).first().getAttribute('value');
    await select.selectOption(value!);
  } else {
    await panel.getByLabel('A suggested start for a crop (sample)').check();
    await panel.getByTestId('source-family').selectOption(source.family);
    await panel.getByTestId('source-crop').selectOption(source.crop);
  }
  if (notes) await panel.getByLabel(/Talking points/).fill(notes);
  const before = await page.getByTestId('slide-card').count();
  await panel.getByRole('button', { name: 'Add slide' }).click();
  await expect(page.getByTestId('slide-card')).toHaveCount(before + 1);
}

test('a trainer builds a deck, presents it by keyboard, compares two slides and shares it', async ({ page, browser }) => {
  await signIn(page, 'trainer', '/classroom');
  await page.goto('/classroom');
  await expect(page.getByRole('heading', { name: 'Classroom', level: 1 })).toBeVisible();
  await hydrated(page);
  await expect(page.getByTestId('deck-list')).toContainText('Small grains vs pulses');
  await shot(page, 'classroom-list');

  const title = `Pulses for new staff ${Date.now().toString(36)}`;
  await page.getByLabel('Title of the new deck').fill(title);
  await page.getByRole('button', { name: 'Create deck' }).click();
  await expect(page).toHaveURL(/\/classroom\/[0-9a-f-]{36}$/);
  await hydrated(page);
  await expect(page.getByLabel('Deck title')).toHaveValue(title);

  await addSlide(page, 'Wheat on North Quarter', { version: /North Quarter/ }, '- **Fine-wire** up front\n- Wide-wire at the rear');
  await addSlide(page, 'Field peas: a gentle start', { family: 'tamarack-m4', crop: 'field-peas' }, 'Round bars thresh *gently*.');
  await addSlide(page, 'Lentils on the split cage', { family: 'sedge-s6', crop: 'lentils' });
  const cards = page.getByTestId('slide-card');
  await expect(cards.nth(0)).toContainText('North Quarter');
  await expect(cards.nth(1).getByTestId('notes-preview')).toBeAttached();
  // Move the lentils slide up one place, then back.
  await cards.nth(2).getByRole('button', { name: 'Move slide 3 up' }).click();
  await expect(cards.nth(1).getByLabel('Title')).toHaveValue('Lentils on the split cage');
  await cards.nth(1).getByRole('button', { name: 'Move slide 2 down' }).click();
  await expect(cards.nth(2).getByLabel('Title')).toHaveValue('Lentils on the split cage');
  await shot(page, 'classroom-editor');
  const deckUrl = page.url();

  // Present with the keyboard.
  await page.getByTestId('present-link').click();
  await expect(page).toHaveURL(/\/present(#1)?$/);
  await hydrated(page);
  await expect(page.locator('html[data-stage-keys="ready"]')).toBeAttached();
  const counter = page.getByTestId('slide-counter');
  const stageTitle = page.getByTestId('stage-title');
  await expect(counter).toHaveText('Slide 1 of 3');
  await expect(stageTitle).toHaveText('Wheat on North Quarter');
  await expect(page.getByTestId('stage-diagram').getByTestId('cage-diagram')).toBeVisible();
  await expect(page.getByTestId('slide-facts')).toContainText('Wheat');
  await shot(page, 'present-slide-1', false);

  await page.keyboard.press('ArrowRight');
  await expect(counter).toHaveText('Slide 2 of 3');
  await expect(stageTitle).toHaveText('Field peas: a gentle start');
  await shot(page, 'present-slide-2', false);
  await page.keyboard.press('PageDown');
  await expect(counter).toHaveText('Slide 3 of 3');
  await expect(stageTitle).toHaveText('Lentils on the split cage');
  await shot(page, 'present-slide-3', false);
  await page.keyboard.press('PageDown'); // already at the end: stays
  await expect(counter).toHaveText('Slide 3 of 3');
  await page.keyboard.press('PageUp');
  await expect(counter).toHaveText('Slide 2 of 3');
  await page.keyboard.press('Space');
  await expect(counter).toHaveText('Slide 3 of 3');
  await page.keyboard.press('ArrowLeft');
  await page.keyboard.press('Home');
  await expect(counter).toHaveText('Slide 1 of 3');
  await expect(page).toHaveURL(/#1$/);

  // The overview: open with O, pick the third slide.
  await page.keyboard.press('o');
  const overview = page.getByTestId('overview');
  await expect(overview).toBeVisible();
  await expect(overview.getByRole('button')).toHaveCount(3);
  await shot(page, 'present-overview', false);
  await page.keyboard.press('Escape');
  await expect(overview).toBeHidden();
  await page.keyboard.press('o');
  await overview.getByRole('button', { name: /Lentils on the split cage/ }).click();
  await expect(counter).toHaveText('Slide 3 of 3');
  await page.keyboard.press('Home');

  // Blank the screen and bring it back (a clicker's "blank" key).
  await page.keyboard.press('b');
  await expect(page.getByTestId('blank')).toBeVisible();
  await page.keyboard.press('b');
  await expect(page.getByTestId('blank')).toBeHidden();

  // The crop path of the current slide.
  await page.keyboard.press('c');
  const path = page.getByTestId('crop-path');
  await expect(path).toBeVisible();
  await expect(path.getByTestId('illustration-label')).toHaveText('An illustration, not a simulation');
  await expect(path).toHaveAttribute('data-playing', 'yes');
  await shot(page, 'present-crop-path', false);
  await page.keyboard.press('c');
  await expect(path).toBeHidden();

  // Full screen through the Fullscreen API.
  await page.getByTestId('fullscreen').click();
  await expect.poll(() => page.evaluate(() => !!document.fullscreenElement)).toBe(true);
  await expect(page.getByTestId('fullscreen')).toHaveText(/Leave full screen/);
  await page.keyboard.press('ArrowRight'); // the button gave the keyboard back to the stage
  await expect(counter).toHaveText('Slide 2 of 3');
  await page.evaluate(() => document.exitFullscreen());
  await expect.poll(() => page.evaluate(() => !!document.fullscreenElement)).toBe(false);

  // The presenter's view in a second window, kept in step both ways.
  const [presenter] = await Promise.all([page.waitForEvent('popup'), page.keyboard.press('p')]);
  await presenter.setViewportSize({ width: 1280, height: 800 });
  await hydrated(presenter);
  await expect(presenter.getByTestId('presenter-title')).toHaveText('2. Field peas: a gentle start');
  await expect(presenter.getByTestId('presenter-notes')).toContainText('Round bars thresh gently');
  await expect(presenter.getByTestId('presenter-next')).toHaveText('Lentils on the split cage');
  await page.keyboard.press('ArrowRight');
  await expect(presenter.getByTestId('presenter-title')).toHaveText('3. Lentils on the split cage');
  await expect(presenter.getByTestId('presenter-next')).toHaveText('End of the deck');
  await presenter.keyboard.press('Home');
  await expect(counter).toHaveText('Slide 1 of 3');
  await expect(presenter.getByTestId('presenter-notes').locator('strong')).toHaveText('Fine-wire');
  await shot(presenter, 'presenter-view', false);
  await presenter.close();

  // Compare slide 1 (wheat) with slide 2 (peas).
  await page.goto(deckUrl);
  await hydrated(page);
  await page.getByLabel('Left (A)').selectOption({ label: '1. Wheat on North Quarter' });
  await page.getByLabel('Right (B)').selectOption({ label: '2. Field peas: a gentle start' });
  await page.getByTestId('compare-link').click();
  await expect(page).toHaveURL(/\/classroom\/compare\?a=slide:.*&b=slide:/);
  const table = page.getByTestId('diff-table');
  await expect(table).toBeVisible();
  const rows = table.locator('tbody tr');
  expect(await rows.count()).toBeGreaterThanOrEqual(5);
  await expect(table).toContainText('Crop');
  await expect(table).toContainText('Field peas');
  await expect(table).toContainText('Position 1, left');
  // Each differing element is marked on both diagrams.
  for (const side of ['side-A', 'side-B']) {
    const changed = page.getByTestId(side).locator('[data-place^="element:"][aria-label*="Changed"]');
    expect(await changed.count(), side).toBeGreaterThanOrEqual(4);
  }
  await expect(page.getByTestId('findings-only-a').or(page.getByTestId('findings-only-b')).first()).toBeVisible();
  await expect(page.getByTestId('metrics-table')).toContainText('Threshing aggressiveness index');
  await shot(page, 'compare-top', false);
  await shot(page, 'compare-full');

  // Share read-only and open the link without signing in.
  await page.goto(deckUrl);
  await hydrated(page);
  const share = page.getByTestId('share-panel');
  await share.getByLabel('Label (for you)').fill('Spring class');
  await share.getByRole('button', { name: 'Create link' }).click();
  const url = await share.getByTestId('share-url').textContent();
  expect(url).toMatch(/\/share\/deck\/[A-Za-z0-9_-]{43}$/);
  await expect(share.getByTestId('share-links')).toContainText('Spring class');

  const stranger = await browser.newContext({ viewport: { width: 1920, height: 1080 } });
  const anon = await stranger.newPage();
  await anon.goto(url!);
  await expect(anon).toHaveURL(url!);
  await expect(anon.getByRole('heading', { level: 1 })).toHaveText(title);
  await expect(anon.getByTestId('shared-slide')).toHaveCount(3);
  await expect(anon.getByTestId('shared-slide').first()).toContainText('Fine-wire');
  await expect(anon.getByTestId('role-label')).toHaveCount(0); // nobody is signed in
  await shot(anon, 'shared-deck');

  // Revoked: the link closes.
  await share.getByRole('button', { name: 'Revoke' }).click();
  await expect(share.getByTestId('share-links')).toContainText('Revoked');
  const gone = await anon.goto(url!);
  expect(gone?.status()).toBe(404);
  await stranger.close();
});

test('the crop path holds still for reduced motion and steps position by position', async ({ browser }) => {
  const context = await browser.newContext({ viewport: { width: 1920, height: 1080 }, reducedMotion: 'reduce' });
  const page = await context.newPage();
  await signIn(page, 'trainer', '/classroom');
  await page.goto('/classroom/compare?a=starter:tamarack-m4:wheat&b=starter:tamarack-m4:field-peas');
  const first = page.getByTestId('crop-path').first();
  await first.scrollIntoViewIfNeeded();
  await hydrated(page, first);
  await expect(first).toHaveAttribute('data-playing', 'no');
  const caption = first.getByTestId('crop-path-caption');
  await expect(caption).toContainText('Position 1');
  await first.getByRole('button', { name: 'Next position' }).click();
  await expect(caption).toContainText('Position 2');
  await first.getByTestId('crop-path-step').press('End');
  await expect(caption).toContainText('Position 4');
  await shot(page, 'crop-path-reduced-motion', false);
  // The viewer may still choose to play it.
  await first.getByTestId('crop-path-play').click();
  await expect(first).toHaveAttribute('data-playing', 'yes');
  await context.close();
});

test('the demo deck shows a wrong layout’s findings large enough for the room', async ({ page }) => {
  await signIn(page, 'trainer', '/classroom');
  await page.goto('/classroom');
  await page.getByTestId('deck-list').getByRole('link', { name: 'Small grains vs pulses' }).click();
  await expect(page.getByLabel('Deck title')).toHaveValue('Small grains vs pulses');
  await hydrated(page);
  await page.getByTestId('present-link').click();
  await expect(page).toHaveURL(/\/present/);
  await hydrated(page);
  await expect(page.locator('html[data-stage-keys="ready"]')).toBeAttached();
  await expect(page.getByTestId('slide-counter')).toHaveText('Slide 1 of 4');
  await page.keyboard.press('ArrowDown');
  await expect(page.getByTestId('slide-counter')).toHaveText('Slide 2 of 4');
  await page.keyboard.press('ArrowDown');
  await expect(page.getByTestId('slide-counter')).toHaveText('Slide 3 of 4');
  await expect(page.getByTestId('stage-title')).toHaveText('What goes wrong: the wheat cage left in for peas');
  const findings = page.getByTestId('findings');
  await expect(findings).toBeVisible();
  await expect(findings.locator('li').first()).toBeVisible();
  // The findings are pinned on the diagram too: the fine-wire places carry them in their names.
  await expect(page.getByTestId('stage-diagram').locator('[data-place="element:1:left"]')).toHaveAttribute(
    'aria-label',
    /Hurts the crop|Blocks fit/,
  );
  await shot(page, 'present-demo-wrong-layout', false);
});
