/**
 * Part history and wear: each place's part with its install date and separator hours, moves
 * between places, machines and the farm's shelf as layouts are installed, the wear measured at
 * inspections kept per part, and the forecast (domain/wear-forecast.ts) drawn from them.
 */
import { and, asc, desc, eq, inArray, isNull, sql } from 'drizzle-orm';
import type { Db } from '~/lib/server/db';
import { getDb } from '~/lib/server/db';
import { installed, machineHours, machines, organisations, partRecords, stock, wearMeasurements, families } from '~/db/schema';
import { installChanges, partPlaces, hoursInService } from '~/lib/domain/part-history';
import { checklistKind } from '~/lib/domain/inspection';
import type { Layout } from '~/lib/domain/schemas';
import {
  DEMO_SEASON_WINDOW,
  dateAtHours,
  forecastWear,
  reachesWithin,
  usualSeasonHours,
  type SeasonHours,
  type WearForecast,
  type WearPoint,
} from '~/lib/domain/wear-forecast';
import { dealerOf, type Actor } from '~/lib/server/access';
import { HttpError, notFound } from '~/lib/server/http';
import { lastHours } from './machine-hours';
import { machineForActor } from './machines';

type Q = Pick<Db, 'select' | 'insert' | 'update'>;
export type PartRecordRow = typeof partRecords.$inferSelect;

// ---------------------------------------------------------------------------------------------
// Writing history (inside the caller's transaction)

/**
 * A machine whose history has not begun (nothing open) but has a layout installed gets a starting
 * record for each of its parts: installed when that layout was recorded, hours then unknown.
 * (The migration that brought part history in did the same for every machine then.)
 */
export async function ensureStartRecords(tx: Q, machine: { id: string; orgId: string }) {
  const open = await tx
    .select({ id: partRecords.id })
    .from(partRecords)
    .where(and(eq(partRecords.machineId, machine.id), isNull(partRecords.removedAt)))
    .limit(1);
  if (open.length) return 0;
  const [inst] = await tx.select().from(installed).where(eq(installed.machineId, machine.id)).limit(1);
  if (!inst) return 0;
  const rows = [...partPlaces(inst.layout)].map(([placeKey, partNumber]) => ({
    machineId: machine.id,
    orgId: machine.orgId,
    placeKey,
    partNumber,
    installedAt: inst.updatedAt,
    origin: 'start' as const,
    installedBy: inst.updatedBy,
  }));
  if (rows.length) await tx.insert(partRecords).values(rows);
  return rows.length;
}

export interface InstallHistory {
  kept: number;
  removed: number;
  moved: number;
  fromShelf: number;
  new: number;
  started: number;
}

/**
 * Records what installing `next` changes in the machine's part history, inside the install's
 * transaction `tx` and BEFORE the installed row changes: places whose part number changed close
 * their record (removed now, at the machine's last separator hours, to the farm's shelf or moved
 * to another place); places that gain a part open one, from a place of this install (moved), from
 * the farm's shelf (the most recently shelved part with that number), or new.
 */
