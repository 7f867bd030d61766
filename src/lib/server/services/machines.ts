import { and, asc, count, desc, eq, ilike, inArray, or, sql, type AnyColumn, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import { getDb, store, storeWriteGeneration, type Db } from '~/lib/server/db';
import { catalogParts, families, installed, machines, organisations } from '~/db/schema';
import { drumIdSchema, slugSchema, vaneControlSchema, type CatalogPart, type MachineFamily } from '~/lib/domain/schemas';
import type { Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { catalogSnapshot } from '~/lib/server/catalog-cache';
import { HttpError, notFound } from '~/lib/server/http';
import { priceCatalogFor } from './prices';

export type MachineRow = typeof machines.$inferSelect;

export interface MachineContext {
  machine: MachineRow;
  family: MachineFamily;
  orgName: string;
}

/** A machine the actor may see, with its family; another organisation's machine is not found. */
export async function machineForActor(actor: Actor, machineId: string, db?: Db): Promise<MachineContext> {
  const d = db ?? (await getDb());
  const [row] = await d
    .select({ machine: machines, family: families.spec, orgName: organisations.name })
    .from(machines)
    .innerJoin(families, eq(families.id, machines.familyId))
    .innerJoin(organisations, eq(organisations.id, machines.orgId))
    .where(and(eq(machines.id, machineId), inArray(machines.orgId, actor.visibleOrgIds)))
    .limit(1);
  if (!row) throw notFound('Machine not found', 'machineId');
  return row;
}

/**
 * The active catalog parts that fit a family: from the kept catalog (catalog-cache.ts), or read
 * through `db` when a caller passes its transaction. With `priceFor` (an organisation id) each
 * part carries the price of the dealer serving that organisation (services/prices.ts); without
 * it, the catalog's list price.
 */
export async function catalogForFamily(familyId: string, db?: Db, priceFor?: string): Promise<CatalogPart[]> {
  if (!db) {
    const kept = [...((await catalogSnapshot()).partsByFamily.get(familyId) ?? [])];
    return priceFor ? priceCatalogFor(kept, priceFor, await getDb()) : kept;
  }
  const d = db;
  const rows = await d
    .select({ spec: catalogParts.spec })
    .from(catalogParts)
    .where(and(eq(catalogParts.familyId, familyId), eq(catalogParts.active, true)));
  const catalog = rows.map((r) => r.spec);
  return priceFor ? priceCatalogFor(catalog, priceFor, d) : catalog;
}

export async function familyById(familyId: string, db?: Db): Promise<MachineFamily | null> {
  const d = db ?? (await getDb());
  const [row] = await d.select({ spec: families.spec }).from(families).where(eq(families.id, familyId)).limit(1);
  return row?.spec ?? null;
}

export async function installedLayout(machineId: string, db?: Db) {
  const d = db ?? (await getDb());
  const [row] = await d.select().from(installed).where(eq(installed.machineId, machineId)).limit(1);
  return row ?? null;
}

// ---------------------------------------------------------------------------------------------
// Fleet: list, create, update and delete machines

const text = (max: number) => z.string().trim().max(max);

export const MACHINE_SORTS = ['nickname', 'serial', 'family', 'org', 'updatedAt', 'createdAt'] as const;

export const machineListQuerySchema = z.object({
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
  /** A column, descending with a leading '-': 'nickname', '-updatedAt'. */
  sort: z
    .string()
    .regex(new RegExp(`^-?(${MACHINE_SORTS.join('|')})$`), `use one of ${MACHINE_SORTS.join(', ')}, with a leading - for descending`)
    .default('-updatedAt'),
  q: z.string().trim().max(100).default(''),
  orgId: z.uuid().optional(),
  familyId: z.string().max(60).optional(),
  /**
   * Keyset paging (the `next` cursor of the page before `page`, or the `prev` cursor of the page
   * after it): the page is read from the index starting at that row instead of counting past
   * every earlier row. Used when the list is sorted by a machine's own column without a text
   * query; otherwise `page` alone decides.
   */
  after: z.string().max(400).optional(),
  before: z.string().max(400).optional(),
});
export type MachineListQuery = z.infer<typeof machineListQuerySchema>;

/** Where a keyset page starts: the sort it belongs to, the sort column's value (as the store spells it) and the row's id. */
interface ListCursor {
  sort: string;
  value: string;
  id: string;
}

const cursorShape = z.tuple([z.string().max(40), z.string().max(200), z.uuid()]);

export function encodeListCursor(c: ListCursor): string {
  return Buffer.from(JSON.stringify([c.sort, c.value, c.id])).toString('base64url');
}

/** A cursor from this list and this sort, or a 400 naming the parameter. */
export function decodeListCursor(text: string, sort: string, field: 'after' | 'before'): ListCursor {
  let tuple: unknown;
  try {
    tuple = JSON.parse(Buffer.from(text, 'base64url').toString('utf8'));
  } catch {
    tuple = null;
  }
  const parsed = cursorShape.safeParse(tuple);
  if (!parsed.success)
    throw new HttpError(400, `${field}: not a cursor of the machines list (use the next or prev cursor of a page)`, field);
  const [cursorSort, value, id] = parsed.data;
  if (cursorSort !== sort) throw new HttpError(400, `${field}: the cursor belongs to the list sorted by ${cursorSort}, not ${sort}`, field);
  return { sort: cursorSort, value, id };
}

export const createMachineSchema = z.object({
  /** The organisation that owns it; defaults to the user's own farm. */
  orgId: z.uuid().optional(),
  familyId: z.string({ error: 'choose the machine family' }).pipe(slugSchema),
  drum: drumIdSchema,
  vaneControl: vaneControlSchema,
  serial: z.string({ error: 'give the serial number' }).trim().min(1, { error: 'give the serial number' }).max(40),
  nickname: z.string({ error: 'give the machine a name' }).trim().min(1, { error: 'give the machine a name' }).max(60),
  notes: text(2000).default(''),
});

export const updateMachineSchema = z
  .object({
    familyId: z.never({ error: 'a machine keeps its family; add a new machine instead' }).optional(),
    orgId: z.never({ error: 'a machine stays with its organisation' }).optional(),
    drum: drumIdSchema.optional(),
    vaneControl: vaneControlSchema.optional(),
    serial: text(40).min(1, { error: 'give the serial number' }).optional(),
    nickname: text(60).min(1, { error: 'give the machine a name' }).optional(),
    notes: text(2000).optional(),
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), {
    error: 'give at least one of drum, vaneControl, serial, nickname or notes to change',
    path: ['nickname'],
  });

/** How a sort column's value is read back from a cursor (its text as the store wrote it). */
const sortCasts: Record<keyof typeof sortColumns, string> = {
  nickname: 'text',
  serial: 'text',
  family: 'text',
  org: 'text',
  updatedAt: 'timestamptz',
  createdAt: 'timestamptz',
};

const sortColumns = {
  nickname: machines.nickname,
  serial: machines.serial,
  family: families.name,
  org: organisations.name,
  updatedAt: machines.updatedAt,
  createdAt: machines.createdAt,
} as const;

/** A machine's own columns in a list row (the family's and farm's names are joined to them). */
const ownColumns = {
  id: machines.id,
  nickname: machines.nickname,
  serial: machines.serial,
  drum: machines.drum,
  vaneControl: machines.vaneControl,
  notes: machines.notes,
  familyId: machines.familyId,
  orgId: machines.orgId,
  createdAt: machines.createdAt,
  updatedAt: machines.updatedAt,
};

const listColumns = {
  id: machines.id,
  nickname: machines.nickname,
  serial: machines.serial,
  drum: machines.drum,
  vaneControl: machines.vaneControl,
  notes: machines.notes,
  familyId: machines.familyId,
  familyName: families.name,
  orgId: machines.orgId,
  orgName: organisations.name,
  createdAt: machines.createdAt,
  updatedAt: machines.updatedAt,
};

/** A row of the machines list as the store gives it. */
type MachineListItemRow = { [K in keyof typeof listColumns]: (typeof listColumns)[K]['_']['data'] };

/** A row of the machines list: times as ISO 8601 text in UTC, to the millisecond (as JSON gives a Date). */
export type MachineListItem = Omit<MachineListItemRow, 'createdAt' | 'updatedAt'> & { createdAt: string; updatedAt: string };

/** A time column as JSON would write the Date it holds: 2026-12-02T12:26:02.337Z. */
const isoTime = (column: SQL | AnyColumn) => sql`to_char(${column} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`;

/** The character that joins name, serial and notes in `search_text` (see the 0013 migration). */
const SEARCH_SEPARATOR = '\u001f';

/** A text query as the list matches it: the separator is an ordinary space, ends trimmed ('' for none). */
const searchTerm = (q: string) => q.replaceAll(SEARCH_SEPARATOR, ' ').trim();

/**
 * One page of the machines the actor may see, filtered by a free-text query, sorted by a column.
 *
 * Two plans, each reading as little as it can (EXPLAIN figures on a store of 2,000 machines
 * seen by one dealer are in docs/store-and-serving.md):
 * - sorted by a machine's own column without a text query: the page is read in order from an
 *   index (machines_updated_idx, machines_nickname_idx, or the per-organisation ones when one
 *   organisation is seen) and stops after the page; only the page's rows are joined to their
 *   family and farm names; the total is one count on machines alone (kept while nothing is written, keptCount below);
 * - with a text query, or sorted by the family's or farm's name: every matching machine has to
 *   be seen anyway, so one statement reads them once and counts them in the same pass
 *   (count(*) over ()); the query matches one stored lower-case value per machine
 *   (`search_text`) and the family and farm names through their small tables, not a join per
 *   row. Sorted by a machine's own column, the matches are read from machines alone and only the
 *   page's rows are joined to their names (as without a query); sorted by a name, the join comes
 *   first. Only a page past the end needs a second statement for the total.
 */
export async function listMachines(actor: Actor, query: MachineListQuery) {
  const db = await getDb();
  const desc_ = query.sort.startsWith('-');
  const key = query.sort.replace(/^-/, '') as keyof typeof sortColumns;
  const column = sortColumns[key];
  // Every sort column is NOT NULL. Ties go by id, the same way as the column: a descending list
  // is the ascending one read backwards, from the same index (see the indexes in schema/fleet.ts).
  const order = listOrder(desc_, column, machines.id);
  const conditions = [inArray(machines.orgId, actor.visibleOrgIds)];
  if (query.orgId) conditions.push(eq(machines.orgId, query.orgId));
  if (query.familyId) conditions.push(eq(machines.familyId, query.familyId));
  const q = searchTerm(query.q);
  if (q) {
    const like = `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    conditions.push(
      or(
        sql`search_text like lower(${like})`,
        inArray(machines.familyId, db.select({ id: families.id }).from(families).where(ilike(families.name, like))),
        inArray(machines.orgId, db.select({ id: organisations.id }).from(organisations).where(ilike(organisations.name, like))),
      )!,
    );
  }
  const where = and(...conditions);
  const offset = (query.page - 1) * query.pageSize;
  const answer = (items: MachineListItem[], total: number, cursors: { next: string | null; prev: string | null } = NO_CURSORS) => ({
    items,
    total,
    page: query.page,
    pageSize: query.pageSize,
    sort: query.sort,
    q: query.q,
    ...cursors,
  });
  if (query.after !== undefined && query.before !== undefined)
    throw new HttpError(400, 'before: give after (the next page) or before (the page before), not both', 'before');
  const cursor =
    query.after !== undefined
      ? { ...decodeListCursor(query.after, query.sort, 'after'), forward: true }
      : query.before !== undefined
        ? { ...decodeListCursor(query.before, query.sort, 'before'), forward: false }
        : null;
  const countAll = async () => (await db.select({ n: count() }).from(machines).where(where))[0]?.n ?? 0;

  if (key === 'family' || key === 'org') {
    const rows = await db
      .select({ ...listColumns, total: sql<number>`count(*) over ()`.mapWith(Number) })
      .from(machines)
      .innerJoin(families, eq(families.id, machines.familyId))
      .innerJoin(organisations, eq(organisations.id, machines.orgId))
      .where(where)
      .orderBy(...order)
      .limit(query.pageSize)
      .offset(offset);
    const total = rows[0]?.total ?? (offset > 0 ? await countAll() : 0);
    return answer(
      rows.map(({ total: _, createdAt, updatedAt, ...row }) => ({
        ...row,
        createdAt: createdAt.toISOString(),
        updatedAt: updatedAt.toISOString(),
      })),
      total,
    );
  }

  // Sorted by a machine's own column: the page's machines from machines alone, then their family
  // and farm names (page rows only), as one JSON array built by the store (one value to read
  // instead of a dozen per machine, which costs more than the page's query).
  // - Without a text query the page is read in order from the index; with a cursor the index is
  //   entered at the cursor's row (read backwards for the page before) and no earlier row is read;
  //   the list's order is (column, id), both the same way. The total is kept (keptCount).
  // - With a text query every match is read anyway: the page is counted in the same pass
  //   (count(*) over ()) and the page number decides (no cursors).
  const searching = q !== '';
  let keyset: SQL | undefined;
  let pageOrder = order;
  if (cursor && !searching) {
    const value = sql`cast(${cursor.value} as ${sql.raw(sortCasts[key])})`;
    // (column, id) after the cursor's row in the list's order: larger when ascending, smaller when
    // descending; the page before reads the other way and is turned round below.
    const op = desc_ === cursor.forward ? sql`<` : sql`>`;
    keyset = sql`(${column}, ${machines.id}) ${op} (${value}, cast(${cursor.id} as uuid))`;
    if (!cursor.forward) pageOrder = listOrder(!desc_, column, machines.id);
  }
  const page = db
    .select({
      ...ownColumns,
      cursorValue: sql<string>`${column}::text`.as('cursor_value'),
      matches: (searching ? sql<number>`count(*) over ()` : sql<number>`0`).as('matches'),
    })
    .from(machines)
    .where(keyset ? and(where, keyset) : where)
    .orderBy(...pageOrder)
    .limit(query.pageSize)
    .offset(keyset ? 0 : offset)
    .as('page');
  const pageColumn = page[key as keyof typeof ownColumns];
  const [{ items, matches }] = await db
    .select({
      items: sql<(MachineListItem & { cursorValue: string })[] | null>`json_agg(json_build_object(
        'id', ${page.id}, 'nickname', ${page.nickname}, 'serial', ${page.serial}, 'drum', ${page.drum},
        'vaneControl', ${page.vaneControl}, 'notes', ${page.notes}, 'familyId', ${page.familyId},
        'familyName', ${families.name}, 'orgId', ${page.orgId}, 'orgName', ${organisations.name},
        'createdAt', ${isoTime(page.createdAt)}, 'updatedAt', ${isoTime(page.updatedAt)},
        'cursorValue', ${page.cursorValue})
        order by ${sql.join(listOrder(desc_, pageColumn, page.id), sql`, `)})`,
      matches: sql<number | null>`max(${page.matches})`.mapWith(Number),
    })
    .from(page)
    .innerJoin(families, eq(families.id, page.familyId))
    .innerJoin(organisations, eq(organisations.id, page.orgId));
  const rows = (items ?? []).map(({ cursorValue: _, ...row }) => row);
  if (searching) return answer(rows, rows.length > 0 ? (matches ?? 0) : offset > 0 ? await countAll() : 0);
  const first = items?.[0];
  const last = items?.[items.length - 1];
  const cursorOf = (r: typeof first) => (r ? encodeListCursor({ sort: query.sort, value: r.cursorValue, id: r.id }) : null);
  return answer(rows, await keptCount([[...actor.visibleOrgIds].sort(), query.orgId, query.familyId], countAll), {
    next: cursorOf(last),
    prev: cursorOf(first),
  });
}

/**
 * The machines a layout may be copied to: the actor's other machines of one family, by name,
 * at most `limit`, with how many there are. With a text query it is the machines list's search
 * (the same matching); without one, a statement on machines and their farms alone (the three
 * columns the copy form shows), read in name order from the index and stopping after the page,
 * and the total counted on machines alone (kept while nothing is written).
 */
export async function copyTargets(
  actor: Actor,
  { familyId, exclude, q, limit }: { familyId: string; exclude: string; q: string; limit: number },
) {
  if (searchTerm(q)) {
    const found = await listMachines(actor, { page: 1, pageSize: limit + 1, sort: 'nickname', q, familyId });
    const items = found.items.filter((m) => m.id !== exclude).slice(0, limit);
    const total = found.total - (found.items.some((m) => m.id === exclude) ? 1 : 0);
    return { items: items.map(({ id, nickname, serial, orgName }) => ({ id, nickname, serial, orgName })), total };
  }
  const db = await getDb();
  const where = and(inArray(machines.orgId, actor.visibleOrgIds), eq(machines.familyId, familyId), sql`${machines.id} <> ${exclude}`);
  const items = await db
    .select({ id: machines.id, nickname: machines.nickname, serial: machines.serial, orgName: organisations.name })
    .from(machines)
    .innerJoin(organisations, eq(organisations.id, machines.orgId))
    .where(where)
    .orderBy(asc(machines.nickname), asc(machines.id))
    .limit(limit);
  const total =
    items.length < limit
      ? items.length
      : await keptCount(
          ['copy-targets', [...actor.visibleOrgIds].sort(), familyId, exclude],
          async () => (await db.select({ n: count() }).from(machines).where(where))[0]?.n ?? 0,
        );
  return { items, total };
}

const NO_CURSORS = { next: null, prev: null };

/** The list's order: the sort column, then the id, both ascending or both descending. */
const listOrder = (descending: boolean, column: SQL | AnyColumn, id: SQL | AnyColumn) =>
  descending ? [desc(column), desc(id)] : [asc(column), asc(id)];

/**
 * Totals of the list without a text query, kept with the embedded store only and used only while
 * the store has not been written since they were counted (the rule of `layoutWithCurrent`'s
 * kept reads: `storeWriteGeneration` moves with every write statement and transaction). Paging
 * through the fleet then counts it once; the page itself is always read. With a PostgreSQL
 * server other processes write too, and every total is counted.
 */
const KEPT_COUNTS_CAP = 256;
const keptCounts = new Map<string, { db: Db; generation: number; n: number }>();

async function keptCount(key: unknown[], countNow: () => Promise<number>): Promise<number> {
  const s = await store();
  if (s.mode !== 'pglite') return countNow();
  const k = JSON.stringify(key);
  const kept = keptCounts.get(k);
  if (kept && kept.db === s.db && kept.generation === storeWriteGeneration()) return kept.n;
  const generation = storeWriteGeneration();
  const n = await countNow();
  if (generation === storeWriteGeneration()) {
    keptCounts.delete(k);
    if (keptCounts.size >= KEPT_COUNTS_CAP) keptCounts.delete(keptCounts.keys().next().value!);
    keptCounts.set(k, { db: s.db, generation, n });
  }
  return n;
}

function assertMachineFitsFamily(family: MachineFamily, drum: string, vaneControl: string) {
  if (!family.drumOptions.some((d) => d.id === drum))
    throw new HttpError(400, `drum: the ${family.name} comes with ${family.drumOptions.map((d) => d.id).join(' or ')}`, 'drum');
  if (!family.vaneControls.includes(vaneControl as MachineFamily['vaneControls'][number]))
    throw new HttpError(400, `vaneControl: the ${family.name} has ${family.vaneControls.join(' or ')} vanes`, 'vaneControl');
}

/** The organisation a new machine belongs to: one the actor may see; by default their own. */
function ownerOrgFor(actor: Actor, orgId: string | undefined): string {
  const wanted = orgId ?? actor.homeOrgId;
  if (!actor.visibleOrgIds.includes(wanted)) throw notFound('Organisation not found', 'orgId');
  return wanted;
}

export async function createMachine(actor: Actor, input: z.infer<typeof createMachineSchema>) {
  const orgId = ownerOrgFor(actor, input.orgId);
  const family = await familyById(input.familyId);
  if (!family) throw new HttpError(400, `familyId: no machine family "${input.familyId}"`, 'familyId');
  assertMachineFitsFamily(family, input.drum, input.vaneControl);
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(machines)
      .values({
        orgId,
        familyId: family.id,
        drum: input.drum,
        vaneControl: input.vaneControl,
        serial: input.serial,
        nickname: input.nickname,
        notes: input.notes,
      })
      .returning();
    await audit(tx, actor, 'create', 'machine', row!.id, { nickname: row!.nickname, serial: row!.serial, familyId: family.id }, orgId);
    return row!;
  });
}

export async function updateMachine(actor: Actor, machineId: string, input: z.infer<typeof updateMachineSchema>) {
  const ctx = await machineForActor(actor, machineId);
  const drum = input.drum ?? ctx.machine.drum;
  const vaneControl = input.vaneControl ?? ctx.machine.vaneControl;
  assertMachineFitsFamily(ctx.family, drum, vaneControl);
  const changes = Object.fromEntries(
    Object.entries({
      drum: input.drum,
      vaneControl: input.vaneControl,
      serial: input.serial,
      nickname: input.nickname,
      notes: input.notes,
    }).filter(([, v]) => v !== undefined),
  );
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(machines)
      .set({ ...changes, updatedAt: sql`now()` })
      .where(eq(machines.id, ctx.machine.id))
      .returning();
    await audit(tx, actor, 'update', 'machine', row!.id, changes, row!.orgId);
    return row!;
  });
}

/** Removes a machine with its layouts, versions, share links and inspections (the audit log stays). */
export async function deleteMachine(actor: Actor, machineId: string) {
  const ctx = await machineForActor(actor, machineId);
  const db = await getDb();
  await db.transaction(async (tx) => {
    await tx.delete(machines).where(eq(machines.id, ctx.machine.id));
    await audit(
      tx,
      actor,
      'delete',
      'machine',
      ctx.machine.id,
      { nickname: ctx.machine.nickname, serial: ctx.machine.serial },
      ctx.machine.orgId,
    );
  });
  return { deleted: ctx.machine.id };
}

/** The families a new machine may be of, with their drum and vane options (for the form). */
export async function familyChoices() {
  const db = await getDb();
  const rows = await db.select({ id: families.id, name: families.name, spec: families.spec }).from(families).orderBy(families.name);
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    cageKind: r.spec.cageKind,
    positions: r.spec.positions.length,
    drumOptions: r.spec.drumOptions.map((d) => ({ id: d.id, label: d.label })),
    vaneControls: r.spec.vaneControls,
  }));
}
