import { and, eq, isNull } from 'drizzle-orm';
import type { Db } from './db';
import * as t from '~/db/schema';
import { buildChecklist, suggestSeverity, checklistKind } from '~/lib/domain/inspection';
import { partPlaces } from '~/lib/domain/part-history';
import { DEMO_SEASON_WINDOW } from '~/lib/domain/wear-forecast';
import type { CatalogPart } from '~/lib/domain/schemas';
import { ensureStartRecords, recordWearMeasurements } from './services/part-history';

/**
 * The demo's shop history (all invented): two seasons of hour-meter readings and inspections with
 * wear measurements on two machines, so part history, the wear forecast and the dealer's
 * before-the-season list show something real. Dates follow today: "last season" is the latest
 * harvest window that has ended, "the season before" the one before it.
 */
const INSPECTOR = 'tomas@kestrel.example';
const DAY = 24 * 3600 * 1000;

interface Reading {
  season: 'before' | 'last';
  month: number;
  day: number;
  engine: number;
  separator: number;
  /** The inspection read at (index into `inspections`), else by hand. */
  inspection?: number;
}

interface DemoInspection {
  season: 'before' | 'last';
  month: number;
  day: number;
  title: string;
  /** Wear in mm per checklist place ('element:1:left', 'row:1'). */
  wear: Record<string, number>;
}

interface MachineHistory {
  serial: string;
  /** When the parts now in went in, and the separator hours then. */
  installed: { season: 'before' | 'last'; month: number; day: number; separator: number; origin: 'new' | 'start' };
  readings: Reading[];
  inspections: DemoInspection[];
  /** A part taken out to the farm's shelf and replaced by a new one of the same number. */
  swapped?: { placeKey: string; season: 'last'; month: number; day: number; separator: number };
}

const HISTORIES: MachineHistory[] = [
  {
    serial: 'LK-2291-A',
    installed: { season: 'before', month: 7, day: 1, separator: 1118, origin: 'new' },
    readings: [
      { season: 'before', month: 7, day: 8, engine: 1480, separator: 1120, inspection: 0 },
      { season: 'before', month: 9, day: 12, engine: 1633, separator: 1239 },
      { season: 'before', month: 11, day: 4, engine: 1790, separator: 1352, inspection: 1 },
      { season: 'last', month: 7, day: 6, engine: 1796, separator: 1356, inspection: 2 },
      { season: 'last', month: 9, day: 10, engine: 1951, separator: 1474 },
      { season: 'last', month: 11, day: 3, engine: 2104, separator: 1590, inspection: 3 },
    ],
    inspections: [
      {
        season: 'before',
        month: 7,
        day: 8,
        title: 'Pre-season inspection',
        wear: {
          'element:1:left': 0.3,
          'element:1:right': 0.2,
          'element:2:left': 0.2,
          'element:2:right': 0.3,
          'element:3:right': 0.5,
          'element:4:right': 0.1,
          'row:1': 0.3,
        },
      },
      {
        season: 'before',
        month: 11,
        day: 4,
        title: 'After-harvest inspection',
        wear: {
          'element:1:left': 3.1,
          'element:1:right': 2.2,
          'element:2:left': 1.4,
          'element:2:right': 1.9,
          'element:3:right': 0.5,
          'element:4:right': 0.5,
          'row:1': 1.7,
        },
      },
      {
        season: 'last',
        month: 7,
        day: 6,
        title: 'Pre-season inspection',
        wear: {
          'element:1:left': 3.2,
          'element:1:right': 2.3,
          'element:2:left': 1.5,
          'element:2:right': 2.0,
          'element:3:right': 0.5,
          'element:4:right': 0,
          'row:1': 1.8,
        },
      },
      {
        season: 'last',
        month: 11,
        day: 3,
        title: 'After-harvest inspection',
        wear: {
          'element:1:left': 6.1,
          'element:1:right': 4.4,
          'element:2:left': 2.9,
          'element:2:right': 3.9,
          'element:3:right': 0.5,
          'element:4:right': 0.45,
          'row:1': 3.2,
        },
      },
    ],
    swapped: { placeKey: 'element:4:right', season: 'last', month: 7, day: 5, separator: 1356 },
  },
  {
    serial: 'HB-7730-S',
    installed: { season: 'before', month: 6, day: 20, separator: 860, origin: 'start' },
    readings: [
      { season: 'before', month: 7, day: 10, engine: 1210, separator: 862, inspection: 0 },
      { season: 'before', month: 11, day: 6, engine: 1480, separator: 1071 },
      { season: 'last', month: 7, day: 9, engine: 1484, separator: 1073, inspection: 1 },
      { season: 'last', month: 11, day: 5, engine: 1751, separator: 1282, inspection: 2 },
    ],
    inspections: [
      { season: 'before', month: 7, day: 10, title: 'Pre-season inspection', wear: { 'element:1:left': 0.6, 'element:1:right': 0.4 } },
      { season: 'last', month: 7, day: 9, title: 'Pre-season inspection', wear: { 'element:1:left': 2.7, 'element:1:right': 1.9 } },
      { season: 'last', month: 11, day: 5, title: 'After-harvest inspection', wear: { 'element:1:left': 4.9, 'element:1:right': 3.6 } },
    ],
  },
];

