import { beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { Client, signedIn } from './client';
import { LOSS_CHECK_BODY, OTHER } from './matrix-fixtures';

/**
 * Loss checks, the season log and the dealer's starting values against the real server:
 * results, bad input named with nothing written, roles, and other organisations kept out.
 */
let olive: Client; // operator, Larkspur Farms (North Quarter)
let dev: Client; // operator of another farm of the same dealer
let tomas: Client; // technician of the dealer
let priya: Client; // trainer of the dealer
let ada: Client; // administrator of the dealer
let stranger: Client; // operator served by another dealer
let strangerAdmin: Client; // the other dealer's administrator
let machineId: string;

const counts = async () => (await ada.get('/api/admin/stats')).body.counts as Record<string, number>;

async function as(email: string) {
  const c = new Client();
  await c.signIn(email);
  expect(c.hasSession()).toBe(true);
  return c;
}

beforeAll(async () => {
  [olive, dev, tomas, priya, ada] = await Promise.all([
    signedIn('operator'),
    signedIn('operator2'),
    signedIn('technician'),
    signedIn('trainer'),
    signedIn('dealerAdmin'),
  ]);
  [stranger, strangerAdmin] = await Promise.all([as(OTHER.operator), as(OTHER.dealer_admin)]);
  const list = await olive.get('/api/machines?pageSize=100');
  machineId = (list.body.items ?? list.body.machines).find((m: { nickname: string }) => m.nickname === 'North Quarter').id;
}, 60_000);

const body = (over: Record<string, unknown> = {}) => ({ ...LOSS_CHECK_BODY, ...over });

describe('recording a loss check', () => {
  it('splits the loss, names the basis, and keeps the settings of the moment', async () => {
    const installed = (await olive.get(`/api/machines/${machineId}/installed`)).body.installed.layout;
    // Wheat on the published 20 kernels/ft² (smallgrains.org, 2003): standing 2, behind the header 10,
    // behind the machine 10 + 3 × 12 with a 30 ft cut spread over 10 ft (concentration 3).
    const res = await olive.post(
      `/api/machines/${machineId}/loss-checks`,
      body({
        fieldName: 'Integration quarter',
        counts: { preHarvest: [2, 2], header: [9, 11], behindMachine: [46] },
        price: { value: 7, per: 'bu', currency: '$' },
        moisturePct: 13.5,
        checkedAt: '2026-08-20T15:00:00Z',
      }),
    );
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const r = res.body.result;
    expect(r.basis).toMatchObject({ kind: 'published', kernelsPerFt2PerBuAc: 20 });
    expect(r.concentrationRatio).toBe(3);
    expect(r.preHarvest.buPerAc).toBeCloseTo(0.1, 9);
    expect(r.header.buPerAc).toBeCloseTo(0.4, 9);
    expect(r.machine.buPerAc).toBeCloseTo(0.6, 9);
    expect(r.harvest.pctOfYield).toBeCloseTo(100 / 60, 9);
    expect(r.harvest.moneyPerAc).toBeCloseTo(7, 9);
    expect(r.verdict).toBe('within');
    expect(res.body.rotorRpm).toBe(installed.rotorRpm);
    expect(res.body.clearanceMm).toBe(installed.clearanceMm);
    expect(res.body.vaneSetting).toBe(installed.vaneSetting);
    // The dealer's starting values fill the rest of the machine (demo wheat values, invented).
    expect(res.body.fanRpm).toBe(1050);
    expect(res.body.moisturePct).toBe(13.5);

    const again = await priya.get(`/api/loss-checks/${res.body.id}`);
    expect(again.status).toBe(200);
    expect(again.body.fieldName).toBe('Integration quarter');
    const season = await priya.get(`/api/machines/${machineId}/loss-checks?season=2026`);
    expect(season.body.checks.map((c: { id: string }) => c.id)).toContain(res.body.id);
  });

  it('names the saved layout version that is installed', async () => {
    const layouts = (await olive.get(`/api/machines/${machineId}/layouts`)).body.layouts as { id: string }[];
    const layoutId = layouts[layouts.length - 1]!.id;
    expect((await olive.put(`/api/machines/${machineId}/installed`, { fromLayout: { layoutId, version: 1 } })).status).toBe(200);
    const crop = (await olive.get(`/api/machines/${machineId}/installed`)).body.installed.layout.crop;
    const res = await olive.post(`/api/machines/${machineId}/loss-checks`, body({ crop }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ layoutId, layoutVersion: 1 });
    // A check in another crop than the one installed names no version.
    const other = await olive.post(`/api/machines/${machineId}/loss-checks`, body({ crop: crop === 'oats' ? 'barley' : 'oats' }));
    expect(other.body.layoutVersion).toBeNull();
  });

  it('takes the settings typed in the cab over what is installed', async () => {
    const res = await tomas.post(
      `/api/machines/${machineId}/loss-checks`,
      body({ settings: { rotorRpm: 801, clearanceMm: 9.5, vaneSetting: 'slow', fanRpm: null } }),
    );
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ rotorRpm: 801, clearanceMm: 9.5, vaneSetting: 'slow', fanRpm: null });
  });

  it('the operator’s own kernel weight and a typed count are bases too', async () => {
    const own = await olive.post(`/api/machines/${machineId}/loss-checks`, body({ basis: { kind: 'own-weight', tkwG: 40 } }));
    expect(own.body.result.basis.kind).toBe('own-weight');
    // (60 lb × 453.59237 / 43,560) / 0.040 = 15.62 kernels/ft² (the weight rule, reference values).
    expect(own.body.result.basis.kernelsPerFt2PerBuAc).toBeCloseTo(15.62, 2);
    const typed = await olive.post(`/api/machines/${machineId}/loss-checks`, body({ basis: { kind: 'typed', kernels: 25, per: 'ft2' } }));
    expect(typed.body.result.basis).toMatchObject({ kind: 'typed', kernelsPerFt2PerBuAc: 25 });
  });

  const BAD: [string, Record<string, unknown>, string][] = [
    ['a negative count', { counts: { preHarvest: [1], header: [3, -2], behindMachine: [20] } }, 'counts.header.1'],
    ['a zero cut width', { cutWidth: 0 }, 'cutWidth'],
    ['a zero spread width', { spreadWidth: 0 }, 'spreadWidth'],
    ['a spread wider than the cut', { cutWidth: 20, spreadWidth: 24 }, 'spreadWidth'],
    ['a zero frame', { frame: { by: 'sides', length: 12, width: 0, unit: 'in' } }, 'frame.width'],
    ['no frame counted', { counts: { preHarvest: [], header: [3], behindMachine: [20] } }, 'counts.preHarvest'],
    ['a count that is not whole', { counts: { preHarvest: [1.5], header: [3], behindMachine: [20] } }, 'counts.preHarvest.0'],
    ['a zero kernel weight', { basis: { kind: 'own-weight', tkwG: 0 } }, 'basis.tkwG'],
    ['a negative yield', { expectedYield: { value: -3, unit: 'bu/ac' } }, 'expectedYield.value'],
    ['a negative price', { price: { value: -1, per: 'bu' } }, 'price.value'],
    ['no field name', { fieldName: '  ' }, 'fieldName'],
    ['a check in the future', { checkedAt: '2099-01-01T00:00:00Z' }, 'checkedAt'],
    ['a rotor speed out of range', { settings: { rotorRpm: 5 } }, 'settings.rotorRpm'],
  ];
  for (const [what, over, field] of BAD) {
    it(`refuses ${what}, naming ${field}, and writes nothing`, async () => {
      const before = await counts();
      const res = await olive.post(`/api/machines/${machineId}/loss-checks`, body(over));
      expect(res.status).toBe(400);
      expect(res.body.error.field).toBe(field);
      expect(await counts()).toEqual(before);
    });
  }
});

