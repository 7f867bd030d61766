/**
 * Untrusted layout input (an API body, a file) → findings and settings, or a list of problems
 * each naming the field it concerns. The API's check route and the check command share it, so
 * both answer bad input the same way.
 */
import { asCatalogIndex, type CatalogIndex } from './catalog';
import { computeSettings, type Settings } from './compute';
import { checkLayout } from './rules';
import { layoutSchema, type CatalogPart, type CatalogPartKind, type Finding, type Layout, type MachineFamily } from './schemas';

export interface InputProblem {
  /** Dotted path to the field, e.g. 'elements.2.partNumber' ('' for the whole document). */
  path: string;
  message: string;
}

export type CheckInputResult =
  { ok: true; layout: Layout; family: MachineFamily; findings: Finding[]; settings: Settings } | { ok: false; problems: InputProblem[] };

export const formatPath = (path: readonly PropertyKey[]): string => path.map(String).join('.');

function valueAt(input: unknown, path: readonly PropertyKey[]): unknown {
  let v: unknown = input;
  for (const k of path) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<PropertyKey, unknown>)[k];
  }
  return v;
}

/**
 * Validate `input` as a layout, resolve its family, and insist every part number exists in the
 * catalog as the right kind of part (an unknown part is bad input here, not a finding, because
 * nothing can be computed about it). Then check and compute.
 */
export function checkLayoutInput(
  input: unknown,
  families: readonly MachineFamily[],
  catalog: readonly CatalogPart[] | CatalogIndex,
): CheckInputResult {
  const parsed = layoutSchema.safeParse(input);
  if (!parsed.success) {
    return {
      ok: false,
      problems: parsed.error.issues.map((i) => ({
        path: formatPath(i.path),
        message: i.path.length && valueAt(input, i.path) === undefined ? 'required field is missing' : i.message,
      })),
    };
  }
  const layout = parsed.data;
  const family = families.find((f) => f.id === layout.familyId);
  if (!family) {
    return {
      ok: false,
      problems: [
        { path: 'familyId', message: `unknown machine family "${layout.familyId}" (known: ${families.map((f) => f.id).join(', ')})` },
      ],
    };
  }
  const cat = asCatalogIndex(catalog);
  const problems: InputProblem[] = [];
  const want = (items: readonly { partNumber: string }[], field: string, kind: CatalogPartKind, what: string) =>
    items.forEach((item, i) => {
      const part = cat.byPartNumber.get(item.partNumber);
      if (!part) problems.push({ path: `${field}.${i}.partNumber`, message: `unknown part number "${item.partNumber}"` });
      else if (part.kind !== kind)
        problems.push({ path: `${field}.${i}.partNumber`, message: `"${item.partNumber}" is a ${part.kind}, not ${what}` });
    });
  want(layout.elements, 'elements', 'element', 'an element');
  want(layout.coverPlates, 'coverPlates', 'cover-plate', 'a cover plate');
  want(layout.rotorBars, 'rotorBars', 'rotor-bar', 'a rotor bar');
  if (problems.length) return { ok: false, problems };
  return {
    ok: true,
    layout,
    family,
    findings: checkLayout(family, cat, layout),
    settings: computeSettings(family, cat, layout),
  };
}
