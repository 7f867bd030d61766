import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import { Client, DEMO, signedIn } from './client';
import { mailbox, ownMachine, tableCounts } from './planner-helpers';

let olive: Client;
let dev: Client;
let tomas: Client;
let admin: Client;
let machineId: string;
let devMachineId: string;

beforeAll(async () => {
  [olive, dev, tomas, admin] = await Promise.all([
    signedIn('operator'),
    signedIn('operator2'),
    signedIn('technician'),
    signedIn('dealerAdmin'),
  ]);
  ({ machineId } = await ownMachine(olive, 'Parts test machine'));
  ({ machineId: devMachineId } = await ownMachine(dev, 'Haldane parts test machine'));
});

async function draftFromPlan(crop = 'field-peas') {
  const res = await olive.post('/api/parts-requests', { from: 'plan', machineId, crop });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body;
}

describe('a parts request from a plan, sent to the parts desk', () => {
  let id: string;
  let number: string;

  it('makes a draft with the plan’s purchases: part number, description, hand, quantity, prices, total', async () => {
    const plan = (await olive.post('/api/plans', { machineId, crop: 'field-peas' })).body.plan;
    const req = await draftFromPlan();
    id = req.id;
    number = req.number;
    expect(number).toMatch(/^PR-[0-9A-F]{8}$/);
    expect(req).toMatchObject({
      status: 'draft',
      source: 'plan',
      org: { name: 'Larkspur Farms' },
      dealer: { name: 'Kestrel Valley Implement' },
    });
    expect(req.lines).toEqual(
      plan.purchases.map((p: any) => ({
        partNumber: p.partNumber,
        description: p.description,
        hand: p.hand,
        quantity: p.quantity,
        unitPriceCents: p.unitPriceCents,
        lineTotalCents: p.lineTotalCents,
      })),
    );
    expect(req.lines[0]).toMatchObject({
      partNumber: 'CW-RB-L-04',
      description: 'Round-bar element, left hand, Tamarack M4',
      hand: 'left',
      quantity: 2,
      unitPriceCents: 131_000,
      lineTotalCents: 262_000,
    });
    expect(req.totalCents).toBe(524_000);
    expect(req.can).toEqual({ edit: true, submit: true, delete: true, advance: false });
  });

  it('edits quantities while a draft; 0 drops a line; a new part takes the catalog price', async () => {
    const res = await olive.put(`/api/parts-requests/${id}`, {
      lines: [
        { partNumber: 'CW-RB-L-04', quantity: 3 },
        { partNumber: 'CW-RB-R-04', quantity: 3 },
        { partNumber: 'CW-BR-RS-04', quantity: 0 },
        { partNumber: 'CW-CP-R-04', quantity: 1 },
      ],
      note: 'One spare of each, please.',
    });
    expect(res.status).toBe(200);
    expect(res.body.lines.map((l: any) => [l.partNumber, l.quantity, l.lineTotalCents])).toEqual([
      ['CW-RB-L-04', 3, 393_000],
      ['CW-RB-R-04', 3, 393_000],
      ['CW-CP-R-04', 1, 24_500],
    ]);
    expect(res.body.totalCents).toBe(810_500);
    expect(res.body.note).toBe('One spare of each, please.');
  });

  it('refuses negative quantities and unknown parts, naming the field, and writes nothing', async () => {
    const before = (await olive.get(`/api/parts-requests/${id}`)).body;
    const counts = await tableCounts(admin);
    const negative = await olive.put(`/api/parts-requests/${id}`, { lines: [{ partNumber: 'CW-RB-L-04', quantity: -2 }] });
    expect(negative.status).toBe(400);
    expect(negative.body.error.field).toBe('lines.0.quantity');
    const fraction = await olive.put(`/api/parts-requests/${id}`, { lines: [{ partNumber: 'CW-RB-L-04', quantity: 1.5 }] });
    expect(fraction.status).toBe(400);
    expect(fraction.body.error.field).toBe('lines.0.quantity');
    const unknown = await olive.put(`/api/parts-requests/${id}`, {
      lines: [
        { partNumber: 'CW-RB-L-04', quantity: 1 },
        { partNumber: 'CW-ZZ-L-99', quantity: 1 },
      ],
    });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.field).toBe('lines.1.partNumber');
    expect(unknown.body.error.message).toMatch(/CW-ZZ-L-99 is not a part of the Tamarack M4 catalog/);
    const otherFamily = await olive.put(`/api/parts-requests/${id}`, { lines: [{ partNumber: 'CW-RB-L-06C', quantity: 1 }] });
    expect(otherFamily.status).toBe(400);
    expect(otherFamily.body.error.field).toBe('lines.0.partNumber');
    expect((await olive.get(`/api/parts-requests/${id}`)).body).toEqual(before);
    expect(await tableCounts(admin)).toEqual(counts);
  });

  it('exports the lines as CSV', async () => {
    const res = await olive.fetch(`/api/parts-requests/${id}?format=csv`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/);
    expect(res.headers.get('content-disposition')).toBe(`attachment; filename="${number.toLowerCase()}.csv"`);
    const rows = Papa.parse<string[]>((await res.text()).trim()).data;
    expect(rows).toEqual([
      ['Part number', 'Description', 'Hand', 'Quantity', 'Unit price', 'Line total', 'Currency'],
      ['CW-RB-L-04', 'Round-bar element, left hand, Tamarack M4', 'left', '3', '1310.00', '3930.00', 'CAD'],
      ['CW-RB-R-04', 'Round-bar element, right hand, Tamarack M4', 'right', '3', '1310.00', '3930.00', 'CAD'],
      ['CW-CP-R-04', 'Cover plate, right, Tamarack M4', 'right', '1', '245.00', '245.00', 'CAD'],
      ['', 'Total', '', '7', '', '8105.00', 'CAD'],
    ]);
    const bad = await olive.get(`/api/parts-requests/${id}?format=pdf`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('format');
  });

  it('sends it: stored as sent, and the parts desk and the owner get the message with the lines', async () => {
    const before = await mailbox(admin);
    expect(before.local).toBe(true);
    expect(before).not.toHaveProperty('dir'); // no server path in the response
    const res = await olive.post(`/api/parts-requests/${id}/submit`);
    expect(res.status).toBe(200);
    expect(res.body.status).toBe('sent');
    expect(res.body.sentAt).toBeTruthy();
    expect(res.body.can).toEqual({ edit: false, submit: false, delete: false, advance: false });

    const after = await mailbox(admin);
    expect(after.total).toBe(before.total + 1);
    const mail = after.messages.find((m) => m.subject.includes(number))!;
    expect(mail).toBeDefined();
    expect(mail.subject).toBe(`Parts request ${number} from Larkspur Farms: Parts test machine (Tamarack M4)`);
    expect(mail.to).toEqual(['parts@kestrel.example']);
    expect(mail.cc).toEqual([DEMO.operator]);
    expect(mail.envelope.to.sort()).toEqual(['olive@larkspur.example', 'parts@kestrel.example']);
    expect(mail.text).toMatch(/^\s+3 × CW-RB-L-04\s+left hand\s+1,310\.00\s+3,930\.00\s+Round-bar element, left hand, Tamarack M4$/m);
    expect(mail.text).toMatch(/^\s+3 × CW-RB-R-04\s+right hand\s+1,310\.00\s+3,930\.00/m);
    expect(mail.text).toMatch(/^\s+1 × CW-CP-R-04\s+right hand\s+245\.00\s+245\.00/m);
    expect(mail.text).toMatch(/Total\s+CA\$8,105\.00/);
    expect(mail.text).toContain('One spare of each, please.');
    expect(mail.text).toContain(`/parts-requests/${id}`);
    expect(mail.attachments).toEqual([expect.objectContaining({ filename: `${number.toLowerCase()}.csv`, contentType: 'text/csv' })]);
    expect(mail.attachments[0]!.content).toContain('CW-CP-R-04,"Cover plate, right, Tamarack M4",right,1,245.00,245.00,CAD');
  });

  it('a sent request can no longer be changed, deleted or sent again', async () => {
    const mails = (await mailbox(admin)).total;
    expect((await olive.put(`/api/parts-requests/${id}`, { lines: [{ partNumber: 'CW-RB-L-04', quantity: 1 }] })).status).toBe(409);
    expect((await olive.delete(`/api/parts-requests/${id}`)).status).toBe(409);
    const again = await olive.post(`/api/parts-requests/${id}/submit`);
    expect(again.status).toBe(409);
    expect(again.body.error.field).toBe('status');
    expect((await mailbox(admin)).total).toBe(mails);
  });

  it('the dealer’s technician sees it coming in and moves it on one step at a time; the owner sees each status', async () => {
    const incoming = await tomas.get('/api/parts-requests?scope=incoming');
    expect(incoming.status).toBe(200);
    expect(incoming.body.items.map((r: any) => r.id)).toContain(id);

    const skip = await tomas.post(`/api/parts-requests/${id}/status`, { status: 'ready' });
    expect(skip.status).toBe(409);
    expect(skip.body.error).toMatchObject({ field: 'status', next: 'acknowledged' });
    const owner = await olive.post(`/api/parts-requests/${id}/status`, { status: 'acknowledged' });
    expect(owner.status).toBe(403);
    const badStatus = await tomas.post(`/api/parts-requests/${id}/status`, { status: 'lost' });
    expect(badStatus.status).toBe(400);
    expect(badStatus.body.error.field).toBe('status');

    const mails = (await mailbox(admin)).total;
    for (const status of ['acknowledged', 'ready', 'picked-up']) {
      const res = await tomas.post(`/api/parts-requests/${id}/status`, { status });
      expect(res.status, status).toBe(200);
      expect(res.body.status).toBe(status);
      expect((await olive.get(`/api/parts-requests/${id}`)).body.status).toBe(status);
    }
    // "Ready" tells the owner by e-mail.
    const box = await mailbox(admin);
    expect(box.total).toBe(mails + 1);
    const ready = box.messages.find((m) => m.subject === `Parts request ${number} is ready for pick-up`)!;
    expect(ready.to).toEqual([DEMO.operator]);
    expect(ready.text).toContain('CW-RB-L-04');
    const done = await tomas.post(`/api/parts-requests/${id}/status`, { status: 'picked-up' });
    expect(done.status).toBe(409);
  });

  it('another farm sees nothing of it', async () => {
    expect((await dev.get(`/api/parts-requests/${id}`)).status).toBe(404);
    expect((await dev.get(`/api/parts-requests/${id}?format=csv`)).status).toBe(404);
    expect((await dev.post(`/api/parts-requests/${id}/submit`)).status).toBe(404);
    const list = await dev.get('/api/parts-requests');
    expect(list.body.items.map((r: any) => r.id)).not.toContain(id);
  });
});

