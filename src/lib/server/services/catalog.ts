import { and, asc, eq, ilike, or, sql, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import { getDb } from '~/lib/server/db';
import { catalogParts, families, machines } from '~/db/schema';
import { catalogPartSchema, slugSchema, type CatalogPart, type MachineFamily } from '~/lib/domain/schemas';
import type { Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError, notFound } from '~/lib/server/http';

export async function listFamilies() {
  const db = await getDb();
  return db
    .select({
      id: families.id,
      name: families.name,
      spec: families.spec,
      updatedAt: families.updatedAt,
      machines: sql<number>`(select count(*)::int from ${machines} m where m.family_id = families.id)`,
      parts: sql<number>`(select count(*)::int from ${catalogParts} p where p.family_id = families.id and p.active)`,
    })
    .from(families)
    .orderBy(asc(families.name));
}

export async function getFamily(id: string) {
  const db = await getDb();
  const [row] = await db.select().from(families).where(eq(families.id, id)).limit(1);
  if (!row) throw notFound('Machine family not found', 'id');
  return row;
}

export async function createFamily(actor: Actor, spec: MachineFamily) {
  const db = await getDb();
  const [clash] = await db.select({ id: families.id }).from(families).where(eq(families.id, spec.id)).limit(1);
  if (clash) throw new HttpError(409, `id: a family with the id “${spec.id}” already exists`, 'id');
  return db.transaction(async (tx) => {
    const [row] = await tx.insert(families).values({ id: spec.id, name: spec.name, spec }).returning();
    await audit(tx, actor, 'create', 'family', spec.id, { name: spec.name });
    return row!;
  });
}

/**
 * Replaces a family's document. Refused (409, naming the field) when it would strand what
 * exists: a drum or vane control a machine of the family has, or a new fit group while parts
 * of the old one are listed under the family.
 */
export async function updateFamily(actor: Actor, id: string, spec: MachineFamily) {
  const current = await getFamily(id);
  if (spec.id !== id) throw new HttpError(400, `id: the family's id stays “${id}”`, 'id');
  const db = await getDb();
  const used = await db
    .selectDistinct({ drum: machines.drum, vaneControl: machines.vaneControl })
    .from(machines)
    .where(eq(machines.familyId, id));
  for (const u of used) {
    if (!spec.drumOptions.some((d) => d.id === u.drum))
      throw new HttpError(409, `drumOptions: machines of this family have the ${u.drum} drum; keep that option`, 'drumOptions');
    if (!spec.vaneControls.includes(u.vaneControl))
      throw new HttpError(409, `vaneControls: machines of this family have ${u.vaneControl} vanes; keep that control`, 'vaneControls');
  }
  if (spec.fitGroup !== current.spec.fitGroup) {
    const [p] = await db
      .select({ n: sql<number>`count(*)::int` })
      .from(catalogParts)
      .where(eq(catalogParts.familyId, id));
    if ((p?.n ?? 0) > 0)
      throw new HttpError(409, `fitGroup: ${p!.n} parts are listed under fit group “${current.spec.fitGroup}”`, 'fitGroup');
  }
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(families)
      .set({ name: spec.name, spec, updatedAt: sql`now()` })
      .where(eq(families.id, id))
      .returning();
    await audit(tx, actor, 'update', 'family', id, { name: spec.name });
    return row!;
  });
}

// ---------------------------------------------------------------------------------------------
// Parts

export const partKinds = ['element', 'cover-plate', 'rotor-bar'] as const;

export const partListQuerySchema = z.object({
  familyId: slugSchema.optional(),
  kind: z.enum(partKinds).optional(),
  q: z.string().trim().max(100).default(''),
  /** 'all' lists retired parts too. */
  status: z.enum(['active', 'retired', 'all']).default('active'),
});

export const partInputSchema = z.object({
  familyId: slugSchema,
  active: z.boolean().default(true),
  part: catalogPartSchema,
});
export type PartInput = z.infer<typeof partInputSchema>;

export interface PartRow {
  partNumber: string;
  familyId: string;
  kind: CatalogPart['kind'];
  spec: CatalogPart;
  active: boolean;
  updatedAt: Date;
}

