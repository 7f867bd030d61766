import { sql } from 'drizzle-orm';
import type { Db } from '~/lib/server/db';

/**
 * Sign-in throttling, shared by every server process through the store.
 *
 * Each attempt is *reserved* before its password is checked, in one INSERT … ON CONFLICT DO
 * UPDATE … WHERE … RETURNING statement per key: the row lock makes parallel reservations take
 * turns, so a burst of parallel requests can never check more passwords than the limit allows.
 * Two keys are reserved, the client address first (so a throttled address cannot push an
 * account's count further), then the account:
 *
 * - `account:<e-mail as typed, lower-cased>` — whether or not the account exists, so the
 *   throttle itself reveals nothing; `ACCOUNT_FREE` attempts, then growing delays.
 * - `address:<client address>` (IPv6 by its /64) — `ADDRESS_FREE` attempts across all accounts.
 *
 * The n-th reservation sets the next allowed time to now + delay(n): nothing while n is below
 * the free count, then `BASE_DELAY_S` doubling per attempt up to `MAX_DELAY_S`. A wait is never
 * longer than that cap, so an attacker can slow an account down but cannot lock its owner out
 * for good; a key quiet for `FORGET_AFTER_S` starts afresh. A successful sign-in clears the
 * account's count and gives the address back the attempt it used.
 */
export const ACCOUNT_FREE = 5;
/** Free attempts per client address (`CAGEWRIGHT_SIGNIN_ADDRESS_FREE`, default 20). */
export const ADDRESS_FREE = positiveInt(process.env.CAGEWRIGHT_SIGNIN_ADDRESS_FREE, 20);
const BASE_DELAY_S = Number(process.env.CAGEWRIGHT_SIGNIN_DELAY_S ?? 30);
const MAX_DELAY_S = 15 * 60;
const FORGET_AFTER_S = 60 * 60;

export type Reservation = { ok: true } | { ok: false; retryAt: Date };

type Exec = Pick<Db, 'execute'>;

export function accountKey(email: string) {
  return `account:${email.trim().toLowerCase()}`;
}

/** The address a throttle counts by: IPv4 as is (also when IPv4-mapped), IPv6 by its /64. */
export function addressKey(address: string | null | undefined) {
  let a = (address ?? '').trim().toLowerCase();
  if (!a) return 'address:unknown';
  const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/.exec(a);
  if (mapped) a = mapped[1]!;
  if (a.includes(':')) {
    const [head = '', tail = ''] = a.split('::');
    const left = head ? head.split(':') : [];
    const right = tail ? tail.split(':') : [];
    const groups = a.includes('::') ? [...left, ...Array(Math.max(0, 8 - left.length - right.length)).fill('0'), ...right] : left;
    a =
      groups
        .slice(0, 4)
        .map((g) => g.replace(/^0+(?=.)/, ''))
        .join(':') + '::/64';
  }
  return `address:${a}`;
}

function delaySeconds(n: ReturnType<typeof sql>, free: number) {
  return sql`case when ${n} >= ${free}::int then least(${MAX_DELAY_S}::float8, ${BASE_DELAY_S}::float8 * power(2, ${n} - ${free}::int)) else 0 end`;
}

/**
 * Reserves one attempt for a key, or says when the next one may be made. One statement. Times are
 * the clock's, not the transaction's start (`now()`): a reservation that waited for another's row
 * lock must compare against the time it is judged, or a free attempt would be refused because the
 * other one's "next allowed" lies a moment after this one's start (parallel sign-ins from one
 * address on a PostgreSQL server).
 */
export async function reserve(db: Exec, key: string, free: number): Promise<Reservation> {
  const next = sql`case when t.last_at < clock_timestamp() - make_interval(secs => ${FORGET_AFTER_S}::float8) then 1 else t.attempts + 1 end`;
  const granted = await db.execute(sql`
    insert into signin_throttle as t (key, attempts, next_at, last_at)
    values (${key}, 1, clock_timestamp() + make_interval(secs => ${delaySeconds(sql`1`, free)}), clock_timestamp())
    on conflict (key) do update set
      attempts = ${next},
      next_at = clock_timestamp() + make_interval(secs => ${delaySeconds(next, free)}),
      last_at = clock_timestamp()
    where t.next_at <= clock_timestamp()
    returning t.attempts`);
  if (granted.rows.length > 0) return { ok: true };
  const held = await db.execute(sql`select next_at from signin_throttle where key = ${key}`);
  const at = (held.rows[0] as { next_at?: string | Date } | undefined)?.next_at;
  return { ok: false, retryAt: at ? new Date(at) : new Date(Date.now() + BASE_DELAY_S * 1000) };
}

/** Reserves an attempt for this address and this account; the address goes first. */
export async function reserveSignIn(db: Exec, email: string, address: string | null): Promise<Reservation> {
  const byAddress = await reserve(db, addressKey(address), ADDRESS_FREE);
  if (!byAddress.ok) return byAddress;
  return reserve(db, accountKey(email), ACCOUNT_FREE);
}

/** After a successful sign-in: the account starts afresh, the address gets its attempt back. */
export async function signInSucceeded(db: Exec, email: string, address: string | null) {
  await db.execute(sql`delete from signin_throttle where key = ${accountKey(email)}`);
  await db.execute(sql`update signin_throttle set attempts = greatest(attempts - 1, 0) where key = ${addressKey(address)}`);
  // Now and then, drop rows nobody has used for a day.
  if (Math.random() < 0.02) await db.execute(sql`delete from signin_throttle where last_at < now() - interval '1 day' and next_at < now()`);
}

function positiveInt(value: string | undefined, fallback: number): number {
  const n = Number(value);
  return Number.isInteger(n) && n > 0 ? n : fallback;
}