describe('bad input writes nothing and sends nothing', () => {
  it('negative quantities, unknown parts, another organisation’s machine, unknown sources', async () => {
    const counts = await tableCounts(admin);
    const mails = (await mailbox(admin)).total;
    const cases: [unknown, number, string][] = [
      [{ from: 'manual', machineId, lines: [{ partNumber: 'CW-RB-L-04', quantity: -1 }] }, 400, 'lines.0.quantity'],
      [{ from: 'manual', machineId, lines: [{ partNumber: 'CW-RB-L-04', quantity: 0 }] }, 400, 'lines.0.quantity'],
      [
        {
          from: 'manual',
          machineId,
          lines: [
            { partNumber: 'CW-RB-L-04', quantity: 2 },
            { partNumber: 'CW-NO-SUCH-1', quantity: 1 },
          ],
        },
        400,
        'lines.1.partNumber',
      ],
      [{ from: 'manual', machineId, lines: [{ partNumber: 'not a part', quantity: 1 }] }, 400, 'lines.0.partNumber'],
      [{ from: 'manual', machineId, lines: [] }, 400, 'lines'],
      [{ from: 'manual', machineId: devMachineId, lines: [{ partNumber: 'CW-RB-L-04', quantity: 1 }] }, 404, 'machineId'],
      [{ from: 'plan', machineId: devMachineId, crop: 'corn' }, 404, 'machineId'],
      [{ from: 'plan', machineId, crop: 'pumpkins' }, 400, 'crop'],
      [{ from: 'layout', layoutId: '00000000-0000-4000-8000-000000000000' }, 404, 'layoutId'],
      [{ from: 'catalogue', machineId }, 400, 'from'],
      [{ machineId }, 400, 'from'],
    ];
    for (const [body, status, field] of cases) {
      const res = await olive.post('/api/parts-requests', body);
      expect(res.status, JSON.stringify(body)).toBe(status);
      expect(res.body.error.field, JSON.stringify(body)).toBe(field);
    }
    // A plan that already has everything: nothing to order, nothing made.
    const same = await olive.post('/api/parts-requests', { from: 'plan', machineId, crop: 'wheat' });
    expect(same.status).toBe(422);
    expect(same.body.error.message).toMatch(/Nothing to order/);
    expect(await tableCounts(admin)).toEqual(counts);
    expect((await mailbox(admin)).total).toBe(mails);
  });

  it('a trainer may not make one, and the signed-out are told to sign in', async () => {
    const trainer = await signedIn('trainer');
    expect((await trainer.post('/api/parts-requests', { from: 'plan', machineId, crop: 'field-peas' })).status).toBe(403);
    expect((await new Client().get('/api/parts-requests')).status).toBe(401);
  });
});

