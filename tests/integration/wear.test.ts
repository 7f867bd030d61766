import { beforeAll, describe, expect, it } from 'vitest';
import { demoCatalog, starterLayout, tamarackM4, type Layout } from '~/lib/domain';
import { Client, signedIn } from './client';
import { LOSS_CHECK_BODY, OTHER } from './matrix-fixtures';

/**
 * Machine hours, part history and the wear forecast against the real server: readings by hand
 * and at inspections and loss checks (a lower one refused with the field named, and nothing
 * written), history rows after installs (moves, the shelf, new), wear kept per part, the
 * forecast through the API and the part page, the dealer's before-the-season list, and who may
 * see what. Each test works on a machine of its own so other suites sharing the store do not
 * disturb it.
 */

let olive: Client;
let tomas: Client;
let ada: Client;
let priya: Client;
let dev: Client;
let noor: Client;
let strangerOp: Client;
let strangerTech: Client;

async function as(email: string) {
  const c = new Client();
  await c.signIn(email);
  expect(c.hasSession()).toBe(true);
  return c;
}

beforeAll(async () => {
  [olive, tomas, ada, priya, dev, noor] = await Promise.all([
    signedIn('operator'),
    signedIn('technician'),
    signedIn('dealerAdmin'),
    signedIn('trainer'),
    signedIn('operator2'),
    signedIn('instanceAdmin'),
  ]);
  strangerOp = await as(OTHER.operator);
  strangerTech = await as(OTHER.technician);
});

let serial = 0;
/** A new Tamarack M4 on Larkspur's farm, nothing installed yet. */
async function bareMachine(nickname: string) {
  const created = await olive.post('/api/machines', {
    familyId: tamarackM4.id,
    drum: 'slim',
    vaneControl: 'powered',
    serial: `WR-${Date.now().toString(36).toUpperCase()}-${++serial}`,
    nickname,
  });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  return created.body.machine.id as string;
}

const wheat = (): Layout => ({ ...starterLayout(tamarackM4, 'wheat', demoCatalog), drum: 'slim', vaneControl: 'powered' }) as Layout;
const part = (l: Layout, position: number, side: 'left' | 'right') => l.elements.find((e) => e.position === position && e.side === side)!;
const withPart = (l: Layout, position: number, side: 'left' | 'right', partNumber: string): Layout => ({
  ...l,
  elements: l.elements.map((e) => (e.position === position && e.side === side ? { ...e, partNumber } : e)),
});

async function install(machineId: string, layout: Layout) {
  const put = await olive.put(`/api/machines/${machineId}/installed`, { layout });
  expect(put.status, JSON.stringify(put.body)).toBe(200);
}

async function hours(c: Client, machineId: string, reading: Record<string, unknown>) {
  return c.post(`/api/machines/${machineId}/hours`, reading);
}

async function readings(machineId: string) {
  const got = await olive.get(`/api/machines/${machineId}/hours`);
  expect(got.status).toBe(200);
  return got.body.readings as {
    engineHours: number;
    separatorHours: number;
    source: string;
    sourceId: string | null;
    correctionReason: string | null;
  }[];
}

async function history(machineId: string) {
  const got = await olive.get(`/api/machines/${machineId}/parts`);
  expect(got.status, JSON.stringify(got.body)).toBe(200);
  return got.body as {
    current: { record: any; points: any[]; forecast: any; limitDate: string | null }[];
    past: any[];
  };
}

