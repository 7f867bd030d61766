import { describe, expect, it } from 'vitest';
import { machineWithLayout, signedIn, type Client } from './client';

/**
 * GET /api/layouts/:id may answer from memory (the embedded store keeps a layout read while
 * nothing is written): every change that shows in the answer must show at once, and a layout
 * someone else has just read is still refused to whoever may not see it.
 */

async function ownLayout(c: Client, name: string) {
  const { machineId, layout } = await machineWithLayout(c);
  const body = (await c.get(`/api/layouts/${layout.id}`)).body.current.body;
  const made = await c.post(`/api/machines/${machineId}/layouts`, { name, body });
  expect(made.status).toBe(201);
  return { machineId, id: made.body.layout.id as string, body };
}

/** Reads a few times, so a kept answer (if any) is in place before the change. */
async function readTwice(c: Client, id: string) {
  const a = await c.get(`/api/layouts/${id}`);
  const b = await c.get(`/api/layouts/${id}`);
  expect(a.status).toBe(200);
  expect(b.body).toEqual(a.body);
  return b.body;
}

describe('reading a layout', () => {
  it('a save, a restore and a rename of the machine show in the next read', async () => {
    const c = await signedIn('technician');
    const { machineId, id, body } = await ownLayout(c, 'kept reads: saves');
    const first = await readTwice(c, id);
    expect(first.current.version).toBe(1);

    const saved = await c.put(`/api/layouts/${id}`, { baseVersion: 1, body: { ...body, rotorRpm: body.rotorRpm + 7 }, note: 'second' });
    expect(saved.status).toBe(201);
    const second = await c.get(`/api/layouts/${id}`);
    expect(second.body.current.version).toBe(2);
    expect(second.body.current.body.rotorRpm).toBe(body.rotorRpm + 7);
    expect(second.body.current.note).toBe('second');
    expect(second.body.layout.currentVersion).toBe(2);

    await readTwice(c, id);
    const restored = await c.post(`/api/layouts/${id}/restore`, { version: 1 });
    expect(restored.status).toBe(201);
    const third = await c.get(`/api/layouts/${id}`);
    expect(third.body.current.version).toBe(3);
    expect(third.body.current.body.rotorRpm).toBe(body.rotorRpm);

    await readTwice(c, id);
    const nickname = `Renamed ${Date.now() % 100000}`;
    const renamed = await c.put(`/api/machines/${machineId}`, { nickname });
    expect(renamed.status).toBe(200);
    expect((await c.get(`/api/layouts/${id}`)).body.machine.nickname).toBe(nickname);
  });

  it('a layout just read by its owner is still a 404 for another farm, and a 404 once deleted', async () => {
    // Larkspur's operator owns it; Haldane's operator (another farm) may not see it; the dealer's
    // technician (Larkspur is a customer farm) may.
    const owner = await signedIn('operator');
    const stranger = await signedIn('operator2');
    const dealerStaff = await signedIn('technician');
    const { machineId, id } = await ownLayout(owner, 'kept reads: visibility');
    expect((await stranger.get(`/api/layouts/${id}`)).status).toBe(404);
    await readTwice(owner, id);
    const refused = await stranger.get(`/api/layouts/${id}`);
    expect(refused.status).toBe(404);
    expect(refused.body.error.field).toBe('layoutId');
    expect(refused.body.layout).toBeUndefined();
    const seen = await dealerStaff.get(`/api/layouts/${id}`);
    expect(seen.status).toBe(200);
    expect(seen.body.layout.id).toBe(id);
    // The owner's next read is unchanged by the refusal.
    expect((await owner.get(`/api/layouts/${id}`)).status).toBe(200);

    // A machine of its own (deleting one takes its layouts with it), read, then deleted.
    const layoutBody = (await owner.get(`/api/layouts/${id}`)).body.current.body;
    const machine = (await owner.get(`/api/machines/${machineId}`)).body.machine;
    const made = await owner.post('/api/machines', {
      familyId: machine.familyId,
      serial: `KR-${Date.now() % 1_000_000}`,
      nickname: 'Kept reads, to delete',
      drum: machine.drum,
      vaneControl: machine.vaneControl,
    });
    expect(made.status).toBe(201);
    const doomedMachine = made.body.machine.id as string;
    const doomed = await owner.post(`/api/machines/${doomedMachine}/layouts`, { name: 'to delete', body: layoutBody });
    expect(doomed.status).toBe(201);
    await readTwice(owner, doomed.body.layout.id);
    expect((await owner.delete(`/api/machines/${doomedMachine}`)).status).toBe(200);
    expect((await owner.get(`/api/layouts/${doomed.body.layout.id}`)).status).toBe(404);
  });

  it('a save answers with the whole new version and is audited with it; a stale one writes nothing', async () => {
    const c = await signedIn('technician');
    const { machineId, id, body } = await ownLayout(c, 'kept reads: audited save');
    const before = Date.now();
    const saved = await c.put(`/api/layouts/${id}`, { baseVersion: 1, body: { ...body, rotorRpm: body.rotorRpm + 3 }, note: 'audited' });
    expect(saved.status).toBe(201);
    const v = saved.body.version;
    expect(Object.keys(v).sort()).toEqual(['body', 'createdAt', 'createdBy', 'id', 'layoutId', 'note', 'version']);
    expect(v).toMatchObject({ layoutId: id, version: 2, note: 'audited' });
    expect(v.body.rotorRpm).toBe(body.rotorRpm + 3);
    expect(v.createdAt).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/);
    expect(Date.parse(v.createdAt)).toBeGreaterThan(before - 60_000);
    expect(v.createdBy).toMatch(/^[0-9a-f-]{36}$/);
    const back = (await c.get(`/api/layouts/${id}`)).body.current;
    expect(back.id).toBe(v.id);
    expect(back.createdAt).toBe(v.createdAt);

    const stale = await c.put(`/api/layouts/${id}`, { baseVersion: 1, body, note: 'stale' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.currentVersion).toBe(2);
    const activity = (await c.get(`/api/machines/${machineId}`)).body.activity as {
      action: string;
      entityId: string;
      detail: Record<string, unknown>;
    }[];
    const saves = activity.filter((a) => a.entityId === id && a.action === 'save');
    expect(saves).toHaveLength(1);
    expect(saves[0]!.detail).toEqual({ version: 2, from: 1 });
    expect((await c.get(`/api/layouts/${id}/versions`)).body.versions.map((x: { version: number }) => x.version)).toEqual([2, 1]);
  });

  it('parallel saves and reads: a read never shows a version older than one already acknowledged', async () => {
    const c = await signedIn('technician');
    const { id, body } = await ownLayout(c, 'kept reads: parallel');
    let acknowledged = 1;
    for (let v = 1; v <= 6; v++) {
      const [save, ...reads] = await Promise.all([
        c.put(`/api/layouts/${id}`, { baseVersion: v, body: { ...body, rotorRpm: body.rotorRpm + v }, note: `v${v + 1}` }),
        c.get(`/api/layouts/${id}`),
        c.get(`/api/layouts/${id}`),
      ]);
      expect(save.status).toBe(201);
      for (const r of reads) expect(r.body.current.version).toBeGreaterThanOrEqual(acknowledged);
      acknowledged = v + 1;
      const after = await c.get(`/api/layouts/${id}`);
      expect(after.body.current.version).toBe(acknowledged);
      expect(after.body.current.body.rotorRpm).toBe(body.rotorRpm + v);
    }
  });
});