export async function recordInstallHistory(
  tx: Q,
  actor: Actor,
  machine: { id: string; orgId: string },
  next: Layout,
): Promise<InstallHistory> {
  const sepNow = (await lastHours(machine.id, tx))?.separatorHours ?? null;
  const counts: InstallHistory = { kept: 0, removed: 0, moved: 0, fromShelf: 0, new: 0, started: 0 };
  const [inst] = await tx.select({ machineId: installed.machineId }).from(installed).where(eq(installed.machineId, machine.id)).limit(1);
  const places = partPlaces(next);
  if (!inst) {
    // The machine's first install: its history begins here.
    const rows = [...places].map(([placeKey, partNumber]) => ({
      machineId: machine.id,
      orgId: machine.orgId,
      placeKey,
      partNumber,
      installedSeparatorHours: sepNow,
      origin: 'start' as const,
      installedBy: actor.id,
    }));
    if (rows.length) await tx.insert(partRecords).values(rows);
    counts.started = rows.length;
    return counts;
  }
  counts.started = await ensureStartRecords(tx, machine);
  const open = await tx
    .select()
    .from(partRecords)
    .where(and(eq(partRecords.machineId, machine.id), isNull(partRecords.removedAt)))
    .for('update');
  const byId = new Map(open.map((r) => [r.id, r] as const));
  const changes = installChanges(open, places);
  counts.kept = open.length - changes.close.length;
  const now = new Date();
  for (const c of changes.close) {
    await tx
      .update(partRecords)
      .set({ removedAt: now, removedSeparatorHours: sepNow, removedTo: c.movedTo ? 'moved' : 'shelf', removedBy: actor.id })
      .where(eq(partRecords.id, c.record.id));
    if (!c.movedTo) counts.removed++;
  }
  for (const o of changes.open) {
    let previous: PartRecordRow | null = o.movedFrom ? byId.get(o.movedFrom.id)! : null;
    let origin: PartRecordRow['origin'] = previous ? 'moved' : 'new';
    if (!previous) {
      const [shelved] = await tx
        .select()
        .from(partRecords)
        .where(
          and(
            eq(partRecords.orgId, machine.orgId),
            eq(partRecords.partNumber, o.partNumber),
            eq(partRecords.removedTo, 'shelf'),
            sql`not exists (select 1 from ${partRecords} n where n.previous_record_id = ${partRecords.id})`,
          ),
        )
        .orderBy(desc(partRecords.removedAt), asc(partRecords.id))
        .limit(1)
        .for('update', { skipLocked: true });
      if (shelved) {
        previous = shelved;
        origin = 'shelf';
      }
    }
    const carriedHours = previous
      ? hoursInService({ ...previous, removedSeparatorHours: previous.removedSeparatorHours ?? (origin === 'moved' ? sepNow : null) }, null)
      : 0;
    await tx.insert(partRecords).values({
      machineId: machine.id,
      orgId: machine.orgId,
      placeKey: o.placeKey,
      partNumber: o.partNumber,
      installedAt: now,
      installedSeparatorHours: sepNow,
      origin,
      previousRecordId: previous?.id ?? null,
      carriedHours,
      installedBy: actor.id,
    });
    if (origin === 'moved') counts.moved++;
    else if (origin === 'shelf') counts.fromShelf++;
    else counts.new++;
  }
  return counts;
}

/**
 * Keeps the wear measured on an inspection's lines against the parts they were taken on: an
 * element line against that place's open record (when its part number matches), a rotor row line
 * against every bar open in that row. `separatorHours` is the machine's meter at the inspection.
 */
export async function recordWearMeasurements(
  tx: Q,
  machine: { id: string; orgId: string },
  inspectionId: string,
  items: readonly { id: string; placeKey: string; partNumber: string | null; measurements: Record<string, number> }[],
  separatorHours: number | null,
  at: Date,
) {
  const measured = items.filter((it) => typeof it.measurements.wearMm === 'number');
  if (!measured.length) return 0;
  await ensureStartRecords(tx, machine);
  const open = await tx
    .select({ id: partRecords.id, placeKey: partRecords.placeKey, partNumber: partRecords.partNumber })
    .from(partRecords)
    .where(and(eq(partRecords.machineId, machine.id), isNull(partRecords.removedAt)));
  const rows: (typeof wearMeasurements.$inferInsert)[] = [];
  for (const it of measured) {
    const kind = checklistKind(it.placeKey);
    const targets =
      kind === 'element'
        ? open.filter((r) => r.placeKey === it.placeKey && (!it.partNumber || r.partNumber === it.partNumber))
        : kind === 'row'
          ? open.filter((r) => r.placeKey.startsWith(`bar:${it.placeKey.slice(4)}:`))
          : [];
    for (const r of targets)
      rows.push({
        partRecordId: r.id,
        orgId: machine.orgId,
        inspectionId,
        inspectionItemId: it.id,
        wearMm: it.measurements.wearMm!,
        separatorHours,
        measuredAt: at,
      });
  }
  if (rows.length) await tx.insert(wearMeasurements).values(rows).onConflictDoNothing();
  return rows.length;
}

// ---------------------------------------------------------------------------------------------
// Reading history and forecasts

interface WearData {
  records: Map<string, PartRecordRow>;
  measurements: Map<string, { wearMm: number; separatorHours: number | null; measuredAt: Date; inspectionId: string }[]>;
  readings: Map<string, { at: Date; separatorHours: number; engineHours: number; corrected: boolean }[]>;
}

