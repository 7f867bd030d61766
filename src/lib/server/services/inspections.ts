import { and, asc, count, desc, eq, inArray, sql } from 'drizzle-orm';
import { z } from 'zod';
import { getDb, type Db } from '~/lib/server/db';
import {
  auditLog,
  families,
  inspectionItems,
  inspections,
  machineHours,
  machines,
  organisations,
  partsRequests,
  photos,
  users,
  wearMeasurements,
} from '~/db/schema';
import type { HoursReading } from '~/lib/domain/machine-hours';
import {
  buildChecklist,
  checklistKind,
  conditionIdSchema,
  conditionsFor,
  countSeverities,
  inspectionSeveritySchema,
  measurementAllowed,
  replacementLines,
  suggestSeverity,
  surveyFromMeasurements,
  type ChecklistKind,
  type ConditionId,
  type ReplacementLine,
} from '~/lib/domain/inspection';
import type { MachineFamily } from '~/lib/domain/schemas';
import type { Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError, notFound } from '~/lib/server/http';
import { catalogForFamily, installedLayout, machineForActor } from './machines';
import { currencyFor } from './prices';
import { addLinesToDraftRequest } from './parts-requests';
import { lastHours, recordHours } from './machine-hours';
import { recordWearMeasurements } from './part-history';

export type InspectionRow = typeof inspections.$inferSelect;
export type InspectionItemRow = typeof inspectionItems.$inferSelect;

// ---------------------------------------------------------------------------------------------
// Input formats

/** Text a person types; the database cannot keep a NUL character, so it is refused up front. */
const typed = (max: number) =>
  z
    .string()
    .max(max)
    .refine((t) => !t.includes('\u0000'), { error: 'contains a character that cannot be stored' });

export const startInspectionSchema = z.object({
  title: typed(120)
    .transform((t) => t.trim())
    .optional(),
});

const measurementValue = z.number().min(0).max(1000).nullable();

export const itemUpdateSchema = z.object({
  id: z.uuid(),
  conditions: z.array(conditionIdSchema).max(10).optional(),
  severity: inspectionSeveritySchema.optional(),
  /** Millimetres; null removes a reading. */
  measurements: z.record(z.string().max(40), measurementValue).optional(),
  note: typed(2000).optional(),
});
export type ItemUpdate = z.infer<typeof itemUpdateSchema>;

export const updateInspectionSchema = z
  .object({
    title: typed(120)
      .transform((t) => t.trim())
      .optional(),
    items: z.array(itemUpdateSchema).max(200).default([]),
  })
  .superRefine((v, ctx) => {
    const seen = new Set<string>();
    v.items.forEach((it, i) => {
      if (seen.has(it.id)) ctx.addIssue({ code: 'custom', path: ['items', i, 'id'], message: 'the same line twice in one update' });
      seen.add(it.id);
    });
  });

export const listInspectionsQuerySchema = z.object({
  machineId: z.uuid().optional(),
  status: z.enum(['open', 'finished']).optional(),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});

// ---------------------------------------------------------------------------------------------
// Lists

const severityCount = (s: 'watch' | 'replace') =>
  sql<number>`(select count(*)::int from ${inspectionItems} where ${inspectionItems.inspectionId} = ${inspections.id} and ${inspectionItems.severity} = ${s})`;

const listColumns = {
  id: inspections.id,
  title: inspections.title,
  status: inspections.status,
  startedAt: inspections.startedAt,
  finishedAt: inspections.finishedAt,
  startedByName: users.name,
  machineId: machines.id,
  machineNickname: machines.nickname,
  machineSerial: machines.serial,
  orgName: organisations.name,
  watch: severityCount('watch'),
  replace: severityCount('replace'),
  photoCount: sql<number>`(select count(*)::int from ${photos} join ${inspectionItems} on ${inspectionItems.id} = ${photos.itemId} where ${inspectionItems.inspectionId} = ${inspections.id})`,
};

