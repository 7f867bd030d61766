import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import Papa from 'papaparse';
import { z } from 'zod';
import { getDb, type Db } from '~/lib/server/db';
import { layouts, layoutVersions, lossChecks, users } from '~/db/schema';
import { checkWidths, computeLossCheck, lossCheckInputBaseSchema } from '~/lib/domain/field-check';
import { CLEARANCE_MAX_MM, CLEARANCE_MIN_MM, RPM_MAX, RPM_MIN, vaneSettingSchema, type Layout } from '~/lib/domain/schemas';
import type { Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError, notFound } from '~/lib/server/http';
import { installedLayout, machineForActor } from './machines';
import { dealerOfOrg, startingValuesFor } from './starting-values';
import { recordHours } from './machine-hours';
import { hoursReadingSchema } from '~/lib/domain/machine-hours';

const typed = (max: number, what: string) =>
  z
    .string({ error: `give the ${what} as text` })
    .trim()
    .min(1, `give the ${what}`)
    .max(max, `the ${what} is too long`)
    .refine((t) => !t.includes('\u0000'), { error: 'contains a character that cannot be stored' });

/** The machine's settings at the moment of the check; absent ones come from what is installed. */
export const checkSettingsSchema = z.object({
  rotorRpm: z.int().min(RPM_MIN).max(RPM_MAX).optional(),
  clearanceMm: z.number().min(CLEARANCE_MIN_MM).max(CLEARANCE_MAX_MM).optional(),
  vaneSetting: vaneSettingSchema.optional(),
  fanRpm: z.int().min(100).max(3000).nullable().optional(),
  upperSieveMm: z.number().min(0).max(60).nullable().optional(),
  lowerSieveMm: z.number().min(0).max(60).nullable().optional(),
});

export const recordLossCheckSchema = lossCheckInputBaseSchema
  .extend({
    fieldName: typed(80, 'field name'),
    /** When the counts were taken (ISO 8601 with an offset); now when absent. */
    checkedAt: z.iso.datetime({ offset: true, error: 'give a date and time such as 2026-08-14T15:30:00Z' }).optional(),
    moisturePct: z.number({ error: 'give the moisture as a number' }).min(0).max(60).nullable().optional(),
    settings: checkSettingsSchema.default({}),
    /** The engine and separator hours read at the check (optional; lower than the last only with a reason). */
    hours: hoursReadingSchema.optional(),
  })
  .superRefine((v, ctx) => {
    checkWidths(v, ctx);
    if (v.checkedAt && new Date(v.checkedAt).getTime() > Date.now() + 24 * 3600 * 1000)
      ctx.addIssue({ code: 'custom', path: ['checkedAt'], message: 'a check cannot lie in the future' });
  });
export type RecordLossCheck = z.input<typeof recordLossCheckSchema>;

export const seasonQuerySchema = z.object({
  season: z.coerce.number().int().min(2000).max(2200).optional(),
  format: z.enum(['json', 'csv']).default('json'),
  units: z.enum(['metric', 'imperial']).optional(),
});

/**
 * For a layout installed as it is (no recorded source): the saved version of this machine's
 * layouts with the same content, newest first.
 */
export async function installedVersionOf(db: Db, machineId: string, layout: Layout): Promise<{ layoutId: string; version: number } | null> {
  const [row] = await db
    .select({ layoutId: layoutVersions.layoutId, version: layoutVersions.version })
    .from(layoutVersions)
    .innerJoin(layouts, eq(layouts.id, layoutVersions.layoutId))
    .where(and(eq(layouts.machineId, machineId), sql`${layoutVersions.body} = ${JSON.stringify(layout)}::jsonb`))
    .orderBy(desc(layoutVersions.createdAt), desc(layoutVersions.version))
    .limit(1);
  return row ?? null;
}

