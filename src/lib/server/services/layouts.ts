import { and, count, desc, eq, inArray, lt, sql } from 'drizzle-orm';
import { z } from 'zod';
import { getDb, store, storeWriteGeneration, type Db } from '~/lib/server/db';
import { families, layouts, layoutVersions, machines, organisations, users } from '~/db/schema';
import { cropIdSchema, layoutSchema, type Layout } from '~/lib/domain/schemas';
import { starterLayout } from '~/lib/domain/starter';
import { checkLayout } from '~/lib/domain/rules';
import { diffLayouts } from '~/lib/domain/diff';
import type { Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError, notFound, whenNotFound } from '~/lib/server/http';
import { catalogSnapshot } from '~/lib/server/catalog-cache';
import { catalogForFamily, machineForActor, type MachineRow } from './machines';
import type { VersionView } from '~/lib/responses';

/** The join of a layout to its current version. */
const isCurrentVersion = and(eq(layoutVersions.layoutId, layouts.id), eq(layoutVersions.version, layouts.currentVersion));

/** The layout, when the actor may see it and its machine (another organisation's is not found). */
const layoutVisibleTo = (actor: Actor, layoutId: string) =>
  and(eq(layouts.id, layoutId), inArray(layouts.orgId, actor.visibleOrgIds), inArray(machines.orgId, actor.visibleOrgIds));

export const createLayoutSchema = z.object({
  name: z.string().trim().min(1).max(120),
  /** The layout itself; without one, `crop` names the crop to start a suggested layout for. */
  body: layoutSchema.optional(),
  crop: cropIdSchema.optional(),
  note: z.string().max(500).default(''),
});

export const saveVersionSchema = z.object({
  /** The version the editor started from; a newer one on the server means a conflict (409). */
  baseVersion: z.int32().min(1),
  body: layoutSchema,
  note: z.string().max(500).default(''),
});

export type LayoutRow = typeof layouts.$inferSelect;

export type { VersionView };

function assertFamily(body: Layout, familyId: string) {
  if (body.familyId !== familyId) {
    throw new HttpError(400, `body.familyId: this machine is of family ${familyId}`, 'body.familyId');
  }
}

