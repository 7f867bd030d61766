import { test, expect, type Page } from '@playwright/test';
import { shot, signIn } from './helpers';

/**
 * A technician adds a customer's machine, starts a layout, saves two more versions, compares
 * them, shares one, and the link opens for someone with no session — also with JavaScript off.
 */

async function saveVersion(page: Page, layoutId: string, change: (body: any) => void, note: string) {
  const cur = await page.request.get(`/api/layouts/${layoutId}`);
  expect(cur.status()).toBe(200);
  const { layout, current } = await cur.json();
  const body = structuredClone(current.body);
  change(body);
  const res = await page.request.put(`/api/layouts/${layoutId}`, { data: { baseVersion: layout.currentVersion, body, note } });
  expect(res.status()).toBe(201);
}

test('technician: machine → versions → compare → share → opens signed out, also without JavaScript', async ({ page, browser, baseURL }) => {
  const serial = `HB-E2E-${Date.now().toString(36).toUpperCase()}`;
  await signIn(page, 'technician', '/machines');

  // The fleet table, filled by the API.
  await page.goto('/machines');
  const table = page.getByTestId('machines-table');
  await expect(table.getByRole('link', { name: 'Creekside' })).toBeVisible();
  await expect(page.getByTestId('machines-count')).toContainText('machines');
  await shot(page, 'fleet-machines-table');

  // Sort by serial, descending, then filter.
  await table.getByRole('button', { name: /Serial/ }).click();
  await expect(page).toHaveURL(/sort=serial/);
  await table.getByRole('button', { name: /Serial/ }).click();
  await expect(page).toHaveURL(/sort=-serial/);
  await page.getByLabel('Search').fill('bean run');
  await expect(table.locator('tbody tr')).toHaveCount(1);
  await expect(table.getByRole('link', { name: 'Bean Runner' })).toBeVisible();

  // Add a machine; a blank name is refused first, naming the field.
  await page.getByRole('link', { name: 'Add a machine' }).click();
  const form = page.getByTestId('machine-form');
  await form.getByLabel('Farm').selectOption({ label: 'Haldane Brothers' });
  await form.getByLabel('Serial number').fill(serial);
  await form.getByLabel('Machine family').selectOption('tamarack-m4');
  await form.getByRole('button', { name: 'Add machine' }).click();
  await expect(page.getByRole('alert')).toContainText('machine name');
  await expect(page.locator('#nickname-error')).toHaveText('give the machine a name');
  await shot(page, 'fleet-new-machine-error');
  await page.getByTestId('machine-form').getByLabel('Machine name').fill('Ridge Runner');
  await page.getByTestId('machine-form').getByRole('radio', { name: 'Slim drum' }).check();
  await page.getByTestId('machine-form').getByRole('radio', { name: 'Powered' }).check();
  await page.getByTestId('machine-form').getByRole('button', { name: 'Add machine' }).click();
  await expect(page.getByTestId('machine-heading')).toHaveText('Ridge Runner');
  await expect(page.getByRole('status')).toContainText('Machine added');
  const machineUrl = new URL(page.url()).pathname;

  // Start a layout for wheat; it opens in the editor page.
  const start = page.getByTestId('new-layout-form');
  await start.getByLabel('Name').fill('Wheat plan');
  await start.getByLabel('Crop').selectOption('wheat');
  await start.getByRole('button', { name: 'Start layout' }).click();
  await expect(page).toHaveURL(/\/layouts\/[0-9a-f-]{36}$/);
  const layoutId = page.url().split('/').pop()!;

  // Two more versions, saved through the API with the technician's session.
  await saveVersion(page, layoutId, (b) => (b.rotorRpm = 700), 'Slower rotor for tough straw');
  await saveVersion(
    page,
    layoutId,
    (b) => {
      const e = b.elements.find((x: any) => x.position === 2 && x.side === 'right');
      e.partNumber = 'CW-WW-R-04';
      b.vaneSetting = 'slow';
    },
    'Wide-wire right in position 2',
  );

  // The machine page lists the layout and the activity.
  await page.goto(machineUrl);
  await expect(page.getByTestId('layouts-table')).toContainText('Wheat plan');
  await expect(page.getByTestId('activity')).toContainText('saved “Wheat plan” as version 3');
  await shot(page, 'fleet-machine-detail');

  // History: three versions with who and the notes.
  await page.goto(`${machineUrl}/layouts/${layoutId}/history`);
  const versions = page.getByTestId('versions-table');
  await expect(versions.locator('tbody tr')).toHaveCount(3);
  await expect(versions).toContainText('Tomas Reyes');
  await expect(versions).toContainText('Wide-wire right in position 2');
  await shot(page, 'fleet-history');

  // Compare version 1 with version 3.
  const compare = page.getByTestId('compare-form');
  await compare.getByLabel('Compare version').fill('1');
  await compare.getByLabel('with version').fill('3');
  await compare.getByRole('button', { name: 'Compare' }).click();
  await expect(page).toHaveURL(/compare\?a=1&b=3/);
  const diffs = page.getByTestId('differences');
  await expect(diffs).toContainText('Position 2, right: CW-FW-R-04 → CW-WW-R-04');
  await expect(diffs).toContainText('Rotor speed (rpm)');
  await expect(diffs).toContainText('Vane setting: medium → slow');
  // The changed half-position is marked in both drawings.
  for (const side of ['version-a', 'version-b']) {
    await expect(page.getByTestId(side).locator('[data-place="element:2:right"]')).toHaveAttribute('aria-label', /Changed/);
  }
  await shot(page, 'fleet-compare');

  // Share version 2 for a week.
  await page.goto(`${machineUrl}/layouts/${layoutId}/share`);
  const share = page.getByTestId('share-form');
  await share.getByLabel('Version').fill('2');
  await share.getByLabel('Label (optional)').fill('Harvest crew');
  await share.getByLabel('Valid for').selectOption('7');
  await share.getByRole('button', { name: 'Make share link' }).click();
  const created = page.getByTestId('new-link');
  await expect(created).toBeVisible();
  await expect(created.getByRole('img', { name: 'QR code of the share link' }).locator('svg')).toBeVisible();
  const url = await page.getByTestId('share-url').inputValue();
  expect(url).toMatch(/\/share\/[A-Za-z0-9_-]{43}$/);
  await expect(page.getByTestId('links-table')).toContainText('Harvest crew');
  await shot(page, 'fleet-share-created');

  // A fresh browser context: no session, no cookies.
  const guest = await browser.newContext({ baseURL });
  const visitor = await guest.newPage();
  const scripts: string[] = [];
  visitor.on('request', (r) => {
    if (r.resourceType() === 'script') scripts.push(r.url());
  });
  const res = await visitor.goto(url);
  expect(res!.status()).toBe(200);
  await expect(visitor.getByRole('heading', { level: 1 })).toHaveText('Wheat plan');
  await expect(visitor.getByTestId('share-sheet')).toContainText('Version 2');
  await expect(visitor.getByTestId('share-sheet')).toContainText('700 rpm');
  await expect(visitor.locator('[data-place="element:1:left"]').filter({ visible: true })).toHaveCount(1);
  await expect(visitor.getByRole('heading', { name: 'Safety before you work on the cage' })).toBeVisible();
  // No script on the share page, so no Print button: the page says how to print.
  await expect(visitor.getByTestId('print-hint')).toBeVisible();
  await expect(visitor.getByRole('link', { name: 'Sign out' })).toHaveCount(0);
  expect(scripts).toEqual([]);
  expect(await guest.cookies()).toEqual([]);
  await shot(visitor, 'fleet-share-public');
  await visitor.setViewportSize({ width: 390, height: 844 });
  await expect(visitor.getByRole('region', { name: 'Cage diagram, scrolls sideways' })).toBeVisible();
  await shot(visitor, 'fleet-share-phone');
  await visitor.setViewportSize({ width: 794, height: 1123 });
  await visitor.emulateMedia({ media: 'print' });
  await expect(visitor.getByTestId('print-hint')).toBeHidden();
  await shot(visitor, 'fleet-share-print');
  await guest.close();

  // JavaScript off: still the whole sheet, diagram included.
  const noJs = await browser.newContext({ baseURL, javaScriptEnabled: false });
  const plain = await noJs.newPage();
  expect((await plain.goto(url))!.status()).toBe(200);
  await expect(plain.locator('svg [data-place="element:2:right"]').filter({ visible: true })).toHaveCount(1);
  await expect(plain.getByRole('rowheader', { name: 'Rotor tip speed' })).toBeVisible();
  await expect(plain.getByRole('heading', { name: 'Parts list' })).toBeVisible();
  await shot(plain, 'fleet-share-no-js');
  await noJs.close();

  // Revoke it; the guest now gets "not found".
  await page
    .getByTestId('links-table')
    .getByRole('button', { name: /Revoke link Harvest crew/ })
    .click();
  await expect(page.getByRole('status')).toContainText('Link revoked');
  const after = await browser.newContext({ baseURL });
  const gone = await after.newPage();
  expect((await gone.goto(url))!.status()).toBe(404);
  await expect(gone.getByRole('heading', { name: 'Link not found' })).toBeVisible();
  await after.close();
});