/**
 * The part records of `orgIds` (a part's chain of records stays within its farm), with the wear
 * measurements and hour readings the forecasts need. With `machineId`, only that machine's
 * records and their chains get measurements, and only the machines on those chains readings: a
 * machine page does not read the whole farm's history.
 */
async function loadWearData(db: Pick<Db, 'select'>, orgIds: string[], machineId?: string): Promise<WearData> {
  if (!orgIds.length) return { records: new Map(), measurements: new Map(), readings: new Map() };
  const recs = await db.select().from(partRecords).where(inArray(partRecords.orgId, orgIds));
  const records = new Map(recs.map((r) => [r.id, r] as const));
  let recordScope = inArray(wearMeasurements.orgId, orgIds);
  let machineScope = inArray(machineHours.orgId, orgIds);
  if (machineId) {
    const ids = new Set<string>();
    for (const r of recs)
      if (r.machineId === machineId)
        for (
          let c: PartRecordRow | undefined = r;
          c && !ids.has(c.id);
          c = c.previousRecordId ? records.get(c.previousRecordId) : undefined
        )
          ids.add(c.id);
    const machineIds = new Set([machineId, ...[...ids].map((id) => records.get(id)!.machineId)]);
    recordScope = inArray(wearMeasurements.partRecordId, [...ids]);
    machineScope = inArray(machineHours.machineId, [...machineIds]);
  }
  const [meas, hrs] = await Promise.all([
    db
      .select({
        partRecordId: wearMeasurements.partRecordId,
        wearMm: wearMeasurements.wearMm,
        separatorHours: wearMeasurements.separatorHours,
        measuredAt: wearMeasurements.measuredAt,
        inspectionId: wearMeasurements.inspectionId,
      })
      .from(wearMeasurements)
      .where(recordScope)
      .orderBy(asc(wearMeasurements.measuredAt)),
    db
      .select({
        machineId: machineHours.machineId,
        at: machineHours.recordedAt,
        separatorHours: machineHours.separatorHours,
        engineHours: machineHours.engineHours,
        reason: machineHours.correctionReason,
      })
      .from(machineHours)
      .where(machineScope)
      .orderBy(asc(machineHours.recordedAt), asc(machineHours.id)),
  ]);
  const measurements: WearData['measurements'] = new Map();
  for (const m of meas) {
    const list = measurements.get(m.partRecordId) ?? [];
    list.push(m);
    measurements.set(m.partRecordId, list);
  }
  const readings: WearData['readings'] = new Map();
  for (const h of hrs) {
    const list = readings.get(h.machineId) ?? [];
    list.push({ at: h.at, separatorHours: h.separatorHours, engineHours: h.engineHours, corrected: !!h.reason });
    readings.set(h.machineId, list);
  }
  return { records, measurements, readings };
}

export interface WearPointView extends WearPoint {
  measuredAt: Date;
  inspectionId: string;
  machineId: string;
  placeKey: string;
}

export interface PartForecastView {
  record: PartRecordRow;
  /** The part's earlier records, oldest first (other places, machines, the shelf). */
  chain: PartRecordRow[];
  points: WearPointView[];
  /** Measurements taken with no separator hours known (not in the fit). */
  unplaced: number;
  forecast: WearForecast;
  season: SeasonHours;
  /** When the limit is reached at the machine's usual hours per season (null: never or unknown). */
  limitDate: Date | null;
  /** Hours at install were unknown: hours count from the first measured reading of that record. */
  installHoursUnknown: boolean;
}

