import { beforeAll, describe, expect, it } from 'vitest';
import { Client, DEMO, DEMO_PASSWORD, signedIn } from './client';
import { OTHER } from './matrix-fixtures';
import { mailbox, ownMachine } from './planner-helpers';

/**
 * Job cards against the built server: who may see and work them, the status rules, the sign-off
 * checklist, the hours read when the work is done, the layout a plan job installs, and the
 * owner's e-mail at sign-off.
 */
let olive: Client;
let tomas: Client;
let priya: Client;
let admin: Client;
let stranger: Client;
let strangerAdmin: Client;
let instance: Client;

async function as(email: string) {
  const c = new Client();
  await c.signIn(email, DEMO_PASSWORD);
  expect(c.hasSession(), email).toBe(true);
  return c;
}

const digests = async () => (await instance.get('/api/admin/stats?digest=1')).body.digests as Record<string, string>;
const ALL_DONE = {
  concaveZeroed: true,
  clearanceSet: true,
  boltsTorqued: true,
  rotorTurned: true,
  guardsOn: true,
  testRun: true,
  lossCheck: 'booked',
};

/** A job by hand on `machineId`, moved to in progress and every step ticked off. */
async function workedHandJob(machineId: string, title: string) {
  const made = await tomas.post('/api/jobs', { origin: 'hand', machineId, title, steps: [{ kind: 'check', text: 'Look the cage over.' }] });
  expect(made.status, JSON.stringify(made.body)).toBe(201);
  const started = await tomas.post(`/api/jobs/${made.body.id}/status`, { status: 'in_progress' });
  expect(started.status, JSON.stringify(started.body)).toBe(200);
  const ticked = await tomas.patch(`/api/jobs/${made.body.id}`, {
    done: made.body.steps.map((s: { id: string }) => ({ id: s.id, done: true })),
  });
  expect(ticked.status, JSON.stringify(ticked.body)).toBe(200);
  return made.body.id as string;
}

beforeAll(async () => {
  [olive, tomas, priya, admin, instance] = await Promise.all([
    signedIn('operator'),
    signedIn('technician'),
    signedIn('trainer'),
    signedIn('dealerAdmin'),
    signedIn('instanceAdmin'),
  ]);
  stranger = await as(OTHER.technician);
  strangerAdmin = await as(OTHER.dealer_admin);
}, 60_000);

