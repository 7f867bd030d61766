import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import { z } from 'zod';
import { getDb } from '../db';
import { layouts, layoutVersions, users } from '../../../db/schema';
import { cropIdSchema, layoutSchema, type Layout } from '../../domain/schemas';
import { starterLayout } from '../../domain/demo-catalog';
import type { Actor } from '../access';
import { audit } from '../audit';
import { HttpError, notFound } from '../http';
import { catalogForFamily, machineForActor } from './machines';

/** Who may change layouts. Trainers read them (for class) but do not change customers' plans. */
export const LAYOUT_WRITERS = ['operator', 'technician', 'admin'] as const;

export const createLayoutSchema = z.object({
  name: z.string().trim().min(1).max(120),
  /** The layout itself; without one, `crop` names the crop to start a suggested layout for. */
  body: layoutSchema.optional(),
  crop: cropIdSchema.optional(),
  note: z.string().max(500).default(''),
});

export const saveVersionSchema = z.object({
  /** The version the editor started from; a newer one on the server means a conflict (409). */
  baseVersion: z.int().min(1),
  body: layoutSchema,
  note: z.string().max(500).default(''),
});

export type LayoutRow = typeof layouts.$inferSelect;

export interface VersionView {
  id: string;
  version: number;
  body: Layout;
  note: string;
  createdAt: Date;
  createdBy: string | null;
  createdByName: string | null;
}

function assertFamily(body: Layout, familyId: string) {
  if (body.familyId !== familyId) {
    throw new HttpError(400, `body.familyId: this machine is of family ${familyId}`, 'body.familyId');
  }
}

async function layoutRowForActor(actor: Actor, layoutId: string): Promise<LayoutRow> {
  const db = await getDb();
  const [row] = await db
    .select()
    .from(layouts)
    .where(and(eq(layouts.id, layoutId), inArray(layouts.orgId, actor.visibleOrgIds)))
    .limit(1);
  if (!row) throw notFound('Layout not found', 'layoutId');
  return row;
}

const versionColumns = {
  id: layoutVersions.id,
  version: layoutVersions.version,
  body: layoutVersions.body,
  note: layoutVersions.note,
  createdAt: layoutVersions.createdAt,
  createdBy: layoutVersions.createdBy,
  createdByName: users.name,
};

export async function versionOf(layoutId: string, version: number): Promise<VersionView> {
  const db = await getDb();
  const [v] = await db
    .select(versionColumns)
    .from(layoutVersions)
    .leftJoin(users, eq(users.id, layoutVersions.createdBy))
    .where(and(eq(layoutVersions.layoutId, layoutId), eq(layoutVersions.version, version)))
    .limit(1);
  if (!v) throw notFound('Version not found', 'version');
  return v;
}

/** A layout with its current version and the machine it belongs to. */
export async function getLayout(actor: Actor, layoutId: string) {
  const row = await layoutRowForActor(actor, layoutId);
  const [ctx, current] = await Promise.all([machineForActor(actor, row.machineId), versionOf(row.id, row.currentVersion)]);
  return { layout: row, current, machine: ctx.machine, family: ctx.family, orgName: ctx.orgName };
}

export async function listVersions(actor: Actor, layoutId: string) {
  const row = await layoutRowForActor(actor, layoutId);
  const db = await getDb();
  const versions = await db
    .select({ id: layoutVersions.id, version: layoutVersions.version, note: layoutVersions.note, createdAt: layoutVersions.createdAt, createdByName: users.name })
    .from(layoutVersions)
    .leftJoin(users, eq(users.id, layoutVersions.createdBy))
    .where(eq(layoutVersions.layoutId, row.id))
    .orderBy(desc(layoutVersions.version));
  return { layout: row, versions };
}

export async function getVersion(actor: Actor, layoutId: string, version: number) {
  const row = await layoutRowForActor(actor, layoutId);
  return versionOf(row.id, version);
}

export async function listLayoutsForMachine(actor: Actor, machineId: string) {
  const ctx = await machineForActor(actor, machineId);
  const db = await getDb();
  const rows = await db
    .select()
    .from(layouts)
    .where(eq(layouts.machineId, ctx.machine.id))
    .orderBy(desc(layouts.updatedAt));
  return { machine: ctx.machine, layouts: rows };
}

export async function createLayout(actor: Actor, machineId: string, input: z.infer<typeof createLayoutSchema>) {
  const ctx = await machineForActor(actor, machineId);
  let body = input.body;
  if (!body) {
    if (!input.crop) throw new HttpError(400, 'crop: give a crop to start from, or a layout body', 'crop');
    // A suggested start for the crop, on this machine's drum and vanes.
    const catalog = await catalogForFamily(ctx.family.id);
    body = starterLayout(ctx.family, input.crop, catalog, { drum: ctx.machine.drum, vaneControl: ctx.machine.vaneControl });
  }
  assertFamily(body, ctx.machine.familyId);
  input = { ...input, body };
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(layouts)
      .values({ machineId: ctx.machine.id, orgId: ctx.machine.orgId, name: input.name, currentVersion: 1, createdBy: actor.id })
      .returning();
    const [v] = await tx
      .insert(layoutVersions)
      .values({ layoutId: row!.id, version: 1, body, note: input.note, createdBy: actor.id })
      .returning();
    await audit(tx, actor, 'create', 'layout', row!.id, { name: input.name, version: 1 }, ctx.machine.orgId);
    return { layout: row!, version: v! };
  });
}

/**
 * Writes a new immutable version. The conditional update on current_version is the guard: of
 * two saves from the same base, exactly one moves the counter; the other gets a 409 carrying
 * the newer version, and nothing of either is lost.
 */
export async function saveVersion(actor: Actor, layoutId: string, input: z.infer<typeof saveVersionSchema>) {
  const row = await layoutRowForActor(actor, layoutId);
  assertFamily(input.body, (await machineForActor(actor, row.machineId)).machine.familyId);
  const db = await getDb();
  const next = input.baseVersion + 1;
  const result = await db.transaction(async (tx) => {
    const moved = await tx
      .update(layouts)
      .set({ currentVersion: next, updatedAt: sql`now()` })
      .where(and(eq(layouts.id, row.id), eq(layouts.currentVersion, input.baseVersion)))
      .returning({ id: layouts.id });
    if (moved.length === 0) return null;
    const [v] = await tx
      .insert(layoutVersions)
      .values({ layoutId: row.id, version: next, body: input.body, note: input.note, createdBy: actor.id })
      .returning();
    await audit(tx, actor, 'save', 'layout', row.id, { version: next, from: input.baseVersion }, row.orgId);
    return v!;
  });
  if (!result) {
    const [fresh] = await db.select().from(layouts).where(eq(layouts.id, row.id)).limit(1);
    const newer = await versionOf(row.id, fresh!.currentVersion);
    throw new HttpError(409, `This layout was saved by someone else since version ${input.baseVersion}.`, 'baseVersion', {
      currentVersion: fresh!.currentVersion,
      current: newer,
    });
  }
  return result;
}