test('a dealer administrator adds a customer farm from the organisations page; a blank name is refused', async ({ page }) => {
  await signIn(page, 'dealerAdmin', '/orgs');
  await page.goto('/machines');
  await page.getByRole('link', { name: 'Organisations' }).click();
  await expect(page.getByTestId('orgs-table')).toContainText('Larkspur Farms');
  const form = page.getByTestId('org-form');
  await form.getByRole('button', { name: 'Add farm' }).click();
  await expect(page.getByRole('alert')).toContainText('name:');
  await page.getByTestId('org-form').getByLabel('Farm name').fill('Wrenfield Acres');
  await page.getByTestId('org-form').getByRole('button', { name: 'Add farm' }).click();
  await expect(page.getByRole('status')).toContainText('Wrenfield Acres');
  await expect(page.getByTestId('orgs-table')).toContainText('Wrenfield Acres');
  await shot(page, 'fleet-orgs');
});

test('a trainer reads machines but gets a clear refusal on the add form', async ({ page }) => {
  await signIn(page, 'trainer', '/machines');
  await page.goto('/machines');
  await expect(page.getByTestId('machines-table').getByRole('link', { name: 'Creekside' })).toBeVisible();
  await expect(page.getByRole('link', { name: 'Add a machine' })).toHaveCount(0);
  const res = await page.goto('/machines/new');
  expect(res!.status()).toBe(403);
  await expect(page.getByRole('alert')).toContainText('Not available to your role');
});