describe('a job card from an accepted plan', () => {
  let machineId: string;
  let jobId: string;
  let layoutId: string;
  let version: number;

  beforeAll(async () => {
    ({ machineId } = await ownMachine(olive, 'Job plan machine'));
    const accepted = await tomas.post('/api/plans/accept', { machineId, crop: 'field-peas' });
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(201);
    ({ layoutId, version } = accepted.body);
    const made = await tomas.post('/api/jobs', { origin: 'plan', layoutId, version });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    jobId = made.body.id;
  }, 60_000);

  it('takes the planner’s steps in their working order, and the parts with where each comes from', async () => {
    const job = (await tomas.get(`/api/jobs/${jobId}`)).body;
    const plan = (await tomas.post('/api/plans', { machineId, crop: 'field-peas' })).body.plan;
    expect(job.status).toBe('planned');
    expect(job.origin).toBe('plan');
    expect(job.layout).toMatchObject({ id: layoutId, version });
    // The same kinds in the same order as the plan's steps (the removal reasons are the version's own).
    expect(job.steps.map((s: { kind: string }) => s.kind)).toEqual(plan.steps.map((s: { kind: string }) => s.kind));
    const bought = job.parts.reduce((n: number, p: { quantity: number }) => n + p.quantity, 0);
    expect(bought).toBe(plan.counts.purchases);
    for (const p of job.parts) expect(['dealer_stock', 'on_order']).toContain(p.source);
    // The estimate is the sum of the steps' flat-rate minutes.
    const sum = job.steps.reduce((n: number, s: { estimatedMinutes: number }) => n + s.estimatedMinutes, 0);
    expect(job.estimate.totalMinutes).toBe(sum);
    expect(sum).toBeGreaterThan(0);
    expect(job.cautions.join(' ')).toMatch(/operator’s manual/);
  });

  it('lets the operator read it but not work it; the trainer gets 403, another dealer’s people 404', async () => {
    expect((await olive.get(`/api/jobs/${jobId}`)).status).toBe(200);
    expect((await olive.get('/api/jobs')).body.items.map((j: { id: string }) => j.id)).toContain(jobId);
    expect((await olive.patch(`/api/jobs/${jobId}`, { title: 'mine now' })).status).toBe(403);
    expect((await olive.post(`/api/jobs/${jobId}/status`, { status: 'in_progress' })).status).toBe(403);
    expect((await olive.post('/api/jobs', { origin: 'plan', layoutId, version })).status).toBe(403);
    expect((await priya.get(`/api/jobs/${jobId}`)).status).toBe(403);
    expect((await priya.get('/api/jobs')).status).toBe(403);
    expect((await instance.get(`/api/jobs/${jobId}`)).status).toBe(403);
    expect((await stranger.get(`/api/jobs/${jobId}`)).status).toBe(404);
    expect((await stranger.patch(`/api/jobs/${jobId}`, { title: 'taken over' })).status).toBe(404);
    expect((await stranger.post(`/api/jobs/${jobId}/status`, { status: 'in_progress' })).status).toBe(404);
    expect((await stranger.post(`/api/jobs/${jobId}/sign-off`, { checklist: ALL_DONE })).status).toBe(404);
    expect((await stranger.post('/api/jobs', { origin: 'plan', layoutId, version })).status).toBe(404);
    expect((await stranger.get('/api/jobs?pageSize=100')).body.items.map((j: { id: string }) => j.id)).not.toContain(jobId);
    // The operator's own job card is still as it was.
    expect((await tomas.get(`/api/jobs/${jobId}`)).body.title).not.toBe('taken over');
  });

  it('follows the status rules, then installs the layout version with the hours when done, and signs off', async () => {
    // Not straight to done; no sign-off before done.
    const skip = await tomas.post(`/api/jobs/${jobId}/status`, { status: 'done', hours: { engineHours: 2000, separatorHours: 1500 } });
    expect(skip.status).toBe(409);
    expect(skip.body.error.field).toBe('status');
    const early = await tomas.post(`/api/jobs/${jobId}/sign-off`, { checklist: ALL_DONE });
    expect(early.status).toBe(409);
    expect(early.body.error.field).toBe('status');

    const started = await tomas.post(`/api/jobs/${jobId}/status`, { status: 'in_progress' });
    expect(started.status, JSON.stringify(started.body)).toBe(200);
    expect(started.body.status).toBe('in_progress');
    expect(started.body.assignedTo.name).toBeTruthy(); // the technician who started it
    expect(started.body.startedByName).toBe(started.body.assignedTo.name);
    // Steps are rewritten only while planned.
    const rewrite = await tomas.patch(`/api/jobs/${jobId}`, { steps: [{ kind: 'other', text: 'x' }] });
    expect(rewrite.status).toBe(409);
    expect(rewrite.body.error.field).toBe('steps');

    // Done needs every step ticked off and the hours.
    const open = await tomas.post(`/api/jobs/${jobId}/status`, { status: 'done' });
    expect(open.status).toBe(400);
    expect(open.body.error.field).toBe('steps');
    expect(open.body.error.problems.map((p: { field: string }) => p.field)).toEqual(['steps', 'hours']);
    const steps = started.body.steps as { id: string }[];
    const ticked = await tomas.patch(`/api/jobs/${jobId}`, { done: steps.map((s) => ({ id: s.id, done: true })) });
    expect(ticked.status, JSON.stringify(ticked.body)).toBe(200);
    expect(ticked.body.steps.every((s: { done: boolean; doneByName: string }) => s.done && s.doneByName)).toBe(true);
    expect(ticked.body.estimate.remainingMinutes).toBe(0);
    const noHours = await tomas.post(`/api/jobs/${jobId}/status`, { status: 'done' });
    expect(noHours.status).toBe(400);
    expect(noHours.body.error.field).toBe('hours');

    const target = (await olive.get(`/api/layouts/${layoutId}/versions/${version}`)).body;
    const targetBody = target.body ?? target.version?.body;
    const before = (await olive.get(`/api/machines/${machineId}/installed`)).body.installed.layout;
    expect(before.crop).toBe('wheat');

    const done = await tomas.post(`/api/jobs/${jobId}/status`, { status: 'done', hours: { engineHours: 1520.5, separatorHours: 1101 } });
    expect(done.status, JSON.stringify(done.body)).toBe(200);
    expect(done.body.status).toBe('done');
    expect(done.body.installed).toBe(true);
    expect(done.body.hours).toMatchObject({ engineHours: 1520.5, separatorHours: 1101 });
    const after = (await olive.get(`/api/machines/${machineId}/installed`)).body.installed.layout;
    expect(after).toEqual(targetBody);
    expect(after.crop).toBe('field-peas');

    // Sign-off with an incomplete checklist is refused naming every missing item; nothing is written.
    const d0 = await digests();
    const partial = await tomas.post(`/api/jobs/${jobId}/sign-off`, {
      checklist: { concaveZeroed: true, clearanceSet: true, boltsTorqued: false, rotorTurned: true, lossCheck: 'no' },
    });
    expect(partial.status).toBe(400);
    expect(partial.body.error.field).toBe('checklist');
    expect(partial.body.error.missing.map((m: { id: string }) => m.id)).toEqual(['boltsTorqued', 'guardsOn', 'testRun', 'lossCheck']);
    for (const label of ['Bolts torqued', 'Guards back on', 'Test run', 'Loss check done or booked'])
      expect(partial.body.error.message).toContain(label);
    expect(await digests()).toEqual(d0);
    expect((await tomas.get(`/api/jobs/${jobId}`)).body.status).toBe('done');

    const mails = (await mailbox(admin)).total;
    const signed = await tomas.post(`/api/jobs/${jobId}/sign-off`, { checklist: ALL_DONE });
    expect(signed.status, JSON.stringify(signed.body)).toBe(200);
    expect(signed.body.status).toBe('signed_off');
    expect(signed.body.signedOffByName).toBeTruthy();
    expect(signed.body.signedOffAt).toBeTruthy();
    expect(signed.body.checklistMissing).toEqual([]);
    expect(signed.body.mailed).toBe(true);
    const box = await mailbox(admin);
    expect(box.total).toBe(mails + 1);
    const mail = box.messages.find((m) => m.subject.includes(signed.body.title))!;
    expect(mail).toBeDefined();
    expect(mail.to).toContain('olive@larkspur.example'); // Larkspur Farms' owner (the demo seed)
    expect(mail.text).toContain(signed.body.signedOffByName);
    expect(mail.text).toContain(`/jobs/${jobId}/sheet`);
    // Signed off is the end.
    const again = await tomas.post(`/api/jobs/${jobId}/sign-off`, { checklist: ALL_DONE });
    expect(again.status).toBe(409);
    expect((await tomas.patch(`/api/jobs/${jobId}`, { title: 'later' })).status).toBe(409);
  });
});

