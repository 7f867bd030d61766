import { beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn } from './client';
import { firstLayoutOf, machineByNickname, newLayout, saveChanged, uniq, type MachineItem } from './fleet-helpers';

// Seeded demo fleet: North Quarter (Larkspur, modular family, slim drum, powered vanes),
// Creekside (Haldane, split family), Bean Runner (Haldane, modular family, full drum, fixed vanes).

let olive: Client; // operator, Larkspur Farms
let dev: Client; // operator, Haldane Brothers
let tomas: Client; // technician, dealer
let priya: Client; // trainer, dealer
let ada: Client; // admin, dealer
let northQuarter: MachineItem;
let creekside: MachineItem;
let beanRunner: MachineItem;

beforeAll(async () => {
  [olive, dev, tomas, priya, ada] = await Promise.all([
    signedIn('operator'),
    signedIn('operator2'),
    signedIn('technician'),
    signedIn('trainer'),
    signedIn('dealerAdmin'),
  ]);
  northQuarter = await machineByNickname(tomas, 'North Quarter');
  creekside = await machineByNickname(tomas, 'Creekside');
  beanRunner = await machineByNickname(tomas, 'Bean Runner');
});

async function machineCount(c: Client) {
  return (await c.get('/api/machines?pageSize=1')).body.total as number;
}

describe('organisations', () => {
  it('lists only what the user may see', async () => {
    expect((await new Client().get('/api/orgs')).status).toBe(401);
    const mine = await olive.get('/api/orgs');
    expect(mine.status).toBe(200);
    expect(mine.body.orgs.map((o: any) => o.name)).toEqual(['Larkspur Farms']);
    expect(mine.body.orgs[0]).toMatchObject({ kind: 'farm', member: true });
    const dealer = await tomas.get('/api/orgs');
    const names = dealer.body.orgs.map((o: any) => o.name);
    expect(names).toEqual(expect.arrayContaining(['Kestrel Valley Implement', 'Larkspur Farms', 'Haldane Brothers']));
    const larkspur = dealer.body.orgs.find((o: any) => o.name === 'Larkspur Farms');
    expect(larkspur).toMatchObject({ member: false });
    expect(larkspur.machines).toBeGreaterThanOrEqual(1);
  });

  it('lets an admin add a customer farm that dealer staff then see; others are refused', async () => {
    const name = uniq('Juniper Hollow');
    expect((await new Client().post('/api/orgs', { name })).status).toBe(401);
    const tech = await tomas.post('/api/orgs', { name });
    expect(tech.status).toBe(403);
    const op = await olive.post('/api/orgs', { name });
    expect(op.status).toBe(403);
    const created = await ada.post('/api/orgs', { name, ownerEmail: 'owner@juniper.example' });
    expect(created.status).toBe(201);
    expect(created.body.org).toMatchObject({ name, kind: 'farm' });
    const seen = await tomas.get('/api/orgs');
    expect(seen.body.orgs.map((o: any) => o.name)).toContain(name);
    expect((await olive.get('/api/orgs')).body.orgs.map((o: any) => o.name)).not.toContain(name);
    const again = await ada.post('/api/orgs', { name: name.toUpperCase() });
    expect(again.status).toBe(409);
    expect(again.body.error.field).toBe('name');
  });

  it('refuses bad input naming the field, writing nothing', async () => {
    const before = (await ada.get('/api/orgs')).body.orgs.length;
    for (const [body, field] of [
      [{ name: '' }, 'name'],
      [{ name: 'x'.repeat(200) }, 'name'],
      [{ name: 'Fine Farm', ownerEmail: 'not-an-address' }, 'ownerEmail'],
      [{}, 'name'],
    ] as const) {
      const res = await ada.post('/api/orgs', body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.field).toBe(field);
      expect(res.body.error.message).toContain(field);
    }
    expect((await ada.get('/api/orgs')).body.orgs.length).toBe(before);
  });
});