describe('machine hours by hand', () => {
  let machineId: string;
  beforeAll(async () => {
    machineId = await bareMachine('Hours test');
  });

  it('records readings, lists them newest first, and refuses a lower one naming the field, writing nothing', async () => {
    expect(await readings(machineId)).toEqual([]);
    expect((await hours(olive, machineId, { engineHours: 100, separatorHours: 80 })).status).toBe(201);
    const lower = await hours(olive, machineId, { engineHours: 90, separatorHours: 85 });
    expect(lower.status).toBe(400);
    expect(lower.body.error?.field).toBe('engineHours');
    const lowerSep = await hours(tomas, machineId, { engineHours: 120, separatorHours: 70 });
    expect(lowerSep.status).toBe(400);
    expect(lowerSep.body.error?.field).toBe('separatorHours');
    const sepOverEngine = await hours(olive, machineId, { engineHours: 120, separatorHours: 130 });
    expect(sepOverEngine.status).toBe(400);
    expect(sepOverEngine.body.error?.field).toBe('separatorHours');
    expect(await readings(machineId)).toHaveLength(1);

    // A correction with a reason is kept; the list reads newest first.
    const corrected = await hours(ada, machineId, { engineHours: 90, separatorHours: 75, correctionReason: 'hour meter replaced' });
    expect(corrected.status, JSON.stringify(corrected.body)).toBe(201);
    const list = await readings(machineId);
    expect(list.map((r) => r.engineHours)).toEqual([90, 100]);
    expect(list[0]).toMatchObject({ source: 'manual', correctionReason: 'hour meter replaced' });
  });

  it('refuses bad input with the field named', async () => {
    const cases: [unknown, string][] = [
      [{ engineHours: 'lots', separatorHours: 1 }, 'engineHours'],
      [{ engineHours: 500, separatorHours: -1 }, 'separatorHours'],
      [{ separatorHours: 1 }, 'engineHours'],
      [{ engineHours: 500, separatorHours: 400, correctionReason: '' }, 'correctionReason'],
      [{ engineHours: 1e9, separatorHours: 1 }, 'engineHours'],
    ];
    for (const [body, field] of cases) {
      const res = await hours(olive, machineId, body as Record<string, unknown>);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error?.field, JSON.stringify(res.body)).toBe(field);
    }
    expect(await readings(machineId)).toHaveLength(2);
  });

  it('lets the farm, its dealer’s technicians and administrators in; trainers 403; other organisations 404', async () => {
    for (const c of [olive, tomas, ada]) expect((await c.get(`/api/machines/${machineId}/hours`)).status).toBe(200);
    expect((await priya.get(`/api/machines/${machineId}/hours`)).status).toBe(403);
    expect((await hours(priya, machineId, { engineHours: 500, separatorHours: 400 })).status).toBe(403);
    expect((await noor.get(`/api/machines/${machineId}/hours`)).status).toBe(403);
    // Another farm of the same dealer, and another dealer's people: not found.
    for (const c of [dev, strangerOp, strangerTech]) {
      expect((await c.get(`/api/machines/${machineId}/hours`)).status).toBe(404);
      expect((await hours(c, machineId, { engineHours: 500, separatorHours: 400 })).status).toBe(404);
    }
    expect(await readings(machineId)).toHaveLength(2);
  });

  it('shows the last reading on the machine page and records one through the form', async () => {
    const page = await (await olive.fetch(`/machines/${machineId}`)).text();
    expect(page).toContain('data-testid="last-hours"');
    expect(page).toMatch(/engine <strong>90(\.0)? h<\/strong>/);
    const form = new URLSearchParams({ engineHours: '80', separatorHours: '70' });
    const refused = await olive.fetch(`/machines/${machineId}/hours`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: form.toString(),
    });
    expect(refused.status).toBe(400);
    expect(await refused.text()).toContain('engineHours');
    const ok = await olive.fetch(`/machines/${machineId}/hours`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ engineHours: '95.5', separatorHours: '78' }).toString(),
    });
    expect(ok.status).toBe(303);
    expect((await readings(machineId))[0]).toMatchObject({ engineHours: 95.5, separatorHours: 78 });
  });
});

