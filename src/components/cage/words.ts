/**
 * Words for places and parts as people say them ("wide-wire element, right, position 3"), shared
 * by the diagram's accessible names, the editor's announcements and its findings list. Never ids.
 */
import type { CatalogPart, Place, Severity } from '../../lib/domain/schemas';
import type { UnitSystem } from '../../lib/domain/units';
import { formatLength, mm } from '../../lib/domain/units';
import { ELEMENT_LABEL } from './patterns';

const SETTING_WORDS: Record<Extract<Place, { kind: 'setting' }>['field'], string> = {
  crop: 'crop',
  drum: 'rotor drum',
  rotorRpm: 'rotor speed',
  clearanceMm: 'concave clearance',
  vaneControl: 'vane control',
  vaneSetting: 'vane setting',
};

/** "right, position 3" · "cage top left, section 2" · "rotor row 1, position 4". */
export function placeWords(place: Place): string {
  switch (place.kind) {
    case 'element':
      return `${place.side}, position ${place.position}`;
    case 'cover':
      return `cage top ${place.side}, section ${place.section}`;
    case 'bar':
      return `rotor row ${place.row}, position ${place.position}`;
    case 'setting':
      return SETTING_WORDS[place.field];
  }
}

const BAR_WORDS = {
  rasp: 'rasp bar',
  'smooth-rasp': 'smooth-top rasp bar',
  'spike-rasp': 'spike rasp bar',
  straight: 'straight bar',
  discharge: 'discharge bar',
} as const;

/** "wide-wire element" · "fine-wire concave" · "right cover plate" · "straight bar". */
export function partWords(part: CatalogPart): string {
  switch (part.kind) {
    case 'element': {
      const what = part.role === 'either' ? 'element' : part.role;
      return `${ELEMENT_LABEL[part.elementType].toLowerCase()} ${what}`;
    }
    case 'cover-plate':
      return `${part.side} cover plate`;
    case 'rotor-bar':
      return BAR_WORDS[part.barKind];
  }
}

/** partWords plus the hand of an element: "wide-wire element, left hand". */
export function partWordsWithHand(part: CatalogPart): string {
  return part.kind === 'element' ? `${partWords(part)}, ${part.hand} hand` : partWords(part);
}

/** "wide-wire element, right, position 3". */
export function partAtPlaceWords(part: CatalogPart | undefined, place: Place): string {
  return part ? `${partWords(part)}, ${placeWords(place)}` : `empty, ${placeWords(place)}`;
}

export const severityWords = (s: Severity): string =>
  s === 'blocks-fit' ? 'Blocks fit' : s === 'hurts-crop' ? 'Hurts the crop' : 'Advice';

export function openingWords(part: CatalogPart, units: UnitSystem): string | null {
  if (part.kind !== 'element') return null;
  if (!part.openingMm) return 'no opening';
  return `opening ${formatLength(mm(part.openingMm.width), units)} × ${formatLength(mm(part.openingMm.length), units)}`;
}

export const BAR_SHORT: Record<keyof typeof BAR_WORDS, string> = {
  rasp: 'Rasp',
  'smooth-rasp': 'Smooth rasp',
  'spike-rasp': 'Spike rasp',
  straight: 'Straight',
  discharge: 'Discharge',
};
