import { beforeAll, describe, expect, it } from 'vitest';
import { Client, DEMO_PASSWORD, signedIn } from './client';
import { ownMachine } from './planner-helpers';

/**
 * Dealer stock and lead times: a plan's purchases are marked on the dealer's shelf or to order
 * with the dealer's lead time, and the plan says when the work can start. Only the machine
 * owner's own dealer's stock is read. Quantities and lead times here are invented test data.
 */
let olive: Client; // Larkspur Farms, served by Kestrel Valley Implement
let tomas: Client; // Kestrel technician
let ada: Client; // Kestrel's administrator
let ivo: Client; // Brackenridge Ag Supply's administrator (another dealer)
let machineId: string;

// A field-peas plan from the starter wheat cage buys two each of two parts (see planner.test.ts):
// with the demo catalog the left and right round-bar elements; read from the first plan, since
// suites sharing this store (a PostgreSQL server) may have added parts the planner may buy.
let LEFT = 'CW-RB-L-04';
let RIGHT = 'CW-RB-R-04';

async function as(email: string) {
  const c = new Client();
  await c.signIn(email, DEMO_PASSWORD);
  if (!c.hasSession()) throw new Error(`sign-in failed for ${email}`);
  return c;
}

/** Today (UTC) plus `days`, as YYYY-MM-DD: the start day the rule gives. */
const dayPlus = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

async function setStock(c: Client, pn: string, quantity: number, leadDays: number | null) {
  const res = await c.put(`/api/dealer-stock/${pn}`, { quantity, leadDays });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
}

async function peas() {
  const res = await olive.post('/api/plans', { machineId, crop: 'field-peas' });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  expect(res.body.plan.purchases.map((p: { partNumber: string; quantity: number }) => [p.partNumber, p.quantity])).toEqual([
    [LEFT, 2],
    [RIGHT, 2],
  ]);
  return res.body.supply as {
    availability: { partNumber: string; source: string; leadDays?: number }[];
    start: { date: string | null; waitDays: number; unknownLead: string[] };
  };
}

beforeAll(async () => {
  [olive, tomas, ada] = await Promise.all([signedIn('operator'), signedIn('technician'), signedIn('dealerAdmin')]);
  ivo = await as('admin@brackenridge.example');
  ({ machineId } = await ownMachine(olive, 'Dealer stock machine'));
  const first = await olive.post('/api/plans', { machineId, crop: 'field-peas' });
  const bought = first.body.plan.purchases as { partNumber: string; quantity: number }[];
  expect(bought.map((p) => p.quantity)).toEqual([2, 2]);
  [LEFT, RIGHT] = bought.map((p) => p.partNumber) as [string, string];
}, 60_000);

describe('dealer stock in the plan', () => {
  it('marks a part on the dealer’s shelf and one to order, and starts after the longest lead time', async () => {
    await setStock(ada, LEFT, 5, 4);
    await setStock(ada, RIGHT, 1, 9); // one on the shelf, two needed: the line is ordered
    // Another dealer holds plenty with a short lead time: never read for Kestrel's customer.
    await setStock(ivo, RIGHT, 50, 1);
    const supply = await peas();
    expect(supply.availability).toEqual([
      { partNumber: LEFT, source: 'dealer-shelf' },
      { partNumber: RIGHT, source: 'order', leadDays: 9 },
    ]);
    expect(supply.start).toEqual({ date: dayPlus(9), waitDays: 9, unknownLead: [] });
  });

  it('starts today when every purchase is on the dealer’s shelf', async () => {
    await setStock(ada, LEFT, 2, 4);
    await setStock(ada, RIGHT, 2, 9);
    const supply = await peas();
    expect(supply.availability.map((a) => a.source)).toEqual(['dealer-shelf', 'dealer-shelf']);
    expect(supply.start).toEqual({ date: dayPlus(0), waitDays: 0, unknownLead: [] });
  });

  it('gives no start date while an order has no lead time', async () => {
    await setStock(ada, RIGHT, 0, null);
    const supply = await peas();
    expect(supply.availability[1]).toEqual({ partNumber: RIGHT, source: 'order' });
    expect(supply.start).toEqual({ date: null, waitDays: 0, unknownLead: [RIGHT] });
  });

  it('takes the longest of several lead times', async () => {
    await setStock(ada, LEFT, 0, 12);
    await setStock(ada, RIGHT, 0, 3);
    const supply = await peas();
    expect(supply.availability).toEqual([
      { partNumber: LEFT, source: 'order', leadDays: 12 },
      { partNumber: RIGHT, source: 'order', leadDays: 3 },
    ]);
    expect(supply.start.date).toBe(dayPlus(12));
  });
});