describe('roles and organisations', () => {
  it('trainers and administrators read but do not record; signed-out is 401', async () => {
    expect((await priya.post(`/api/machines/${machineId}/loss-checks`, body())).status).toBe(403);
    expect((await ada.post(`/api/machines/${machineId}/loss-checks`, body())).status).toBe(403);
    expect((await priya.get(`/api/machines/${machineId}/loss-checks`)).status).toBe(200);
    expect((await new Client().get(`/api/machines/${machineId}/loss-checks`)).status).toBe(401);
  });

  it('another farm of the same dealer and another dealer’s people get 404, and nothing is written', async () => {
    const mine = await olive.post(`/api/machines/${machineId}/loss-checks`, body());
    const before = await counts();
    for (const c of [dev, stranger]) {
      expect((await c.get(`/api/machines/${machineId}/loss-checks`)).status).toBe(404);
      expect((await c.get(`/api/machines/${machineId}/loss-checks?format=csv`)).status).toBe(404);
      expect((await c.post(`/api/machines/${machineId}/loss-checks`, body())).status).toBe(404);
      expect((await c.get(`/api/loss-checks/${mine.body.id}`)).status).toBe(404);
      expect((await c.delete(`/api/loss-checks/${mine.body.id}`)).status).toBe(404);
      for (const page of ['loss-check', 'season', 'card']) expect((await c.fetch(`/machines/${machineId}/${page}`)).status).toBe(404);
    }
    expect(await counts()).toEqual(before);
  });

  it('a technician removes a check recorded by mistake (audited); then it is gone', async () => {
    const made = await olive.post(`/api/machines/${machineId}/loss-checks`, body({ fieldName: 'Mistake' }));
    const before = await counts();
    expect((await priya.delete(`/api/loss-checks/${made.body.id}`)).status).toBe(403);
    const del = await tomas.delete(`/api/loss-checks/${made.body.id}`);
    expect(del.status).toBe(200);
    const after = await counts();
    expect(after.lossChecks).toBe(before.lossChecks - 1);
    expect(after.auditLog).toBe(before.auditLog + 1);
    expect((await olive.get(`/api/loss-checks/${made.body.id}`)).status).toBe(404);
  });
});

