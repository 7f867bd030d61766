import { beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn } from './client';
import { uniq } from './fleet-helpers';

let olive: Client;
let tomas: Client;
let noor: Client; // instance administrator: keeps the catalog
let ada: Client; // a dealer's administrator: reads it, never changes it

beforeAll(async () => {
  [olive, tomas, noor, ada] = await Promise.all([
    signedIn('operator'),
    signedIn('technician'),
    signedIn('instanceAdmin'),
    signedIn('dealerAdmin'),
  ]);
});

/** An invented three-position modular family with one drum and fixed vanes. */
function willow(id: string) {
  return {
    id,
    name: `Willow W3 ${id.slice(-4)}`,
    fitGroup: id,
    cageKind: 'modular',
    positions: [
      { index: 1, zone: 'threshing' },
      { index: 2, zone: 'separating' },
      { index: 3, zone: 'separating' },
    ],
    drumOptions: [{ id: 'full', label: 'Full drum', diameterMm: 700 }],
    vaneControls: ['fixed'],
    cageTopSections: [
      { index: 1, positions: [1, 2], coverPlateSides: ['right'] },
      { index: 2, positions: [3], coverPlateSides: [] },
    ],
    rotorBarRows: [
      { index: 1, angleDeg: 0 },
      { index: 2, angleDeg: 180 },
    ],
    rotorBarPlaces: [
      { row: 1, position: 1, inLine: true },
      { row: 2, position: 1, inLine: false },
    ],
    rearPosition: 3,
  };
}

function element(familyId: string, partNumber: string) {
  return {
    familyId,
    active: true,
    part: {
      kind: 'element',
      partNumber,
      name: 'Fine-wire element, left hand, Willow W3',
      fitGroup: familyId,
      massKg: 31.5,
      priceCents: 99_000,
      elementType: 'fine-wire',
      role: 'either',
      hand: 'left',
      zones: ['threshing', 'separating'],
      openingMm: { width: 5, length: 24 },
      openArea: 0.36,
    },
  };
}

async function familyCount() {
  return ((await noor.get('/api/catalog/families')).body.families as unknown[]).length;
}
async function partCount(familyId?: string) {
  return ((await noor.get(`/api/catalog/parts?status=all${familyId ? `&familyId=${familyId}` : ''}`)).body.parts as unknown[]).length;
}