/** The layout if the actor may see it, with its machine's family (one query). */
async function layoutRowForActor(actor: Actor, layoutId: string): Promise<LayoutRow & { familyId: string }> {
  const db = await getDb();
  const [found] = await db
    .select({ layout: layouts, familyId: machines.familyId })
    .from(layouts)
    .innerJoin(machines, eq(machines.id, layouts.machineId))
    .where(and(eq(layouts.id, layoutId), inArray(layouts.orgId, actor.visibleOrgIds)))
    .limit(1);
  if (!found) throw notFound('Layout not found', 'layoutId');
  return { ...found.layout, familyId: found.familyId };
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

/**
 * What the API's GET of a layout answers: the layout, its current version and the machine's
 * name. One prepared query without the family document: this is the busiest read of the app;
 * with the embedded store a layout read again before anything is written comes from memory
 * (`keptLayouts` below), checked against the actor's organisations like the query.
 */
export async function layoutWithCurrent(actor: Actor, layoutId: string): Promise<LayoutWithCurrent> {
  const s = await store();
  const kept = s.mode === 'pglite' ? keptLayouts.get(layoutId) : undefined;
  if (kept && kept.db === s.db && kept.generation === storeWriteGeneration()) {
    // The same rule as the query's: the layout's organisation is one the actor sees.
    if (!actor.visibleOrgIds.includes(kept.row.layout.orgId)) throw notFound('Layout not found', 'layoutId');
    return kept.row;
  }
  const generation = storeWriteGeneration();
  const [row] = await layoutWithCurrentQuery(s.db).execute({ layoutId, orgIds: actor.visibleOrgIds });
  if (!row) throw notFound('Layout not found', 'layoutId');
  if (s.mode === 'pglite' && generation === storeWriteGeneration()) {
    if (keptLayouts.size >= KEPT_LAYOUTS_CAP) keptLayouts.delete(keptLayouts.keys().next().value!);
    keptLayouts.set(layoutId, { db: s.db, generation, row: deepFreeze(row) });
  }
  return row;
}

/**
 * The GET's query, built once per store (drizzle's prepared query: on a PostgreSQL server a named
 * statement each connection plans once; on the embedded store it saves rebuilding the SQL).
 */
function buildLayoutWithCurrent(db: Db) {
  return db
    .select({
      layout: layouts,
      machine: { id: machines.id, nickname: machines.nickname, familyId: machines.familyId },
      current: versionColumns,
    })
    .from(layouts)
    .innerJoin(machines, eq(machines.id, layouts.machineId))
    .innerJoin(layoutVersions, isCurrentVersion)
    .leftJoin(users, eq(users.id, layoutVersions.createdBy))
    .where(and(eq(layouts.id, sql.placeholder('layoutId')), sql`${layouts.orgId} = any(${sql.placeholder('orgIds')}::uuid[])`))
    .limit(1)
    .prepare('cw_layout_with_current');
}
export type LayoutWithCurrent = Awaited<ReturnType<ReturnType<typeof buildLayoutWithCurrent>['execute']>>[number];
const preparedLayoutReads = new WeakMap<Db, ReturnType<typeof buildLayoutWithCurrent>>();
function layoutWithCurrentQuery(db: Db) {
  let q = preparedLayoutReads.get(db);
  if (!q) preparedLayoutReads.set(db, (q = buildLayoutWithCurrent(db)));
  return q;
}

/**
 * Layouts read lately, kept with the embedded store only (one owner: every write passes through
 * this process) and used only while the store has not been written since they were read
 * (`storeWriteGeneration`, moved by every write statement and transaction). Reading a layout
 * that nobody changes in between, the busiest request, then needs no query.
 */
const KEPT_LAYOUTS_CAP = 256;
const keptLayouts = new Map<string, { db: Db; generation: number; row: LayoutWithCurrent }>();

function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object' && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const v of Object.values(value)) deepFreeze(v);
  }
  return value;
}

/** A layout with its current version and the machine it belongs to, in one query (a hot path). */
export async function getLayout(actor: Actor, layoutId: string) {
  const db = await getDb();
  const [row] = await db
    .select(layoutReadColumns)
    .from(layouts)
    .innerJoin(machines, eq(machines.id, layouts.machineId))
    .innerJoin(families, eq(families.id, machines.familyId))
    .innerJoin(organisations, eq(organisations.id, machines.orgId))
    .innerJoin(layoutVersions, isCurrentVersion)
    .leftJoin(users, eq(users.id, layoutVersions.createdBy))
    .where(layoutVisibleTo(actor, layoutId))
    .limit(1);
  if (!row) throw notFound('Layout not found', 'layoutId');
  return row;
}

const layoutReadColumns = {
  layout: layouts,
  machine: machines,
  family: families.spec,
  orgName: organisations.name,
  current: versionColumns,
};

/**
 * ?page=1&pageSize=50 or ?before=<version>&pageSize=50 on the versions list: newest first.
 * `before` is a keyset cursor (the versions older than that one); `page` counts pages from the
 * newest. Both read through the (layout_id, version) index, never past rows they skip.
 */
export const versionListQuerySchema = z.object({
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
  before: z.coerce.number().int().min(1).max(2_147_483_647).optional(),
});
export type VersionListQuery = z.infer<typeof versionListQuerySchema>;

/** How many versions the history page shows at a time. */
export const HISTORY_PAGE_SIZE = 50;

export interface VersionPage {
  versions: { id: string; version: number; note: string; createdAt: Date; createdByName: string | null }[];
  /** Cursor for the next (older) page, null on the last one. */
  olderBefore: number | null;
  /** Cursor for the previous (newer) page; undefined on the first page, null when that is the first page. */
  newerBefore: number | null | undefined;
}

