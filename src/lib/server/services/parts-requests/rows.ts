/** Parts requests: the rows an actor may reach (their organisations', or sent to their dealer). */
import { and, eq, inArray, or } from 'drizzle-orm';
import { getDb, type Db } from '~/lib/server/db';
import { partsRequests } from '~/db/schema';
import type { Actor } from '~/lib/server/access';
import { notFound } from '~/lib/server/http';

export const visibleTo = (actor: Actor) =>
  or(inArray(partsRequests.orgId, actor.visibleOrgIds), inArray(partsRequests.dealerOrgId, actor.memberOrgIds))!;

export type Row = typeof partsRequests.$inferSelect;

export async function rowForActor(actor: Actor, id: string, db?: Db): Promise<Row> {
  const d = db ?? (await getDb());
  const [row] = await d
    .select()
    .from(partsRequests)
    .where(and(eq(partsRequests.id, id), visibleTo(actor)))
    .limit(1);
  if (!row) throw notFound('Parts request not found', 'id');
  return row;
}
