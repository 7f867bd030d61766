import { expect, test } from '@playwright/test';
import { shot, signIn } from './helpers';
import { demoCatalog, formatLength, mm, starterLayout, tamarackM4 } from '~/lib/domain';

// A user who chose inches sees inches in the planner, on the parts request sheet and in the
// e-mail to the parts desk; prices carry the dealer's currency. 1 in = 25.4 mm exactly (NIST
// Handbook 44, Appendix C).

test('inches in the plan, the request sheet and the e-mail; prices in the dealer’s currency', async ({ page, browser }) => {
  await signIn(page, 'operator2');
  expect((await page.request.put('/api/me', { data: { unitSystem: 'imperial' } })).status()).toBe(200);
  try {
    const created = await page.request.post('/api/machines', {
      data: {
        familyId: tamarackM4.id,
        drum: 'slim',
        vaneControl: 'powered',
        serial: `UN-${Date.now().toString(36)}`,
        nickname: 'Inch field',
      },
    });
    expect(created.status()).toBe(201);
    const machineId = (await created.json()).machine.id;
    const wheat = { ...starterLayout(tamarackM4, 'wheat', demoCatalog), drum: 'slim', vaneControl: 'powered' };
    const corn = starterLayout(tamarackM4, 'corn', demoCatalog);
    expect((await page.request.put(`/api/machines/${machineId}/installed`, { data: { layout: wheat } })).status()).toBe(200);
    const inches = (v: number) => formatLength(mm(v), 'imperial');

    await page.goto(`/planner?machine=${machineId}&crop=corn&mode=program`);
    const settings = page.getByTestId('plan-settings');
    await expect(settings).toContainText(`Set the concave clearance to ${inches(corn.clearanceMm)} (now ${inches(wheat.clearanceMm)}).`);
    await expect(settings).not.toContainText(' mm');
    await expect(page.getByTestId('plan-summary')).toContainText('CA$');
    await shot(page, 'units-planner-inches');

    await page.getByRole('button', { name: 'Make a parts request' }).click();
    await expect(page).toHaveURL(/\/parts-requests\/[0-9a-f-]+\?created=1$/);
    await expect(page.getByTestId('request-settings')).toContainText(`concave clearance ${inches(corn.clearanceMm)}`);
    await expect(page.getByTestId('request-settings')).not.toContainText('mm');
    await expect(page.getByTestId('bom-total')).toHaveText(/^CA\$[\d,]+\.\d\d$/);
    await expect(page.getByTestId('bom-table')).toContainText('Unit price (CAD)');
    await shot(page, 'units-request-sheet-inches');
    await page.getByRole('button', { name: 'Send to the parts desk' }).click();
    await expect(page.getByTestId('request-status')).toContainText('Sent to the parts desk');
    const number = (await page.getByTestId('request-heading').innerText()).replace('Parts request ', '').trim();

    const desk = await browser.newPage();
    await signIn(desk, 'dealerAdmin');
    const mails = (await (await desk.request.get('/api/admin/mailbox?limit=500')).json()).messages as { subject: string; text: string }[];
    const mail = mails.find((m) => m.subject.includes(number))!;
    expect(mail.text).toContain(`concave clearance ${inches(corn.clearanceMm)}`);
    expect(mail.text).not.toMatch(/\d mm\b/);
    expect(mail.text).toMatch(/Total\s+CA\$[\d,]+\.\d\d/);
    await desk.close();
  } finally {
    await page.request.put('/api/me', { data: { unitSystem: 'metric' } });
  }
});

test('dates in the reader’s locale: the deck’s share date field', async ({ browser }) => {
  // CLDR (shipped with Node and Chromium) writes German dates as "2. März 2026". The browser's
  // locale is what it sends as Accept-Language.
  const context = await browser.newContext({ locale: 'de-DE' });
  const page = await context.newPage();
  await signIn(page, 'trainer');
  const decks = (await (await page.request.get('/api/decks')).json()).decks as { id: string }[];
  await page.goto(`/classroom/${decks[0]!.id}`);
  const panel = page.getByTestId('share-panel');
  // Until the island has hydrated, a typed date is not seen: type again until it is.
  await expect(async () => {
    await panel.getByLabel('Valid until (optional)').fill('');
    await panel.getByLabel('Valid until (optional)').fill('2026-03-02');
    await expect(panel.getByTestId('share-until-words')).toHaveText('Open until the end of 2. März 2026', { timeout: 1000 });
  }).toPass();
  await shot(page, 'units-deck-date-de');
  await context.close();

  const english = await browser.newContext({ locale: 'en-US' });
  const us = await english.newPage();
  await signIn(us, 'trainer');
  const decks2 = (await (await us.request.get('/api/decks')).json()).decks as { id: string }[];
  await us.goto(`/classroom/${decks2[0]!.id}`);
  await expect(async () => {
    await us.getByTestId('share-panel').getByLabel('Valid until (optional)').fill('');
    await us.getByTestId('share-panel').getByLabel('Valid until (optional)').fill('2026-03-02');
    await expect(us.getByTestId('share-until-words')).toHaveText('Open until the end of March 2, 2026', { timeout: 1000 });
  }).toPass();
  await english.close();
});