describe('season log CSV', () => {
  it('downloads the season with cells that could run as formulas neutralised', async () => {
    await olive.post(
      `/api/machines/${machineId}/loss-checks`,
      body({ fieldName: '=HYPERLINK("http://x")', checkedAt: '2026-08-21T10:00:00Z' }),
    );
    const res = await priya.fetch(`/api/machines/${machineId}/loss-checks?season=2026&format=csv`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/text\/csv/);
    expect(res.headers.get('content-disposition')).toMatch(/attachment; filename="loss-checks-north-quarter-2026\.csv"/);
    const rows = Papa.parse<string[]>(await res.text()).data.filter((r) => r.length > 1);
    expect(rows[0]).toContain('Harvest loss % of yield');
    const field = rows[0]!.indexOf('Field');
    const evil = rows.find((r) => r[field]!.includes('HYPERLINK'))!;
    expect(evil[field]!.startsWith("'=")).toBe(true);
    // Priya works in metric: clearance in mm.
    expect(rows[0]).toContain('Clearance mm');
  });
  it('a bad season or format is named', async () => {
    const res = await olive.get(`/api/machines/${machineId}/loss-checks?season=abc`);
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('season');
    expect((await olive.get(`/api/machines/${machineId}/loss-checks?format=xml`)).body.error.field).toBe('format');
  });
});

