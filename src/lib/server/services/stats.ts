import { count, inArray, sql, type SQL } from 'drizzle-orm';
import { getDb } from '~/lib/server/db';
import * as t from '~/db/schema';
import { dealerOf, isInstanceAdmin, type Actor } from '~/lib/server/access';

const TABLES = {
  organisations: t.organisations,
  users: t.users,
  memberships: t.memberships,
  families: t.families,
  catalogParts: t.catalogParts,
  dealerPrices: t.dealerPrices,
  stock: t.stock,
  machines: t.machines,
  installed: t.installed,
  layouts: t.layouts,
  layoutVersions: t.layoutVersions,
  shareLinks: t.shareLinks,
  inspections: t.inspections,
  inspectionItems: t.inspectionItems,
  photos: t.photos,
  partsRequests: t.partsRequests,
  decks: t.decks,
  deckSlides: t.deckSlides,
  lossChecks: t.lossChecks,
  startingValues: t.startingValues,
  machineHours: t.machineHours,
  partRecords: t.partRecords,
  wearMeasurements: t.wearMeasurements,
  auditLog: t.auditLog,
  // Shop work: job cards.
  jobCards: t.jobCards,
  jobSteps: t.jobSteps,
  jobParts: t.jobParts,
  flatRates: t.flatRates,
} as const;

type Counts = Record<keyof typeof TABLES, number>;

/**
 * Which rows of each table concern a dealer: its own and its customer farms' (the actor's
 * visible organisations). The machine families and the catalog are shared by every dealer.
 */
function scopeOf(visible: string[], dealerId: string | null): Record<keyof typeof TABLES, SQL | undefined> {
  const ids = sql.join(
    visible.map((id) => sql`${id}::uuid`),
    sql`, `,
  );
  const inVisible = (col: SQL) => sql`${col} in (${ids})`;
  return {
    organisations: inArray(t.organisations.id, visible),
    users: sql`exists (select 1 from ${t.memberships} m where m.user_id = ${t.users.id} and ${inVisible(sql`m.org_id`)})`,
    memberships: inArray(t.memberships.orgId, visible),
    families: undefined,
    catalogParts: undefined,
    dealerPrices: inArray(t.dealerPrices.dealerId, visible),
    stock: inArray(t.stock.orgId, visible),
    machines: inArray(t.machines.orgId, visible),
    installed: sql`exists (select 1 from ${t.machines} m where m.id = ${t.installed.machineId} and ${inVisible(sql`m.org_id`)})`,
    layouts: inArray(t.layouts.orgId, visible),
    layoutVersions: sql`exists (select 1 from ${t.layouts} l where l.id = ${t.layoutVersions.layoutId} and ${inVisible(sql`l.org_id`)})`,
    shareLinks: inArray(t.shareLinks.orgId, visible),
    inspections: inArray(t.inspections.orgId, visible),
    inspectionItems: sql`exists (select 1 from ${t.inspections} i where i.id = ${t.inspectionItems.inspectionId} and ${inVisible(sql`i.org_id`)})`,
    photos: inArray(t.photos.orgId, visible),
    partsRequests: dealerId
      ? sql`(${inVisible(sql`${t.partsRequests.orgId}`)} or ${t.partsRequests.dealerOrgId} = ${dealerId}::uuid)`
      : inArray(t.partsRequests.orgId, visible),
    decks: inArray(t.decks.orgId, visible),
    deckSlides: sql`exists (select 1 from ${t.decks} d where d.id = ${t.deckSlides.deckId} and ${inVisible(sql`d.org_id`)})`,
    lossChecks: inArray(t.lossChecks.orgId, visible),
    startingValues: inArray(t.startingValues.dealerId, visible),
    machineHours: inArray(t.machineHours.orgId, visible),
    partRecords: inArray(t.partRecords.orgId, visible),
    wearMeasurements: inArray(t.wearMeasurements.orgId, visible),
    auditLog: inArray(t.auditLog.orgId, visible),
    jobCards: inArray(t.jobCards.orgId, visible),
    jobSteps: sql`exists (select 1 from ${t.jobCards} j where j.id = ${t.jobSteps.jobId} and ${inVisible(sql`j.org_id`)})`,
    jobParts: sql`exists (select 1 from ${t.jobCards} j where j.id = ${t.jobParts.jobId} and ${inVisible(sql`j.org_id`)})`,
    flatRates: inArray(t.flatRates.dealerId, visible),
  };
}

/**
 * Row counts of every table: the administrators' overview, and how tests prove nothing was
 * written. The instance administrator (and the server itself, with no actor) counts every row;
 * a dealer administrator counts only what concerns their dealer and its customer farms.
 */
export async function tableCounts(actor?: Actor): Promise<Counts> {
  const db = await getDb();
  const scoped = actor && !isInstanceAdmin(actor);
  const scope = scoped
    ? scopeOf(actor.visibleOrgIds.length ? actor.visibleOrgIds : ['00000000-0000-0000-0000-000000000000'], dealerOf(actor))
    : null;
  const entries = await Promise.all(
    Object.entries(TABLES).map(async ([name, table]) => {
      const where = scope?.[name as keyof typeof TABLES];
      const [row] = await db.select({ n: count() }).from(table).where(where);
      return [name, row?.n ?? 0] as const;
    }),
  );
  return Object.fromEntries(entries) as Counts;
}

/**
 * A digest of every table's contents (row count and an order-free sum of each row's hash): equal
 * digests mean no row was added, removed or changed, which row counts alone cannot tell (a
 * half-applied update keeps the count). The instance administrator's, for tests and checks.
 */
export async function tableDigests(): Promise<Record<keyof typeof TABLES, string>> {
  const db = await getDb();
  const entries = await Promise.all(
    Object.entries(TABLES).map(async ([name, table]) => {
      const result = await db.execute(
        sql`select count(*)::text || ':' || coalesce(sum(hashtextextended(x::text, 0)), 0)::text as digest from ${table} x`,
      );
      return [name, String((result.rows[0] as { digest: string }).digest)] as const;
    }),
  );
  return Object.fromEntries(entries) as Record<keyof typeof TABLES, string>;
}