describe('other ways in', () => {
  it('from a saved layout: what it needs beyond what is installed and on the shelf', async () => {
    const made = await olive.post(`/api/machines/${machineId}/layouts`, { name: 'Corn trial', crop: 'corn' });
    expect(made.status).toBe(201);
    const res = await olive.post('/api/parts-requests', { from: 'layout', layoutId: made.body.layout.id });
    expect(res.status).toBe(201);
    // Installed is the wheat cage: wide-wire moves forward, skip-wire and straight bars are bought.
    // One straight bar spans each pair of in-line mounts (common practice): two pairs, two bars.
    expect(res.body.lines.map((l: any) => [l.partNumber, l.quantity])).toEqual([
      ['CW-SW-L-04', 2],
      ['CW-SW-R-04', 2],
      ['CW-BR-ST-04', 2],
    ]);
    expect(res.body.source).toBe('layout');
  });

  it('by hand, and deleting the draft', async () => {
    const res = await olive.post('/api/parts-requests', {
      from: 'manual',
      machineId,
      lines: [
        { partNumber: 'CW-BR-RS-04', quantity: 4 },
        { partNumber: 'CW-BR-RS-04', quantity: 2 },
      ],
    });
    expect(res.status).toBe(201);
    expect(res.body.lines).toEqual([expect.objectContaining({ partNumber: 'CW-BR-RS-04', quantity: 6, hand: null })]);
    const del = await olive.delete(`/api/parts-requests/${res.body.id}`);
    expect(del.status).toBe(200);
    expect((await olive.get(`/api/parts-requests/${res.body.id}`)).status).toBe(404);
  });

  it('a technician makes one for a customer farm; it goes to the farm’s owner and the desk', async () => {
    const res = await tomas.post('/api/parts-requests', { from: 'manual', machineId, lines: [{ partNumber: 'CW-CP-R-04', quantity: 1 }] });
    expect(res.status).toBe(201);
    expect(res.body.org.name).toBe('Larkspur Farms');
    const sent = await tomas.post(`/api/parts-requests/${res.body.id}/submit`);
    expect(sent.status).toBe(200);
    const mail = (await mailbox(admin)).messages.find((m) => m.subject.includes(res.body.number))!;
    expect(mail.envelope.to.sort()).toEqual(['olive@larkspur.example', 'parts@kestrel.example']);
    expect(mail.text).toContain('Requested by: Tomas Reyes <tomas@kestrel.example>');
  });

  it('the mailbox is for admins only', async () => {
    expect((await olive.get('/api/admin/mailbox')).status).toBe(403);
    expect((await tomas.get('/api/admin/mailbox')).status).toBe(403);
  });
});
