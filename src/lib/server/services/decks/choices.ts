/** Choices for the deck editor: the layouts a slide may show. */
import { and, asc, eq, inArray } from 'drizzle-orm';
import { getDb } from '~/lib/server/db';
import { layouts, layoutVersions, machines, organisations } from '~/db/schema';
import type { Actor } from '~/lib/server/access';

/** The current version of every layout on the machines the actor may see, to put on a slide. */
export async function slideLayoutChoices(actor: Actor) {
  const db = await getDb();
  const rows = await db
    .select({
      layoutId: layouts.id,
      layoutName: layouts.name,
      version: layouts.currentVersion,
      layoutVersionId: layoutVersions.id,
      body: layoutVersions.body,
      machineId: machines.id,
      machineNickname: machines.nickname,
      familyId: machines.familyId,
      orgName: organisations.name,
    })
    .from(layouts)
    .innerJoin(layoutVersions, and(eq(layoutVersions.layoutId, layouts.id), eq(layoutVersions.version, layouts.currentVersion)))
    .innerJoin(machines, eq(machines.id, layouts.machineId))
    .innerJoin(organisations, eq(organisations.id, machines.orgId))
    .where(inArray(layouts.orgId, actor.visibleOrgIds))
    .orderBy(asc(organisations.name), asc(machines.nickname), asc(layouts.name))
    .limit(500);
  return rows.map(({ body, ...r }) => ({ ...r, crop: body.crop }));
}
