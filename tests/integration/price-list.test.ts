import { beforeAll, describe, expect, it } from 'vitest';
import { Client, DEMO_PASSWORD, signedIn } from './client';
import { ownMachine, tableCounts } from './planner-helpers';

/**
 * Prices belong to dealers: each dealer's administrator keeps a price list; a farm's requests and
 * plans are priced by its own dealer, and no dealer reaches another's prices. The part numbers
 * and prices are the invented demo catalog's.
 */
let olive: Client; // Larkspur Farms, served by Kestrel Valley Implement
let tomas: Client; // Kestrel technician
let ada: Client; // Kestrel's administrator
let noor: Client; // instance administrator
let ivo: Client; // Brackenridge Ag Supply's administrator (the second dealer)
let june: Client; // Fenwick Acres, served by Brackenridge
let machineId: string;
let fenwickMachineId: string;

const PART = 'CW-RB-L-04';
const OTHER_PART = 'CW-RB-R-04';

async function as(email: string) {
  const c = new Client();
  await c.signIn(email, DEMO_PASSWORD);
  if (!c.hasSession()) throw new Error(`sign-in failed for ${email}`);
  return c;
}

const priceOf = async (c: Client, pn: string) =>
  (
    (await c.get('/api/price-list')).body.items as {
      partNumber: string;
      priceCents: number;
      dealerPriceCents: number | null;
      listPriceCents: number;
    }[]
  ).find((i) => i.partNumber === pn)!;

async function requestPrice(c: Client, machine: string, pn: string): Promise<number> {
  const res = await c.post('/api/parts-requests', { from: 'manual', machineId: machine, lines: [{ partNumber: pn, quantity: 1 }] });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const price = res.body.lines[0].unitPriceCents as number;
  expect((await c.delete(`/api/parts-requests/${res.body.id}`)).status).toBe(200);
  return price;
}

beforeAll(async () => {
  [olive, tomas, ada, noor] = await Promise.all([
    signedIn('operator'),
    signedIn('technician'),
    signedIn('dealerAdmin'),
    signedIn('instanceAdmin'),
  ]);
  [ivo, june] = await Promise.all([as('admin@brackenridge.example'), as('op@fenwick.example')]);
  ({ machineId } = await ownMachine(olive, 'Price list machine'));
  fenwickMachineId = (await june.get('/api/machines?pageSize=100')).body.items[0].id;
  // Other suites on this store may have priced these parts: start from the list price.
  for (const c of [ada, ivo]) for (const pn of [PART, OTHER_PART]) expect((await c.delete(`/api/price-list/${pn}`)).status).toBe(200);
}, 60_000);

