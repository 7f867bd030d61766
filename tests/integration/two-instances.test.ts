import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, DEMO, DEMO_PASSWORD, machineWithLayout } from './client';
import { OTHER } from './matrix-fixtures';
import { removeDir, startServer, type RunningServer } from './server';

/**
 * Two server processes on one PostgreSQL database behave as one: the sign-in throttle, sign-out,
 * role changes, share-link revocation and 409 on stale saves hold across both. Needs a
 * PostgreSQL server (`DATABASE_URL`, as `npm test` sets for its server-mode run under `.ci/run`);
 * without one the block is reported as skipped, with the reason in its name.
 */
const PG = process.env.DATABASE_URL;
// Longer than a burst of 100 sign-ins takes on a loaded machine, so the wait cannot run out mid-burst.
const DELAY_S = 30;

describe.skipIf(!PG)('two server processes on one PostgreSQL database (skipped without DATABASE_URL)', () => {
  let a: RunningServer;
  let b: RunningServer;
  let db: pg.Client;
  let dbName: string;

  beforeAll(async () => {
    dbName = 'cw_two_' + randomBytes(6).toString('hex');
    const admin = new pg.Client({ connectionString: PG });
    await admin.connect();
    await admin.query(`create database "${dbName}"`);
    await admin.end();
    const url = new URL(PG!);
    url.pathname = `/${dbName}`;
    // Each request may name its address (X-Forwarded-For from 127.0.0.1 is trusted here), so a
    // burst can come from many addresses and only the per-account limit applies.
    const env = { DATABASE_URL: url.toString(), CAGEWRIGHT_SIGNIN_DELAY_S: String(DELAY_S), CAGEWRIGHT_TRUSTED_PROXIES: '127.0.0.1' };
    a = await startServer({ env }); // migrates and seeds
    b = await startServer({ env }); // finds the store ready
    db = new pg.Client({ connectionString: url.toString() });
    await db.connect();
  }, 240_000);

  afterAll(async () => {
    await db?.end();
    await a?.stop();
    await b?.stop();
    for (const s of [a, b]) if (s) removeDir(s.dataDir);
    if (dbName) {
      const admin = new pg.Client({ connectionString: PG });
      await admin.connect();
      await admin.query(`drop database if exists "${dbName}" with (force)`);
      await admin.end();
    }
  });

  const on = (s: RunningServer) => new Client(s.baseUrl);
  const from = (n: number) => ({ 'x-forwarded-for': `198.51.100.${(n % 250) + 1}` });

  async function signIn(s: RunningServer, email: string, password = DEMO_PASSWORD, headers: Record<string, string> = {}) {
    const c = on(s);
    const res = await c.signIn(email, password, headers);
    const code = new URL(res.headers.get('location') ?? '/', 'http://x').searchParams.get('code');
    return { c, code, signedIn: c.hasSession() };
  }

  async function expectRefused(c: Client) {
    expect((await c.get('/api/me')).status).toBe(401);
    const page = await c.fetch('/machines');
    expect(page.status).toBe(303);
    expect(page.headers.get('location')).toMatch(/^\/signin\?next=/);
  }

  it('share one sign-in throttle: 100 parallel wrong passwords over both check at most the limit', async () => {
    const email = DEMO.trainer;
    const results = await Promise.all(Array.from({ length: 100 }, (_, i) => signIn(i % 2 ? a : b, email, `wrong-${i}`, from(i))));
    const checked = results.filter((r) => !r.code?.startsWith('throttled-'));
    expect(results.some((r) => r.signedIn)).toBe(false);
    expect(checked.length).toBeGreaterThan(0);
    expect(checked.length).toBeLessThanOrEqual(5);
    // The audit trail agrees: one row per checked password, one per refused reservation.
    const { rows } = await db.query(`select action, count(*)::int as n from audit_log where detail->>'email' = $1 group by action`, [
      email,
    ]);
    const n = Object.fromEntries(rows.map((r) => [r.action, r.n]));
    expect(n['signin-failed']).toBe(checked.length);
    expect(n['signin-throttled']).toBe(100 - checked.length);

    // The right password in a parallel burst over both, during the wait: refused everywhere.
    const burst = await Promise.all(
      Array.from({ length: 40 }, (_, i) => signIn(i % 2 ? b : a, email, i % 10 === 3 ? DEMO_PASSWORD : `again-${i}`, from(120 + i))),
    );
    expect(burst.some((r) => r.signedIn)).toBe(false);
    expect(burst.every((r) => r.code?.startsWith('throttled-'))).toBe(true);

    const until = Math.max(...burst.map((r) => Number(r.code!.slice('throttled-'.length))));
    await new Promise((r) => setTimeout(r, Math.max(0, until * 1000 - Date.now()) + 1000));
    const after = await signIn(b, email, DEMO_PASSWORD, from(200));
    expect(after.signedIn).toBe(true);
  }, 180_000);

  it('share sign-out: a cookie signed out on one is refused by the other', async () => {
    const { c } = await signIn(a, DEMO.technician);
    const kept = c.copy(b.baseUrl);
    expect((await kept.get('/api/me')).status).toBe(200);
    await c.signOut();
    await expectRefused(kept);
    await expectRefused(c.copy(a.baseUrl));
  });

  it('share role changes: a role changed on one ends the person’s sessions on the other', async () => {
    const { c: admin } = await signIn(a, OTHER.dealer_admin);
    const people = (await admin.get('/api/admin/users')).body.users as { id: string; email: string; orgId: string }[];
    const mara = people.find((p) => p.email === OTHER.trainer)!;
    const { c: onB } = await signIn(b, OTHER.trainer);
    expect((await onB.get('/api/me')).body.role).toBe('trainer');
    expect((await admin.put(`/api/admin/users/${mara.id}`, { orgId: mara.orgId, role: 'operator' })).status).toBe(200);
    await expectRefused(onB);
    const { c: again } = await signIn(b, OTHER.trainer);
    expect((await again.get('/api/me')).body.role).toBe('operator');
    // Decks are for trainers and technicians: the new role is enforced on the other process.
    expect((await again.get('/api/decks')).status).toBe(403);
  });

  it('share link revocation: a link revoked on one is gone on the other', async () => {
    const { c: olive } = await signIn(a, DEMO.operator);
    const { layout } = await machineWithLayout(olive);
    const made = await olive.post('/api/share-links', { layoutId: layout.id, version: 1, label: 'two processes' });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    const anon = on(b);
    expect((await anon.fetch(made.body.path)).status).toBe(200);
    expect((await olive.delete(`/api/share-links/${made.body.link.id}`)).status).toBe(200);
    expect((await anon.fetch(made.body.path)).status).toBe(404);
    expect((await on(a).fetch(made.body.path)).status).toBe(404);
  });

  it('share the stale-save guard: two saves from one version, one per process, give one 409', async () => {
    const { c: olive } = await signIn(a, DEMO.operator);
    const { c: tomas } = await signIn(b, DEMO.technician);
    const { machineId, layout: seeded } = await machineWithLayout(olive);
    const body = (await olive.get(`/api/layouts/${seeded.id}`)).body.current.body;
    const made = await olive.post(`/api/machines/${machineId}/layouts`, { name: 'two processes', body });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    const id = made.body.layout.id;
    const base = (await olive.get(`/api/layouts/${id}`)).body.current;
    const [ra, rb] = await Promise.all([
      olive.put(`/api/layouts/${id}`, {
        baseVersion: base.version,
        body: { ...base.body, rotorRpm: base.body.rotorRpm + 10 },
        note: 'on A',
      }),
      tomas.put(`/api/layouts/${id}`, {
        baseVersion: base.version,
        body: { ...base.body, rotorRpm: base.body.rotorRpm + 20 },
        note: 'on B',
      }),
    ]);
    expect([ra.status, rb.status].sort()).toEqual([201, 409]);
    const loser = ra.status === 409 ? ra : rb;
    expect(loser.body.error.currentVersion).toBe(base.version + 1);
    // A save from the version one process just wrote is refused by the other as well.
    expect((await tomas.put(`/api/layouts/${id}`, { baseVersion: base.version, body: base.body, note: 'stale' })).status).toBe(409);
  });
});
