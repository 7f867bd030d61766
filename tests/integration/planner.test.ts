import { beforeAll, describe, expect, it } from 'vitest';
import { WORK_CAUTIONS } from '~/lib/domain/planner';
import { Client, signedIn } from './client';
import { ownMachine, tableCounts } from './planner-helpers';

let olive: Client;
let admin: Client;
let machineId: string;

beforeAll(async () => {
  olive = await signedIn('operator');
  admin = await signedIn('dealerAdmin');
  ({ machineId } = await ownMachine(olive, 'Planner test machine'));
});

describe('POST /api/plans', () => {
  it('proposes the cage for field peas: round-bar in front, bought; the fine-wire elements come off', async () => {
    const res = await olive.post('/api/plans', { machineId, crop: 'field-peas' });
    expect(res.status).toBe(200);
    const { plan, machine, installed } = res.body;
    expect(machine).toMatchObject({ id: machineId, familyName: 'Tamarack M4', drum: 'slim', vaneControl: 'powered' });
    expect(installed.crop).toBe('wheat');
    expect(plan.ok).toBe(true);
    expect(plan.counts).toMatchObject({ purchases: 4, removed: 4, moves: 8 });
    expect(plan.purchases.map((p: any) => [p.partNumber, p.quantity, p.unitPriceCents])).toEqual([
      ['CW-RB-L-04', 2, 131_000],
      ['CW-RB-R-04', 2, 131_000],
    ]);
    // Cautions first, then the steps in working order.
    expect(plan.cautions).toEqual(WORK_CAUTIONS);
    expect(plan.cautions.join(' ')).toMatch(/Engine off, key out/);
    expect(plan.cautions.join(' ')).toMatch(/operator’s manual/);
    // Parts first: the orders and the wait for them, then each place emptied and filled at once,
    // then set and verify.
    const work = (k: string) => plan.steps.filter((s: any) => s.phase === k).map((s: any) => s.kind);
    // Each purchase is collected from the dealer's shelf or ordered; the work waits only for orders.
    // Other suites may change the dealer's stock on this shared server: follow what it says now.
    const supply = res.body.supply.availability as { partNumber: string; source: string; leadDays?: number }[];
    expect(supply.map((a) => a.partNumber)).toEqual(['CW-RB-L-04', 'CW-RB-R-04']);
    const ordered = supply.some((a) => a.source === 'order');
    expect(work('parts')).toEqual(['buy', 'buy', ...(ordered ? ['wait'] : [])]);
    supply.forEach((a, i) =>
      expect(plan.steps[i].text).toMatch(
        a.source !== 'order'
          ? /^Collect .*on the dealer's shelf/
          : a.leadDays === undefined
            ? /^Order (?!.*to order)/
            : /^Order .*to order, about/,
      ),
    );
    expect(work('work')).toEqual(['remove', 'install', 'remove', 'install', 'remove', 'install', 'remove', 'install']);
    const first = work('parts').length;
    expect(plan.steps[first].text).toMatch(/^Take off the left-hand fine-wire element CW-FW-L-04 at position 1, left/);
    expect(plan.steps[first + 1].text).toMatch(/^Fit the left-hand round-bar element CW-RB-L-04 \(new\) at position 1, left/);
    expect(plan.steps.at(-1)).toMatchObject({ phase: 'verify', link: '/field-check' });
    expect(plan.counts.effort).toMatchObject({ lifts: 8, rotorAccess: false });
    // The proposal passes every fit rule, checked again by the server's own check endpoint.
    const check = await olive.post('/api/check', { layout: plan.layout });
    expect(check.status).toBe(200);
    expect(check.body.findings.filter((f: any) => f.severity === 'blocks-fit')).toEqual([]);
    expect(plan.findings.filter((f: any) => f.severity === 'blocks-fit')).toEqual([]);
  });

  it('fits spares from the farm’s shelf before buying', async () => {
    // Larkspur keeps one fine-wire element of each hand on its shelf (seeded).
    const { machineId: gappy } = await ownMachine(olive, 'Planner gap machine', (l) => ({
      ...l,
      elements: l.elements.filter((e) => e.position !== 1),
    }));
    const res = await olive.post('/api/plans', { machineId: gappy, crop: 'wheat' });
    expect(res.status).toBe(200);
    expect(res.body.shelf).toMatchObject({ 'CW-FW-L-04': 1, 'CW-FW-R-04': 1 });
    const { plan } = res.body;
    expect(plan.counts).toMatchObject({ purchases: 0, fromShelf: 2, moves: 2 });
    expect(plan.steps.filter((s: any) => s.phase !== 'verify').map((s: any) => s.kind)).toEqual(['fetch', 'fetch', 'install', 'install']);
  });

  it('follows the mode: parts on hand first never buys a cover plate the program would fit', async () => {
    const program = await olive.post('/api/plans', { machineId, crop: 'rice' });
    const onHand = await olive.post('/api/plans', { machineId, crop: 'rice', mode: 'on-hand' });
    expect(program.body.plan.layout.coverPlates).toEqual([{ section: 2, side: 'right', partNumber: 'CW-CP-R-04' }]);
    expect(onHand.body.plan.layout.coverPlates).toEqual([]);
    expect(onHand.body.plan.counts.purchases).toBeLessThan(program.body.plan.counts.purchases);
  });

  it('refuses bad input with a 4xx naming the field, and another organisation’s machine with 404', async () => {
    const cases: [unknown, number, string][] = [
      [{ machineId, crop: 'pumpkins' }, 400, 'crop'],
      [{ machineId: 'not-a-uuid', crop: 'wheat' }, 400, 'machineId'],
      [{ crop: 'wheat' }, 400, 'machineId'],
      [{ machineId, crop: 'wheat', mode: 'cheapest' }, 400, 'mode'],
    ];
    for (const [body, status, field] of cases) {
      const res = await olive.post('/api/plans', body);
      expect(res.status, JSON.stringify(body)).toBe(status);
      expect(res.body.error.field).toBe(field);
    }
    const dev = await signedIn('operator2');
    const theirs = await dev.post('/api/plans', { machineId, crop: 'wheat' });
    expect(theirs.status).toBe(404);
    expect(theirs.body.error.field).toBe('machineId');
    const text = await olive.fetch('/api/plans', { method: 'POST', headers: { 'content-type': 'text/plain' }, body: 'wheat' });
    expect(text.status).toBe(415);
  });

  it('answers 401 signed out and 403 for a trainer', async () => {
    expect((await new Client().post('/api/plans', { machineId, crop: 'wheat' })).status).toBe(401);
    const trainer = await signedIn('trainer');
    expect((await trainer.post('/api/plans', { machineId, crop: 'wheat' })).status).toBe(403);
    expect((await trainer.post('/api/plans/accept', { machineId, crop: 'wheat' })).status).toBe(403);
  });

  it('a dealer technician plans for a customer’s machine', async () => {
    const tomas = await signedIn('technician');
    const res = await tomas.post('/api/plans', { machineId, crop: 'soybeans' });
    expect(res.status).toBe(200);
    expect(res.body.machine.orgName).toBe('Larkspur Farms');
    expect(res.body.plan.ok).toBe(true);
  });
});

