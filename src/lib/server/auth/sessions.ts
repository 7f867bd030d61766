import { randomBytes } from 'node:crypto';
import { sql } from 'drizzle-orm';
import type { Db } from '~/lib/server/db';

/** How long a session lasts from sign-in; auth.config.ts gives the cookie the same age. */
export const SESSION_MAX_AGE_S = 12 * 60 * 60;

type Exec = Pick<Db, 'execute'>;

/** Opens a session row for a user who just proved their password; returns its id. */
export async function startSession(db: Exec, userId: string): Promise<string> {
  const id = randomBytes(24).toString('base64url');
  await db.execute(sql`
    insert into sessions (id, user_id, expires_at)
    values (${id}, ${userId}, now() + make_interval(secs => ${SESSION_MAX_AGE_S}::float8))`);
  // The user's long-expired rows go now and then; open ones stay for the middleware.
  await db.execute(sql`delete from sessions where user_id = ${userId} and expires_at < now() - interval '7 days'`);
  return id;
}

/** Whether a session is open: not ended, not expired. */
export async function sessionIsOpen(db: Exec, sessionId: string): Promise<boolean> {
  const res = await db.execute(sql`select 1 from sessions where id = ${sessionId} and ended_at is null and expires_at > now()`);
  return res.rows.length > 0;
}

/** Ends one session (sign-out). Returns whether it was still open. */
export async function endSession(db: Exec, sessionId: string, reason = 'signed-out'): Promise<boolean> {
  const res = await db.execute(sql`
    update sessions set ended_at = now(), ended_reason = ${reason}
    where id = ${sessionId} and ended_at is null returning id`);
  return res.rows.length > 0;
}

/**
 * Ends every open session of a user. Password, role and membership changes do this in the
 * store itself (triggers in drizzle/0002_end_sessions_on_access_change.sql); call this for
 * anything else that should sign a user out everywhere.
 */
export async function endUserSessions(db: Exec, userId: string, reason: string): Promise<number> {
  const res = await db.execute(sql`
    update sessions set ended_at = now(), ended_reason = ${reason}
    where user_id = ${userId} and ended_at is null returning id`);
  return res.rows.length;
}
