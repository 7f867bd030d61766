import { CredentialsSignin } from '@auth/core/errors';
import { eq } from 'drizzle-orm';
import { z } from 'zod';
import { getDb } from '~/lib/server/db';
import { audit } from '~/lib/server/audit';
import { users, memberships } from '~/db/schema';
import { DECOY_HASH, verifyPassword } from './passwords';
import { reserveSignIn, signInSucceeded } from './throttle';
import { startSession } from './sessions';
import { currentClientAddress } from './client-address';

export const signInSchema = z.object({
  email: z.email({ error: 'Enter a valid e-mail address.' }).max(254, { error: 'The e-mail address is too long.' }),
  password: z
    .string({ error: 'Enter your password.' })
    .min(1, { error: 'Enter your password.' })
    .max(200, { error: 'The password is too long.' }),
});

/** Codes travel to /signin as `?code=`; the page turns them into words. */
class SignInProblem extends CredentialsSignin {
  constructor(code: string) {
    super();
    this.code = code;
  }
}

/** `throttled-<unix seconds>`: the page tells the user when to try again. */
export function throttledCode(retryAt: Date) {
  return `throttled-${Math.ceil(retryAt.getTime() / 1000)}`;
}

export async function verifyCredentials(raw: Partial<Record<string, unknown>>) {
  const parsed = signInSchema.safeParse({ email: raw.email, password: raw.password });
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new SignInProblem(`invalid_${String(issue?.path[0] ?? 'form')}`);
  }
  const { email, password } = parsed.data;
  const address = currentClientAddress();
  const typed = email.trim().toLowerCase();
  const db = await getDb();

  // Reserve the attempt before the password is checked (see throttle.ts).
  const reservation = await reserveSignIn(db, typed, address);
  if (!reservation.ok) {
    await audit(db, null, 'signin-throttled', 'signin', null, { email: typed, address, retryAt: reservation.retryAt.toISOString() });
    throw new SignInProblem(throttledCode(reservation.retryAt));
  }

  const [user] = await db.select().from(users).where(eq(users.email, typed)).limit(1);
  const ok = await verifyPassword(password, user?.passwordHash ?? DECOY_HASH);
  const [membership] = user && ok ? await db.select().from(memberships).where(eq(memberships.userId, user.id)).limit(1) : [];
  if (!user || !ok || !membership) {
    await audit(db, null, 'signin-failed', 'signin', user?.id ?? null, { email: typed, address });
    return null;
  }
  await signInSucceeded(db, typed, address);
  const sid = await startSession(db, user.id);
  return { id: user.id, email: user.email, name: user.name, role: membership.role, sid };
}