/**
 * One page of a layout's versions, newest first, older than `before` (the newest when absent).
 * Versions are 1, 2, … up to the current one: every save and restore adds the next number
 * (guarded by the version it started from) and none is ever removed, so the cursors are plain
 * arithmetic and no count is needed.
 */
async function versionPage(layoutId: string, currentVersion: number, before: number | undefined, pageSize: number): Promise<VersionPage> {
  const db = await getDb();
  const top = Math.min(before ?? currentVersion + 1, currentVersion + 1);
  const versions = await db
    .select({
      id: layoutVersions.id,
      version: layoutVersions.version,
      note: layoutVersions.note,
      createdAt: layoutVersions.createdAt,
      createdByName: users.name,
    })
    .from(layoutVersions)
    .leftJoin(users, eq(users.id, layoutVersions.createdBy))
    .where(and(eq(layoutVersions.layoutId, layoutId), lt(layoutVersions.version, top)))
    .orderBy(desc(layoutVersions.version))
    .limit(pageSize);
  return pageAround(versions, currentVersion, top, pageSize);
}

/** The cursors of a page of versions read below `top` (see versionPage). */
function pageAround(versions: VersionPage['versions'], currentVersion: number, top: number, pageSize: number): VersionPage {
  const last = versions[versions.length - 1]?.version;
  const newerTop = top + pageSize;
  return {
    versions,
    olderBefore: last !== undefined && last > 1 ? last : null,
    newerBefore: top > currentVersion ? undefined : newerTop > currentVersion ? null : newerTop,
  };
}

/**
 * A layout's versions a page at a time, newest first, with the total (the API). The layout comes
 * as the editor's GET reads it (`layoutWithCurrent`: from memory with the embedded store while
 * nothing was written, a statement planned once per connection on a PostgreSQL server), then one
 * small statement reads the page backwards through the (layout_id, version) index.
 */
export async function listVersions(actor: Actor, layoutId: string, paging: VersionListQuery) {
  const head = await layoutWithCurrent(actor, layoutId);
  const current = head.layout.currentVersion;
  const before = paging.before ?? Math.max(1, current + 1 - (paging.page - 1) * paging.pageSize);
  const { versions } = await versionPage(layoutId, current, before, paging.pageSize);
  const last = versions[versions.length - 1]?.version;
  return {
    layout: { ...head.layout, familyId: head.machine.familyId },
    versions,
    total: current,
    page: paging.before === undefined ? paging.page : undefined,
    pageSize: paging.pageSize,
    /** Pass as ?before= for the next (older) page; null on the last page. */
    nextBefore: last !== undefined && last > 1 ? last : null,
  };
}

const layoutPageParams = z.object({ id: z.uuid(), layoutId: z.uuid() });

/**
 * For the pages under /machines/:id/layouts/:layoutId: the layout (as getLayout gives it)
 * when both ids are well formed and it is a layout of that machine the actor may see; null
 * otherwise, and the page answers 404.
 */
export async function layoutOnMachine(actor: Actor, params: Record<string, string | undefined>) {
  const ids = layoutPageParams.safeParse(params);
  if (!ids.success) return null;
  try {
    const l = await getLayout(actor, ids.data.layoutId);
    return l.machine.id === ids.data.id ? l : null;
  } catch (e) {
    if (e instanceof HttpError && e.status === 404) return null;
    throw e;
  }
}

/**
 * For the history page: the layout of that machine with its current version (as the editor's GET
 * reads it, see `listVersions`), its family from the kept catalog, and one page of its versions
 * (HISTORY_PAGE_SIZE, newest first, older than `before`); null when not found or not that
 * machine's. Small statements each planned quickly, instead of one join of six tables whose
 * planning alone cost more than reading it.
 */
export async function layoutOnMachineWithVersions(actor: Actor, params: Record<string, string | undefined>, before?: number) {
  const ids = layoutPageParams.safeParse(params);
  if (!ids.success) return null;
  try {
    const head = await layoutWithCurrent(actor, ids.data.layoutId);
    if (head.machine.id !== ids.data.id) return null;
    const family = (await catalogSnapshot()).familyById.get(head.machine.familyId);
    if (!family) return null;
    const page = await versionPage(head.layout.id, head.layout.currentVersion, before, HISTORY_PAGE_SIZE);
    return { ...head, family, page };
  } catch (e) {
    if (e instanceof HttpError && e.status === 404) return null;
    throw e;
  }
}

