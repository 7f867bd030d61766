import { count } from 'drizzle-orm';
import { getDb } from '../db';
import * as t from '../../../db/schema';

const TABLES = {
  organisations: t.organisations,
  users: t.users,
  memberships: t.memberships,
  families: t.families,
  catalogParts: t.catalogParts,
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
  auditLog: t.auditLog,
} as const;

/** Row counts of every table: the admin's overview, and how tests prove nothing was written. */
export async function tableCounts(): Promise<Record<keyof typeof TABLES, number>> {
  const db = await getDb();
  const entries = await Promise.all(
    Object.entries(TABLES).map(async ([name, table]) => {
      const [row] = await db.select({ n: count() }).from(table);
      return [name, row?.n ?? 0] as const;
    }),
  );
  return Object.fromEntries(entries) as Record<keyof typeof TABLES, number>;
}
