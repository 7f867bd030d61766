import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatLength, mm } from '~/lib/domain';
import { Client, signedIn } from './client';
import { mailbox, ownMachine, tableCounts } from './planner-helpers';

/**
 * The reader's unit choice and the dealer's currency on every page, sheet and e-mail that a
 * crop change produces. Lengths: 1 in = 25.4 mm exactly (NIST Handbook 44, Appendix C).
 */

let olive: Client;
let dev: Client;
let admin: Client;
let tomas: Client;

const form = (fields: Record<string, string>) => ({
  method: 'POST',
  headers: { 'content-type': 'application/x-www-form-urlencoded' },
  body: new URLSearchParams(fields).toString(),
});
const text = (html: string) =>
  html
    .replace(/<[^>]+>/g, ' ')
    .replace(/&amp;/g, '&')
    .replace(/\s+/g, ' ');
const testId = (html: string, id: string) => {
  const m = new RegExp(`data-testid="${id}"[^>]*>([\\s\\S]*?)</(?:p|ul|td|strong)>`).exec(html);
  return m ? text(m[1]!) : null;
};

beforeAll(async () => {
  [olive, dev, admin, tomas] = await Promise.all([
    signedIn('operator'),
    signedIn('operator2'),
    signedIn('dealerAdmin'),
    signedIn('technician'),
  ]);
  expect((await olive.put('/api/me', { unitSystem: 'imperial' })).status).toBe(200);
});
afterAll(async () => {
  await olive.put('/api/me', { unitSystem: 'metric' });
  await admin.fetch('/admin/prices', form({ form: 'currency', currency: 'CAD' }));
});

