import { PGlite } from '@electric-sql/pglite';
import { drizzle } from 'drizzle-orm/pglite';
import { migrate } from 'drizzle-orm/pglite/migrator';
import { sql } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import * as schema from '~/db/schema';
import { ACCOUNT_FREE, ADDRESS_FREE, accountKey, addressKey, reserve, reserveSignIn, signInSucceeded } from '~/lib/server/auth/throttle';
import { endSession, startSession } from '~/lib/server/auth/sessions';

/**
 * The throttle and the session rows against a real (in-memory) store with the real migrations,
 * triggers included. The limits are our own choice (common practice, no published source:
 * a handful of free attempts, then delays that double, capped).
 */
let db: ReturnType<typeof drizzle<typeof schema>>;
let userId: string;
let orgId: string;

const rows = async <T>(q: ReturnType<typeof sql>) => (await db.execute(q)).rows as T[];

beforeAll(async () => {
  db = drizzle(new PGlite(), { schema });
  await migrate(db, { migrationsFolder: 'drizzle' });
  const [org] = await db.insert(schema.organisations).values({ name: 'Test farm', kind: 'farm' }).returning();
  const [user] = await db.insert(schema.users).values({ email: 'a@test.example', name: 'A', passwordHash: 'x' }).returning();
  await db.insert(schema.memberships).values({ userId: user!.id, orgId: org!.id, role: 'operator' });
  userId = user!.id;
  orgId = org!.id;
}, 60_000);

describe('sign-in throttle in the store', () => {
  it('grants at most the free attempts to 100 parallel reservations, then names a time ~30 s ahead', async () => {
    const results = await Promise.all(Array.from({ length: 100 }, () => reserve(db, 'account:burst@test.example', ACCOUNT_FREE)));
    expect(results.filter((r) => r.ok)).toHaveLength(ACCOUNT_FREE);
    const refused = results.find((r) => !r.ok) as { ok: false; retryAt: Date };
    const wait = (refused.retryAt.getTime() - Date.now()) / 1000;
    expect(wait).toBeGreaterThan(25);
    expect(wait).toBeLessThanOrEqual(31);
  });

  it('lets one attempt through after the wait, and the next wait is twice as long, up to 15 minutes', async () => {
    const key = 'account:grow@test.example';
    for (let i = 0; i < ACCOUNT_FREE; i++) expect((await reserve(db, key, ACCOUNT_FREE)).ok).toBe(true);
    const waits: number[] = [];
    for (let round = 0; round < 8; round++) {
      expect((await reserve(db, key, ACCOUNT_FREE)).ok).toBe(false);
      const [row] = await rows<{ s: number }>(
        sql`select extract(epoch from next_at - now())::float8 as s from signin_throttle where key = ${key}`,
      );
      waits.push(Math.round(row!.s));
      await db.execute(sql`update signin_throttle set next_at = now() where key = ${key}`); // the wait is over
      expect((await reserve(db, key, ACCOUNT_FREE)).ok).toBe(true);
      expect((await reserve(db, key, ACCOUNT_FREE)).ok).toBe(false);
    }
    expect(waits).toEqual([30, 60, 120, 240, 480, 900, 900, 900]);
  });

  it('starts afresh after a quiet hour', async () => {
    const key = 'account:quiet@test.example';
    for (let i = 0; i < ACCOUNT_FREE; i++) await reserve(db, key, ACCOUNT_FREE);
    await db.execute(
      sql`update signin_throttle set next_at = now() - interval '61 minutes', last_at = now() - interval '61 minutes' where key = ${key}`,
    );
    expect((await reserve(db, key, ACCOUNT_FREE)).ok).toBe(true);
    const [row] = await rows<{ attempts: number }>(sql`select attempts from signin_throttle where key = ${key}`);
    expect(row!.attempts).toBe(1);
  });

  it('reserves the address first: a throttled address does not count against the account', async () => {
    const address = '203.0.113.9';
    for (let i = 0; i < ADDRESS_FREE; i++) expect((await reserveSignIn(db, `spray${i}@test.example`, address)).ok).toBe(true);
    expect((await reserveSignIn(db, 'victim@test.example', address)).ok).toBe(false);
    const victim = await rows(sql`select 1 from signin_throttle where key = ${accountKey('victim@test.example')}`);
    expect(victim).toHaveLength(0);
    // Another address still gets through for the same account.
    expect((await reserveSignIn(db, 'victim@test.example', '198.51.100.7')).ok).toBe(true);
  });

  it('clears the account and gives the address its attempt back after a success', async () => {
    const address = '192.0.2.44';
    await reserveSignIn(db, 'Someone@Test.example', address);
    await reserveSignIn(db, 'someone@test.example', address);
    await signInSucceeded(db, 'someone@test.example', address);
    expect(await rows(sql`select 1 from signin_throttle where key = ${accountKey('SOMEONE@test.example')}`)).toHaveLength(0);
    const [row] = await rows<{ attempts: number }>(sql`select attempts from signin_throttle where key = ${addressKey(address)}`);
    expect(row!.attempts).toBe(1);
  });

  it('counts IPv6 clients by their /64 and IPv4-mapped addresses as IPv4', () => {
    expect(addressKey('2001:db8:1:2:aaaa::1')).toBe(addressKey('2001:0db8:0001:0002:ffff:1:2:3'));
    expect(addressKey('2001:db8:1:2::1')).not.toBe(addressKey('2001:db8:1:3::1'));
    expect(addressKey('::ffff:127.0.0.1')).toBe(addressKey('127.0.0.1'));
    expect(addressKey('')).toBe('address:unknown');
  });
});

describe('session rows', () => {
  const open = async (sid: string) =>
    (await rows(sql`select 1 from sessions where id = ${sid} and ended_at is null and expires_at > now()`)).length === 1;

  it('signing out ends one session and leaves the user’s others open', async () => {
    const a = await startSession(db, userId);
    const b = await startSession(db, userId);
    expect(await endSession(db, a)).toBe(true);
    expect(await open(a)).toBe(false);
    expect(await open(b)).toBe(true);
    expect(await endSession(db, a)).toBe(false);
  });

  it('a role change, a membership change or a password change ends every session of the user', async () => {
    const [other] = await db.insert(schema.organisations).values({ name: 'Other farm', kind: 'farm' }).returning();
    const cases: [string, () => Promise<unknown>][] = [
      ['role change', () => db.execute(sql`update memberships set role = 'technician' where user_id = ${userId} and org_id = ${orgId}`)],
      ['membership added', () => db.insert(schema.memberships).values({ userId, orgId: other!.id, role: 'operator' })],
      ['membership removed', () => db.execute(sql`delete from memberships where user_id = ${userId} and org_id = ${other!.id}`)],
      ['password change', () => db.execute(sql`update users set password_hash = 'y' where id = ${userId}`)],
    ];
    for (const [what, change] of cases) {
      const a = await startSession(db, userId);
      const b = await startSession(db, userId);
      await change();
      expect([what, await open(a), await open(b)]).toEqual([what, false, false]);
    }
  });

  it('other updates of the user (units, an unchanged role) leave sessions open', async () => {
    const a = await startSession(db, userId);
    await db.execute(sql`update users set unit_system = 'imperial' where id = ${userId}`);
    await db.execute(sql`update memberships set role = role where user_id = ${userId}`);
    await db.execute(sql`update users set password_hash = password_hash where id = ${userId}`);
    expect(await open(a)).toBe(true);
  });
});
