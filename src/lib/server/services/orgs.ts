import { and, count, eq, inArray, sql } from 'drizzle-orm';
import { z } from 'zod';
import { getDb } from '~/lib/server/db';
import { machines, memberships, organisations } from '~/db/schema';
import type { Actor } from '~/lib/server/access';
import { forgetActors } from '~/lib/server/actors';
import { audit } from '~/lib/server/audit';
import { HttpError } from '~/lib/server/http';

/** The organisations the actor may see, with how many machines and members each has. */
export async function listOrgs(actor: Actor) {
  const db = await getDb();
  const rows = await db
    .select({
      id: organisations.id,
      name: organisations.name,
      kind: organisations.kind,
      dealerId: organisations.dealerId,
      ownerEmail: organisations.ownerEmail,
      partsDeskEmail: organisations.partsDeskEmail,
      machines: sql<number>`(select count(*)::int from ${machines} m where m.org_id = organisations.id)`,
      members: sql<number>`(select count(*)::int from ${memberships} ms where ms.org_id = organisations.id)`,
    })
    .from(organisations)
    .where(inArray(organisations.id, actor.visibleOrgIds))
    .orderBy(organisations.kind, organisations.name);
  return rows.map((r) => ({ ...r, member: actor.memberOrgIds.includes(r.id) }));
}

export const createOrgSchema = z.object({
  name: z.string().trim().min(2, { error: 'give the farm a name of at least 2 characters' }).max(120),
  ownerEmail: z.email({ error: 'enter a valid e-mail address' }).max(254).optional(),
});

/**
 * An admin adds a customer farm served by their dealer; the dealer's staff see it at once
 * (their memberships are read from the store, and the kept actors are dropped once it is added).
 */
export async function createFarm(actor: Actor, input: z.infer<typeof createOrgSchema>) {
  if (actor.homeOrgKind !== 'dealer') throw new HttpError(403, 'Only a dealer’s administrator adds customer farms.');
  const db = await getDb();
  const [dupe] = await db
    .select({ n: count() })
    .from(organisations)
    .where(and(eq(organisations.dealerId, actor.homeOrgId), sql`lower(${organisations.name}) = lower(${input.name})`));
  if ((dupe?.n ?? 0) > 0) throw new HttpError(409, `name: a customer farm called “${input.name}” already exists`, 'name');
  const farm = await db.transaction(async (tx) => {
    const [row] = await tx
      .insert(organisations)
      .values({ name: input.name, kind: 'farm', dealerId: actor.homeOrgId, ownerEmail: input.ownerEmail ?? null })
      .returning();
    await audit(tx, actor, 'create', 'organisation', row!.id, { name: row!.name, kind: 'farm' }, row!.id);
    return row!;
  });
  // The dealer's staff see the new farm on their next request.
  forgetActors();
  return farm;
}
