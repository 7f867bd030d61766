import { eq } from 'drizzle-orm';
import type { Db } from './db';
import * as t from '~/db/schema';
import { computeLossCheck, type LossCheckInput } from '~/lib/domain/field-check';
import { DEMO_STARTING_VALUES } from './services/starting-values';

/** The demo machine whose harvest is logged, and who counted (all invented). */
const DEMO_SERIAL = 'LK-2291-A';
const DEMO_OPERATOR = 'olive@larkspur.example';

/** Invented checks of one wheat harvest: settings changed between checks as an operator would. */
const CHECKS: {
  day: number;
  hour: number;
  field: string;
  rpm: number;
  clearanceMm: number;
  vanes: 'slow' | 'medium';
  moisture: number;
  pre: number[];
  header: number[];
  behind: number[];
  signs?: LossCheckInput['signs'];
}[] = [
  {
    day: 4,
    hour: 14,
    field: 'Home quarter',
    rpm: 860,
    clearanceMm: 10,
    vanes: 'medium',
    moisture: 14.1,
    pre: [2, 3, 1],
    header: [9, 12, 10],
    behind: [58, 64, 61],
    signs: ['unthreshed'],
  },
  {
    day: 4,
    hour: 17,
    field: 'Home quarter',
    rpm: 860,
    clearanceMm: 8,
    vanes: 'medium',
    moisture: 13.6,
    pre: [2, 2, 1],
    header: [10, 9, 11],
    behind: [40, 44, 38],
  },
  {
    day: 6,
    hour: 11,
    field: 'Coulee field',
    rpm: 830,
    clearanceMm: 8,
    vanes: 'slow',
    moisture: 13.2,
    pre: [3, 2, 2],
    header: [11, 8, 9],
    behind: [30, 26, 33],
  },
  {
    day: 9,
    hour: 15,
    field: 'Coulee field',
    rpm: 800,
    clearanceMm: 8,
    vanes: 'slow',
    moisture: 12.8,
    pre: [2, 1, 2],
    header: [8, 9, 7],
    behind: [20, 22, 19],
  },
  {
    day: 12,
    hour: 16,
    field: 'West slough',
    rpm: 800,
    clearanceMm: 7,
    vanes: 'slow',
    moisture: 12.4,
    pre: [1, 2, 2],
    header: [18, 21, 16],
    behind: [52, 58, 49],
    signs: ['in-chaff'],
  },
];

export async function seedDemoField(db: Db) {
  const [dealer] = await db.select({ id: t.organisations.id }).from(t.organisations).where(eq(t.organisations.kind, 'dealer')).limit(1);
  const families = await db.select({ id: t.families.id }).from(t.families);
  if (!dealer) return;
  for (const f of families) {
    for (const v of DEMO_STARTING_VALUES) {
      await db
        .insert(t.startingValues)
        .values({ dealerId: dealer.id, familyId: f.id, ...v, invented: true })
        .onConflictDoNothing();
    }
  }

  const [machine] = await db.select().from(t.machines).where(eq(t.machines.serial, DEMO_SERIAL)).limit(1);
  const [operator] = await db.select({ id: t.users.id }).from(t.users).where(eq(t.users.email, DEMO_OPERATOR)).limit(1);
  if (!machine || !operator) return;
  const now = new Date();
  // The latest August that has passed: this season, or last year's before harvest comes round.
  const year = now.getUTCMonth() >= 8 ? now.getUTCFullYear() : now.getUTCFullYear() - 1;
  const start = DEMO_STARTING_VALUES.find((v) => v.crop === 'wheat')!;
  for (const c of CHECKS) {
    const input: LossCheckInput = {
      crop: 'wheat',
      frame: { by: 'area', area: 1, unit: 'ft2' },
      counts: { preHarvest: c.pre, header: c.header, behindMachine: c.behind },
      cutWidth: 35,
      spreadWidth: 35,
      widthUnit: 'ft',
      basis: { kind: 'default' },
      expectedYield: { value: 62, unit: 'bu/ac' },
      price: { value: 6.4, per: 'bu', currency: '$' },
      targetPct: null,
      signs: c.signs ?? [],
    };
    // Wider spread on the first field (spreader vanes set narrow): 35 ft cut, 28 ft spread.
    if (c.field === 'Home quarter') input.spreadWidth = 28;
    const result = computeLossCheck(input);
    const [row] = await db
      .insert(t.lossChecks)
      .values({
        machineId: machine.id,
        orgId: machine.orgId,
        fieldName: c.field,
        checkedAt: new Date(Date.UTC(year, 7, c.day, c.hour)),
        crop: 'wheat',
        moisturePct: c.moisture,
        rotorRpm: c.rpm,
        clearanceMm: c.clearanceMm,
        vaneSetting: c.vanes,
        fanRpm: start.fanRpm,
        upperSieveMm: start.upperSieveMm,
        lowerSieveMm: start.lowerSieveMm,
        input: input as never,
        result,
        harvestBuPerAc: result.harvest.buPerAc,
        harvestPct: result.harvest.pctOfYield,
        verdict: result.verdict,
        createdBy: operator.id,
      })
      .returning({ id: t.lossChecks.id });
    await db.insert(t.auditLog).values({
      userId: operator.id,
      orgId: machine.orgId,
      action: 'record',
      entity: 'loss-check',
      entityId: row!.id,
      detail: { demo: true },
    });
  }
}
