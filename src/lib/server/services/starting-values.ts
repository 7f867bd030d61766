import { and, asc, eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import { getDb, type Db } from '~/lib/server/db';
import { families, organisations, startingValues } from '~/db/schema';
import { cropIdSchema, slugSchema } from '~/lib/domain/schemas';
import type { Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError } from '~/lib/server/http';

const note = (what: string) =>
  z
    .string({ error: `give the ${what} as text` })
    .trim()
    .max(500, `the ${what} is too long`)
    .refine((t) => !t.includes('\u0000'), { error: 'contains a character that cannot be stored' })
    .default('');

/** Openings and fan speed are stored in mm and rpm; forms convert from the user's units first. */
export const startingValuesSchema = z.object({
  familyId: slugSchema,
  crop: cropIdSchema,
  fanRpm: z
    .int({ error: 'give the fan speed as a whole number' })
    .min(100, 'the fan speed is too low')
    .max(3000, 'the fan speed is too high')
    .nullable()
    .default(null),
  upperSieveMm: z
    .number({ error: 'give the opening as a number' })
    .min(0, 'an opening cannot be negative')
    .max(60, 'the opening is too large')
    .nullable()
    .default(null),
  lowerSieveMm: z
    .number({ error: 'give the opening as a number' })
    .min(0, 'an opening cannot be negative')
    .max(60, 'the opening is too large')
    .nullable()
    .default(null),
  feederNote: note('feeder note'),
  headerNote: note('header note'),
});
export type StartingValuesInput = z.output<typeof startingValuesSchema>;

export const startingValuesQuerySchema = z.object({
  familyId: slugSchema.optional(),
  crop: cropIdSchema.optional(),
});

export type StartingValuesRow = typeof startingValues.$inferSelect;

/** The dealer that serves an organisation: itself when it is a dealer, else the farm's dealer. */
export async function dealerOfOrg(orgId: string, db?: Db): Promise<string | null> {
  const d = db ?? (await getDb());
  const [org] = await d
    .select({ kind: organisations.kind, dealerId: organisations.dealerId })
    .from(organisations)
    .where(eq(organisations.id, orgId))
    .limit(1);
  if (!org) return null;
  return org.kind === 'dealer' ? orgId : org.dealerId;
}

export async function startingValuesFor(dealerId: string, familyId: string, crop: string, db?: Db): Promise<StartingValuesRow | null> {
  const d = db ?? (await getDb());
  const [row] = await d
    .select()
    .from(startingValues)
    .where(and(eq(startingValues.dealerId, dealerId), eq(startingValues.familyId, familyId), eq(startingValues.crop, crop)))
    .limit(1);
  return row ?? null;
}

/** The starting values of the dealer that serves the actor (their own dealer, or their farm's). */
export async function listStartingValues(actor: Actor, query: z.infer<typeof startingValuesQuerySchema> = {}) {
  const db = await getDb();
  const dealerId = await dealerOfOrg(actor.homeOrgId, db);
  if (!dealerId) return { dealerId: null, items: [] };
  const where = [eq(startingValues.dealerId, dealerId)];
  if (query.familyId) where.push(eq(startingValues.familyId, query.familyId));
  if (query.crop) where.push(eq(startingValues.crop, query.crop));
  const items = await db
    .select({ ...listColumns, familyName: families.name })
    .from(startingValues)
    .innerJoin(families, eq(families.id, startingValues.familyId))
    .where(and(...where))
    .orderBy(asc(families.name), asc(startingValues.crop));
  return { dealerId, items };
}

const listColumns = {
  familyId: startingValues.familyId,
  crop: startingValues.crop,
  fanRpm: startingValues.fanRpm,
  upperSieveMm: startingValues.upperSieveMm,
  lowerSieveMm: startingValues.lowerSieveMm,
  feederNote: startingValues.feederNote,
  headerNote: startingValues.headerNote,
  invented: startingValues.invented,
  updatedAt: startingValues.updatedAt,
};

/**
 * Writes the starting values of the administrator's own dealer for one family and crop (a value
 * entered by hand is no longer marked invented).
 */
export async function putStartingValues(actor: Actor, input: StartingValuesInput) {
  if (actor.homeOrgKind !== 'dealer') throw new HttpError(403, 'Only a dealer’s administrator enters starting values.');
  const db = await getDb();
  const [family] = await db.select({ id: families.id }).from(families).where(eq(families.id, input.familyId)).limit(1);
  if (!family) throw new HttpError(400, 'familyId: no such machine family', 'familyId');
  const dealerId = actor.homeOrgId;
  const values = {
    fanRpm: input.fanRpm,
    upperSieveMm: input.upperSieveMm,
    lowerSieveMm: input.lowerSieveMm,
    feederNote: input.feederNote,
    headerNote: input.headerNote,
    invented: false,
    updatedBy: actor.id,
  };
  await db.transaction(async (tx) => {
    await tx
      .insert(startingValues)
      .values({ dealerId, familyId: input.familyId, crop: input.crop, ...values })
      .onConflictDoUpdate({
        target: [startingValues.dealerId, startingValues.familyId, startingValues.crop],
        set: { ...values, updatedAt: sql`now()` },
      });
    await audit(tx, actor, 'set', 'starting-values', null, { familyId: input.familyId, crop: input.crop, ...values }, dealerId);
  });
  return startingValuesFor(dealerId, input.familyId, input.crop);
}

/** Invented demo values for the demo dealer: marked `invented`, never real settings. */
export const DEMO_STARTING_VALUES: Omit<StartingValuesInput, 'familyId'>[] = [
  {
    crop: 'wheat',
    fanRpm: 1050,
    upperSieveMm: 16,
    lowerSieveMm: 8,
    feederNote: 'Feeder drum in the lower position (demo value).',
    headerNote: 'Reel just ahead of the knife; cut high enough to leave stubble for the spreader (demo value).',
  },
  {
    crop: 'canola',
    fanRpm: 780,
    upperSieveMm: 12,
    lowerSieveMm: 5,
    feederNote: 'Feeder drum in the upper position (demo value).',
    headerNote: 'Draper speed matched to ground speed (demo value).',
  },
  {
    crop: 'field-peas',
    fanRpm: 1150,
    upperSieveMm: 20,
    lowerSieveMm: 14,
    feederNote: 'Feeder drum in the upper position (demo value).',
    headerNote: 'Flex header on the ground; slow reel (demo value).',
  },
  {
    crop: 'corn',
    fanRpm: 1200,
    upperSieveMm: 20,
    lowerSieveMm: 12,
    feederNote: 'Feeder drum in the upper position (demo value).',
    headerNote: 'Deck plates set a little wider than the stalks (demo value).',
  },
  {
    crop: 'soybeans',
    fanRpm: 1100,
    upperSieveMm: 18,
    lowerSieveMm: 10,
    feederNote: 'Feeder drum in the lower position (demo value).',
    headerNote: 'Cut as low as the ground allows (demo value).',
  },
];

/** Every starting value a dealer keeps for one machine family (the loss check prefills from them). */
export async function startingValuesOfDealer(dealerId: string, familyId: string, db?: Db): Promise<StartingValuesRow[]> {
  const d = db ?? (await getDb());
  return d
    .select()
    .from(startingValues)
    .where(and(eq(startingValues.dealerId, dealerId), eq(startingValues.familyId, familyId)));
}