describe('a user who chose inches sees inches in the plan, the request sheet and the e-mail', () => {
  let machineId: string;
  let requestId: string;
  let clearanceMm: number;
  let installedClearanceMm: number;

  it('the planner (API and page) gives the concave clearance in inches', async () => {
    const own = await ownMachine(olive, 'Inches test machine');
    machineId = own.machineId;
    installedClearanceMm = own.installed.clearanceMm;
    const res = await olive.post('/api/plans', { machineId, crop: 'corn' });
    expect(res.status).toBe(200);
    const change = res.body.plan.settings.find((s: any) => s.field === 'clearanceMm');
    clearanceMm = change.after;
    expect(clearanceMm).not.toBe(installedClearanceMm);
    const inches = formatLength(mm(clearanceMm), 'imperial');
    expect(inches).toMatch(/^\d+\.\d+ in$/);
    expect(change.text).toBe(`Set the concave clearance to ${inches} (now ${formatLength(mm(installedClearanceMm), 'imperial')}).`);

    const page = await (await olive.fetch(`/planner?machine=${machineId}&crop=corn&mode=program`)).text();
    const settings = testId(page, 'plan-settings')!;
    expect(settings).toContain(`concave clearance to ${inches}`);
    expect(settings).not.toMatch(/\d mm\b/);
    // The money carries the dealer's currency (the demo dealer's is CAD).
    expect(testId(page, 'plan-summary')).toMatch(/Parts to buy: CA\$[\d,]+\.\d\d\./);
  });

  it('the request made from the plan carries the settings, and its sheet shows them in inches and the prices in CAD', async () => {
    const res = await olive.post('/api/parts-requests', { from: 'plan', machineId, crop: 'corn' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    requestId = res.body.id;
    expect(res.body.currency).toBe('CAD');
    expect(res.body.settings).toMatchObject({ clearanceMm });
    const sheet = await (await olive.fetch(`/parts-requests/${requestId}`)).text();
    const words = testId(sheet, 'request-settings')!;
    expect(words).toContain(`concave clearance ${formatLength(mm(clearanceMm), 'imperial')}`);
    expect(words).not.toMatch(/\bmm\b/);
    expect(testId(sheet, 'bom-total')).toMatch(/^\s*CA\$[\d,]+\.\d\d\s*$/);
  });

  it('a metric reader of the same request sees millimetres', async () => {
    // Other suites on this shared server may have left this technician in inches: choose millimetres.
    expect((await tomas.put('/api/me', { unitSystem: 'metric' })).status).toBe(200);
    const sheet = await (await tomas.fetch(`/parts-requests/${requestId}`)).text();
    expect(testId(sheet, 'request-settings')).toContain(`concave clearance ${formatLength(mm(clearanceMm), 'metric')}`);
  });

  it('the e-mail to the parts desk gives the settings in the sender’s inches and the prices in CAD', async () => {
    const sent = await olive.post(`/api/parts-requests/${requestId}/submit`);
    expect(sent.status).toBe(200);
    const mail = (await mailbox(admin)).messages.find((m) => m.subject.includes(sent.body.number))!;
    expect(mail.text).toContain(`concave clearance ${formatLength(mm(clearanceMm), 'imperial')}`);
    expect(mail.text).not.toMatch(/\d mm\b/);
    expect(mail.text).toMatch(/Unit CAD\s+Line CAD/);
    expect(mail.text).toMatch(/Total\s+CA\$[\d,]+\.\d\d/);
    const csv = mail.attachments[0]!.content!;
    expect(csv.split(/\r?\n/)[0]).toBe('Part number,Description,Hand,Quantity,Unit price,Line total,Currency');
    expect(csv).toMatch(/,CAD\r?\n/);
  });

  it('a metric user’s plan still speaks millimetres', async () => {
    const { machineId: devMachine } = await ownMachine(dev, 'Millimetre test machine');
    const res = await dev.post('/api/plans', { machineId: devMachine, crop: 'corn' });
    const change = res.body.plan.settings.find((s: any) => s.field === 'clearanceMm');
    expect(change.text).toContain(formatLength(mm(change.after), 'metric'));
    expect(change.text).not.toMatch(/\bin\)?\.?$/);
  });
});

describe('the dealer’s currency', () => {
  it('its administrator sets it (ISO 4217); a bad code is a 400 naming the field and changes nothing', async () => {
    const counts = await tableCounts(admin);
    const bad = await admin.fetch('/admin/prices', form({ form: 'currency', currency: 'dollars' }));
    expect(bad.status).toBe(400);
    expect(await bad.text()).toMatch(/ISO 4217/);
    const unknown = await admin.fetch('/admin/prices', form({ form: 'currency', currency: 'QQQ' }));
    expect(unknown.status).toBe(400);
    expect(await tableCounts(admin)).toEqual(counts);
    const page = await (await admin.fetch('/admin/prices')).text();
    expect(testId(page, 'dealer-currency')).toBe('CAD');

    const ok = await admin.fetch('/admin/prices', form({ form: 'currency', currency: 'eur' }));
    expect(ok.status).toBe(303);
    expect(ok.headers.get('location')).toBe('/admin/prices?currency=EUR');
    const after = await (await admin.fetch('/admin/prices')).text();
    expect(testId(after, 'dealer-currency')).toBe('EUR');
    expect(after).toContain('€');
  });

  it('a technician may read the price list but not change its currency', async () => {
    const refused = await tomas.fetch('/admin/prices', form({ form: 'currency', currency: 'USD' }));
    expect(refused.status).toBe(403);
    expect(testId(await (await admin.fetch('/admin/prices')).text(), 'dealer-currency')).toBe('EUR');
  });

  it('the dealer’s customers then see their prices in it', async () => {
    const { machineId } = await ownMachine(olive, 'Euro test machine');
    const res = await olive.post('/api/parts-requests', { from: 'plan', machineId, crop: 'corn' });
    expect(res.body.currency).toBe('EUR');
    const sheet = await (await olive.fetch(`/parts-requests/${res.body.id}`)).text();
    expect(testId(sheet, 'bom-total')).toMatch(/^\s*€[\d,]+\.\d\d\s*$/);
    const list = await (await olive.fetch('/parts-requests')).text();
    expect(list).toContain('€');
    expect((await olive.delete(`/api/parts-requests/${res.body.id}`)).status).toBe(200);
  });
});