describe('POST /api/plans/accept', () => {
  it('saves the proposal as a new layout, then as a new version of it', async () => {
    const proposal = (await olive.post('/api/plans', { machineId, crop: 'field-peas' })).body.plan;
    const res = await olive.post('/api/plans/accept', {
      machineId,
      crop: 'field-peas',
      fingerprint: proposal.fingerprint,
      name: 'Peas next week',
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ machineId, version: 1, created: true, fingerprint: proposal.fingerprint });
    expect(res.body.editorUrl).toBe(`/machines/${machineId}/layouts/${res.body.layoutId}`);
    const saved = await olive.get(`/api/layouts/${res.body.layoutId}`);
    expect(saved.status).toBe(200);
    expect(saved.body.layout.name).toBe('Peas next week');
    expect(saved.body.current.body).toEqual(proposal.layout);
    expect(saved.body.current.note).toMatch(/^Crop-change plan from wheat to field peas\. 4 parts to buy/);

    const v2 = await olive.post('/api/plans/accept', { machineId, crop: 'lentils', layoutId: res.body.layoutId, baseVersion: 1 });
    expect(v2.status).toBe(201);
    expect(v2.body).toMatchObject({ layoutId: res.body.layoutId, version: 2, created: false });
    // Someone saved meanwhile: the stale base version is refused.
    const stale = await olive.post('/api/plans/accept', { machineId, crop: 'lentils', layoutId: res.body.layoutId, baseVersion: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.field).toBe('baseVersion');
  });

  it('refuses a plan that changed since it was shown, and writes nothing', async () => {
    const before = await tableCounts(admin);
    const res = await olive.post('/api/plans/accept', { machineId, crop: 'field-peas', fingerprint: '00000000' });
    expect(res.status).toBe(409);
    expect(res.body.error.field).toBe('fingerprint');
    expect(res.body.error.plan.ok).toBe(true);
    const badLayout = await olive.post('/api/plans/accept', {
      machineId,
      crop: 'field-peas',
      layoutId: '00000000-0000-4000-8000-000000000000',
      baseVersion: 1,
    });
    expect(badLayout.status).toBe(404);
    expect(badLayout.body.error.field).toBe('layoutId');
    const noBase = await olive.post('/api/plans/accept', {
      machineId,
      crop: 'field-peas',
      layoutId: '00000000-0000-4000-8000-000000000000',
    });
    expect(noBase.status).toBe(400);
    expect(noBase.body.error.field).toBe('baseVersion');
    const after = await tableCounts(admin);
    expect(after.layouts).toBe(before.layouts);
    expect(after.layoutVersions).toBe(before.layoutVersions);
    expect(after.auditLog).toBe(before.auditLog);
  });
});

describe('the planner page', () => {
  it('shows the proposal beside what is installed, with the cautions before the steps', async () => {
    const res = await olive.fetch(`/planner?machine=${machineId}&crop=field-peas`);
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html.match(/data-testid="cage-diagram"/g)).toHaveLength(2);
    const cautions = html.indexOf('data-testid="work-cautions"');
    const steps = html.indexOf('data-testid="plan-steps"');
    expect(cautions).toBeGreaterThan(0);
    expect(steps).toBeGreaterThan(cautions);
    expect(html).toContain('CW-RB-L-04');
  });

  it('answers 403 to a trainer and says why', async () => {
    const trainer = await signedIn('trainer');
    const res = await trainer.fetch('/planner');
    expect(res.status).toBe(403);
    expect(await res.text()).toMatch(/for operators, technicians and dealer administrators/);
  });
});