/** The year of the latest harvest window that has ended by `now`. */
function lastSeasonYear(now: Date): number {
  const y = now.getUTCFullYear();
  const end = Date.UTC(y, DEMO_SEASON_WINDOW.endMonth - 1, DEMO_SEASON_WINDOW.endDay) + DAY;
  return now.getTime() >= end + 7 * DAY ? y : y - 1;
}

export async function seedDemoWear(db: Db, now = new Date()) {
  const last = lastSeasonYear(now);
  const at = (season: 'before' | 'last', month: number, day: number, hour = 10) =>
    new Date(Date.UTC(season === 'last' ? last : last - 1, month - 1, day, hour));
  const [inspector] = await db.select().from(t.users).where(eq(t.users.email, INSPECTOR)).limit(1);
  const allMachines = await db.select().from(t.machines);
  await db.transaction(async (tx) => {
    for (const h of HISTORIES) {
      const machine = allMachines.find((m) => m.serial === h.serial);
      const [inst] = machine ? await tx.select().from(t.installed).where(eq(t.installed.machineId, machine.id)).limit(1) : [];
      const [family] = machine ? await tx.select().from(t.families).where(eq(t.families.id, machine.familyId)).limit(1) : [];
      if (!machine || !inst || !family || !inspector) continue;
      const catalog: CatalogPart[] = (
        await tx.select({ spec: t.catalogParts.spec }).from(t.catalogParts).where(eq(t.catalogParts.familyId, family.id))
      ).map((r) => r.spec);
      const installedAt = at(h.installed.season, h.installed.month, h.installed.day);
      const places = [...partPlaces(inst.layout)];
      await tx.insert(t.partRecords).values(
        places.map(([placeKey, partNumber]) => ({
          machineId: machine.id,
          orgId: machine.orgId,
          placeKey,
          partNumber,
          installedAt,
          installedSeparatorHours: h.installed.separator,
          origin: h.installed.origin,
          installedBy: inspector.id,
        })),
      );
      const inspectionIds: string[] = [];
      const lines = buildChecklist(family.spec, inst.layout, catalog);
      for (const [i, insp] of h.inspections.entries()) {
        // The part swapped at the start of last season: its old record closes to the shelf.
        if (h.swapped && at(h.swapped.season, h.swapped.month, h.swapped.day) <= at(insp.season, insp.month, insp.day)) {
          await swapToShelf(
            tx,
            machine,
            h.swapped.placeKey,
            at(h.swapped.season, h.swapped.month, h.swapped.day),
            h.swapped.separator,
            inspector.id,
          );
        }
        const startedAt = at(insp.season, insp.month, insp.day, 8);
        const finishedAt = at(insp.season, insp.month, insp.day, 11);
        const [row] = await tx
          .insert(t.inspections)
          .values({
            machineId: machine.id,
            orgId: machine.orgId,
            status: 'finished',
            title: insp.title,
            startedBy: inspector.id,
            startedAt,
            finishedAt,
          })
          .returning({ id: t.inspections.id });
        inspectionIds.push(row!.id);
        const items = await tx
          .insert(t.inspectionItems)
          .values(
            lines.map((l, n) => {
              const measurements: Record<string, number> = { ...l.measurements };
              if (insp.wear[l.placeKey] !== undefined) measurements.wearMm = insp.wear[l.placeKey]!;
              const kind = checklistKind(l.placeKey) ?? 'element';
              return {
                inspectionId: row!.id,
                placeKey: l.placeKey,
                partNumber: l.partNumber,
                label: l.label,
                severity: kind === 'survey' ? ('ok' as const) : suggestSeverity(kind, [], measurements),
                measurements,
                position: n,
              };
            }),
          )
          .returning();
        const reading = h.readings.find((r) => r.inspection === i);
        await recordWearMeasurements(tx, machine, row!.id, items, reading?.separator ?? null, finishedAt);
        await tx.insert(t.auditLog).values({
          at: finishedAt,
          userId: inspector.id,
          orgId: machine.orgId,
          action: 'finish',
          entity: 'inspection',
          entityId: row!.id,
          detail: { machineId: machine.id, demo: true },
        });
      }
      await tx.insert(t.machineHours).values(
        h.readings.map((r) => ({
          machineId: machine.id,
          orgId: machine.orgId,
          engineHours: r.engine,
          separatorHours: r.separator,
          source: r.inspection !== undefined ? ('inspection' as const) : ('manual' as const),
          sourceId: r.inspection !== undefined ? (inspectionIds[r.inspection] ?? null) : null,
          recordedBy: inspector.id,
          recordedAt: at(r.season, r.month, r.day, r.inspection !== undefined ? 9 : 18),
        })),
      );
    }
    // Every other demo machine starts its history with what is installed.
    for (const m of allMachines) await ensureStartRecords(tx, m);
    // The demo's latest inspection (seeded before this) keeps its wear against the parts, at the last reading.
    const recent = await tx.select().from(t.inspections).where(eq(t.inspections.status, 'finished'));
    for (const insp of recent) {
      const has = await tx
        .select({ id: t.wearMeasurements.id })
        .from(t.wearMeasurements)
        .where(eq(t.wearMeasurements.inspectionId, insp.id))
        .limit(1);
      if (has.length) continue;
      const machine = allMachines.find((m) => m.id === insp.machineId);
      if (!machine) continue;
      const items = await tx.select().from(t.inspectionItems).where(eq(t.inspectionItems.inspectionId, insp.id));
      const h = HISTORIES.find((x) => x.serial === machine.serial);
      const latest = h?.readings.at(-1)?.separator ?? null;
      await recordWearMeasurements(tx, machine, insp.id, items, latest, insp.finishedAt ?? insp.startedAt);
    }
    await tx.insert(t.auditLog).values({ action: 'seed', entity: 'demo-wear', detail: { machines: HISTORIES.length } });
  });
}

/** Closes the open record at `placeKey` to the farm's shelf and opens a new part of the same number. */
async function swapToShelf(
  tx: Pick<Db, 'select' | 'insert' | 'update'>,
  machine: { id: string; orgId: string },
  placeKey: string,
  when: Date,
  separator: number,
  by: string,
) {
  const [open] = await tx
    .select()
    .from(t.partRecords)
    .where(and(eq(t.partRecords.machineId, machine.id), eq(t.partRecords.placeKey, placeKey), isNull(t.partRecords.removedAt)))
    .limit(1);
  if (!open || open.installedAt >= when) return;
  await tx
    .update(t.partRecords)
    .set({ removedAt: when, removedSeparatorHours: separator, removedTo: 'shelf', removedBy: by })
    .where(eq(t.partRecords.id, open.id));
  await tx.insert(t.partRecords).values({
    machineId: machine.id,
    orgId: machine.orgId,
    placeKey,
    partNumber: open.partNumber,
    installedAt: when,
    installedSeparatorHours: separator,
    origin: 'new',
    installedBy: by,
  });
}