describe('machines list', () => {
  it('pages, sorts and filters what the user may see', async () => {
    const mine = await olive.get('/api/machines?pageSize=100');
    expect(mine.status).toBe(200);
    expect(mine.body.items.every((m: any) => m.orgName === 'Larkspur Farms')).toBe(true);
    expect(mine.body.items.map((m: any) => m.nickname)).toContain('North Quarter');

    const all = await tomas.get('/api/machines?sort=nickname&pageSize=100');
    const nicknames: string[] = all.body.items.map((m: any) => m.nickname);
    expect(nicknames).toEqual(expect.arrayContaining(['North Quarter', 'Creekside', 'Bean Runner']));
    const sorted = [...nicknames].sort((a, b) => a.localeCompare(b, 'en', { sensitivity: 'base' }));
    expect(nicknames.map((n) => n.toLowerCase())).toEqual(sorted.map((n) => n.toLowerCase()));
    const reversed = await tomas.get('/api/machines?sort=-nickname&pageSize=100');
    expect(reversed.body.items.map((m: any) => m.nickname)).toEqual([...nicknames].reverse());

    const p1 = await tomas.get('/api/machines?sort=nickname&pageSize=2&page=1');
    const p2 = await tomas.get('/api/machines?sort=nickname&pageSize=2&page=2');
    expect(p1.body.items).toHaveLength(2);
    expect(p1.body.total).toBe(all.body.total);
    expect(p2.body.items[0].nickname).toBe(nicknames[2]);

    const creek = await tomas.get('/api/machines?q=creek');
    expect(creek.body.items.map((m: any) => m.nickname)).toEqual(['Creekside']);
    expect(creek.body.total).toBe(1);
    // A text query also matches the farm's name; the total counts what matches.
    const haldane = await tomas.get('/api/machines?q=haldane&pageSize=100');
    expect(haldane.body.total).toBe(haldane.body.items.length);
    expect(haldane.body.items.every((m: any) => m.orgName === 'Haldane Brothers')).toBe(true);
    const byFarm = await tomas.get(`/api/machines?orgId=${creekside.orgId}&pageSize=100`);
    expect(byFarm.body.items.every((m: any) => m.orgName === 'Haldane Brothers')).toBe(true);
    expect(byFarm.body.total).toBe(byFarm.body.items.length);
    // Past the last page: no rows, and the total still says how many there are.
    const past = await tomas.get('/api/machines?pageSize=2&page=99');
    expect(past.body.items).toEqual([]);
    expect(past.body.total).toBe(all.body.total);
    // A query term matching only another farm's machine finds nothing for Olive.
    expect((await olive.get('/api/machines?q=creekside')).body.items).toEqual([]);
    // LIKE wildcards in the query are taken literally.
    expect((await tomas.get('/api/machines?q=%25')).body.items).toEqual([]);
  });

  it('names the bad query parameter', async () => {
    expect((await new Client().get('/api/machines')).status).toBe(401);
    for (const [qs, field] of [
      ['sort=colour', 'sort'],
      ['pageSize=1000', 'pageSize'],
      ['page=0', 'page'],
      ['page=two', 'page'],
      ['orgId=not-a-uuid', 'orgId'],
    ] as const) {
      const res = await tomas.get(`/api/machines?${qs}`);
      expect(res.status, qs).toBe(400);
      expect(res.body.error.field).toBe(field);
    }
  });
});

