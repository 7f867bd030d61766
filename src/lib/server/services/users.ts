import { eq, inArray } from 'drizzle-orm';
import { z } from 'zod';
import { getDb } from '../db';
import { memberships, organisations, users } from '../../../db/schema';
import { forgetActors, type Actor } from '../access';
import { audit } from '../audit';

export const preferencesSchema = z.object({ unitSystem: z.enum(['metric', 'imperial']) }).strict();

export function me(actor: Actor) {
  const { id, email, name, role, unitSystem, homeOrgId, homeOrgKind, memberOrgIds } = actor;
  return { id, email, name, role, unitSystem, homeOrgId, homeOrgKind, memberOrgIds };
}

export async function updatePreferences(actor: Actor, prefs: z.infer<typeof preferencesSchema>) {
  const db = await getDb();
  await db.transaction(async (tx) => {
    await tx.update(users).set({ unitSystem: prefs.unitSystem }).where(eq(users.id, actor.id));
    await audit(tx, actor, 'update', 'user-preferences', actor.id, prefs);
  });
  forgetActors();
  return { ...me(actor), ...prefs };
}

/** Users of the organisations the admin can see, with their roles. */
export async function listUsers(actor: Actor) {
  const db = await getDb();
  return db
    .select({ id: users.id, email: users.email, name: users.name, role: memberships.role, orgId: organisations.id, orgName: organisations.name })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .innerJoin(organisations, eq(organisations.id, memberships.orgId))
    .where(inArray(memberships.orgId, actor.visibleOrgIds))
    .orderBy(organisations.name, users.name);
}