test('an operator of one farm gets "not found" for another farm’s machine page', async ({ page }) => {
  await signIn(page, 'operator2', '/machines');
  const res = await page.request.get('/api/machines?q=Creekside');
  const creekside = (await res.json()).items[0];
  await page.context().clearCookies();
  await signIn(page, 'operator', '/');
  const visit = await page.goto(`/machines/${creekside.id}`);
  expect(visit!.status()).toBe(404);
  await expect(page.getByRole('heading', { name: 'Machine not found' })).toBeVisible();
  // Her own machine shows what is installed, drawn on the server.
  await page.goto('/machines');
  await page.getByTestId('machines-table').getByRole('link', { name: 'North Quarter' }).click();
  await expect(page.getByRole('heading', { name: 'Installed now' })).toBeVisible();
  await expect(page.locator('[data-place="element:1:left"]')).toBeVisible();
  await shot(page, 'fleet-machine-installed');
});

test('the machines list turns pages with Next and Previous, each read from the row it follows', async ({ page }) => {
  await signIn(page, 'technician', '/machines');
  const found = await (await page.request.get('/api/machines?q=Creekside')).json();
  const creekside = found.items.find((m: { nickname: string }) => m.nickname === 'Creekside');
  const tag = `Pager ${Date.now().toString(36)}`;
  const made: string[] = [];
  try {
    for (let i = 0; i < 12; i++) {
      const res = await page.request.post('/api/machines', {
        data: {
          familyId: creekside.familyId,
          drum: creekside.drum,
          vaneControl: creekside.vaneControl,
          orgId: creekside.orgId,
          serial: `${tag}-${i}`.toUpperCase().replace(/\s/g, ''),
          nickname: `${tag} ${String(i).padStart(2, '0')}`,
        },
      });
      expect(res.status()).toBe(201);
      made.push((await res.json()).machine.id);
    }
    await page.goto(`/machines?orgId=${creekside.orgId}&sort=nickname&pageSize=10`);
    const table = page.getByTestId('machines-table');
    const names = () => table.locator('tbody tr td:first-child').allInnerTexts();
    await expect(page.getByTestId('machines-count')).toContainText('page 1 of');
    await expect(table.locator('tbody tr')).toHaveCount(10);
    const pageOne = await names();

    // Next by keyboard: the request starts after the last row shown.
    const nextRequest = page.waitForRequest((r) => r.url().includes('/api/machines?') && r.url().includes('after='));
    await page.getByRole('button', { name: 'Next' }).focus();
    await page.keyboard.press('Enter');
    await nextRequest;
    await expect(page.getByTestId('machines-count')).toContainText('page 2 of');
    await expect.poll(names).not.toEqual(pageOne);
    const pageTwo = await names();
    expect(pageTwo.some((n) => pageOne.includes(n))).toBe(false);
    expect([...pageOne, ...pageTwo].slice(-1)[0]! >= pageOne.slice(-1)[0]!).toBe(true);
    await shot(page, 'fleet-machines-page-2', false);

    // Previous by mouse: the page before the first row shown, the same rows as before.
    const prevRequest = page.waitForRequest((r) => r.url().includes('/api/machines?') && r.url().includes('before='));
    await page.getByRole('button', { name: 'Previous' }).click();
    await prevRequest;
    await expect(page.getByTestId('machines-count')).toContainText('page 1 of');
    await expect.poll(names).toEqual(pageOne);
  } finally {
    for (const id of made) await page.request.delete(`/api/machines/${id}`);
  }
});