/** A `?before=` value from a page's URL: a whole number ≥ 1, or undefined. */
export function beforeParam(value: string | null): number | undefined {
  if (value === null || !/^\d{1,10}$/.test(value)) return undefined;
  const n = Number(value);
  return n >= 1 && n <= 2_147_483_647 ? n : undefined;
}

export async function getVersion(actor: Actor, layoutId: string, version: number) {
  const row = await layoutRowForActor(actor, layoutId);
  return versionOf(row.id, version);
}

/** ?page=1&pageSize=50 on a machine's layouts: most recently changed first. */
export const layoutListQuerySchema = z.object({
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});

/**
 * One page of a machine's layouts, most recently changed first, with the total. One statement
 * when the page has rows: the machine (only if the actor sees it) joined to its layouts, counted
 * in the same pass; an empty page reads the machine (or its 404) and the count apart.
 */
export async function listLayoutsForMachine(
  actor: Actor,
  machineId: string,
  paging: z.infer<typeof layoutListQuerySchema> = { page: 1, pageSize: 50 },
) {
  const db = await getDb();
  const answer = (machine: MachineRow, rows: LayoutRow[], total: number) => ({
    machine,
    layouts: rows,
    total,
    page: paging.page,
    pageSize: paging.pageSize,
  });
  const rows = await db
    .select({ machine: machines, layout: layouts, total: sql<number>`count(*) over ()`.mapWith(Number) })
    .from(machines)
    .innerJoin(layouts, eq(layouts.machineId, machines.id))
    .where(and(eq(machines.id, machineId), inArray(machines.orgId, actor.visibleOrgIds)))
    .orderBy(desc(layouts.updatedAt), desc(layouts.id))
    .limit(paging.pageSize)
    .offset((paging.page - 1) * paging.pageSize);
  if (rows[0]) {
    return answer(
      rows[0].machine,
      rows.map((r) => r.layout),
      rows[0].total,
    );
  }
  const ctx = await machineForActor(actor, machineId);
  const [counted] = await db.select({ n: count() }).from(layouts).where(eq(layouts.machineId, ctx.machine.id));
  return answer(ctx.machine, [], counted?.n ?? 0);
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
  const first: Layout = body;
  const note = input.note || (input.body ? '' : `Started from the suggested ${input.crop} layout`);
  assertFamily(first, ctx.machine.familyId);
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(layouts)
      .values({ machineId: ctx.machine.id, orgId: ctx.machine.orgId, name: input.name, currentVersion: 1, createdBy: actor.id })
      .returning();
    const [v] = await tx
      .insert(layoutVersions)
      .values({ layoutId: row!.id, version: 1, body: first, note, createdBy: actor.id })
      .returning();
    await audit(tx, actor, 'create', 'layout', row!.id, { name: input.name, version: 1 }, ctx.machine.orgId);
    return { layout: row!, version: v! };
  });
}

/**
 * Writes a new immutable version. The conditional update on current_version is the guard: of
 * two saves from the same base, exactly one moves the counter; the other gets a 409 carrying
 * the newer version, and nothing of either is lost.
 *
 * A save that succeeds is one statement: the update only moves a layout the actor may see, on a
 * machine of the body's family, at `baseVersion`. Only when it writes nothing is the layout read
 * to say why: 404 (not one the actor sees), 400 (another family), else 409.
 */
export async function saveVersion(actor: Actor, layoutId: string, input: z.infer<typeof saveVersionSchema>) {
  const saved = await appendVersion(actor, { layoutId, familyId: input.body.familyId }, input, 'save', {});
  if (saved) return saved;
  const row = await layoutRowForActor(actor, layoutId);
  assertFamily(input.body, row.familyId);
  throw await staleBase(row.id, input.baseVersion);
}