describe('machines: create, read, update, delete', () => {
  it('lets a technician add a machine for a customer farm, audited', async () => {
    const serial = uniq('HB');
    const res = await tomas.post('/api/machines', {
      orgId: beanRunner.orgId,
      familyId: 'tamarack-m4',
      drum: 'slim',
      vaneControl: 'powered',
      serial,
      nickname: 'South Forty',
      notes: 'Demo unit on loan.',
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const id = res.body.machine.id;
    const got = await dev.get(`/api/machines/${id}`);
    expect(got.status).toBe(200);
    expect(got.body.machine).toMatchObject({ serial, nickname: 'South Forty', drum: 'slim', vaneControl: 'powered' });
    expect(got.body.orgName).toBe('Haldane Brothers');
    expect(got.body.family.id).toBe('tamarack-m4');
    expect(got.body.installed).toBeNull();
    expect(got.body.layouts).toEqual([]);
    expect(got.body.activity[0]).toMatchObject({ action: 'create', entity: 'machine', byName: 'Tomas Reyes' });
  });

  it('creates an operator’s machine on their own farm by default', async () => {
    const res = await olive.post('/api/machines', {
      familyId: 'sedge-s6',
      drum: 'full',
      vaneControl: 'manual',
      serial: uniq('LK'),
      nickname: 'Hilltop',
    });
    expect(res.status).toBe(201);
    expect(res.body.machine.orgId).toBe(northQuarter.orgId);
  });

  it('refuses the signed-out (401), a trainer (403) and another farm (404)', async () => {
    const body = { familyId: 'tamarack-m4', drum: 'full', vaneControl: 'fixed', serial: 'X-1', nickname: 'Nope' };
    const before = await machineCount(tomas);
    expect((await new Client().post('/api/machines', body)).status).toBe(401);
    expect((await priya.post('/api/machines', body)).status).toBe(403);
    const foreign = await olive.post('/api/machines', { ...body, orgId: creekside.orgId });
    expect(foreign.status).toBe(404);
    expect(foreign.body.error.field).toBe('orgId');
    expect(await machineCount(tomas)).toBe(before);
  });

  it('refuses bad input naming the field, writing nothing', async () => {
    const good = { familyId: 'tamarack-m4', drum: 'full', vaneControl: 'fixed', serial: 'X-2', nickname: 'Fine' };
    const before = await machineCount(tomas);
    const cases: [Record<string, unknown>, string][] = [
      [{ ...good, nickname: '' }, 'nickname'],
      [{ ...good, nickname: '   ' }, 'nickname'],
      [{ ...good, serial: undefined }, 'serial'],
      [{ ...good, familyId: 'no-such-family' }, 'familyId'],
      [{ ...good, familyId: 'Bad Family!' }, 'familyId'],
      [{ ...good, drum: 'hollow' }, 'drum'],
      [{ ...good, familyId: 'sedge-s6', drum: 'slim', vaneControl: 'manual' }, 'drum'],
      [{ ...good, vaneControl: 'manual' }, 'vaneControl'],
      [{ ...good, notes: 'x'.repeat(5000) }, 'notes'],
      [{ ...good, orgId: 'nope' }, 'orgId'],
    ];
    for (const [body, field] of cases) {
      const res = await tomas.post('/api/machines', { ...body, orgId: body.orgId ?? beanRunner.orgId });
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.field, JSON.stringify(body)).toBe(field);
    }
    const wrongType = await tomas.fetch('/api/machines', { method: 'POST', headers: { 'content-type': 'text/plain' }, body: 'x' });
    expect(wrongType.status).toBe(415);
    const broken = await tomas.fetch('/api/machines', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{' });
    expect(broken.status).toBe(400);
    expect(await machineCount(tomas)).toBe(before);
  });

  it('hides another organisation’s machine as not found', async () => {
    for (const path of [
      `/api/machines/${creekside.id}`,
      `/api/machines/${creekside.id}/installed`,
      `/api/machines/${creekside.id}/layouts`,
    ]) {
      const res = await olive.get(path);
      expect(res.status, path).toBe(404);
    }
    expect((await olive.put(`/api/machines/${creekside.id}`, { nickname: 'Mine now' })).status).toBe(404);
    expect((await olive.delete(`/api/machines/${creekside.id}`)).status).toBe(404);
    expect((await olive.get('/api/machines/not-a-uuid')).status).toBe(404);
    expect((await dev.get(`/api/machines/${creekside.id}`)).body.machine.nickname).toBe('Creekside');
  });

  it('updates a machine, keeping its family, and refuses the wrong role', async () => {
    const created = await dev.post('/api/machines', {
      familyId: 'tamarack-m4',
      drum: 'full',
      vaneControl: 'fixed',
      serial: uniq('HB'),
      nickname: 'Old Blue',
    });
    const id = created.body.machine.id;
    expect((await new Client().put(`/api/machines/${id}`, { nickname: 'x' })).status).toBe(401);
    expect((await priya.put(`/api/machines/${id}`, { nickname: 'x' })).status).toBe(403);
    const ok = await dev.put(`/api/machines/${id}`, { nickname: 'Old Blue II', drum: 'slim', notes: 'New drum fitted.' });
    expect(ok.status).toBe(200);
    expect(ok.body.machine).toMatchObject({ nickname: 'Old Blue II', drum: 'slim', notes: 'New drum fitted.', familyId: 'tamarack-m4' });
    for (const [body, field] of [
      [{ familyId: 'sedge-s6' }, 'familyId'],
      [{ orgId: northQuarter.orgId }, 'orgId'],
      [{ vaneControl: 'manual' }, 'vaneControl'],
      [{ nickname: '' }, 'nickname'],
    ] as const) {
      const res = await dev.put(`/api/machines/${id}`, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.field).toBe(field);
    }
    const after = await dev.get(`/api/machines/${id}`);
    expect(after.body.machine).toMatchObject({ nickname: 'Old Blue II', drum: 'slim', familyId: 'tamarack-m4', vaneControl: 'fixed' });
    expect(after.body.activity.map((a: any) => a.action)).toEqual(['update', 'create']);
  });

  it('deletes a machine with its layouts; a trainer may not', async () => {
    const created = await dev.post('/api/machines', {
      familyId: 'tamarack-m4',
      drum: 'full',
      vaneControl: 'fixed',
      serial: uniq('HB'),
      nickname: 'Scrap',
    });
    const id = created.body.machine.id;
    const { layout } = await newLayout(dev, id, 'to go');
    expect((await priya.delete(`/api/machines/${id}`)).status).toBe(403);
    expect((await new Client().delete(`/api/machines/${id}`)).status).toBe(401);
    const gone = await dev.delete(`/api/machines/${id}`);
    expect(gone.status).toBe(200);
    expect((await dev.get(`/api/machines/${id}`)).status).toBe(404);
    expect((await dev.get(`/api/layouts/${layout.id}`)).status).toBe(404);
    expect((await dev.delete(`/api/machines/${id}`)).status).toBe(404);
  });
});

describe('what is installed', () => {
  it('reads the installed layout with findings; records a saved version as installed', async () => {
    const got = await olive.get(`/api/machines/${northQuarter.id}/installed`);
    expect(got.status).toBe(200);
    expect(got.body.installed.layout.familyId).toBe('tamarack-m4');
    expect(Array.isArray(got.body.findings)).toBe(true);

    const { layout } = await newLayout(olive, northQuarter.id, uniq('canola plan'), 'canola');
    expect(
      (await priya.put(`/api/machines/${northQuarter.id}/installed`, { fromLayout: { layoutId: layout.id, version: 1 } })).status,
    ).toBe(403);
    const put = await olive.put(`/api/machines/${northQuarter.id}/installed`, { fromLayout: { layoutId: layout.id, version: 1 } });
    expect(put.status, JSON.stringify(put.body)).toBe(200);
    expect(put.body.installed.layout.crop).toBe('canola');
    expect(put.body.installed.updatedByName).toBe('Olive Marsh');
    const overview = await olive.get(`/api/machines/${northQuarter.id}`);
    expect(overview.body.installed.layout.crop).toBe('canola');
    expect(overview.body.activity[0]).toMatchObject({ action: 'install', entity: 'machine' });

    // A full layout document works too.
    const body = { ...put.body.installed.layout, crop: 'wheat' };
    const doc = await olive.put(`/api/machines/${northQuarter.id}/installed`, { layout: body });
    expect(doc.status).toBe(200);
    expect(doc.body.installed.layout.crop).toBe('wheat');
  });

  it('refuses bad input naming the field, and other farms’ machines', async () => {
    const before = (await olive.get(`/api/machines/${northQuarter.id}/installed`)).body.installed;
    const body = before.layout;
    const creekLayout = await firstLayoutOf(dev, creekside.id);
    const cases: [unknown, string][] = [
      [{}, 'layout'],
      [{ layout: { ...body, familyId: 'sedge-s6' } }, 'layout.familyId'],
      [{ layout: { ...body, rotorRpm: 5 } }, 'layout.rotorRpm'],
      [{ layout: { ...body, elements: [{ position: 1, side: 'left', partNumber: 'CW-NOPE-L-04' }] } }, 'layout.elements.0.partNumber'],
      [{ fromLayout: { layoutId: creekLayout.id, version: 1 } }, 'fromLayout.layoutId'],
      [{ fromLayout: { layoutId: 'x', version: 1 } }, 'fromLayout.layoutId'],
    ];
    for (const [input, field] of cases) {
      const res = await olive.put(`/api/machines/${northQuarter.id}/installed`, input);
      expect(res.status, JSON.stringify(input).slice(0, 120)).toBe(400);
      expect(res.body.error.field).toBe(field);
    }
    const after = (await olive.get(`/api/machines/${northQuarter.id}/installed`)).body.installed;
    expect(after.layout).toEqual(before.layout);
    expect((await olive.put(`/api/machines/${creekside.id}/installed`, { layout: body })).status).toBe(404);
    expect((await new Client().get(`/api/machines/${creekside.id}/installed`)).status).toBe(401);
  });
});

describe('layouts: start, history, restore, compare, copy', () => {
  it('starts a layout from a crop on the machine’s own drum and vanes, or names the missing field', async () => {
    const { layout, version } = await newLayout(olive, northQuarter.id, uniq('peas'), 'field-peas');
    expect(layout.currentVersion).toBe(1);
    expect(version.body).toMatchObject({ familyId: 'tamarack-m4', crop: 'field-peas', drum: 'slim', vaneControl: 'powered' });
    const none = await olive.post(`/api/machines/${northQuarter.id}/layouts`, { name: 'empty' });
    expect(none.status).toBe(400);
    expect(none.body.error.field).toBe('crop');
    const badCrop = await olive.post(`/api/machines/${northQuarter.id}/layouts`, { name: 'x', crop: 'turnips' });
    expect(badCrop.body.error.field).toBe('crop');
    expect((await priya.post(`/api/machines/${northQuarter.id}/layouts`, { name: 'x', crop: 'wheat' })).status).toBe(403);
  });

  it('restores an old version as a new one, keeping every version', async () => {
    const { layout, version: v1 } = await newLayout(olive, northQuarter.id, uniq('history'));
    const v2 = await saveChanged(olive, layout.id, (b) => (b.rotorRpm = 700), 'slower');
    expect(v2).toBe(2);
    const v3 = await saveChanged(olive, layout.id, (b) => (b.vaneSetting = 'fast'), 'faster vanes');
    expect(v3).toBe(3);

    expect((await new Client().post(`/api/layouts/${layout.id}/restore`, { version: 1 })).status).toBe(401);
    expect((await priya.post(`/api/layouts/${layout.id}/restore`, { version: 1 })).status).toBe(403);
    expect((await dev.post(`/api/layouts/${layout.id}/restore`, { version: 1 })).status).toBe(404);
    for (const [body, field] of [
      [{ version: 9 }, 'version'],
      [{ version: 3 }, 'version'],
      [{ version: 0 }, 'version'],
      [{ version: '1' }, 'version'],
      [{}, 'version'],
    ] as const) {
      const res = await olive.post(`/api/layouts/${layout.id}/restore`, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.field).toBe(field);
    }
    const stale = await olive.post(`/api/layouts/${layout.id}/restore`, { version: 1, baseVersion: 2 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.currentVersion).toBe(3);

    const restored = await olive.post(`/api/layouts/${layout.id}/restore`, { version: 1 });
    expect(restored.status).toBe(201);
    expect(restored.body.version).toMatchObject({ version: 4, note: 'Restored from version 1' });
    expect(restored.body.version.body).toEqual(v1.body);
    const history = await olive.get(`/api/layouts/${layout.id}/versions`);
    expect(history.body.versions.map((v: any) => v.version)).toEqual([4, 3, 2, 1]);
    expect(history.body.versions.map((v: any) => v.note)).toEqual(['Restored from version 1', 'faster vanes', 'slower', 'test start']);
    expect(history.body).toMatchObject({ total: 4, page: 1, pageSize: 50 });
    // A page at a time, newest first; a bad page size is named.
    const second = await olive.get(`/api/layouts/${layout.id}/versions?pageSize=3&page=2`);
    expect(second.body.versions.map((v: any) => v.version)).toEqual([1]);
    expect(second.body.total).toBe(4);
    const bad = await olive.get(`/api/layouts/${layout.id}/versions?pageSize=0`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('pageSize');
    const overview = await olive.get(`/api/machines/${northQuarter.id}`);
    const trail = overview.body.activity.filter((a: any) => a.entityId === layout.id).map((a: any) => a.action);
    expect(trail).toEqual(['restore', 'save', 'save', 'create']);
  });

  it('compares two versions place by place', async () => {
    const { layout } = await newLayout(olive, northQuarter.id, uniq('compare'));
    await saveChanged(olive, layout.id, (b) => {
      b.rotorRpm = 690;
      const e = b.elements.find((x: any) => x.position === 2 && x.side === 'left');
      e.partNumber = 'CW-WW-L-04';
    });
    const res = await tomas.get(`/api/layouts/${layout.id}/compare?a=1&b=2`);
    expect(res.status).toBe(200);
    expect(res.body.a.version).toBe(1);
    expect(res.body.b.version).toBe(2);
    expect(res.body.diff.differences).toEqual([
      {
        kind: 'setting',
        place: { kind: 'setting', field: 'rotorRpm' },
        field: 'rotorRpm',
        change: 'changed',
        before: res.body.a.body.rotorRpm,
        after: 690,
      },
      {
        kind: 'element',
        place: { kind: 'element', position: 2, side: 'left' },
        change: 'changed',
        before: 'CW-FW-L-04',
        after: 'CW-WW-L-04',
      },
    ]);
    expect(Array.isArray(res.body.a.findings)).toBe(true);
    expect((await priya.get(`/api/layouts/${layout.id}/compare?a=1&b=2`)).status).toBe(200);
    expect((await dev.get(`/api/layouts/${layout.id}/compare?a=1&b=2`)).status).toBe(404);
    expect((await new Client().get(`/api/layouts/${layout.id}/compare?a=1&b=2`)).status).toBe(401);
    const missing = await olive.get(`/api/layouts/${layout.id}/compare?a=1`);
    expect(missing.status).toBe(400);
    expect(missing.body.error.field).toBe('b');
    const none = await olive.get(`/api/layouts/${layout.id}/compare?a=1&b=7`);
    expect(none.status).toBe(404);
    expect(none.body.error.field).toBe('b');
  });

  it('copies a layout to a machine of the same family, re-checked, adapted to that machine', async () => {
    const { layout } = await newLayout(olive, northQuarter.id, uniq('to share'), 'wheat');
    await saveChanged(
      olive,
      layout.id,
      (b) => {
        b.elements = b.elements.filter((e: any) => !(e.position === 4 && e.side === 'right'));
      },
      'missing one',
    );
    const copy = await tomas.post(`/api/layouts/${layout.id}/copy`, { machineId: beanRunner.id, version: 2 });
    expect(copy.status, JSON.stringify(copy.body)).toBe(201);
    // North Quarter: slim drum, powered vanes; Bean Runner: full drum, fixed vanes.
    expect(copy.body.adjusted).toEqual(['drum', 'vaneControl']);
    expect(copy.body.version.body).toMatchObject({ drum: 'full', vaneControl: 'fixed', familyId: 'tamarack-m4' });
    expect(copy.body.findings.map((f: any) => f.code)).toContain('FIT_EMPTY_POSITION');
    expect(copy.body.layout.name).toBe(layout.name);
    const there = await dev.get(`/api/machines/${beanRunner.id}/layouts`);
    expect(there.body.layouts.map((l: any) => l.id)).toContain(copy.body.layout.id);
    expect((await olive.get(`/api/layouts/${copy.body.layout.id}`)).status).toBe(404);
  });

  it('refuses a copy to another family, to a farm not visible, or by the wrong role', async () => {
    const { layout } = await newLayout(olive, northQuarter.id, uniq('no copy'));
    const before = (await dev.get(`/api/machines/${creekside.id}/layouts`)).body.layouts.length;
    const other = await tomas.post(`/api/layouts/${layout.id}/copy`, { machineId: creekside.id });
    expect(other.status).toBe(400);
    expect(other.body.error.field).toBe('machineId');
    expect(other.body.error.message).toMatch(/same family/);
    const hidden = await olive.post(`/api/layouts/${layout.id}/copy`, { machineId: beanRunner.id });
    expect(hidden.status).toBe(404);
    expect(hidden.body.error.field).toBe('machineId');
    expect((await priya.post(`/api/layouts/${layout.id}/copy`, { machineId: beanRunner.id })).status).toBe(403);
    expect((await new Client().post(`/api/layouts/${layout.id}/copy`, { machineId: beanRunner.id })).status).toBe(401);
    for (const [body, field] of [
      [{ machineId: 'x' }, 'machineId'],
      [{}, 'machineId'],
      [{ machineId: beanRunner.id, version: 5 }, 'version'],
      [{ machineId: beanRunner.id, name: '' }, 'name'],
    ] as const) {
      const res = await tomas.post(`/api/layouts/${layout.id}/copy`, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.field).toBe(field);
    }
    expect((await dev.get(`/api/machines/${creekside.id}/layouts`)).body.layouts.length).toBe(before);
  });
});

describe('bad input on every write route (generated bodies)', () => {
  it('always answers 400 with a message (naming the field for objects), never 5xx, and writes nothing', async () => {
    const fc = (await import('fast-check')).default;
    const { layout } = await newLayout(olive, northQuarter.id, uniq('fuzz target'));
    const linkCount = async () => ((await olive.get('/api/share-links')).body.links as unknown[]).length;
    const partCount = async () => ((await ada.get('/api/catalog/parts?status=all')).body.parts as unknown[]).length;
    const before = {
      machines: await machineCount(tomas),
      versions: (await olive.get(`/api/layouts/${layout.id}/versions`)).body.versions.length,
      links: await linkCount(),
      orgs: (await ada.get('/api/orgs')).body.orgs.length,
      parts: await partCount(),
      families: (await ada.get('/api/catalog/families')).body.families.length,
      machine: (await olive.get(`/api/machines/${northQuarter.id}`)).body.machine,
      installed: (await olive.get(`/api/machines/${northQuarter.id}/installed`)).body.installed,
    };
    const routes: [Client, 'POST' | 'PUT', string][] = [
      [tomas, 'POST', '/api/machines'],
      [olive, 'PUT', `/api/machines/${northQuarter.id}`],
      [olive, 'PUT', `/api/machines/${northQuarter.id}/installed`],
      [olive, 'POST', `/api/machines/${northQuarter.id}/layouts`],
      [olive, 'PUT', `/api/layouts/${layout.id}`],
      [olive, 'POST', `/api/layouts/${layout.id}/restore`],
      [olive, 'POST', `/api/layouts/${layout.id}/copy`],
      [olive, 'POST', '/api/share-links'],
      [ada, 'POST', '/api/orgs'],
      [ada, 'POST', '/api/catalog/families'],
      [ada, 'PUT', '/api/catalog/families/tamarack-m4'],
      [ada, 'POST', '/api/catalog/parts'],
      [ada, 'PUT', '/api/catalog/parts/CW-FW-L-04'],
    ];
    // Arbitrary JSON, and objects whose keys are the routes' real field names with wrong values.
    const keys = fc.constantFrom(
      'name',
      'nickname',
      'serial',
      'familyId',
      'drum',
      'vaneControl',
      'orgId',
      'layout',
      'body',
      'baseVersion',
      'version',
      'machineId',
      'layoutId',
      'label',
      'expiresAt',
      'part',
      'crop',
      'positions',
      'id',
    );
    // Field values are never strings: a random string can be a valid name, and then the body is
    // simply valid (that is not bad input).
    const notString = fc.oneof(
      fc.integer(),
      fc.double(),
      fc.boolean(),
      fc.array(fc.jsonValue({ maxDepth: 1 }), { maxLength: 3 }),
      fc.dictionary(fc.string(), fc.jsonValue({ maxDepth: 1 }), { maxKeys: 3 }),
    );
    const body = fc.oneof(fc.jsonValue({ maxDepth: 3 }), fc.dictionary(keys, notString, { minKeys: 1, maxKeys: 5 }));
    for (const [client, method, path] of routes) {
      await fc.assert(
        fc.asyncProperty(body, async (b) => {
          const res = await client.json(method, path, b);
          expect(res.status, `${method} ${path} ${JSON.stringify(b).slice(0, 200)}`).toBeGreaterThanOrEqual(400);
          expect(res.status, `${method} ${path} ${JSON.stringify(b).slice(0, 200)}`).toBeLessThan(500);
          expect(typeof res.body.error.message).toBe('string');
          if (res.status === 400 && b !== null && typeof b === 'object' && !Array.isArray(b))
            expect(res.body.error.field, `${path} ${JSON.stringify(b).slice(0, 200)}`).toBeTruthy();
        }),
        { numRuns: 15 },
      );
    }
    expect(await machineCount(tomas)).toBe(before.machines);
    expect((await olive.get(`/api/layouts/${layout.id}/versions`)).body.versions.length).toBe(before.versions);
    expect(await linkCount()).toBe(before.links);
    expect((await ada.get('/api/orgs')).body.orgs.length).toBe(before.orgs);
    expect(await partCount()).toBe(before.parts);
    expect((await ada.get('/api/catalog/families')).body.families.length).toBe(before.families);
    expect((await olive.get(`/api/machines/${northQuarter.id}`)).body.machine).toEqual(before.machine);
    expect((await olive.get(`/api/machines/${northQuarter.id}/installed`)).body.installed).toEqual(before.installed);
  }, 300_000);
});
