import { describe, expect, it, vi } from 'vitest';
import { actorFor, forgetActors } from '~/lib/server/actors';

/** A stand-in store: counts the actor queries and answers with one farm membership. */
function fakeStore(mode: 'pglite' | 'postgres', role = 'operator') {
  const calls = { n: 0 };
  let gate: Promise<void> = Promise.resolve();
  const db = {
    execute: vi.fn(async () => {
      calls.n++;
      await gate;
      return {
        rows: [
          { id: 'u1', email: 'a@b.example', name: 'A', unit_system: 'metric', org_id: 'o1', role, org_kind: 'farm', customer_ids: [] },
        ],
      };
    }),
  };
  return { store: { db: db as never, mode }, calls, hold: (p: Promise<void>) => (gate = p) };
}

describe('actors kept for a moment (embedded store only)', () => {
  it('reads the store once for several requests of one user, then again after a change', async () => {
    forgetActors();
    const { store, calls } = fakeStore('pglite');
    const a = await actorFor(store, 'u1', 's1');
    const b = await actorFor(store, 'u1', 's1');
    expect(calls.n).toBe(1);
    expect(b).toBe(a);
    expect(a?.role).toBe('operator');
    // Kept actors cannot be changed by a route.
    expect(() => (a!.visibleOrgIds as string[]).push('o2')).toThrow();
    forgetActors();
    await actorFor(store, 'u1', 's1');
    expect(calls.n).toBe(2);
  });

  it('keeps actors per session: another session of the same user reads the store', async () => {
    forgetActors();
    const { store, calls } = fakeStore('pglite');
    await actorFor(store, 'u1', 's1');
    await actorFor(store, 'u1', 's2');
    expect(calls.n).toBe(2);
  });

  it('keeps nothing with a PostgreSQL server (other processes may write)', async () => {
    forgetActors();
    const { store, calls } = fakeStore('postgres');
    await actorFor(store, 'u1', 's1');
    await actorFor(store, 'u1', 's1');
    expect(calls.n).toBe(2);
  });

  it('does not keep a load that overlapped a change', async () => {
    forgetActors();
    const { store, calls, hold } = fakeStore('pglite');
    let release!: () => void;
    hold(new Promise<void>((r) => (release = r)));
    const loading = actorFor(store, 'u1', 's1');
    forgetActors(); // a role change commits while the old row is being read
    release();
    await loading;
    hold(Promise.resolve());
    await actorFor(store, 'u1', 's1');
    expect(calls.n).toBe(2);
  });

  it('reads the store again after a few seconds', async () => {
    forgetActors();
    const { store, calls } = fakeStore('pglite');
    vi.useFakeTimers({ toFake: ['Date'] });
    try {
      await actorFor(store, 'u1', 's1');
      vi.setSystemTime(Date.now() + 3_500);
      await actorFor(store, 'u1', 's1');
      expect(calls.n).toBe(2);
    } finally {
      vi.useRealTimers();
    }
  });
});
