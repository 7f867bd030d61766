import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { z } from 'zod';
import { getDb, type Db } from '~/lib/server/db';
import { catalogParts, organisations, stock } from '~/db/schema';
import { dealerOf, type Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError, notFound } from '~/lib/server/http';
import type { DealerStockLine } from '~/lib/domain/planner/availability';
import { pricingDealerOf } from './prices';

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

/**
 * The dealer stock the planner reads for a machine's owner: its dealer's shelf and lead times,
 * by part number. Only the owner's own dealer is read (a farm's dealer, or the dealer itself),
 * never another. A dealer's own machine already counts its shelf as the owner's shelf, so the
 * quantities come back as zero there (only the lead times stay).
 */
export async function dealerStockFor(orgId: string, db?: Db): Promise<Record<string, DealerStockLine>> {
  const d = db ?? (await getDb());
  const dealerId = await pricingDealerOf(orgId, d);
  if (!dealerId) return {};
  const rows = await d
    .select({ partNumber: stock.partNumber, quantity: stock.quantity, leadDays: stock.leadDays })
    .from(stock)
    .where(eq(stock.orgId, dealerId));
  const own = dealerId === orgId;
  return Object.fromEntries(
    rows.map((r) => [r.partNumber, { quantity: own ? 0 : Math.max(0, r.quantity), leadDays: r.leadDays }] as const),
  );
}

/** The largest lead time a dealer may give: a year. */
export const MAX_LEAD_DAYS = 365;

export const setDealerStockSchema = z
  .object({
    quantity: z.int().min(0).max(100_000),
    /** About how many days an order takes; null: not given. */
    leadDays: z.int().min(0).max(MAX_LEAD_DAYS).nullable(),
  })
  .strict();
export type SetDealerStock = z.infer<typeof setDealerStockSchema>;

function ownDealer(actor: Actor): string {
  const dealerId = dealerOf(actor);
  if (!dealerId) throw new HttpError(403, 'Dealer stock belongs to dealers: only a dealer’s staff keep one.');
  return dealerId;
}

export interface DealerStockItem {
  partNumber: string;
  name: string;
  familyId: string;
  active: boolean;
  quantity: number;
  leadDays: number | null;
}

/** The actor's dealer's stock: every catalog part with its shelf quantity and lead time. */
export async function listDealerStock(actor: Actor): Promise<DealerStockItem[]> {
  const dealerId = ownDealer(actor);
  const db = await getDb();
  const rows = await db
    .select({
      partNumber: catalogParts.partNumber,
      spec: catalogParts.spec,
      familyId: catalogParts.familyId,
      active: catalogParts.active,
      quantity: stock.quantity,
      leadDays: stock.leadDays,
    })
    .from(catalogParts)
    .leftJoin(stock, and(eq(stock.partNumber, catalogParts.partNumber), eq(stock.orgId, dealerId)))
    .orderBy(asc(catalogParts.familyId), asc(catalogParts.partNumber));
  return rows.map((r) => ({
    partNumber: r.partNumber,
    name: r.spec.name,
    familyId: r.familyId,
    active: r.active,
    quantity: r.quantity ?? 0,
    leadDays: r.leadDays ?? null,
  }));
}

/** Sets the actor's dealer's shelf quantity and lead time of one catalog part (audited). */
export async function setDealerStock(actor: Actor, partNumber: string, input: SetDealerStock) {
  const dealerId = ownDealer(actor);
  const db = await getDb();
  const [part] = await db
    .select({ pn: catalogParts.partNumber })
    .from(catalogParts)
    .where(eq(catalogParts.partNumber, partNumber))
    .limit(1);
  if (!part) throw notFound('Part not found', 'partNumber');
  await db.transaction(async (tx) => {
    await tx
      .insert(stock)
      .values({ orgId: dealerId, partNumber, quantity: input.quantity, leadDays: input.leadDays })
      .onConflictDoUpdate({ target: [stock.orgId, stock.partNumber], set: { quantity: input.quantity, leadDays: input.leadDays } });
    await audit(tx, actor, 'set-stock', 'dealer-stock', partNumber, { ...input }, dealerId);
  });
  return { partNumber, ...input };
}

const wholeNumber = (text: string, max: number): number | null => {
  const t = text.trim();
  if (!/^\d{1,7}$/.test(t)) return null;
  const n = Number(t);
  return n <= max ? n : null;
};

/**
 * Saves the stock page's table: per part number the shelf quantity and the lead time as typed
 * (lead time blank: not given). Any bad cell and nothing is saved; the errors name the parts.
 */
export async function saveStockTable(actor: Actor, entries: Record<string, { quantity: string; leadDays: string }>) {
  const dealerId = ownDealer(actor);
  const current = new Map((await listDealerStock(actor)).map((i) => [i.partNumber, i]));
  const errors: Record<string, string> = {};
  const set: { partNumber: string; quantity: number; leadDays: number | null }[] = [];
  for (const [partNumber, cell] of Object.entries(entries)) {
    const item = current.get(partNumber);
    if (!item) {
      errors[partNumber] = 'not in the catalog';
      continue;
    }
    const quantity = wholeNumber(cell.quantity, 100_000);
    const leadDays = cell.leadDays.trim() === '' ? null : wholeNumber(cell.leadDays, MAX_LEAD_DAYS);
    if (quantity === null) errors[partNumber] = 'quantity: a whole number from 0 to 100000';
    else if (leadDays === null && cell.leadDays.trim() !== '')
      errors[partNumber] = `lead time: whole days from 0 to ${MAX_LEAD_DAYS}, or blank when not known`;
    else if (quantity !== item.quantity || leadDays !== item.leadDays) set.push({ partNumber, quantity, leadDays });
  }
  if (Object.keys(errors).length) return { ok: false as const, errors };
  if (!set.length) return { ok: true as const, changed: 0 };
  const db = await getDb();
  await db.transaction(async (tx) => {
    await tx
      .insert(stock)
      .values(set.map((v) => ({ orgId: dealerId, ...v })))
      .onConflictDoUpdate({
        target: [stock.orgId, stock.partNumber],
        set: { quantity: sql`excluded.quantity`, leadDays: sql`excluded.lead_days` },
      });
    await audit(tx, actor, 'save-stock', 'dealer-stock', null, { set: set.length }, dealerId);
  });
  return { ok: true as const, changed: set.length };
}