/** The forecast of one record (the physical part's whole chain of records), as of `now`. */
function forecastOf(data: WearData, recordId: string, now: Date): PartForecastView | null {
  const record = data.records.get(recordId);
  if (!record) return null;
  const chain: PartRecordRow[] = [];
  for (let r = record.previousRecordId ? data.records.get(record.previousRecordId) : undefined; r && chain.length < 1000;) {
    chain.unshift(r);
    r = r.previousRecordId ? data.records.get(r.previousRecordId) : undefined;
  }
  const points: WearPointView[] = [];
  let unplaced = 0;
  let installHoursUnknown = false;
  const baselineOf = (r: PartRecordRow) => {
    if (r.installedSeparatorHours !== null) return r.installedSeparatorHours;
    const first = (data.measurements.get(r.id) ?? []).find((m) => m.separatorHours !== null);
    const firstReading = (data.readings.get(r.machineId) ?? []).find((h) => h.at >= r.installedAt);
    return first?.separatorHours ?? firstReading?.separatorHours ?? null;
  };
  for (const r of [...chain, record]) {
    const base = baselineOf(r);
    if (r.installedSeparatorHours === null) installHoursUnknown = true;
    for (const m of data.measurements.get(r.id) ?? []) {
      if (m.separatorHours === null || base === null) {
        unplaced++;
        continue;
      }
      points.push({
        hours: r.carriedHours + Math.max(0, m.separatorHours - base),
        wearMm: m.wearMm,
        measuredAt: m.measuredAt,
        inspectionId: m.inspectionId,
        machineId: r.machineId,
        placeKey: r.placeKey,
      });
    }
  }
  const readings = data.readings.get(record.machineId) ?? [];
  const nowHours = record.removedAt ? null : (readings.at(-1)?.separatorHours ?? null);
  const hoursNow = hoursInService(record, nowHours, baselineOf(record));
  const forecast = forecastWear(points, hoursNow);
  const season = usualSeasonHours(readings, DEMO_SEASON_WINDOW);
  const limitDate =
    forecast.status === 'now'
      ? now
      : forecast.status === 'ahead' && !record.removedAt
        ? dateAtHours(forecast.hoursLeft!, season.hours, DEMO_SEASON_WINDOW, now)
        : null;
  return { record, chain, points, unplaced, forecast, season, limitDate, installHoursUnknown };
}

/** Elements first, then cover plates, then rotor bars. */
const placeRank = (key: string) => (key.startsWith('element:') ? 0 : key.startsWith('cover:') ? 1 : 2);

/**
 * A machine's part history: the parts in it now (with each one's forecast) and the records
 * closed before, newest first.
 */
export async function partHistory(actor: Actor, machineId: string, now = new Date()) {
  const ctx = await machineForActor(actor, machineId);
  const db = await getDb();
  const data = await loadWearData(db, [ctx.machine.orgId], ctx.machine.id);
  const mine = [...data.records.values()].filter((r) => r.machineId === ctx.machine.id);
  const current = mine
    .filter((r) => !r.removedAt)
    .sort((a, b) => placeRank(a.placeKey) - placeRank(b.placeKey) || a.placeKey.localeCompare(b.placeKey, 'en', { numeric: true }))
    .map((r) => forecastOf(data, r.id, now)!);
  const past = mine
    .filter((r) => r.removedAt)
    .sort((a, b) => b.removedAt!.getTime() - a.removedAt!.getTime() || b.installedAt.getTime() - a.installedAt.getTime())
    .slice(0, 200);
  const readings = data.readings.get(ctx.machine.id) ?? [];
  return {
    machine: { id: ctx.machine.id, nickname: ctx.machine.nickname, orgName: ctx.orgName, familyId: ctx.family.id },
    season: usualSeasonHours(readings, DEMO_SEASON_WINDOW),
    window: DEMO_SEASON_WINDOW,
    current,
    past,
  };
}

/** One part record of a machine with its measurements, chain and forecast (another's: 404). */
export async function partRecordDetail(actor: Actor, machineId: string, recordId: string, now = new Date()) {
  const ctx = await machineForActor(actor, machineId);
  const db = await getDb();
  const data = await loadWearData(db, [ctx.machine.orgId], ctx.machine.id);
  const rec = data.records.get(recordId);
  if (!rec || rec.machineId !== ctx.machine.id) throw notFound('Part record not found', 'recordId');
  const view = forecastOf(data, recordId, now)!;
  const next = [...data.records.values()].find((r) => r.previousRecordId === recordId) ?? null;
  const machineNames = new Map(
    (
      await db
        .select({ id: machines.id, nickname: machines.nickname })
        .from(machines)
        .where(inArray(machines.id, [...new Set([...view.chain, rec, ...(next ? [next] : [])].map((r) => r.machineId))]))
    ).map((m) => [m.id, m.nickname] as const),
  );
  return {
    machine: { id: ctx.machine.id, nickname: ctx.machine.nickname, orgName: ctx.orgName, familyId: ctx.family.id },
    ...view,
    next,
    machineNames: Object.fromEntries(machineNames),
    window: DEMO_SEASON_WINDOW,
  };
}
export type PartRecordDetail = Awaited<ReturnType<typeof partRecordDetail>>;