/** Inspections of the machines the actor may see, newest first. */
export async function listInspections(actor: Actor, query: z.infer<typeof listInspectionsQuerySchema>) {
  const db = await getDb();
  const where = [inArray(inspections.orgId, actor.visibleOrgIds)];
  if (query.machineId) where.push(eq(inspections.machineId, query.machineId));
  if (query.status) where.push(eq(inspections.status, query.status));
  const [rows, [{ n }]] = await Promise.all([
    db
      .select(listColumns)
      .from(inspections)
      .innerJoin(machines, eq(machines.id, inspections.machineId))
      .innerJoin(organisations, eq(organisations.id, inspections.orgId))
      .leftJoin(users, eq(users.id, inspections.startedBy))
      .where(and(...where))
      .orderBy(desc(inspections.startedAt), asc(inspections.id))
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize),
    db
      .select({ n: count() })
      .from(inspections)
      .where(and(...where)) as Promise<{ n: number }[]>,
  ]);
  return { items: rows, total: n, page: query.page, pageSize: query.pageSize };
}

/** One machine's inspection history (another organisation's machine is not found). */
export async function listInspectionsForMachine(actor: Actor, machineId: string, page = 1, pageSize = 50) {
  const ctx = await machineForActor(actor, machineId);
  const list = await listInspections(actor, { machineId: ctx.machine.id, page, pageSize });
  return {
    machine: {
      id: ctx.machine.id,
      nickname: ctx.machine.nickname,
      serial: ctx.machine.serial,
      familyName: ctx.family.name,
      orgName: ctx.orgName,
    },
    ...list,
  };
}

// ---------------------------------------------------------------------------------------------
// Start

export async function startInspection(actor: Actor, machineId: string, input: z.infer<typeof startInspectionSchema>, dbArg?: Db) {
  const ctx = await machineForActor(actor, machineId, dbArg);
  const current = await installedLayout(ctx.machine.id, dbArg);
  if (!current)
    throw new HttpError(
      409,
      'Nothing is recorded as installed on this machine yet, so there is no checklist to build. Record what is installed first.',
      'machineId',
    );
  const catalog = await catalogForFamily(ctx.family.id, dbArg, ctx.machine.orgId);
  const lines = buildChecklist(ctx.family, current.layout, catalog);
  const db = dbArg ?? (await getDb());
  const title = input.title || 'Pre-season inspection';
  const id = await db.transaction(async (tx) => {
    const [row] = await tx
      .insert(inspections)
      .values({ machineId: ctx.machine.id, orgId: ctx.machine.orgId, title, startedBy: actor.id })
      .returning({ id: inspections.id });
    await tx.insert(inspectionItems).values(
      lines.map((l, i) => ({
        inspectionId: row!.id,
        placeKey: l.placeKey,
        partNumber: l.partNumber,
        label: l.label,
        measurements: l.measurements,
        position: i,
      })),
    );
    await audit(tx, actor, 'start', 'inspection', row!.id, { machineId: ctx.machine.id, title, lines: lines.length }, ctx.machine.orgId);
    return row!.id;
  });
  return getInspection(actor, id, dbArg);
}

// ---------------------------------------------------------------------------------------------
// Read

async function inspectionRowForActor(actor: Actor, id: string, db: Db) {
  const [row] = await db
    .select()
    .from(inspections)
    .where(and(eq(inspections.id, id), inArray(inspections.orgId, actor.visibleOrgIds)))
    .limit(1);
  if (!row) throw notFound('Inspection not found', 'id');
  return row;
}

export interface PhotoRef {
  id: string;
  url: string;
  thumbUrl: string;
  contentType: string;
  bytes: number;
  createdAt: Date;
}

export const photoUrl = (id: string, thumb = false) => `/api/photos/${id}${thumb ? '?thumb=1' : ''}`;

