/** Flat-rate minutes per kind of step: the dealer's own over the defaults. */
import { and, eq, inArray, sql } from 'drizzle-orm';
import { getDb, type Db } from '~/lib/server/db';
import { flatRates } from '~/db/schema';
import { dealerOf, type Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError } from '~/lib/server/http';
import { DEFAULT_FLAT_RATES, flatRatesWith, JOB_STEP_KINDS, type FlatRates, type JobStepKind } from '~/lib/domain/jobs';
import { pricingDealerOf } from '~/lib/server/services/prices';

/** A dealer's table (kinds it has set), by kind. */
async function dealerTable(dealerId: string, db: Pick<Db, 'select'>): Promise<Partial<Record<JobStepKind, number>>> {
  const rows = await db
    .select({ kind: flatRates.kind, minutes: flatRates.minutes })
    .from(flatRates)
    .where(eq(flatRates.dealerId, dealerId));
  return Object.fromEntries(rows.map((r) => [r.kind, r.minutes]));
}

/** The rates for work on an organisation's machines: those of the dealer serving it, over the defaults. */
export async function ratesForOrg(orgId: string, db?: Db): Promise<FlatRates> {
  const d = db ?? (await getDb());
  const dealerId = await pricingDealerOf(orgId, d);
  return flatRatesWith(dealerId ? await dealerTable(dealerId, d) : {});
}

function ownDealer(actor: Actor): string {
  const dealerId = dealerOf(actor);
  if (!dealerId) throw new HttpError(403, 'Flat rates belong to a dealer; you are not signed in for one.');
  return dealerId;
}

/** The caller's dealer's table: each kind's minutes, the default and whether the dealer set it. */
export async function flatRateTable(actor: Actor) {
  const dealerId = ownDealer(actor);
  const table = await dealerTable(dealerId, await getDb());
  return {
    rates: JOB_STEP_KINDS.map((kind) => ({
      kind,
      minutes: table[kind] ?? DEFAULT_FLAT_RATES[kind],
      defaultMinutes: DEFAULT_FLAT_RATES[kind],
      own: table[kind] !== undefined,
    })),
  };
}

/** Sets some kinds' minutes for the caller's dealer (the others keep theirs); audited. */
export async function setFlatRates(actor: Actor, rates: Partial<Record<JobStepKind, number>>) {
  const dealerId = ownDealer(actor);
  const db = await getDb();
  const entries = Object.entries(rates) as [JobStepKind, number][];
  await db.transaction(async (tx) => {
    await tx.delete(flatRates).where(
      and(
        eq(flatRates.dealerId, dealerId),
        inArray(
          flatRates.kind,
          entries.map(([k]) => k),
        ),
      ),
    );
    await tx.insert(flatRates).values(entries.map(([kind, minutes]) => ({ dealerId, kind, minutes, updatedAt: sql`now()` })));
    await audit(tx, actor, 'flat-rates.set', 'dealer', dealerId, { rates }, dealerId);
  });
  return flatRateTable(actor);
}
