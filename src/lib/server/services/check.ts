import { checkLayout } from '../../domain/rules';
import { computeSettings } from '../../domain/compute';
import type { CatalogPart, Layout } from '../../domain/schemas';
import { HttpError } from '../http';
import { catalogForFamily, familyById } from './machines';

/**
 * Checks a layout against its family and the catalog without storing anything. A part number
 * the catalog does not know, or an unknown family, is bad input (400) rather than a finding,
 * because the caller can fix the request.
 */
export async function checkStateless(layout: Layout) {
  const family = await familyById(layout.familyId);
  if (!family) throw new HttpError(400, `layout.familyId: no machine family "${layout.familyId}"`, 'layout.familyId');
  const catalog: CatalogPart[] = await catalogForFamily(family.id);
  const known = new Set(catalog.map((p) => p.partNumber));
  const lists = [
    ['elements', layout.elements],
    ['coverPlates', layout.coverPlates],
    ['rotorBars', layout.rotorBars],
  ] as const;
  for (const [name, items] of lists) {
    items.forEach((item, i) => {
      if (!known.has(item.partNumber)) {
        throw new HttpError(400, `layout.${name}.${i}.partNumber: ${item.partNumber} is not a part of this family's catalog`, `layout.${name}.${i}.partNumber`);
      }
    });
  }
  return { findings: checkLayout(family, catalog, layout), settings: computeSettings(family, catalog, layout) };
}
