import { desc, eq, inArray, sql } from 'drizzle-orm';
import { getDb } from '~/lib/server/db';
import { families, lossChecks, machines, organisations } from '~/db/schema';
import type { Actor } from '~/lib/server/access';

/** The machines the actor may see, with the time of each one's last loss check (a page of 100). */
export async function fieldCheckMachines(actor: Actor) {
  const db = await getDb();
  return db
    .select({
      id: machines.id,
      nickname: machines.nickname,
      familyName: families.name,
      orgName: organisations.name,
      lastCheckAt:
        sql<Date | null>`(select max(${lossChecks.checkedAt}) from ${lossChecks} where ${lossChecks.machineId} = ${machines.id})`.mapWith(
          (v) => (v ? new Date(v) : null),
        ),
    })
    .from(machines)
    .innerJoin(families, eq(families.id, machines.familyId))
    .innerJoin(organisations, eq(organisations.id, machines.orgId))
    .where(inArray(machines.orgId, actor.visibleOrgIds))
    .orderBy(desc(machines.updatedAt))
    .limit(100);
}
