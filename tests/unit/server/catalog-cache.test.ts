// The catalog kept in memory (src/lib/server/catalog-cache.ts) against a real embedded store:
// read once, reused while nothing changes, read again after any write to the catalog tables,
// including writes that bypass the services (the migration's triggers count them).
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const dir = mkdtempSync(join(tmpdir(), 'cagewright-catalog-cache-'));
process.env.CAGEWRIGHT_DATA_DIR = dir;
process.env.CAGEWRIGHT_SEED = 'off';

const { store, getDb } = await import('~/lib/server/db');
const { catalogSnapshot, catalogLoads } = await import('~/lib/server/catalog-cache');
const { catalogForFamily } = await import('~/lib/server/services/machines');
const { catalogParts, families } = await import('~/db/schema');
const { demoCatalog, demoFamilies } = await import('~/lib/domain/demo-catalog');

const family = demoFamilies[0]!;
const parts = demoCatalog.filter((p) => p.fitGroup === family.fitGroup).slice(0, 3);

beforeAll(async () => {
  const db = await getDb();
  await db.insert(families).values({ id: family.id, name: family.name, spec: family });
  await db.insert(catalogParts).values(parts.map((p) => ({ partNumber: p.partNumber, familyId: family.id, kind: p.kind, spec: p })));
}, 60_000);

afterAll(async () => {
  await (await store()).close();
  rmSync(dir, { recursive: true, force: true });
});

describe('the kept catalog', () => {
  it('is read from the store once and reused while the catalog is unchanged', async () => {
    const before = catalogLoads();
    const a = await catalogSnapshot();
    const b = await catalogSnapshot();
    const c = await catalogForFamily(family.id);
    expect(catalogLoads() - before).toBe(1);
    expect(b).toBe(a);
    expect(a.families.map((f) => f.id)).toEqual([family.id]);
    expect(c.map((p) => p.partNumber).sort()).toEqual(parts.map((p) => p.partNumber).sort());
  });

  it('answers concurrent callers with one read', async () => {
    const db = await getDb();
    await db
      .update(families)
      .set({ updatedAt: sql`now()` })
      .where(eq(families.id, family.id));
    const before = catalogLoads();
    const all = await Promise.all(Array.from({ length: 5 }, () => catalogSnapshot()));
    expect(catalogLoads() - before).toBe(1);
    expect(new Set(all).size).toBe(1);
  });

  it('is read again after a part is retired, and the retired part is gone', async () => {
    const db = await getDb();
    const first = await catalogSnapshot();
    await db.update(catalogParts).set({ active: false }).where(eq(catalogParts.partNumber, parts[0]!.partNumber));
    const after = await catalogSnapshot();
    expect(after).not.toBe(first);
    expect(after.revision).toBeGreaterThan(first.revision);
    expect(after.parts.map((p) => p.partNumber)).not.toContain(parts[0]!.partNumber);
    expect((await catalogForFamily(family.id)).map((p) => p.partNumber)).not.toContain(parts[0]!.partNumber);
  });

  it('sees raw SQL writes and deletes too (triggers, not the services, count changes)', async () => {
    const db = await getDb();
    const first = await catalogSnapshot();
    await db.execute(sql`update catalog_parts set spec = jsonb_set(spec, '{priceCents}', '1') where part_number = ${parts[1]!.partNumber}`);
    const second = await catalogSnapshot();
    expect(second).not.toBe(first);
    await db.delete(catalogParts).where(eq(catalogParts.partNumber, parts[2]!.partNumber));
    const third = await catalogSnapshot();
    expect(third).not.toBe(second);
    expect(third.parts.map((p) => p.partNumber)).toEqual([parts[1]!.partNumber]);
  });

  it('a copy handed to a caller cannot change the kept list', async () => {
    const list = await catalogForFamily(family.id);
    list.length = 0;
    expect((await catalogForFamily(family.id)).length).toBe(1);
  });
});