/** The whole inspection: machine, lines with their photos and suggestions, survey, counts. */
export async function getInspection(actor: Actor, id: string, dbArg?: Db) {
  const db = dbArg ?? (await getDb());
  const row = await inspectionRowForActor(actor, id, db);
  const ctx = await machineForActor(actor, row.machineId, db);
  const [items, photoRows, starter, request] = await Promise.all([
    db.select().from(inspectionItems).where(eq(inspectionItems.inspectionId, row.id)).orderBy(asc(inspectionItems.position)),
    db
      .select({ id: photos.id, itemId: photos.itemId, contentType: photos.contentType, bytes: photos.bytes, createdAt: photos.createdAt })
      .from(photos)
      .innerJoin(inspectionItems, eq(inspectionItems.id, photos.itemId))
      .where(eq(inspectionItems.inspectionId, row.id))
      .orderBy(asc(photos.createdAt), asc(photos.id)),
    row.startedBy ? db.select({ name: users.name }).from(users).where(eq(users.id, row.startedBy)).limit(1) : Promise.resolve([]),
    partsRequestOfInspection(row, db),
  ]);
  const byItem = new Map<string, PhotoRef[]>();
  for (const p of photoRows) {
    const list = byItem.get(p.itemId) ?? [];
    list.push({
      id: p.id,
      url: photoUrl(p.id),
      thumbUrl: photoUrl(p.id, true),
      contentType: p.contentType,
      bytes: p.bytes,
      createdAt: p.createdAt,
    });
    byItem.set(p.itemId, list);
  }
  const lines = items.map((it) => {
    const kind = checklistKind(it.placeKey) ?? 'element';
    return {
      id: it.id,
      placeKey: it.placeKey,
      kind,
      partNumber: it.partNumber,
      label: it.label,
      conditions: it.conditions as ConditionId[],
      severity: it.severity,
      measurements: it.measurements,
      note: it.note,
      suggested: suggestSeverity(kind, it.conditions as ConditionId[], it.measurements, ctx.family),
      photos: byItem.get(it.id) ?? [],
    };
  });
  const surveyLine = lines.find((l) => l.kind === 'survey');
  const currency = await currencyFor(ctx.machine.orgId, db);
  return {
    id: row.id,
    /** ISO 4217 code of the replacement prices (the dealer's). */
    currency,
    title: row.title,
    status: row.status,
    startedAt: row.startedAt,
    finishedAt: row.finishedAt,
    startedByName: starter[0]?.name ?? null,
    machine: {
      id: ctx.machine.id,
      nickname: ctx.machine.nickname,
      serial: ctx.machine.serial,
      familyId: ctx.family.id,
      familyName: ctx.family.name,
      orgName: ctx.orgName,
    },
    family: ctx.family,
    items: lines,
    survey: surveyLine ? surveyFromMeasurements(ctx.family, surveyLine.measurements) : null,
    counts: countSeverities(lines.filter((l) => l.kind !== 'survey')),
    photoCount: photoRows.length,
    partsRequest: request,
  };
}
export type InspectionDetail = Awaited<ReturnType<typeof getInspection>>;

/**
 * The parts request a finished inspection added its replacements to. The finish is audited with
 * the request's id, so the link is read back from that record.
 */
async function partsRequestOfInspection(row: InspectionRow, db: Db) {
  if (row.status !== 'finished') return null;
  const [entry] = await db
    .select({ detail: auditLog.detail })
    .from(auditLog)
    .where(
      and(eq(auditLog.orgId, row.orgId), eq(auditLog.entity, 'inspection'), eq(auditLog.entityId, row.id), eq(auditLog.action, 'finish')),
    )
    .orderBy(desc(auditLog.at))
    .limit(1);
  const requestId = entry?.detail.partsRequestId;
  if (typeof requestId !== 'string') return null;
  const [req] = await db
    .select({ id: partsRequests.id, status: partsRequests.status, lines: partsRequests.lines, updatedAt: partsRequests.updatedAt })
    .from(partsRequests)
    .where(eq(partsRequests.id, requestId))
    .limit(1);
  return req ? { ...req, added: (entry!.detail.lines as ReplacementLine[] | undefined) ?? [] } : null;
}

// ---------------------------------------------------------------------------------------------
// Update

function assertOpen(row: InspectionRow) {
  if (row.status !== 'open') throw new HttpError(409, 'This inspection is finished; start a new one to record more.', 'status');
}