export async function listParts(query: z.infer<typeof partListQuerySchema>): Promise<PartRow[]> {
  const db = await getDb();
  const where: SQL[] = [];
  if (query.familyId) where.push(eq(catalogParts.familyId, query.familyId));
  if (query.kind) where.push(eq(catalogParts.kind, query.kind));
  if (query.status !== 'all') where.push(eq(catalogParts.active, query.status === 'active'));
  if (query.q) {
    const like = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    where.push(or(ilike(catalogParts.partNumber, like), sql`${catalogParts.spec} ->> 'name' ilike ${like}`)!);
  }
  return db
    .select()
    .from(catalogParts)
    .where(where.length ? and(...where) : undefined)
    .orderBy(asc(catalogParts.familyId), asc(catalogParts.partNumber));
}

export async function getPart(partNumber: string): Promise<PartRow> {
  const db = await getDb();
  const [row] = await db.select().from(catalogParts).where(eq(catalogParts.partNumber, partNumber)).limit(1);
  if (!row) throw notFound('Part not found', 'partNumber');
  return row;
}

async function familyForPart(input: PartInput) {
  const db = await getDb();
  const [fam] = await db.select().from(families).where(eq(families.id, input.familyId)).limit(1);
  if (!fam) throw new HttpError(400, `familyId: no machine family “${input.familyId}”`, 'familyId');
  if (input.part.fitGroup !== fam.spec.fitGroup)
    throw new HttpError(400, `part.fitGroup: parts of the ${fam.name} belong to fit group “${fam.spec.fitGroup}”`, 'part.fitGroup');
  if (input.part.kind === 'element' && fam.spec.cageKind === 'modular' && input.part.role !== 'either')
    throw new HttpError(400, `part.role: the ${fam.name} has a modular cage; its elements fit any position (role “either”)`, 'part.role');
  return fam;
}

export async function createPart(actor: Actor, input: PartInput) {
  await familyForPart(input);
  const db = await getDb();
  const [clash] = await db
    .select({ p: catalogParts.partNumber })
    .from(catalogParts)
    .where(eq(catalogParts.partNumber, input.part.partNumber))
    .limit(1);
  if (clash) throw new HttpError(409, `part.partNumber: ${input.part.partNumber} is already in the catalog`, 'part.partNumber');
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(catalogParts)
      .values({
        partNumber: input.part.partNumber,
        familyId: input.familyId,
        kind: input.part.kind,
        spec: input.part,
        active: input.active,
      })
      .returning();
    await audit(tx, actor, 'create', 'part', row!.partNumber, { familyId: input.familyId, kind: input.part.kind });
    return row!;
  });
}

export async function updatePart(actor: Actor, partNumber: string, input: PartInput) {
  const current = await getPart(partNumber);
  if (input.part.partNumber !== partNumber)
    throw new HttpError(400, `part.partNumber: a part keeps its number (${partNumber}); add a new part instead`, 'part.partNumber');
  if (input.part.kind !== current.kind)
    throw new HttpError(400, `part.kind: a ${current.kind} stays a ${current.kind}; add a new part instead`, 'part.kind');
  await familyForPart(input);
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(catalogParts)
      .set({ familyId: input.familyId, spec: input.part, active: input.active, updatedAt: sql`now()` })
      .where(eq(catalogParts.partNumber, partNumber))
      .returning();
    await audit(tx, actor, 'update', 'part', partNumber, { familyId: input.familyId, active: input.active });
    return row!;
  });
}

/**
 * Retires a part: saved layouts and stock still name it, so it stays in the table, marked
 * inactive; the editor's palette and new checks no longer offer it.
 */
export async function retirePart(actor: Actor, partNumber: string) {
  const current = await getPart(partNumber);
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(catalogParts)
      .set({ active: false, updatedAt: sql`now()` })
      .where(eq(catalogParts.partNumber, current.partNumber))
      .returning();
    await audit(tx, actor, 'retire', 'part', partNumber, {});
    return row!;
  });
}