describe('hours at inspections and loss checks', () => {
  let machineId: string;
  beforeAll(async () => {
    machineId = await bareMachine('Hours at work');
    await install(machineId, wheat());
    expect((await hours(olive, machineId, { engineHours: 500, separatorHours: 400 })).status).toBe(201);
  });

  it('an inspection finished with a lower reading stays open and records nothing; with a right one the reading and the wear are kept', async () => {
    const started = await tomas.post(`/api/machines/${machineId}/inspections`, { title: 'Hours test' });
    expect(started.status, JSON.stringify(started.body)).toBe(201);
    const insp = started.body;
    const line = insp.items.find((i: any) => i.placeKey === 'element:1:right');
    expect((await tomas.patch(`/api/inspections/${insp.id}`, { items: [{ id: line.id, measurements: { wearMm: 1.5 } }] })).status).toBe(
      200,
    );

    const refused = await tomas.post(`/api/inspections/${insp.id}`, { action: 'finish', hours: { engineHours: 450, separatorHours: 410 } });
    expect(refused.status).toBe(400);
    expect(refused.body.error?.field).toBe('hours.engineHours');
    expect((await tomas.get(`/api/inspections/${insp.id}`)).body.status).toBe('open');
    expect(await readings(machineId)).toHaveLength(1);
    expect((await history(machineId)).current.every((v) => v.points.length === 0)).toBe(true);

    const done = await tomas.post(`/api/inspections/${insp.id}`, { action: 'finish', hours: { engineHours: 520, separatorHours: 415 } });
    expect(done.status, JSON.stringify(done.body)).toBe(200);
    expect(done.body.status).toBe('finished');
    const [latest] = await readings(machineId);
    expect(latest).toMatchObject({ engineHours: 520, separatorHours: 415, source: 'inspection', sourceId: insp.id });
    const h = await history(machineId);
    const measured = h.current.find((v) => v.record.placeKey === 'element:1:right')!;
    expect(measured.points).toHaveLength(1);
    expect(measured.points[0]).toMatchObject({ wearMm: 1.5, inspectionId: insp.id });
    expect(h.current.filter((v) => v.points.length > 0)).toHaveLength(1);
  });

  it('a loss check with a lower reading is refused and not recorded; with a right one both are', async () => {
    const before = (await olive.get(`/api/machines/${machineId}/loss-checks`)).body.checks.length;
    const refused = await olive.post(`/api/machines/${machineId}/loss-checks`, {
      ...LOSS_CHECK_BODY,
      hours: { engineHours: 530, separatorHours: 300 },
    });
    expect(refused.status).toBe(400);
    expect(refused.body.error?.field).toBe('hours.separatorHours');
    expect((await olive.get(`/api/machines/${machineId}/loss-checks`)).body.checks.length).toBe(before);
    expect(await readings(machineId)).toHaveLength(2);

    const ok = await olive.post(`/api/machines/${machineId}/loss-checks`, {
      ...LOSS_CHECK_BODY,
      hours: { engineHours: 531, separatorHours: 425 },
    });
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    const [latest] = await readings(machineId);
    expect(latest).toMatchObject({ engineHours: 531, separatorHours: 425, source: 'loss_check', sourceId: ok.body.id });
    // Without hours the loss check is recorded as before.
    expect((await olive.post(`/api/machines/${machineId}/loss-checks`, LOSS_CHECK_BODY)).status).toBe(201);
    expect(await readings(machineId)).toHaveLength(3);
  });
});

