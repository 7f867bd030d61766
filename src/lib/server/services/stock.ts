import { and, eq, inArray } from 'drizzle-orm';
import { getDb, type Db } from '~/lib/server/db';
import { organisations, stock } from '~/db/schema';
import type { Actor } from '~/lib/server/access';
import { notFound } from '~/lib/server/http';

export interface StockCount {
  /** On the shelf of the organisation that owns the machine. */
  own: number;
  /** At that organisation's dealer (zero when the owner is itself the dealer or has none). */
  dealer: number;
}

/**
 * What is on the shelf for an organisation's machines: its own spares and its dealer's stock,
 * by part number. The organisation must be one the actor sees; its dealer's counts come along
 * because the dealer serves that farm (the counts say how many, nothing else about the dealer).
 */
export async function stockForOrg(actor: Actor, orgId: string, db?: Db): Promise<Record<string, StockCount>> {
  if (!actor.visibleOrgIds.includes(orgId)) throw notFound('Organisation not found', 'orgId');
  const d = db ?? (await getDb());
  const [org] = await d
    .select({ id: organisations.id, kind: organisations.kind, dealerId: organisations.dealerId })
    .from(organisations)
    .where(eq(organisations.id, orgId))
    .limit(1);
  if (!org) throw notFound('Organisation not found', 'orgId');
  const dealerId = org.kind === 'farm' ? org.dealerId : null;
  const orgIds = dealerId ? [org.id, dealerId] : [org.id];
  const rows = await d
    .select({ orgId: stock.orgId, partNumber: stock.partNumber, quantity: stock.quantity })
    .from(stock)
    .where(and(inArray(stock.orgId, orgIds)));
  const out: Record<string, StockCount> = {};
  for (const r of rows) {
    const c = (out[r.partNumber] ??= { own: 0, dealer: 0 });
    if (r.orgId === org.id) c.own += r.quantity;
    else c.dealer += r.quantity;
  }
  return out;
}
