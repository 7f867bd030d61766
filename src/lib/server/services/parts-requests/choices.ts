/** Parts requests: what a request can be made from. */
import { desc, eq, inArray } from 'drizzle-orm';
import { getDb } from '~/lib/server/db';
import { layouts, machines, organisations } from '~/db/schema';
import type { Actor } from '~/lib/server/access';

/** The saved layouts a request can be made from: the current version of each, newest first. */
export async function requestLayoutChoices(actor: Actor) {
  const db = await getDb();
  return db
    .select({
      id: layouts.id,
      name: layouts.name,
      currentVersion: layouts.currentVersion,
      machineId: machines.id,
      machineNickname: machines.nickname,
      orgName: organisations.name,
    })
    .from(layouts)
    .innerJoin(machines, eq(machines.id, layouts.machineId))
    .innerJoin(organisations, eq(organisations.id, machines.orgId))
    .where(inArray(layouts.orgId, actor.visibleOrgIds))
    .orderBy(organisations.name, machines.nickname, desc(layouts.updatedAt))
    .limit(300);
}