describe('machine families', () => {
  it('are read by anyone signed in, and by nobody signed out', async () => {
    expect((await new Client().get('/api/catalog/families')).status).toBe(401);
    const res = await olive.get('/api/catalog/families');
    expect(res.status).toBe(200);
    const ids = res.body.families.map((f: any) => f.id);
    expect(ids).toEqual(expect.arrayContaining(['tamarack-m4', 'sedge-s6']));
    const tamarack = res.body.families.find((f: any) => f.id === 'tamarack-m4');
    expect(tamarack.spec.cageKind).toBe('modular');
    expect(tamarack.machines).toBeGreaterThanOrEqual(2);
    expect(tamarack.parts).toBeGreaterThan(10);
    const one = await olive.get('/api/catalog/families/sedge-s6');
    expect(one.body.family.spec.positions).toHaveLength(6);
    expect((await olive.get('/api/catalog/families/no-such')).status).toBe(404);
    expect((await olive.get('/api/catalog/families/Not%20A%20Slug')).status).toBe(404);
  });

  it('are added and edited by an instance administrator only', async () => {
    const id = uniq('willow').toLowerCase();
    const spec = willow(id);
    expect((await new Client().post('/api/catalog/families', spec)).status).toBe(401);
    expect((await tomas.post('/api/catalog/families', spec)).status).toBe(403);
    expect((await olive.post('/api/catalog/families', spec)).status).toBe(403);
    expect((await ada.post('/api/catalog/families', spec)).status).toBe(403);
    const created = await noor.post('/api/catalog/families', spec);
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect(created.body.family).toMatchObject({ id, name: spec.name });
    const dup = await noor.post('/api/catalog/families', spec);
    expect(dup.status).toBe(409);
    expect(dup.body.error.field).toBe('id');

    const renamed = {
      ...spec,
      name: 'Willow W3 (2nd series)',
      drumOptions: [...spec.drumOptions, { id: 'slim', label: 'Slim drum', diameterMm: 700 }],
    };
    expect((await tomas.put(`/api/catalog/families/${id}`, renamed)).status).toBe(403);
    expect((await ada.put(`/api/catalog/families/${id}`, renamed)).status).toBe(403);
    const put = await noor.put(`/api/catalog/families/${id}`, renamed);
    expect(put.status).toBe(200);
    expect(put.body.family.name).toBe('Willow W3 (2nd series)');
    expect((await olive.get(`/api/catalog/families/${id}`)).body.family.spec.drumOptions).toHaveLength(2);
    const otherId = await noor.put(`/api/catalog/families/${id}`, { ...renamed, id: 'tamarack-m4' });
    expect(otherId.status).toBe(400);
    expect(otherId.body.error.field).toBe('id');
  });

  it('refuses an edit that would strand machines of the family', async () => {
    const res = await olive.get('/api/catalog/families/tamarack-m4');
    const spec = res.body.family.spec;
    // North Quarter has the slim drum and powered vanes.
    const noSlim = await noor.put('/api/catalog/families/tamarack-m4', {
      ...spec,
      drumOptions: spec.drumOptions.filter((d: any) => d.id !== 'slim'),
    });
    expect(noSlim.status).toBe(409);
    expect(noSlim.body.error.field).toBe('drumOptions');
    const noPowered = await noor.put('/api/catalog/families/tamarack-m4', { ...spec, vaneControls: ['fixed'] });
    expect(noPowered.status).toBe(409);
    expect(noPowered.body.error.field).toBe('vaneControls');
    const newGroup = await noor.put('/api/catalog/families/tamarack-m4', { ...spec, fitGroup: 'other-group' });
    expect(newGroup.status).toBe(409);
    expect(newGroup.body.error.field).toBe('fitGroup');
    expect((await olive.get('/api/catalog/families/tamarack-m4')).body.family.spec).toEqual(spec);
  });

  it('validates the family document with the domain schema, naming the field, writing nothing', async () => {
    const before = await familyCount();
    const base = willow(uniq('bad').toLowerCase());
    const cases: [unknown, string][] = [
      [{ ...base, id: 'Has Spaces' }, 'id'],
      [{ ...base, name: '' }, 'name'],
      [{ ...base, cageKind: 'round' }, 'cageKind'],
      [{ ...base, rearPosition: 2 }, 'rearPosition'],
      [
        {
          ...base,
          positions: [
            { index: 1, zone: 'separating' },
            { index: 2, zone: 'threshing' },
            { index: 3, zone: 'separating' },
          ],
        },
        'positions.1.zone',
      ],
      [{ ...base, drumOptions: [{ id: 'full', label: 'Full', diameterMm: 20 }] }, 'drumOptions.0.diameterMm'],
      [{ ...base, vaneControls: [] }, 'vaneControls'],
      [{ ...base, rotorBarPlaces: [{ row: 7, position: 1, inLine: false }] }, 'rotorBarPlaces.0.row'],
    ];
    for (const [body, field] of cases) {
      const res = await noor.post('/api/catalog/families', body);
      expect(res.status, field).toBe(400);
      expect(res.body.error.field).toBe(field);
    }
    expect(await familyCount()).toBe(before);
  });
});