/** Checks one line's changes against what that kind of line accepts; names the field on failure. */
function checkItemUpdate(kind: ChecklistKind, family: MachineFamily, u: ItemUpdate, i: number) {
  const allowed = new Set(conditionsFor(kind).map((c) => c.id));
  u.conditions?.forEach((c, j) => {
    if (!allowed.has(c))
      throw new HttpError(400, `items.${i}.conditions.${j}: "${c}" does not apply to this line`, `items.${i}.conditions.${j}`);
  });
  for (const [key, value] of Object.entries(u.measurements ?? {})) {
    const rule = measurementAllowed(kind, family, key);
    const field = `items.${i}.measurements.${key}`;
    if (!rule) throw new HttpError(400, `${field}: this line takes no such measurement`, field);
    if (value !== null && value > rule.max) throw new HttpError(400, `${field}: at most ${rule.max} mm`, field);
    if (key === 'toleranceMm' && value !== null && value <= 0) throw new HttpError(400, `${field}: must be more than 0 mm`, field);
  }
}

export async function updateInspection(actor: Actor, id: string, input: z.infer<typeof updateInspectionSchema>) {
  const db = await getDb();
  const row = await inspectionRowForActor(actor, id, db);
  assertOpen(row);
  const ctx = await machineForActor(actor, row.machineId, db);
  const ids = input.items.map((u) => u.id);
  const current = ids.length
    ? await db
        .select()
        .from(inspectionItems)
        .where(and(eq(inspectionItems.inspectionId, row.id), inArray(inspectionItems.id, ids)))
    : [];
  const byId = new Map(current.map((c) => [c.id, c] as const));
  input.items.forEach((u, i) => {
    const item = byId.get(u.id);
    if (!item) throw new HttpError(404, `items.${i}.id: no such line in this inspection`, `items.${i}.id`);
    checkItemUpdate(checklistKind(item.placeKey) ?? 'element', ctx.family, u, i);
  });
  await db.transaction(async (tx) => {
    // Lock the inspection so a finish cannot slip in between the check and the write.
    const [locked] = await tx.select({ status: inspections.status }).from(inspections).where(eq(inspections.id, row.id)).for('update');
    if (locked?.status !== 'open') assertOpen({ ...row, status: 'finished' });
    if (input.title !== undefined && input.title !== row.title) {
      await tx
        .update(inspections)
        .set({ title: input.title || 'Pre-season inspection' })
        .where(eq(inspections.id, row.id));
    }
    for (const u of input.items) {
      const item = byId.get(u.id)!;
      const changes: Partial<InspectionItemRow> = {};
      if (u.conditions) changes.conditions = [...new Set(u.conditions)];
      if (u.severity) changes.severity = u.severity;
      if (u.note !== undefined) changes.note = u.note;
      if (u.measurements) {
        const m = { ...item.measurements };
        for (const [k, v] of Object.entries(u.measurements)) {
          if (v === null) delete m[k];
          else m[k] = Math.round(v * 100) / 100;
        }
        changes.measurements = m;
      }
      if (Object.keys(changes).length) await tx.update(inspectionItems).set(changes).where(eq(inspectionItems.id, item.id));
    }
    await audit(
      tx,
      actor,
      'update',
      'inspection',
      row.id,
      {
        title: input.title,
        items: input.items.map((u) => ({ id: u.id, placeKey: byId.get(u.id)!.placeKey, severity: u.severity, conditions: u.conditions })),
      },
      row.orgId,
    );
  });
  return getInspection(actor, row.id, db);
}

// ---------------------------------------------------------------------------------------------
// Finish: flagged lines become replacement lines on a draft parts request

/** The survey line says "serviceable" while its readings find an uneven clearance. */
export function surveyVerdictDisagrees(
  family: MachineFamily,
  items: readonly { placeKey: string; severity: string; measurements: Record<string, number> }[],
): boolean {
  const survey = items.find((it) => checklistKind(it.placeKey) === 'survey');
  return !!survey && survey.severity === 'ok' && surveyFromMeasurements(family, survey.measurements).uneven;
}

/**
 * Finishes an inspection. A survey whose readings are uneven but whose verdict is "serviceable"
 * is finished only with `acceptUnevenSurvey` (a conscious choice, audited); otherwise 409 naming
 * that field, and nothing changes.
 */
