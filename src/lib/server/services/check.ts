import { checkLayoutInput } from '~/lib/domain/check-input';
import { catalogSnapshot } from '~/lib/server/catalog-cache';
import { getDb } from '~/lib/server/db';
import { HttpError } from '~/lib/server/http';
import { priceCatalogFor } from './prices';

/**
 * Checks a layout against its family and the whole catalog without storing anything. Schema
 * errors, an unknown family or an unknown part number are bad input (400 naming the field), so
 * the caller can fix the request; everything else comes back as findings. With `priceFor` (the
 * caller's organisation) the parts' total is priced by that organisation's dealer.
 */
export async function checkStateless(input: unknown, priceFor?: string) {
  // The catalog is kept between calls and read again only after it changed; prices are the dealer's.
  const catalog = await catalogSnapshot();
  const parts = priceFor ? await priceCatalogFor(catalog.parts, priceFor, await getDb()) : catalog.parts;
  const result = checkLayoutInput(input, catalog.families, parts);
  if (!result.ok) {
    const [first] = result.problems;
    const field = `layout.${first!.path}`;
    throw new HttpError(400, `${field}: ${first!.message}`, field, {
      issues: result.problems.map((p) => ({ field: `layout.${p.path}`, message: p.message })),
    });
  }
  return { findings: result.findings, settings: result.settings };
}
