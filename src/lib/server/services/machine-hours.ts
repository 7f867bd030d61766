import { desc, eq } from 'drizzle-orm';
import { getDb, type Db } from '~/lib/server/db';
import { machineHours, hoursSources, users } from '~/db/schema';
import { checkHoursReading, type HoursReading, type LastHours } from '~/lib/domain/machine-hours';
import type { Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError } from '~/lib/server/http';
import { machineForActor } from './machines';

export type HoursSource = (typeof hoursSources)[number];

/** The machine's latest hour-meter reading, or null when none was ever taken. */
export async function lastHours(machineId: string, db?: Pick<Db, 'select'>): Promise<(LastHours & { recordedAt: Date }) | null> {
  const d = db ?? (await getDb());
  const [row] = await d
    .select({ engineHours: machineHours.engineHours, separatorHours: machineHours.separatorHours, recordedAt: machineHours.recordedAt })
    .from(machineHours)
    .where(eq(machineHours.machineId, machineId))
    .orderBy(desc(machineHours.recordedAt), desc(machineHours.id))
    .limit(1);
  return row ?? null;
}

/**
 * Records a reading for a machine the caller has already checked the actor may see, inside the
 * caller's transaction `db`. A reading lower than the last one without a correction reason is a
 * 400 naming the field (`prefix` + engineHours / separatorHours), and nothing is written.
 */
export async function recordHours(
  db: Pick<Db, 'select' | 'insert'>,
  actor: Actor,
  machine: { id: string; orgId: string },
  reading: HoursReading,
  source: HoursSource,
  sourceId: string | null,
  prefix = '',
) {
  const last = await lastHours(machine.id, db);
  const [problem] = checkHoursReading(last, reading);
  if (problem) throw new HttpError(400, `${prefix}${problem.field}: ${problem.message}`, `${prefix}${problem.field}`);
  const [row] = await db
    .insert(machineHours)
    .values({
      machineId: machine.id,
      orgId: machine.orgId,
      engineHours: reading.engineHours,
      separatorHours: reading.separatorHours,
      source,
      sourceId,
      correctionReason: reading.correctionReason ?? null,
      recordedBy: actor.id,
    })
    .returning();
  await audit(
    db,
    actor,
    reading.correctionReason ? 'hours.correct' : 'hours.record',
    'machine',
    machine.id,
    { engineHours: reading.engineHours, separatorHours: reading.separatorHours, source, reason: reading.correctionReason ?? null },
    machine.orgId,
  );
  return row!;
}

/** How many readings the hours list shows at a time. */
export const HOURS_SHOWN = 100;

/** A machine's readings, newest first (another organisation's machine is not found). */
export async function listHours(actor: Actor, machineId: string) {
  const ctx = await machineForActor(actor, machineId);
  const db = await getDb();
  const readings = await db
    .select({
      id: machineHours.id,
      engineHours: machineHours.engineHours,
      separatorHours: machineHours.separatorHours,
      source: machineHours.source,
      sourceId: machineHours.sourceId,
      correctionReason: machineHours.correctionReason,
      recordedAt: machineHours.recordedAt,
      recordedByName: users.name,
    })
    .from(machineHours)
    .leftJoin(users, eq(users.id, machineHours.recordedBy))
    .where(eq(machineHours.machineId, ctx.machine.id))
    .orderBy(desc(machineHours.recordedAt), desc(machineHours.id))
    .limit(HOURS_SHOWN);
  return { machineId: ctx.machine.id, readings };
}
export type HoursList = Awaited<ReturnType<typeof listHours>>;

/** A reading taken by hand (the machine page, the API): lower than the last only with a reason. */
export async function recordHoursByHand(actor: Actor, machineId: string, reading: HoursReading) {
  const ctx = await machineForActor(actor, machineId);
  const db = await getDb();
  return db.transaction((tx) => recordHours(tx, actor, ctx.machine, reading, 'manual', null));
}