export async function finishInspection(actor: Actor, id: string, opts: { acceptUnevenSurvey?: boolean; hours?: HoursReading } = {}) {
  const db = await getDb();
  const row = await inspectionRowForActor(actor, id, db);
  assertOpen(row);
  const ctx = await machineForActor(actor, row.machineId, db);
  const [items, catalog, current] = await Promise.all([
    db.select().from(inspectionItems).where(eq(inspectionItems.inspectionId, row.id)).orderBy(asc(inspectionItems.position)),
    catalogForFamily(ctx.family.id, db, ctx.machine.orgId),
    installedLayout(ctx.machine.id, db),
  ]);
  const { lines, unknown } = replacementLines(items, current?.layout ?? null, catalog, ctx.family);
  const disagrees = surveyVerdictDisagrees(ctx.family, items);
  if (disagrees && !opts.acceptUnevenSurvey)
    throw new HttpError(
      409,
      'The clearance survey finds an uneven clearance, yet its verdict is "serviceable". Mark the survey to watch or replace, or finish with the uneven clearance accepted as it is.',
      'acceptUnevenSurvey',
    );

  // Close it first, under a lock, so only one finish ever adds the parts.
  await db.transaction(async (tx) => {
    const [locked] = await tx.select({ status: inspections.status }).from(inspections).where(eq(inspections.id, row.id)).for('update');
    if (locked?.status !== 'open') assertOpen({ ...row, status: 'finished' });
    await tx
      .update(inspections)
      .set({ status: 'finished', finishedAt: sql`now()` })
      .where(eq(inspections.id, row.id));
    // The hour meters read at the inspection (optional): a refused reading finishes nothing.
    if (opts.hours) await recordHours(tx, actor, ctx.machine, opts.hours, 'inspection', row.id, 'hours.');
    // Each wear measurement is kept against its part, at the separator hours of this inspection
    // (the reading given now, else the machine's last reading).
    const separatorHours = opts.hours?.separatorHours ?? (await lastHours(ctx.machine.id, tx))?.separatorHours ?? null;
    await recordWearMeasurements(tx, ctx.machine, row.id, items, separatorHours, new Date());
  });

  let requestId: string | null = null;
  if (lines.length > 0) {
    const when = new Date().toISOString().slice(0, 10);
    try {
      const request = await addLinesToDraftRequest(
        actor,
        ctx.machine.id,
        lines.map((l) => ({ partNumber: l.partNumber, quantity: l.quantity })),
        'inspection',
        `Replacements for ${ctx.machine.nickname} (serial ${ctx.machine.serial}) from the inspection finished ${when}.`,
      );
      requestId = request.id;
    } catch (err) {
      // The parts could not be requested: open the inspection again so nothing is lost (and
      // take back what the finish recorded: its hours reading and its wear measurements).
      await db.transaction(async (tx) => {
        await tx.update(inspections).set({ status: 'open', finishedAt: null }).where(eq(inspections.id, row.id));
        await tx.delete(wearMeasurements).where(eq(wearMeasurements.inspectionId, row.id));
        await tx.delete(machineHours).where(and(eq(machineHours.source, 'inspection'), eq(machineHours.sourceId, row.id)));
      });
      throw err;
    }
  }
  await db.transaction(async (tx) => {
    await audit(
      tx,
      actor,
      'finish',
      'inspection',
      row.id,
      {
        machineId: row.machineId,
        counts: countSeverities(items),
        partsRequestId: requestId,
        lines,
        unknownParts: unknown,
        ...(disagrees ? { unevenSurveyAccepted: true } : {}),
      },
      row.orgId,
    );
  });
  const detail = await getInspection(actor, row.id, db);
  return { ...detail, added: lines, unknownParts: unknown, partsRequestId: requestId };
}

/** Which families the inspected machines belong to, for the list page's start form. */
export async function machinesToInspect(actor: Actor) {
  const db = await getDb();
  return db
    .select({
      id: machines.id,
      nickname: machines.nickname,
      serial: machines.serial,
      familyName: families.name,
      orgName: organisations.name,
    })
    .from(machines)
    .innerJoin(families, eq(families.id, machines.familyId))
    .innerJoin(organisations, eq(organisations.id, machines.orgId))
    .where(inArray(machines.orgId, actor.visibleOrgIds))
    .orderBy(asc(organisations.name), asc(machines.nickname))
    .limit(500);
}
