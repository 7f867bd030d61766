import { eq } from 'drizzle-orm';
import { checkLayoutInput } from '../../domain/check-input';
import { catalogParts, families } from '../../../db/schema';
import { getDb } from '../db';
import { HttpError } from '../http';
import { priceCatalogFor } from './prices';

/**
 * Checks a layout against its family and the whole catalog without storing anything. Schema
 * errors, an unknown family or an unknown part number are bad input (400 naming the field), so
 * the caller can fix the request; everything else comes back as findings. With `priceFor` (the
 * caller's organisation) the parts' total is priced by that organisation's dealer.
 */
export async function checkStateless(input: unknown, priceFor?: string) {
  const db = await getDb();
  const [familyRows, partRows] = await Promise.all([
    db.select({ spec: families.spec }).from(families),
    db.select({ spec: catalogParts.spec }).from(catalogParts).where(eq(catalogParts.active, true)),
  ]);
  const parts = partRows.map((r) => r.spec);
  const result = checkLayoutInput(input, familyRows.map((r) => r.spec), priceFor ? await priceCatalogFor(parts, priceFor, db) : parts);
  if (!result.ok) {
    const [first] = result.problems;
    const field = `layout.${first!.path}`;
    throw new HttpError(400, `${field}: ${first!.message}`, field, {
      issues: result.problems.map((p) => ({ field: `layout.${p.path}`, message: p.message })),
    });
  }
  return { findings: result.findings, settings: result.settings };
}
