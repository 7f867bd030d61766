import { checkLayoutInput } from '../../domain/check-input';
import { catalogSnapshot } from '../catalog-cache';
import { HttpError } from '../http';

/**
 * Checks a layout against its family and the whole catalog without storing anything. Schema
 * errors, an unknown family or an unknown part number are bad input (400 naming the field), so
 * the caller can fix the request; everything else comes back as findings.
 */
export async function checkStateless(input: unknown) {
  // The catalog is kept between calls and read again only after it changed.
  const catalog = await catalogSnapshot();
  const result = checkLayoutInput(input, catalog.families, catalog.parts);
  if (!result.ok) {
    const [first] = result.problems;
    const field = `layout.${first!.path}`;
    throw new HttpError(400, `${field}: ${first!.message}`, field, {
      issues: result.problems.map((p) => ({ field: `layout.${p.path}`, message: p.message })),
    });
  }
  return { findings: result.findings, settings: result.settings };
}
