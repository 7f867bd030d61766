/** Resolving a placed part number against the catalog, with the findings when that fails. */
import type { CatalogPart, CatalogPartKind, Place } from '~/lib/domain/schemas';
import { emit, type RuleContext } from './context';
import { partNameWithHand as partWords } from '~/lib/domain/vocabulary';

const KIND_WORDS: Record<CatalogPartKind, string> = {
  element: 'an element',
  'cover-plate': 'a cover plate',
  'rotor-bar': 'a rotor bar',
};

/**
 * The catalog part for `partNumber` when it exists, is of `kind` and belongs to the family's fit
 * group; otherwise emits PART_UNKNOWN, PART_WRONG_KIND or FIT_GROUP_FOREIGN and returns null.
 */
export function resolvePart<K extends CatalogPartKind>(
  ctx: RuleContext,
  partNumber: string,
  kind: K,
  place: Place,
  where: string,
): Extract<CatalogPart, { kind: K }> | null {
  const part = ctx.catalog.byPartNumber.get(partNumber);
  if (!part) {
    emit(
      ctx,
      'PART_UNKNOWN',
      'blocks-fit',
      [place],
      `Unknown part ${partNumber}`,
      `Part number ${partNumber} at ${where} is not in the catalog, so nobody can order or fit it.`,
      'Check the part number, or pick the part from the catalog palette.',
    );
    return null;
  }
  if (part.kind !== kind) {
    emit(
      ctx,
      'PART_WRONG_KIND',
      'blocks-fit',
      [place],
      `${partNumber} is not ${KIND_WORDS[kind]}`,
      `${partNumber} is ${KIND_WORDS[part.kind]} (${partWords(part)}), but ${where} takes ${KIND_WORDS[kind]}.`,
      `Put ${KIND_WORDS[kind]} here and move ${partNumber} to a place that takes it.`,
    );
    return null;
  }
  if (part.fitGroup !== ctx.family.fitGroup) {
    emit(
      ctx,
      'FIT_GROUP_FOREIGN',
      'blocks-fit',
      [place],
      `${partNumber} belongs to another machine family`,
      `${partNumber} (${partWords(part)}) at ${where} is made for fit group "${part.fitGroup}"; this ${ctx.family.name} takes fit group "${ctx.family.fitGroup}", so it will not bolt on.`,
      `Use the matching ${partWords(part)} from this family's catalog.`,
    );
    return null;
  }
  return part as Extract<CatalogPart, { kind: K }>;
}
