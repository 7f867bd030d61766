import { CredentialsSignin } from '@auth/core/errors';
import { eq } from 'drizzle-orm';
import { z } from 'zod';
import { getDb } from '../db';
import { users, memberships } from '../../../db/schema';
import { DECOY_HASH, verifyPassword } from './passwords';
import { recordFailure, recordSuccess, waitFor } from './throttle';

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

export async function verifyCredentials(raw: Partial<Record<string, unknown>>) {
  const parsed = signInSchema.safeParse({ email: raw.email, password: raw.password });
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new SignInProblem(`invalid_${String(issue?.path[0] ?? 'form')}`);
  }
  const { email, password } = parsed.data;
  if (waitFor(email) > 0) throw new SignInProblem('throttled');

  const db = await getDb();
  const [user] = await db.select().from(users).where(eq(users.email, email.toLowerCase())).limit(1);
  const ok = await verifyPassword(password, user?.passwordHash ?? DECOY_HASH);
  if (!user || !ok) {
    recordFailure(email);
    return null;
  }
  const [membership] = await db.select().from(memberships).where(eq(memberships.userId, user.id)).limit(1);
  if (!membership) {
    recordFailure(email);
    return null;
  }
  recordSuccess(email);
  return { id: user.id, email: user.email, name: user.name, role: membership.role };
}