describe('the dealer price list', () => {
  it('is read by the dealer’s staff and changed by its administrator only', async () => {
    const list = await ada.get('/api/price-list');
    expect(list.status).toBe(200);
    expect(list.body.dealer.name).toBe('Kestrel Valley Implement');
    expect(list.body.items.length).toBeGreaterThan(20);
    expect((await tomas.get('/api/price-list')).status).toBe(200);
    expect((await olive.get('/api/price-list')).status).toBe(403);
    expect((await noor.get('/api/price-list')).status).toBe(403);
    expect((await new Client().get('/api/price-list')).status).toBe(401);
    expect((await tomas.put(`/api/price-list/${PART}`, { priceCents: 1 })).status).toBe(403);
    expect((await olive.put(`/api/price-list/${PART}`, { priceCents: 1 })).status).toBe(403);
    expect((await noor.put(`/api/price-list/${PART}`, { priceCents: 1 })).status).toBe(403);
    expect((await tomas.post('/api/price-list/import', { csv: `part number,price\n${PART},1.00` })).status).toBe(403);
  });

  it('names bad input and writes nothing', async () => {
    const before = await priceOf(ada, PART);
    for (const [body, field] of [
      [{ priceCents: -1 }, 'priceCents'],
      [{ priceCents: 1.5 }, 'priceCents'],
      [{ priceCents: '100' }, 'priceCents'],
      [{}, 'priceCents'],
      [{ priceCents: 100, extra: 1 }, 'body'],
    ] as const) {
      const res = await ada.put(`/api/price-list/${PART}`, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.field).toBe(field);
    }
    expect((await ada.put('/api/price-list/CW-NONE-X-00', { priceCents: 100 })).status).toBe(404);
    expect((await ada.put('/api/price-list/not%20a%20part', { priceCents: 100 })).status).toBe(404);
    expect(await priceOf(ada, PART)).toEqual(before);
  });

  it('prices a farm’s parts requests and plans by its own dealer; another dealer’s change reaches nobody else', async () => {
    const list = (await priceOf(ada, PART)).listPriceCents;
    expect(await requestPrice(olive, machineId, PART)).toBe(list);
    expect(await requestPrice(june, fenwickMachineId, PART)).toBe(list);

    // Kestrel lowers its price: Kestrel's farm pays it, Brackenridge's farm does not.
    expect((await ada.put(`/api/price-list/${PART}`, { priceCents: list - 1_000 })).status).toBe(200);
    expect(await requestPrice(olive, machineId, PART)).toBe(list - 1_000);
    expect(await requestPrice(june, fenwickMachineId, PART)).toBe(list);

    // Brackenridge sets its own price for the same part: Kestrel's stays.
    expect((await ivo.put(`/api/price-list/${PART}`, { priceCents: list + 7_000 })).status).toBe(200);
    expect(await requestPrice(june, fenwickMachineId, PART)).toBe(list + 7_000);
    expect(await requestPrice(olive, machineId, PART)).toBe(list - 1_000);
    expect((await priceOf(ada, PART)).priceCents).toBe(list - 1_000);
    // …and clearing it touches only Brackenridge's list.
    expect((await ivo.delete(`/api/price-list/${PART}`)).status).toBe(200);
    expect(await requestPrice(june, fenwickMachineId, PART)).toBe(list);
    expect((await priceOf(ada, PART)).priceCents).toBe(list - 1_000);

    // The planner's purchases carry the farm's dealer's price (a lower price never changes the choice).
    const plan = await olive.post('/api/plans', { machineId, crop: 'field-peas' });
    expect(plan.status).toBe(200);
    const bought = (plan.body.plan.purchases as { partNumber: string; unitPriceCents: number }[]).find((p) => p.partNumber === PART)!;
    expect(bought.unitPriceCents).toBe(list - 1_000);

    // Back to the list price.
    expect((await ada.delete(`/api/price-list/${PART}`)).status).toBe(200);
    expect(await priceOf(ada, PART)).toMatchObject({ dealerPriceCents: null, priceCents: list });
    expect(await requestPrice(olive, machineId, PART)).toBe(list);
  });

  it('imports a CSV; any problem is named by row and column and nothing is written', async () => {
    const counts = await tableCounts(noor);
    const before = [await priceOf(ada, PART), await priceOf(ada, OTHER_PART)];
    const bad = [
      ['part number,price', `${PART},1200.50`, `${OTHER_PART},twelve`, 'CW-NONE-X-00,10.00', `${PART},5.00`].join('\n'),
      ['item,cost', `${PART},1.00`].join('\n'),
      'part number,price\n',
      ['part number,price', `${PART},-3`].join('\n'),
    ];
    const first = await ada.post('/api/price-list/import', { csv: bad[0] });
    expect(first.status).toBe(400);
    expect(first.body.error.field).toBe('csv');
    expect(first.body.error.message).toMatch(/^csv: row 3, column price/);
    expect(first.body.error.problems).toEqual([
      { row: 3, column: 'price', message: expect.stringContaining('twelve') },
      { row: 4, column: 'part number', message: expect.stringContaining('not in the catalog') },
      { row: 5, column: 'part number', message: expect.stringContaining('row 2') },
    ]);
    const header = await ada.post('/api/price-list/import', { csv: bad[1] });
    expect(header.status).toBe(400);
    expect(header.body.error.problems).toEqual([
      { row: 1, column: 'part number', message: expect.any(String) },
      { row: 1, column: 'price', message: expect.any(String) },
    ]);
    // Broken CSV: the row is named, and a lone column is no excuse to blame the delimiter.
    const broken = await ada.post('/api/price-list/import', { csv: `part number,price\n${PART},1.00\n"unterminated` });
    expect(broken.status).toBe(400);
    expect(broken.body.error.problems).toEqual([{ row: 3, column: '', message: expect.stringContaining('not valid CSV') }]);
    for (const csv of bad.slice(2)) {
      const res = await ada.post('/api/price-list/import', { csv });
      expect(res.status, csv).toBe(400);
      expect(res.body.error.field).toBe('csv');
      expect(res.body.error.problems[0]).toMatchObject({ row: 2 });
    }
    expect(await tableCounts(noor)).toEqual(counts);
    expect([await priceOf(ada, PART), await priceOf(ada, OTHER_PART)]).toEqual(before);

    // A good file: quoted cells, a byte-order mark, thousands separators and CRLF line ends.
    const good = '\uFEFFPart number,Price\r\n' + `"${PART}","1,234.50"\r\n${OTHER_PART},999\r\n`;
    const ok = await ada.post('/api/price-list/import', { csv: good });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    expect(ok.body.imported).toBe(2);
    expect((await priceOf(ada, PART)).priceCents).toBe(123_450);
    expect((await priceOf(ada, OTHER_PART)).priceCents).toBe(99_900);
    // Only Kestrel's list changed.
    expect((await priceOf(ivo, PART)).dealerPriceCents).toBeNull();
    for (const pn of [PART, OTHER_PART]) expect((await ada.delete(`/api/price-list/${pn}`)).status).toBe(200);
  });

  it('has a page: the administrator edits and imports, a technician reads, others are refused', async () => {
    const page = await ada.fetch('/admin/prices');
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain('Kestrel Valley Implement');
    expect(html).toContain(`name="p:${PART}"`);

    // A bad import through the form: the problems are listed by row and column, nothing written.
    const form = new FormData();
    form.set('form', 'import');
    form.set('csv', `part number,price\n${PART},abc`);
    const bad = await ada.fetch('/admin/prices', { method: 'POST', body: form });
    expect(bad.status).toBe(400);
    expect(await bad.text()).toMatch(/Row 2, column price/);
    expect((await priceOf(ada, PART)).dealerPriceCents).toBeNull();

    // The table form: one price set, a bad one named, nothing saved until all are good.
    const table = new URLSearchParams({ form: 'prices', [`p:${PART}`]: '1000.00', [`p:${OTHER_PART}`]: 'lots' });
    const refused = await ada.fetch('/admin/prices', {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: table,
    });
    expect(refused.status).toBe(400);
    expect(await refused.text()).toContain(`${OTHER_PART}: “lots” is not an amount`);
    expect((await priceOf(ada, PART)).dealerPriceCents).toBeNull();
    table.set(`p:${OTHER_PART}`, '');
    const saved = await ada.fetch('/admin/prices', {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: table,
    });
    expect(saved.status).toBe(303);
    expect((await priceOf(ada, PART)).dealerPriceCents).toBe(100_000);
    expect((await ada.delete(`/api/price-list/${PART}`)).status).toBe(200);

    const read = await tomas.fetch('/admin/prices');
    expect(read.status).toBe(200);
    expect(await read.text()).not.toContain(`name="p:${PART}"`);
    const post = await tomas.fetch('/admin/prices', {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: table,
    });
    expect(post.status).toBe(403);
    expect((await priceOf(ada, PART)).dealerPriceCents).toBeNull();
    expect((await olive.fetch('/admin/prices')).status).toBe(403);
    expect((await noor.fetch('/admin/prices')).status).toBe(403);
  });
});