describe('part history through installs, and the forecast', () => {
  let machineId: string;
  const first = wheat();
  const fwRight = part(first, 2, 'right').partNumber;
  const wwRight = part(first, 3, 'right').partNumber;
  const fwLeft = part(first, 1, 'left').partNumber;
  const wwLeft = part(first, 3, 'left').partNumber;

  beforeAll(async () => {
    expect(fwLeft).not.toBe(wwLeft);
    expect(fwRight).not.toBe(wwRight);
    machineId = await bareMachine('History test');
    expect((await hours(olive, machineId, { engineHours: 100, separatorHours: 50 })).status).toBe(201);
  });

  it('opens a starting record per part at the first install, with the separator hours then', async () => {
    await install(machineId, first);
    const h = await history(machineId);
    const places = first.elements.length + first.coverPlates.length + first.rotorBars.length;
    expect(h.current).toHaveLength(places);
    expect(h.past).toHaveLength(0);
    for (const v of h.current) expect(v.record).toMatchObject({ origin: 'start', installedSeparatorHours: 50, removedAt: null });
  });

  it('after a second install: swapped places are moves, a changed place goes to the shelf; a third install takes it back from the shelf', async () => {
    expect((await hours(olive, machineId, { engineHours: 200, separatorHours: 130 })).status).toBe(201);
    // Swap position 1 left and 3 left (a move each way), and put a wide-wire element at 2 right.
    const second = withPart(withPart(withPart(first, 1, 'left', wwLeft), 3, 'left', fwLeft), 2, 'right', wwRight);
    await install(machineId, second);
    let h = await history(machineId);
    const at = (key: string) => h.current.find((v) => v.record.placeKey === key)!.record;
    const pastAt = (key: string) => h.past.filter((r) => r.placeKey === key);
    expect(pastAt('element:1:left')).toEqual([
      expect.objectContaining({ partNumber: fwLeft, removedTo: 'moved', removedSeparatorHours: 130 }),
    ]);
    expect(pastAt('element:3:left')).toEqual([expect.objectContaining({ partNumber: wwLeft, removedTo: 'moved' })]);
    expect(pastAt('element:2:right')).toEqual([
      expect.objectContaining({ partNumber: fwRight, removedTo: 'shelf', removedSeparatorHours: 130 }),
    ]);
    // The moved parts carry the hours they ran in their old place: 130 − 50 = 80.
    expect(at('element:3:left')).toMatchObject({
      partNumber: fwLeft,
      origin: 'moved',
      previousRecordId: pastAt('element:1:left')[0].id,
      carriedHours: 80,
    });
    expect(at('element:1:left')).toMatchObject({ partNumber: wwLeft, origin: 'moved', installedSeparatorHours: 130, carriedHours: 80 });
    expect(['new', 'shelf']).toContain(at('element:2:right').origin);
    // Places that kept their part keep their record.
    expect(at('element:1:right')).toMatchObject({ origin: 'start', installedSeparatorHours: 50 });
    const shelved = pastAt('element:2:right')[0];

    expect((await hours(olive, machineId, { engineHours: 260, separatorHours: 170 })).status).toBe(201);
    await install(machineId, withPart(second, 2, 'right', fwRight));
    h = await history(machineId);
    const back = at('element:2:right');
    expect(back).toMatchObject({
      partNumber: fwRight,
      origin: 'shelf',
      previousRecordId: shelved.id,
      carriedHours: 80,
      installedSeparatorHours: 170,
    });
    expect(pastAt('element:2:right').map((r) => r.removedTo)).toEqual(['shelf', 'shelf']);

    const detail = await olive.get(`/api/machines/${machineId}/parts/${back.id}`);
    expect(detail.status).toBe(200);
    expect(detail.body.chain.map((r: any) => r.id)).toEqual([shelved.id]);
    expect(detail.body.forecast.hoursNow).toBe(80);
    // The shelved record points to the record that took it back.
    expect((await olive.get(`/api/machines/${machineId}/parts/${shelved.id}`)).body.next.id).toBe(back.id);
    // A refused install changes no history.
    const bad = await olive.put(`/api/machines/${machineId}/installed`, { layout: withPart(second, 2, 'right', 'CW-NO-SUCH-PART') });
    expect(bad.status).toBe(400);
    expect((await history(machineId)).current.find((v) => v.record.placeKey === 'element:2:right')!.record.id).toBe(back.id);
  });

  it('fits the wear line over the measurements since install and gives the hours left and a date', async () => {
    // Position 1 right has been in since 50 separator hours.
    const measure = async (wearMm: number, engineHours: number, separatorHours: number) => {
      const insp = (await tomas.post(`/api/machines/${machineId}/inspections`, {})).body;
      const line = insp.items.find((i: any) => i.placeKey === 'element:1:right');
      expect((await tomas.patch(`/api/inspections/${insp.id}`, { items: [{ id: line.id, measurements: { wearMm } }] })).status).toBe(200);
      const done = await tomas.post(`/api/inspections/${insp.id}`, { action: 'finish', hours: { engineHours, separatorHours } });
      expect(done.status, JSON.stringify(done.body)).toBe(200);
    };
    let h = await history(machineId);
    const recordId = h.current.find((v) => v.record.placeKey === 'element:1:right')!.record.id;
    await measure(1, 300, 200);
    let one = (await olive.get(`/api/machines/${machineId}/parts/${recordId}`)).body;
    expect(one.forecast.status).toBe('no-trend');
    expect(one.limitDate).toBeNull();

    await measure(4, 400, 300);
    // hand-computed: part hours 150 and 250 (separator − 50 at install); b = (4 − 1) / 100 = 0.03 mm/h,
    // a = 1 − 0.03·150 = −3.5; today 250 h → 4 mm; (6 − 4) / 0.03 = 66.7 h left
    one = (await olive.get(`/api/machines/${machineId}/parts/${recordId}`)).body;
    expect(one.forecast.status).toBe('ahead');
    expect(one.forecast.trend.b).toBeCloseTo(0.03, 6);
    expect(one.forecast.trend.a).toBeCloseTo(-3.5, 6);
    expect(one.forecast.hoursLeft).toBeCloseTo(200 / 3, 4);
    expect(one.points.map((p: any) => p.hours)).toEqual([150, 250]);
    expect(one.limitDate).not.toBeNull();
    expect(one.season.from).toBe('default');

    h = await history(machineId);
    expect(h.current.find((v) => v.record.id === recordId)!.forecast.status).toBe('ahead');

    // The part page draws the chart on the server and states the model.
    const page = await olive.fetch(`/machines/${machineId}/parts/${recordId}`);
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain('data-testid="wear-chart"');
    expect(html).toContain('<svg');
    expect(html).toContain('wear = a + b·hours');
    expect(html).toMatch(/about 66\.7 h left/);

    // The dealer's before-the-season list names the machine and the part to stock.
    const list = await tomas.get('/api/season-list');
    expect(list.status).toBe(200);
    const mine = list.body.machines.find((m: any) => m.id === machineId);
    expect(mine.parts.map((p: any) => p.recordId)).toContain(recordId);
    const stock = list.body.parts.find((p: any) => p.partNumber === fwRight);
    expect(stock.needed).toBeGreaterThanOrEqual(1);
    expect(typeof stock.onShelf).toBe('number');
    expect(stock.short).toBe(Math.max(0, stock.needed - stock.onShelf));
    const page2 = await ada.fetch('/before-season');
    expect(page2.status).toBe(200);
    expect(await page2.text()).toContain(`/machines/${machineId}/parts/${recordId}`);
  });

  it('keeps part history and the forecast to the machine’s own people and its dealer', async () => {
    const h = await history(machineId);
    const recordId = h.current[0]!.record.id;
    for (const c of [tomas, ada]) {
      expect((await c.get(`/api/machines/${machineId}/parts`)).status).toBe(200);
      expect((await c.get(`/api/machines/${machineId}/parts/${recordId}`)).status).toBe(200);
    }
    expect((await priya.get(`/api/machines/${machineId}/parts`)).status).toBe(403);
    expect((await priya.fetch(`/machines/${machineId}/parts/${recordId}`)).status).toBe(403);
    for (const c of [dev, strangerOp, strangerTech]) {
      expect((await c.get(`/api/machines/${machineId}/parts`)).status).toBe(404);
      expect((await c.get(`/api/machines/${machineId}/parts/${recordId}`)).status).toBe(404);
      expect((await c.fetch(`/machines/${machineId}/parts/${recordId}`)).status).toBe(404);
    }
    // A record of another machine is not found under this one.
    const other = await bareMachine('History other');
    expect((await olive.get(`/api/machines/${other}/parts/${recordId}`)).status).toBe(404);
    // The before-the-season list: dealer staff only, and only their own dealer's customers.
    expect((await olive.get('/api/season-list')).status).toBe(403);
    expect((await priya.get('/api/season-list')).status).toBe(403);
    const theirs = await strangerTech.get('/api/season-list');
    expect(theirs.status).toBe(200);
    expect(theirs.body.machines.some((m: any) => m.id === machineId)).toBe(false);
  });
});