export async function recordLossCheck(actor: Actor, machineId: string, input: z.output<typeof recordLossCheckSchema>) {
  const db = await getDb();
  const ctx = await machineForActor(actor, machineId, db);
  const current = await installedLayout(ctx.machine.id, db);
  const s = input.settings;
  const rotorRpm = s.rotorRpm ?? current?.layout.rotorRpm;
  const clearanceMm = s.clearanceMm ?? current?.layout.clearanceMm;
  const vaneSetting = s.vaneSetting ?? current?.layout.vaneSetting;
  if (rotorRpm === undefined || clearanceMm === undefined || vaneSetting === undefined)
    throw new HttpError(
      400,
      'settings: nothing is recorded as installed on this machine; give the rotor speed, clearance and vanes',
      'settings',
    );
  const dealerId = await dealerOfOrg(ctx.machine.orgId, db);
  const start = dealerId ? await startingValuesFor(dealerId, ctx.family.id, input.crop, db) : null;
  const fanRpm = s.fanRpm !== undefined ? s.fanRpm : (start?.fanRpm ?? null);
  const upperSieveMm = s.upperSieveMm !== undefined ? s.upperSieveMm : (start?.upperSieveMm ?? null);
  const lowerSieveMm = s.lowerSieveMm !== undefined ? s.lowerSieveMm : (start?.lowerSieveMm ?? null);

  const { fieldName, checkedAt, moisturePct, settings: _s, hours, ...countsInput } = input;
  const result = computeLossCheck(countsInput);
  // The layout version only counts when what is installed still carries the crop checked.
  // The version it was installed from when that was recorded; else a saved version with the same content.
  const version =
    current && current.layout.crop === input.crop
      ? current.sourceLayoutId && current.sourceVersion
        ? { layoutId: current.sourceLayoutId, version: current.sourceVersion }
        : await installedVersionOf(db, ctx.machine.id, current.layout)
      : null;

  const id = await db.transaction(async (tx) => {
    const [row] = await tx
      .insert(lossChecks)
      .values({
        machineId: ctx.machine.id,
        orgId: ctx.machine.orgId,
        fieldName,
        checkedAt: checkedAt ? new Date(checkedAt) : new Date(),
        crop: input.crop,
        moisturePct: moisturePct ?? null,
        layoutId: version?.layoutId ?? null,
        layoutVersion: version?.version ?? null,
        rotorRpm,
        clearanceMm,
        vaneSetting,
        fanRpm,
        upperSieveMm,
        lowerSieveMm,
        input: countsInput as never,
        result,
        harvestBuPerAc: result.harvest.buPerAc,
        harvestPct: result.harvest.pctOfYield,
        verdict: result.verdict,
        createdBy: actor.id,
      })
      .returning({ id: lossChecks.id });
    // The hour meters read at the check (optional): a refused reading records no check at all.
    if (hours) await recordHours(tx, actor, ctx.machine, hours, 'loss_check', row!.id, 'hours.');
    await audit(
      tx,
      actor,
      'record',
      'loss-check',
      row!.id,
      {
        machineId: ctx.machine.id,
        fieldName,
        crop: input.crop,
        harvestPct: Math.round(result.harvest.pctOfYield * 100) / 100,
        verdict: result.verdict,
      },
      ctx.machine.orgId,
    );
    return row!.id;
  });
  return getLossCheck(actor, id);
}

const viewColumns = {
  id: lossChecks.id,
  machineId: lossChecks.machineId,
  fieldName: lossChecks.fieldName,
  checkedAt: lossChecks.checkedAt,
  crop: lossChecks.crop,
  moisturePct: lossChecks.moisturePct,
  layoutId: lossChecks.layoutId,
  layoutVersion: lossChecks.layoutVersion,
  rotorRpm: lossChecks.rotorRpm,
  clearanceMm: lossChecks.clearanceMm,
  vaneSetting: lossChecks.vaneSetting,
  fanRpm: lossChecks.fanRpm,
  upperSieveMm: lossChecks.upperSieveMm,
  lowerSieveMm: lossChecks.lowerSieveMm,
  verdict: lossChecks.verdict,
  result: lossChecks.result,
  createdByName: users.name,
  createdAt: lossChecks.createdAt,
};
export async function getLossCheck(actor: Actor, id: string) {
  const db = await getDb();
  const [row] = await db
    .select({ ...viewColumns, orgId: lossChecks.orgId, input: lossChecks.input })
    .from(lossChecks)
    .leftJoin(users, eq(users.id, lossChecks.createdBy))
    .where(and(eq(lossChecks.id, id), inArray(lossChecks.orgId, actor.visibleOrgIds)))
    .limit(1);
  if (!row) throw notFound('Loss check not found', 'id');
  return row;
}

export async function deleteLossCheck(actor: Actor, id: string) {
  const db = await getDb();
  const row = await getLossCheck(actor, id);
  await db.transaction(async (tx) => {
    await tx.delete(lossChecks).where(eq(lossChecks.id, row.id));
    await audit(tx, actor, 'delete', 'loss-check', row.id, { machineId: row.machineId, fieldName: row.fieldName }, row.orgId);
  });
  return { deleted: row.id };
}