/** The 409 for a save or restore from a version that is no longer the current one, carrying the newer version. */
async function staleBase(layoutId: string, baseVersion: number): Promise<HttpError> {
  const db = await getDb();
  const [fresh] = await db.select().from(layouts).where(eq(layouts.id, layoutId)).limit(1);
  if (!fresh) return notFound('Layout not found', 'layoutId');
  const newer = await versionOf(layoutId, fresh.currentVersion);
  return new HttpError(409, `This layout was saved by someone else since version ${baseVersion}.`, 'baseVersion', {
    currentVersion: fresh.currentVersion,
    current: newer,
  });
}

/**
 * The guarded write shared by a save and a restore; `action` and `detail` go to the audit log.
 * One statement: moving the layout's current version (only from `baseVersion`, only on a layout
 * of an organisation the actor sees and, when `familyId` is given, on a machine of that family),
 * the new version and its audit row are written together or not at all, in one round trip to
 * the store instead of five (BEGIN, three writes, COMMIT). The audit row is the one `audit()`
 * writes. The answer carries the body as given (the store keeps the same document); null when
 * the guard wrote nothing.
 */
async function appendVersion(
  actor: Actor,
  target: { layoutId: string; familyId?: string },
  input: z.infer<typeof saveVersionSchema>,
  action: string,
  detail: Record<string, unknown>,
) {
  const db = await getDb();
  const next = input.baseVersion + 1;
  const auditDetail = { version: next, from: input.baseVersion, ...detail };
  const orgIds = sql.join(
    actor.visibleOrgIds.map((id) => sql`${id}`),
    sql`, `,
  );
  const sameFamily = target.familyId
    ? sql`and exists (select 1 from machines m where m.id = layouts.machine_id and m.family_id = ${target.familyId})`
    : sql``;
  const written = await db.execute(sql`
    with moved as (
      update layouts set current_version = ${next}, updated_at = now()
      where id = ${target.layoutId} and current_version = ${input.baseVersion}
        and org_id = any(array[${orgIds}]::uuid[]) ${sameFamily}
      returning id, org_id
    ), added as (
      insert into layout_versions (layout_id, version, body, note, created_by)
      select id, ${next}, ${JSON.stringify(input.body)}::jsonb, ${input.note}, ${actor.id}::uuid from moved
      returning id, layout_id, version, note, created_by, created_at
    ), audited as (
      insert into audit_log (user_id, org_id, action, entity, entity_id, detail)
      select ${actor.id}::uuid, org_id, ${action}, 'layout', id::text, ${JSON.stringify(auditDetail)}::jsonb from moved
    )
    select id, layout_id, version, note, created_by, created_at from added`);
  const [v] = written.rows as {
    id: string;
    layout_id: string;
    version: number;
    note: string;
    created_by: string | null;
    created_at: string | Date;
  }[];
  if (!v) return null;
  return {
    id: v.id,
    layoutId: v.layout_id,
    version: Number(v.version),
    body: input.body,
    note: v.note,
    createdBy: v.created_by,
    createdAt: new Date(v.created_at),
  };
}

// ---------------------------------------------------------------------------------------------
// History: restore, copy, compare

export const restoreSchema = z.object({
  /** The old version whose content becomes the newest version. */
  version: z.int32().min(1),
  /** Optional guard: the version the page showed as current (409 if someone saved since). */
  baseVersion: z.int32().min(1).optional(),
  note: z.string().max(500).optional(),
});

/**
 * Restores an old version by writing its content as a new version on top; history is never
 * rewritten, so the versions in between stay and the restore can itself be undone.
 */
export async function restoreVersion(actor: Actor, layoutId: string, input: z.infer<typeof restoreSchema>) {
  const row = await layoutRowForActor(actor, layoutId);
  const old = await versionOf(row.id, input.version).catch(
    whenNotFound(() => new HttpError(400, `version: this layout has no version ${input.version}`, 'version')),
  );
  if (input.version === row.currentVersion) {
    throw new HttpError(400, `version: version ${input.version} is already the current one`, 'version');
  }
  const baseVersion = input.baseVersion ?? row.currentVersion;
  const restored = await appendVersion(
    actor,
    { layoutId: row.id },
    { baseVersion, body: old.body, note: input.note?.trim() || `Restored from version ${input.version}` },
    'restore',
    { restoredFrom: input.version },
  );
  if (!restored) throw await staleBase(row.id, baseVersion);
  return restored;
}

