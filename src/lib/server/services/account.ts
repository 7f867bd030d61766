import { and, eq, inArray, sql } from 'drizzle-orm';
import { z } from 'zod';
import { getDb } from '~/lib/server/db';
import { memberships, users } from '~/db/schema';
import { TENANT_ROLES, type Actor } from '~/lib/server/access';
import { forgetActors } from '~/lib/server/actors';
import { audit } from '~/lib/server/audit';
import { HttpError, notFound } from '~/lib/server/http';
import { hashPassword, verifyPassword } from '~/lib/server/auth/passwords';
import { ACCOUNT_FREE, reserve } from '~/lib/server/auth/throttle';

/** Roles a dealer administrator may give within their dealer. */

export const passwordChangeSchema = z
  .object({
    currentPassword: z.string().min(1, { error: 'enter your current password' }).max(200, { error: 'at most 200 characters' }),
    newPassword: z
      .string()
      .min(12, { error: 'choose a new password of at least 12 characters' })
      .max(200, { error: 'at most 200 characters' }),
  })
  .strict();

/**
 * Changes the signed-in user's password. The current password is checked under a throttle of
 * its own (`password:<user id>`, reserved before the check, like sign-in), so a borrowed session
 * cannot be used to guess it quickly. Writing the new hash ends every session of the user on
 * every server process (the trigger on users.password_hash), this one included: the caller
 * signs in again with the new password.
 */
export async function changePassword(actor: Actor, input: z.infer<typeof passwordChangeSchema>) {
  const db = await getDb();
  const reservation = await reserve(db, `password:${actor.id}`, ACCOUNT_FREE);
  if (!reservation.ok) {
    const seconds = Math.max(1, Math.ceil((reservation.retryAt.getTime() - Date.now()) / 1000));
    throw new HttpError(429, `Too many attempts. Try again in ${seconds} s.`, 'currentPassword', { retryAfter: seconds });
  }
  const [user] = await db.select({ hash: users.passwordHash }).from(users).where(eq(users.id, actor.id)).limit(1);
  if (!user || !(await verifyPassword(input.currentPassword, user.hash))) {
    await audit(db, actor, 'password-change-refused', 'user', actor.id, {});
    throw new HttpError(400, 'currentPassword: that is not your current password', 'currentPassword');
  }
  if (input.newPassword === input.currentPassword) {
    throw new HttpError(400, 'newPassword: choose a password other than the current one', 'newPassword');
  }
  const hash = await hashPassword(input.newPassword);
  await db.transaction(async (tx) => {
    await tx.update(users).set({ passwordHash: hash }).where(eq(users.id, actor.id));
    await audit(tx, actor, 'update', 'user-password', actor.id, {});
  });
  await db.execute(sql`delete from signin_throttle where key = ${`password:${actor.id}`}`);
  forgetActors();
  return { changed: true, signedOut: true };
}

export const roleChangeSchema = z
  .object({
    orgId: z.uuid({ error: 'name the organisation by its id' }),
    // An installation's administrator is made on the host (`npm run instance-admin`), never here.
    role: z.enum(TENANT_ROLES, { error: `one of: ${TENANT_ROLES.join(', ')}` }),
  })
  .strict();

/**
 * An administrator changes a person's role in one of the administrator's own organisations.
 * Someone outside them is a 404. The change ends that person's sessions on every server process
 * (the trigger on memberships), so they sign in again under the new role.
 */
export async function changeRole(actor: Actor, userId: string, input: z.infer<typeof roleChangeSchema>) {
  if (!actor.memberOrgIds.includes(input.orgId)) throw notFound('Not found', 'orgId');
  if (userId === actor.id) throw new HttpError(409, 'role: you cannot change your own role; ask another administrator', 'role');
  const db = await getDb();
  const changed = await db.transaction(async (tx) => {
    const [before] = await tx
      .select({ role: memberships.role })
      .from(memberships)
      .where(and(eq(memberships.userId, userId), inArray(memberships.orgId, [input.orgId])))
      .for('update');
    if (!before) return null;
    if (before.role === input.role) return { previous: before.role, role: input.role };
    await tx
      .update(memberships)
      .set({ role: input.role })
      .where(and(eq(memberships.userId, userId), eq(memberships.orgId, input.orgId)));
    await audit(tx, actor, 'update', 'membership', userId, { orgId: input.orgId, role: input.role, previous: before.role }, input.orgId);
    return { previous: before.role, role: input.role };
  });
  if (!changed) throw notFound();
  forgetActors();
  return { userId, orgId: input.orgId, ...changed };
}