describe('catalog parts', () => {
  let familyId: string;
  beforeAll(async () => {
    familyId = uniq('parts').toLowerCase();
    expect((await noor.post('/api/catalog/families', willow(familyId))).status).toBe(201);
  });

  it('are listed and filtered for anyone signed in', async () => {
    expect((await new Client().get('/api/catalog/parts')).status).toBe(401);
    const all = await olive.get('/api/catalog/parts?familyId=tamarack-m4');
    expect(all.status).toBe(200);
    expect(all.body.parts.every((p: any) => p.familyId === 'tamarack-m4' && p.active)).toBe(true);
    const plates = await olive.get('/api/catalog/parts?familyId=tamarack-m4&kind=cover-plate');
    expect(plates.body.parts.map((p: any) => p.partNumber).sort()).toEqual(['CW-CP-L-04', 'CW-CP-R-04']);
    const search = await olive.get('/api/catalog/parts?q=discharge');
    expect(search.body.parts.length).toBeGreaterThanOrEqual(2);
    expect(search.body.parts.every((p: any) => p.spec.barKind === 'discharge')).toBe(true);
    const one = await olive.get('/api/catalog/parts/CW-FW-L-04');
    expect(one.body.part.spec).toMatchObject({ kind: 'element', elementType: 'fine-wire', hand: 'left' });
    expect((await olive.get('/api/catalog/parts/CW-NONE-99')).status).toBe(404);
    expect((await olive.get('/api/catalog/parts/lower-case')).status).toBe(404);
    expect((await olive.get('/api/catalog/parts?kind=wheel')).body.error.field).toBe('kind');
  });

  it('are added, edited and retired by an instance administrator only', async () => {
    const pn = `CW-FW-L-${familyId.slice(-4).toUpperCase()}`.replace(/[^A-Z0-9-]/g, 'X');
    const body = element(familyId, pn);
    expect((await new Client().post('/api/catalog/parts', body)).status).toBe(401);
    expect((await tomas.post('/api/catalog/parts', body)).status).toBe(403);
    expect((await ada.post('/api/catalog/parts', body)).status).toBe(403);
    const created = await noor.post('/api/catalog/parts', body);
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect(created.body.part).toMatchObject({ partNumber: pn, familyId, kind: 'element', active: true });
    const dup = await noor.post('/api/catalog/parts', body);
    expect(dup.status).toBe(409);
    expect(dup.body.error.field).toBe('part.partNumber');

    const cheaper = { ...body, part: { ...body.part, priceCents: 95_000 } };
    expect((await olive.put(`/api/catalog/parts/${pn}`, cheaper)).status).toBe(403);
    // A dealer's administrator changes no part's technical data or list price, their own dealer's or another's.
    expect((await ada.put(`/api/catalog/parts/${pn}`, cheaper)).status).toBe(403);
    const put = await noor.put(`/api/catalog/parts/${pn}`, cheaper);
    expect(put.status).toBe(200);
    expect(put.body.part.spec.priceCents).toBe(95_000);
    const renumber = await noor.put(`/api/catalog/parts/${pn}`, { ...body, part: { ...body.part, partNumber: 'CW-OTHER-1' } });
    expect(renumber.body.error.field).toBe('part.partNumber');
    const rekind = await noor.put(`/api/catalog/parts/${pn}`, {
      familyId,
      part: { kind: 'rotor-bar', partNumber: pn, name: 'x', fitGroup: familyId, massKg: 5, priceCents: 1, barKind: 'rasp' },
    });
    expect(rekind.status).toBe(400);
    expect(rekind.body.error.field).toBe('part.kind');

    expect((await tomas.delete(`/api/catalog/parts/${pn}`)).status).toBe(403);
    expect((await ada.delete(`/api/catalog/parts/${pn}`)).status).toBe(403);
    const retired = await noor.delete(`/api/catalog/parts/${pn}`);
    expect(retired.status).toBe(200);
    expect(retired.body.part.active).toBe(false);
    const active = await olive.get(`/api/catalog/parts?familyId=${familyId}`);
    expect(active.body.parts.map((p: any) => p.partNumber)).not.toContain(pn);
    const retiredList = await olive.get(`/api/catalog/parts?familyId=${familyId}&status=retired`);
    expect(retiredList.body.parts.map((p: any) => p.partNumber)).toEqual([pn]);
  });

  it('validates the part document with the domain schema, naming the field, writing nothing', async () => {
    const before = await partCount();
    const body = element(familyId, 'CW-FW-R-W3Z');
    const cases: [unknown, string][] = [
      [{ ...body, part: { ...body.part, partNumber: 'cw-lower' } }, 'part.partNumber'],
      [{ ...body, part: { ...body.part, massKg: -2 } }, 'part.massKg'],
      [{ ...body, part: { ...body.part, priceCents: 12.5 } }, 'part.priceCents'],
      [{ ...body, part: { ...body.part, openArea: 1.5 } }, 'part.openArea'],
      [{ ...body, part: { ...body.part, hand: 'middle' } }, 'part.hand'],
      [{ ...body, part: { ...body.part, kind: 'wheel' } }, 'part.kind'],
      [{ ...body, part: { ...body.part, fitGroup: 'tamarack' } }, 'part.fitGroup'],
      [{ ...body, part: { ...body.part, role: 'concave' } }, 'part.role'],
      [{ ...body, familyId: 'no-such-family' }, 'familyId'],
      [{ ...body, active: 'yes' }, 'active'],
    ];
    for (const [input, field] of cases) {
      const res = await noor.post('/api/catalog/parts', input);
      expect(res.status, field).toBe(400);
      expect(res.body.error.field).toBe(field);
    }
    expect(await partCount()).toBe(before);
  });
});
