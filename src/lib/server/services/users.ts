import { eq, inArray } from 'drizzle-orm';
import { z } from 'zod';
import { getDb } from '~/lib/server/db';
import { memberships, organisations, users } from '~/db/schema';
import { isInstanceAdmin, type Actor } from '~/lib/server/access';
import { forgetActors } from '~/lib/server/actors';
import { audit } from '~/lib/server/audit';

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

/**
 * Users with their roles: of the organisations a dealer administrator sees (their dealer and its
 * customer farms); of every organisation for the instance administrator, who runs the installation.
 */
export async function listUsers(actor: Actor) {
  const db = await getDb();
  const q = db
    .select({
      id: users.id,
      email: users.email,
      name: users.name,
      role: memberships.role,
      orgId: organisations.id,
      orgName: organisations.name,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .innerJoin(organisations, eq(organisations.id, memberships.orgId))
    .where(isInstanceAdmin(actor) ? undefined : inArray(memberships.orgId, actor.visibleOrgIds))
    .orderBy(organisations.name, users.name);
  return q;
}
