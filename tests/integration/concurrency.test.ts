import { describe, expect, it } from 'vitest';
import { machineWithLayout, signedIn } from './client';

const firstLayout = machineWithLayout;

describe('concurrent edits', () => {
  it('two clients saving the same version: one 409 carrying the newer version, both edits kept', async () => {
    const a = await signedIn('operator');
    const b = await signedIn('technician');
    // A layout of its own, so the seeded ones (which decks and shares point at) stay as they are.
    const { machineId, layout: seeded } = await firstLayout(a);
    const seededBody = (await a.get(`/api/layouts/${seeded.id}`)).body.current.body;
    const made = await a.post(`/api/machines/${machineId}/layouts`, { name: 'conflict test', body: seededBody });
    expect(made.status).toBe(201);
    const layout = made.body.layout;
    const got = await a.get(`/api/layouts/${layout.id}`);
    const base = got.body.current;
    const editA = { ...base.body, rotorRpm: base.body.rotorRpm + 10 };
    const editB = { ...base.body, rotorRpm: base.body.rotorRpm + 20 };
    const [ra, rb] = await Promise.all([
      a.put(`/api/layouts/${layout.id}`, { baseVersion: base.version, body: editA, note: 'from A' }),
      b.put(`/api/layouts/${layout.id}`, { baseVersion: base.version, body: editB, note: 'from B' }),
    ]);
    const statuses = [ra.status, rb.status].sort();
    expect(statuses).toEqual([201, 409]);
    const loser = ra.status === 409 ? ra : rb;
    const winnerEdit = ra.status === 201 ? editA : editB;
    const loserEdit = ra.status === 409 ? editA : editB;
    expect(loser.body.error.field).toBe('baseVersion');
    expect(loser.body.error.currentVersion).toBe(base.version + 1);
    expect(loser.body.error.current.body.rotorRpm).toBe(winnerEdit.rotorRpm);

    // The loser keeps their edit by saving on top of the newer version.
    const retry = await (loser === ra ? a : b).put(`/api/layouts/${layout.id}`, {
      baseVersion: loser.body.error.currentVersion,
      body: loserEdit,
      note: 'saved again after a conflict',
    });
    expect(retry.status).toBe(201);
    const history = await a.get(`/api/layouts/${layout.id}/versions`);
    const rpms = history.body.versions.map((v: { version: number }) => v.version);
    expect(rpms.slice(0, 3)).toEqual([base.version + 2, base.version + 1, base.version]);
    const v1 = await a.get(`/api/layouts/${layout.id}/versions/${base.version + 1}`);
    const v2 = await a.get(`/api/layouts/${layout.id}/versions/${base.version + 2}`);
    expect([v1.body.body.rotorRpm, v2.body.body.rotorRpm].sort()).toEqual([editA.rotorRpm, editB.rotorRpm].sort());
  });

  it('50 parallel writers on different layouts: every acknowledged write is present', async () => {
    const c = await signedIn('technician');
    const { machineId, layout } = await firstLayout(c);
    const base = (await c.get(`/api/layouts/${layout.id}`)).body.current;
    const created = await Promise.all(
      Array.from({ length: 50 }, (_, i) =>
        c.post(`/api/machines/${machineId}/layouts`, {
          name: `parallel ${i}`,
          body: { ...base.body, rotorRpm: 400 + i },
          note: `writer ${i}`,
        }),
      ),
    );
    const acked = created.filter((r) => r.status === 201);
    expect(acked.length).toBe(50);
    for (const r of acked) {
      const back = await c.get(`/api/layouts/${r.body.layout.id}`);
      expect(back.status).toBe(200);
      expect(back.body.current.note).toBe(r.body.version.note);
      expect(back.body.current.body.rotorRpm).toBe(r.body.version.body.rotorRpm);
    }
  });
});