describe('hours at a job card', () => {
  it('refuses a reading lower than the last one, writing nothing; a correction with a reason is kept', async () => {
    const { machineId } = await ownMachine(olive, 'Job hours machine');
    const first = await workedHandJob(machineId, 'First service');
    const ok = await tomas.post(`/api/jobs/${first}/status`, { status: 'done', hours: { engineHours: 1200, separatorHours: 900 } });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);

    const second = await workedHandJob(machineId, 'Second service');
    const d0 = await digests();
    const lower = await tomas.post(`/api/jobs/${second}/status`, { status: 'done', hours: { engineHours: 1100, separatorHours: 950 } });
    expect(lower.status).toBe(400);
    expect(lower.body.error.field).toBe('hours.engineHours');
    expect(await digests()).toEqual(d0);
    const still = (await tomas.get(`/api/jobs/${second}`)).body;
    expect(still.status).toBe('in_progress');
    expect(still.hours).toBeNull();
    const sep = await tomas.post(`/api/jobs/${second}/status`, { status: 'done', hours: { engineHours: 1300, separatorHours: 800 } });
    expect(sep.status).toBe(400);
    expect(sep.body.error.field).toBe('hours.separatorHours');
    const above = await tomas.post(`/api/jobs/${second}/status`, { status: 'done', hours: { engineHours: 1300, separatorHours: 1400 } });
    expect(above.status).toBe(400);
    expect(above.body.error.field).toBe('hours.separatorHours');
    expect(await digests()).toEqual(d0);

    const corrected = await tomas.post(`/api/jobs/${second}/status`, {
      status: 'done',
      hours: { engineHours: 1100, separatorHours: 850, correctionReason: 'the engine meter was replaced' },
    });
    expect(corrected.status, JSON.stringify(corrected.body)).toBe(200);
    expect(corrected.body.hours).toMatchObject({
      engineHours: 1100,
      separatorHours: 850,
      correctionReason: 'the engine meter was replaced',
    });
    expect(corrected.body.installed).toBeNull(); // a job by hand installs nothing
  });
});