export const copySchema = z.object({
  /** The machine to copy to; it must be of the same family. */
  machineId: z.uuid(),
  /** Which version to copy; the current one by default. */
  version: z.int32().min(1).optional(),
  name: z.string().trim().min(1).max(120).optional(),
  note: z.string().max(500).optional(),
});

/**
 * Copies a layout version to another machine of the same family as a new layout there. The
 * copy takes the target machine's drum and vane control (the plan follows the machine it is
 * on), and is checked again by the rules; the findings come back with it.
 */
export async function copyLayout(actor: Actor, layoutId: string, input: z.infer<typeof copySchema>) {
  const row = await layoutRowForActor(actor, layoutId);
  const source = await versionOf(row.id, input.version ?? row.currentVersion).catch(
    whenNotFound(() => new HttpError(400, `version: this layout has no version ${input.version}`, 'version')),
  );
  const target = await machineForActor(actor, input.machineId).catch(whenNotFound(() => notFound('Machine not found', 'machineId')));
  if (target.machine.familyId !== source.body.familyId) {
    throw new HttpError(
      400,
      `machineId: ${target.machine.nickname} is a ${target.family.name}; a layout copies only to a machine of the same family`,
      'machineId',
    );
  }
  const adjusted: string[] = [];
  const body: Layout = { ...source.body };
  if (body.drum !== target.machine.drum) {
    body.drum = target.machine.drum;
    adjusted.push('drum');
  }
  if (body.vaneControl !== target.machine.vaneControl) {
    body.vaneControl = target.machine.vaneControl;
    adjusted.push('vaneControl');
  }
  const catalog = await catalogForFamily(target.family.id);
  const findings = checkLayout(target.family, catalog, body);
  const name = input.name ?? row.name;
  const note = input.note?.trim() || `Copied from “${row.name}” version ${source.version}`;
  const db = await getDb();
  const created = await db.transaction(async (tx) => {
    const [l] = await tx
      .insert(layouts)
      .values({ machineId: target.machine.id, orgId: target.machine.orgId, name, currentVersion: 1, createdBy: actor.id })
      .returning();
    const [v] = await tx.insert(layoutVersions).values({ layoutId: l!.id, version: 1, body, note, createdBy: actor.id }).returning();
    await audit(
      tx,
      actor,
      'copy',
      'layout',
      l!.id,
      { fromLayout: row.id, fromVersion: source.version, toMachine: target.machine.id, adjusted },
      target.machine.orgId,
    );
    return { layout: l!, version: v! };
  });
  return { ...created, findings, adjusted, machine: { id: target.machine.id, nickname: target.machine.nickname } };
}

/** Two versions of one layout with their differences and each one's findings. */
export async function compareVersions(actor: Actor, layoutId: string, a: number, b: number) {
  const row = await layoutRowForActor(actor, layoutId);
  const [va, vb, ctx] = await Promise.all([
    versionOf(row.id, a).catch(whenNotFound(() => notFound(`This layout has no version ${a}`, 'a'))),
    versionOf(row.id, b).catch(whenNotFound(() => notFound(`This layout has no version ${b}`, 'b'))),
    machineForActor(actor, row.machineId),
  ]);
  const catalog = await catalogForFamily(ctx.family.id, undefined, ctx.machine.orgId);
  return {
    layout: row,
    machine: ctx.machine,
    family: ctx.family,
    a: { ...va, findings: checkLayout(ctx.family, catalog, va.body) },
    b: { ...vb, findings: checkLayout(ctx.family, catalog, vb.body) },
    diff: diffLayouts(va.body, vb.body),
    catalog,
  };
}