/** A machine's checks in one season (a calendar year; the latest with checks by default), oldest first. */
export async function seasonLog(actor: Actor, machineId: string, season?: number) {
  const db = await getDb();
  const ctx = await machineForActor(actor, machineId, db);
  const year = sql<number>`extract(year from ${lossChecks.checkedAt})::int`;
  const seasons = (
    await db.selectDistinct({ year }).from(lossChecks).where(eq(lossChecks.machineId, ctx.machine.id)).orderBy(desc(year))
  ).map((r) => r.year);
  const chosen = season ?? seasons[0] ?? new Date().getUTCFullYear();
  const checks = await db
    .select(viewColumns)
    .from(lossChecks)
    .leftJoin(users, eq(users.id, lossChecks.createdBy))
    .where(and(eq(lossChecks.machineId, ctx.machine.id), sql`${year} = ${chosen}`))
    .orderBy(asc(lossChecks.checkedAt), asc(lossChecks.id))
    .limit(1000);
  return {
    machine: {
      id: ctx.machine.id,
      nickname: ctx.machine.nickname,
      serial: ctx.machine.serial,
      familyName: ctx.family.name,
      orgName: ctx.orgName,
    },
    season: chosen,
    seasons: seasons.includes(chosen) ? seasons : [chosen, ...seasons].sort((a, b) => b - a),
    checks,
  };
}

/** The last check of a machine in a crop (the settings card shows it). */
export async function lastLossCheck(machineId: string, crop: string, db?: Db) {
  const d = db ?? (await getDb());
  const [row] = await d
    .select(viewColumns)
    .from(lossChecks)
    .leftJoin(users, eq(users.id, lossChecks.createdBy))
    .where(and(eq(lossChecks.machineId, machineId), eq(lossChecks.crop, crop)))
    .orderBy(desc(lossChecks.checkedAt), desc(lossChecks.id))
    .limit(1);
  return row ?? null;
}

const r = (n: number | null | undefined, digits: number) => (n === null || n === undefined ? '' : n.toFixed(digits));

/**
 * The season as CSV (papaparse; cells that start with = + - @ tab or CR are neutralised). Widths,
 * clearance and sieves in the user's units; losses in both bu/ac and kg/ha.
 */
export function seasonCsv(checks: Awaited<ReturnType<typeof seasonLog>>['checks'], units: 'metric' | 'imperial'): string {
  const len = (mm: number | null) => (mm === null ? '' : units === 'imperial' ? (mm / 25.4).toFixed(2) : mm.toFixed(1));
  const lenUnit = units === 'imperial' ? 'in' : 'mm';
  return Papa.unparse(
    {
      fields: [
        'Checked at (UTC)',
        'Field',
        'Crop',
        'Moisture %',
        'Layout version',
        'Rotor rpm',
        `Clearance ${lenUnit}`,
        'Vanes',
        'Fan rpm',
        `Upper sieve ${lenUnit}`,
        `Lower sieve ${lenUnit}`,
        'Basis',
        'Kernels/ft² for 1 bu/ac',
        'Pre-harvest bu/ac',
        'Header bu/ac',
        'Machine bu/ac',
        'Harvest loss bu/ac',
        'Harvest loss kg/ha',
        'Harvest loss % of yield',
        'Target %',
        'Verdict',
        'Recorded by',
      ],
      data: checks.map((c) => [
        c.checkedAt.toISOString(),
        c.fieldName,
        c.crop,
        r(c.moisturePct, 1),
        c.layoutVersion ?? '',
        c.rotorRpm,
        len(c.clearanceMm),
        c.vaneSetting,
        c.fanRpm ?? '',
        len(c.upperSieveMm),
        len(c.lowerSieveMm),
        c.result.basis.kind,
        r(c.result.basis.kernelsPerFt2PerBuAc, 2),
        r(c.result.preHarvest.buPerAc, 2),
        r(c.result.header.buPerAc, 2),
        r(c.result.machine.buPerAc, 2),
        r(c.result.harvest.buPerAc, 2),
        r(c.result.harvest.kgPerHa, 1),
        r(c.result.harvest.pctOfYield, 2),
        r(c.result.target.pct, 2),
        c.verdict,
        c.createdByName ?? '',
      ]),
    },
    { escapeFormulae: true },
  );
}