describe('a job card from an inspection, and by hand', () => {
  it('makes one step per line marked replace or watch, from a finished inspection only', async () => {
    const { machineId } = await ownMachine(olive, 'Job inspection machine');
    const started = await tomas.post(`/api/machines/${machineId}/inspections`, { title: 'Pre-season' });
    expect(started.status, JSON.stringify(started.body)).toBe(201);
    const inspectionId: string = started.body.id ?? started.body.inspection?.id;
    const items = (await tomas.get(`/api/inspections/${inspectionId}`)).body.items as {
      id: string;
      kind: string;
      partNumber: string | null;
    }[];
    const [a, b] = items.filter((i) => i.kind === 'element');
    const patched = await tomas.patch(`/api/inspections/${inspectionId}`, {
      items: [
        { id: a!.id, severity: 'replace', conditions: ['bent-bars'] },
        { id: b!.id, severity: 'watch' },
      ],
    });
    expect(patched.status, JSON.stringify(patched.body)).toBe(200);
    const unfinished = await tomas.post('/api/jobs', { origin: 'inspection', inspectionId });
    expect(unfinished.status).toBe(409);
    expect(unfinished.body.error.field).toBe('inspectionId');
    const finished = await tomas.post(`/api/inspections/${inspectionId}`, { action: 'finish', acceptUnevenSurvey: true });
    expect(finished.status, JSON.stringify(finished.body)).toBe(200);
    const made = await tomas.post('/api/jobs', { origin: 'inspection', inspectionId });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    expect(made.body.steps.map((s: { kind: string }) => s.kind)).toEqual(['replace', 'look']);
    expect(made.body.steps[0].text).toMatch(/bent bars/);
    expect(made.body.parts).toEqual([expect.objectContaining({ partNumber: a!.partNumber, quantity: 1, source: 'on_order' })]);
    expect((await stranger.post('/api/jobs', { origin: 'inspection', inspectionId })).status).toBe(404);
  });

  it('by hand: steps and parts typed in, estimated with the dealer’s flat rates; bad parts and assignees named', async () => {
    const { machineId } = await ownMachine(olive, 'Job hand machine');
    const set = await admin.put('/api/flat-rates', { rates: { other: 33 } });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    expect(set.body.rates.find((r: { kind: string }) => r.kind === 'other')).toMatchObject({ minutes: 33, own: true });
    // Another dealer's rate does not reach this dealer's customers.
    expect((await strangerAdmin.put('/api/flat-rates', { rates: { other: 500 } })).status).toBe(200);
    expect((await tomas.put('/api/flat-rates', { rates: { other: 1 } })).status).toBe(403);
    const bogus = await admin.put('/api/flat-rates', { rates: { bogus: 1 } });
    expect(bogus.status).toBe(400);
    expect(bogus.body.error.field).toMatch(/^rates/);

    const made = await tomas.post('/api/jobs', {
      origin: 'hand',
      machineId,
      title: 'Straighten a bent wire',
      steps: [
        { kind: 'other', text: 'Straighten the wire at position 2, left.' },
        { kind: 'other', text: 'Touch up the paint.', minutes: 5 },
      ],
      parts: [{ partNumber: 'CW-FW-L-04', quantity: 1, source: 'farm_shelf' }],
    });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    // 33 (the dealer's flat rate for "other") + 5 typed = 38 (hand-computed).
    expect(made.body.estimate.totalMinutes).toBe(38);
    expect(made.body.parts).toEqual([expect.objectContaining({ partNumber: 'CW-FW-L-04', quantity: 1, source: 'farm_shelf' })]);

    const d0 = await digests();
    const badPart = await tomas.post('/api/jobs', {
      origin: 'hand',
      machineId,
      title: 'x',
      steps: [{ kind: 'other', text: 'x' }],
      parts: [
        { partNumber: 'CW-FW-L-04', quantity: 1, source: 'farm_shelf' },
        { partNumber: 'CW-NO-L-99', quantity: 1, source: 'on_order' },
      ],
    });
    expect(badPart.status).toBe(400);
    expect(badPart.body.error.field).toBe('parts.1.partNumber');
    const strangerId = (await strangerAdmin.get('/api/admin/users')).body.users.find(
      (u: { email: string }) => u.email === OTHER.technician,
    ).id;
    const badAssignee = await tomas.post('/api/jobs', {
      origin: 'hand',
      machineId,
      title: 'x',
      steps: [{ kind: 'other', text: 'x' }],
      assignedTo: strangerId,
    });
    expect(badAssignee.status).toBe(400);
    expect(badAssignee.body.error.field).toBe('assignedTo');
    const noSteps = await tomas.post('/api/jobs', { origin: 'hand', machineId, title: 'x', steps: [] });
    expect(noSteps.status).toBe(400);
    expect(noSteps.body.error.field).toBe('steps');
    const badKind = await tomas.post('/api/jobs', { origin: 'hand', machineId, title: 'x', steps: [{ kind: 'dance', text: 'x' }] });
    expect(badKind.status).toBe(400);
    expect(badKind.body.error.field).toBe('steps.0.kind');
    expect(await digests()).toEqual(d0);

    // Assign the dealer's technician by id; the operator is no technician.
    const people = (await admin.get('/api/admin/users')).body.users as { id: string; email: string }[];
    const tech = people.find((p) => p.email === DEMO.technician)!;
    const assigned = await tomas.patch(`/api/jobs/${made.body.id}`, { assignedTo: tech.id });
    expect(assigned.status, JSON.stringify(assigned.body)).toBe(200);
    expect(assigned.body.assignedTo.id).toBe(tech.id);
    const trainerId = people.find((p) => p.email === DEMO.trainer)!.id;
    const notTech = await tomas.patch(`/api/jobs/${made.body.id}`, { assignedTo: trainerId });
    expect(notTech.status).toBe(400);
    expect(notTech.body.error.field).toBe('assignedTo');
  });
});