describe('PUT /api/dealer-stock/[partNumber]', () => {
  it('is for the dealer’s administrator only', async () => {
    expect((await tomas.put(`/api/dealer-stock/${LEFT}`, { quantity: 1, leadDays: 1 })).status).toBe(403);
    expect((await olive.put(`/api/dealer-stock/${LEFT}`, { quantity: 1, leadDays: 1 })).status).toBe(403);
    expect((await new Client().put(`/api/dealer-stock/${LEFT}`, { quantity: 1, leadDays: 1 })).status).toBe(401);
  });

  it('refuses bad input naming the field, and writes nothing', async () => {
    await setStock(ada, LEFT, 3, 6);
    const bad: [unknown, string][] = [
      [{ quantity: -1, leadDays: 2 }, 'quantity'],
      [{ quantity: 1.5, leadDays: 2 }, 'quantity'],
      [{ quantity: '2', leadDays: 2 }, 'quantity'],
      [{ quantity: 2, leadDays: -3 }, 'leadDays'],
      [{ quantity: 2, leadDays: 366 }, 'leadDays'],
      [{ quantity: 2 }, 'leadDays'],
      [{ quantity: 2, leadDays: 2, dealerId: 'x' }, 'dealerId'],
    ];
    for (const [body, field] of bad) {
      const res = await ada.put(`/api/dealer-stock/${LEFT}`, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(JSON.stringify(res.body), JSON.stringify(body)).toContain(field);
    }
    expect((await ada.put('/api/dealer-stock/NO-SUCH-PART', { quantity: 1, leadDays: 1 })).status).toBe(404);
    const supply = await peas();
    expect(supply.availability[0]).toEqual({ partNumber: LEFT, source: 'dealer-shelf' });
  });
});

describe('the dealer stock page', () => {
  const post = (c: Client, fields: Record<string, string>) =>
    c.fetch('/admin/stock', {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams(fields),
    });

  it('saves the table for the administrator’s own dealer, refuses bad cells naming the part, and is for the administrator only', async () => {
    const page = await ada.fetch('/admin/stock');
    expect(page.status).toBe(200);
    expect(await page.text()).toContain(`name="d:${LEFT}"`);

    const bad = await post(ada, { [`q:${LEFT}`]: '7', [`d:${LEFT}`]: '2', [`q:${RIGHT}`]: 'many', [`d:${RIGHT}`]: '' });
    expect(bad.status).toBe(400);
    expect(await bad.text()).toContain(`${RIGHT}: quantity`);
    const tooLong = await post(ada, { [`q:${RIGHT}`]: '1', [`d:${RIGHT}`]: '999' });
    expect(tooLong.status).toBe(400);
    expect(await tooLong.text()).toContain(`${RIGHT}: lead time`);

    const ok = await post(ada, { [`q:${LEFT}`]: '0', [`d:${LEFT}`]: '8', [`q:${RIGHT}`]: '0', [`d:${RIGHT}`]: '' });
    expect(ok.status).toBe(303);
    const supply = await peas();
    expect(supply.availability).toEqual([
      { partNumber: LEFT, source: 'order', leadDays: 8 },
      { partNumber: RIGHT, source: 'order' },
    ]);

    // Another dealer's administrator writes only their own dealer's stock.
    expect((await post(ivo, { [`q:${LEFT}`]: '99', [`d:${LEFT}`]: '1' })).status).toBe(303);
    expect((await peas()).availability[0]).toEqual({ partNumber: LEFT, source: 'order', leadDays: 8 });

    for (const c of [tomas, olive]) {
      expect((await c.fetch('/admin/stock')).status).toBe(403);
      expect((await post(c, { [`q:${LEFT}`]: '99', [`d:${LEFT}`]: '1' })).status).toBe(403);
    }
    expect((await peas()).availability[0]).toEqual({ partNumber: LEFT, source: 'order', leadDays: 8 });
  });
});
