/** Plain words for the planner's explanations and steps: places and parts, never ids. */
import type { CatalogPart, Place } from '../schemas';
import { barWords, coverWords, halfWords, partWords } from '../rules/words';

export { elementWord, listWords, partWords } from '../rules/words';

export function placeWords(place: Place): string {
  switch (place.kind) {
    case 'element':
      return halfWords(place.position, place.side);
    case 'cover':
      return coverWords(place.section, place.side);
    case 'bar':
      return barWords(place.row, place.position);
    case 'setting':
      return place.field;
  }
}

/** "the left-hand wide-wire element CW-WW-L-04", or the bare number for an unknown part. */
export function partWithNumber(part: CatalogPart | undefined, partNumber: string): string {
  return part ? `the ${partWords(part)} ${partNumber}` : `part ${partNumber}`;
}

export function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** 12345 cents → "123.45". */
export function money(cents: number): string {
  return (cents / 100).toFixed(2);
}
