import { eq } from 'drizzle-orm';
import { catalogParts, catalogRevision, families } from '~/db/schema';
import type { CatalogPart, MachineFamily } from '~/lib/domain/schemas';
import { getDb } from './db';

/**
 * The catalog (every family and every active part) kept in memory between requests. Triggers
 * count each change to the catalog tables in `catalog_revision` (see the migration), so each use
 * costs one single-row read; a changed revision loads the catalog again. The revision is read
 * before the catalog, so a change that lands in between only makes the next call load again.
 */
export interface CatalogSnapshot {
  revision: number;
  families: MachineFamily[];
  familyById: Map<string, MachineFamily>;
  /** Active parts. */
  parts: CatalogPart[];
  partsByFamily: Map<string, CatalogPart[]>;
}

let kept: CatalogSnapshot | null = null;
let loading: Promise<CatalogSnapshot> | null = null;
let loadingRevision = -1;
let loads = 0;

async function currentRevision(): Promise<number> {
  const db = await getDb();
  const [row] = await db.select({ revision: catalogRevision.revision }).from(catalogRevision).where(eq(catalogRevision.id, 1)).limit(1);
  // A store without the row (should not happen after the migration) never keeps anything.
  return row ? Number(row.revision) : -1;
}

async function load(revision: number): Promise<CatalogSnapshot> {
  const db = await getDb();
  const [familyRows, partRows] = await Promise.all([
    db.select({ spec: families.spec }).from(families),
    db.select({ familyId: catalogParts.familyId, spec: catalogParts.spec }).from(catalogParts).where(eq(catalogParts.active, true)),
  ]);
  loads++;
  const partsByFamily = new Map<string, CatalogPart[]>();
  for (const r of partRows) {
    const list = partsByFamily.get(r.familyId) ?? [];
    list.push(r.spec);
    partsByFamily.set(r.familyId, list);
  }
  const familySpecs = familyRows.map((r) => r.spec);
  return {
    revision,
    families: familySpecs,
    familyById: new Map(familySpecs.map((f) => [f.id, f])),
    parts: partRows.map((r) => r.spec),
    partsByFamily,
  };
}

/** The current catalog; callers must not change what it returns. */
export async function catalogSnapshot(): Promise<CatalogSnapshot> {
  const revision = await currentRevision();
  if (revision >= 0 && kept?.revision === revision) return kept;
  if (loading && loadingRevision === revision) return loading;
  const p = load(revision);
  loading = p;
  loadingRevision = revision;
  try {
    const snap = await p;
    if (revision >= 0) kept = snap;
    return snap;
  } finally {
    if (loading === p) loading = null;
  }
}

/** How many times the catalog was read from the store (for tests and benchmarks). */
export function catalogLoads(): number {
  return loads;
}