// ---------------------------------------------------------------------------------------------
// The dealer's before-the-season list

/**
 * The dealer's customer machines with parts that reach their wear limit within the coming season
 * (the machine's usual separator hours per season), the parts to stock (part numbers and counts)
 * and the dealer's shelf beside them. For the actor's own dealer only.
 */
export async function seasonList(actor: Actor, now = new Date()) {
  const dealerId = dealerOf(actor);
  if (!dealerId) throw new HttpError(403, 'The before-the-season list belongs to a dealer: only a dealer’s staff see one.');
  const db = await getDb();
  const farms = await db
    .select({ id: organisations.id, name: organisations.name })
    .from(organisations)
    .where(and(eq(organisations.dealerId, dealerId), inArray(organisations.id, actor.visibleOrgIds)));
  const orgIds = farms.map((f) => f.id);
  const data = await loadWearData(db, orgIds);
  const machineRows = orgIds.length
    ? await db
        .select({ id: machines.id, nickname: machines.nickname, serial: machines.serial, orgId: machines.orgId, familyName: families.name })
        .from(machines)
        .innerJoin(families, eq(families.id, machines.familyId))
        .where(inArray(machines.orgId, orgIds))
        .orderBy(asc(machines.nickname))
    : [];
  const farmName = new Map(farms.map((f) => [f.id, f.name] as const));
  const machinesOut = [];
  const toStock = new Map<string, number>();
  const openByMachine = new Map<string, PartRecordRow[]>();
  for (const r of data.records.values()) if (!r.removedAt) openByMachine.set(r.machineId, [...(openByMachine.get(r.machineId) ?? []), r]);
  for (const m of machineRows) {
    const open = openByMachine.get(m.id) ?? [];
    const views = open.map((r) => forecastOf(data, r.id, now)!);
    const season = usualSeasonHours(data.readings.get(m.id) ?? [], DEMO_SEASON_WINDOW);
    const due = views
      .filter((v) => reachesWithin(v.forecast, season.hours))
      .sort((a, b) => (a.forecast.hoursLeft ?? 0) - (b.forecast.hoursLeft ?? 0) || a.record.placeKey.localeCompare(b.record.placeKey));
    if (!due.length) continue;
    for (const v of due) toStock.set(v.record.partNumber, (toStock.get(v.record.partNumber) ?? 0) + 1);
    machinesOut.push({
      ...m,
      orgName: farmName.get(m.orgId) ?? '',
      season,
      parts: due.map((v) => ({
        recordId: v.record.id,
        placeKey: v.record.placeKey,
        partNumber: v.record.partNumber,
        status: v.forecast.status,
        hoursLeft: v.forecast.hoursLeft,
        latestWearMm: v.forecast.latest?.wearMm ?? null,
        limitDate: v.limitDate,
      })),
    });
  }
  const numbers = [...toStock.keys()].sort();
  const shelf = numbers.length
    ? await db
        .select({ partNumber: stock.partNumber, quantity: stock.quantity, leadDays: stock.leadDays })
        .from(stock)
        .where(and(eq(stock.orgId, dealerId), inArray(stock.partNumber, numbers)))
    : [];
  const shelfBy = new Map(shelf.map((s) => [s.partNumber, s] as const));
  return {
    window: DEMO_SEASON_WINDOW,
    machines: machinesOut,
    parts: numbers.map((pn) => ({
      partNumber: pn,
      needed: toStock.get(pn)!,
      onShelf: shelfBy.get(pn)?.quantity ?? 0,
      leadDays: shelfBy.get(pn)?.leadDays ?? null,
      short: Math.max(0, toStock.get(pn)! - (shelfBy.get(pn)?.quantity ?? 0)),
    })),
  };
}
export type SeasonList = Awaited<ReturnType<typeof seasonList>>;