describe('dealer starting values and the settings card', () => {
  let familyId: string;
  beforeAll(async () => {
    familyId =
      (await olive.get(`/api/machines/${machineId}`)).body.familyId ??
      (await olive.get(`/api/machines/${machineId}`)).body.machine.familyId;
  });

  it('the dealer’s administrator sets values; the farm sees them; the other dealer’s admin changes only their own', async () => {
    const put = await ada.put('/api/starting-values', {
      familyId,
      crop: 'barley',
      fanRpm: 990,
      upperSieveMm: 15,
      lowerSieveMm: 7,
      feederNote: 'Drum low',
      headerNote: '',
    });
    expect(put.status, JSON.stringify(put.body)).toBe(200);
    expect(put.body).toMatchObject({ fanRpm: 990, invented: false });
    const seen = await olive.get(`/api/starting-values?familyId=${familyId}&crop=barley`);
    expect(seen.body.items).toEqual([expect.objectContaining({ fanRpm: 990, upperSieveMm: 15 })]);

    const theirs = await strangerAdmin.put('/api/starting-values', { familyId, crop: 'barley', fanRpm: 500 });
    expect(theirs.status).toBe(200);
    const still = await olive.get(`/api/starting-values?familyId=${familyId}&crop=barley`);
    expect(still.body.items[0].fanRpm).toBe(990);
    expect((await stranger.get(`/api/starting-values?familyId=${familyId}&crop=barley`)).body.items[0].fanRpm).toBe(500);
  });

  it('bad values are named and nothing is written; technicians may not set them', async () => {
    const before = await counts();
    for (const [over, field] of [
      [{ fanRpm: -5 }, 'fanRpm'],
      [{ upperSieveMm: 'wide' }, 'upperSieveMm'],
      [{ crop: 'rye-grass' }, 'crop'],
      [{ familyId: 'no-such-family' }, 'familyId'],
    ] as const) {
      const res = await ada.put('/api/starting-values', { familyId, crop: 'wheat', ...over });
      expect(res.status).toBe(400);
      expect(res.body.error.field).toBe(field);
    }
    expect((await tomas.put('/api/starting-values', { familyId, crop: 'wheat' })).status).toBe(403);
    expect(await counts()).toEqual(before);
  });

  it('the starting-values page takes the same values from a plain form, naming bad ones', async () => {
    const post = (c: Client, fields: Record<string, string>) =>
      c.fetch('/admin/starting-values', {
        method: 'POST',
        headers: { 'content-type': 'application/x-www-form-urlencoded' },
        body: new URLSearchParams(fields).toString(),
      });
    const before = await counts();
    const bad = await post(ada, { familyId, crop: 'oats', fanRpm: '-40', upperSieve: '12', lowerSieve: '' });
    expect(bad.status).toBe(400);
    expect(await bad.text()).toContain('fanRpm: the fan speed is too low');
    expect((await post(tomas, { familyId, crop: 'oats', fanRpm: '900' })).status).toBe(403);
    expect(await counts()).toEqual(before);
    const good = await post(ada, {
      familyId,
      crop: 'oats',
      fanRpm: '900',
      upperSieve: '14.5',
      lowerSieve: '6',
      feederNote: 'Drum low',
      headerNote: '',
    });
    expect(good.status).toBe(303);
    const seen = await olive.get(`/api/starting-values?familyId=${familyId}&crop=oats`);
    expect(seen.body.items[0]).toMatchObject({ fanRpm: 900, upperSieveMm: 14.5, lowerSieveMm: 6, feederNote: 'Drum low', invented: false });
  });

  it('the card shows the cage, the starting values marked invented, the last check and the manual-first caution', async () => {
    const res = await priya.fetch(`/machines/${machineId}/card?crop=wheat`);
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html).toContain('data-testid="settings-card"');
    expect(html).toContain('Demo values, invented');
    expect(html).toContain('operator’s manual comes first');
    expect(html).toMatch(/Last loss check[\s\S]*harvest loss/);
    expect(html).toContain('data-place=');
    // No layout for a crop this machine has never had: not found, with the reason.
    expect((await priya.fetch(`/machines/${machineId}/card?crop=hemp`)).status).toBe(404);
  });

  it('adding the QR code makes a share link, only for people who may share', async () => {
    const links = async () => (await olive.get('/api/share-links')).body;
    const count = (l: unknown) => (Array.isArray(l) ? l.length : (l as { links: unknown[] }).links.length);
    const before = count(await links());
    const form = { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: 'qr=1' };
    expect((await priya.fetch(`/machines/${machineId}/card?crop=wheat`, form)).status).toBe(403);
    expect(count(await links())).toBe(before);
    const res = await tomas.fetch(`/machines/${machineId}/card?crop=wheat`, form);
    expect(res.status).toBe(201);
    const html = await res.text();
    expect(html).toMatch(/<svg role="img" aria-label="QR code to the shared layout"/);
    expect(count(await links())).toBe(before + 1);
  });
});
