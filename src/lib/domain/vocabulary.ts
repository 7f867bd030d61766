/**
 * The one vocabulary for places and parts. Every sentence the product writes about the cage —
 * the editor's announcements and accessible names, findings, plan steps, inspection lines,
 * differences between versions — names a slot and a part through these functions, so the same
 * slot reads the same everywhere ("position 3, right") and each kind of part has one name
 * ("perforated plate", never "Perforated" in one place and "perforated-plate" in another).
 * Never ids. Pure (the domain imports nothing but zod and itself).
 */
import type { BarKind, CatalogPart, CropId, ElementType, Place, SettingField, Severity, Side } from './schemas';
import { BAR_KIND_VALUES, ELEMENT_TYPE_VALUES } from './values';
import { isRoundHole } from './cage-metrics';
import { formatLength, mm, type UnitSystem } from './units';
import { capitalise, plural, withArticle } from './words';

// ---------------------------------------------------------------------------------------------
// Kinds of part

/** Every element type, in the schema's order (the list the schema is built from, never a copy). */
export const ELEMENT_TYPES: readonly ElementType[] = ELEMENT_TYPE_VALUES;
/** Every kind of rotor bar, in the schema's order. */
export const BAR_KINDS: readonly BarKind[] = BAR_KIND_VALUES;

/** The one name of each element type, as said in a sentence: "perforated plate". */
const ELEMENT_NAMES: Readonly<Record<ElementType, string>> = {
  'fine-wire': 'fine-wire',
  'wide-wire': 'wide-wire',
  'skip-wire': 'skip-wire',
  'round-bar': 'round-bar',
  perforated: 'perforated plate',
  blank: 'blank plate',
  'close-bar': 'close-bar',
};

/** The one name of each kind of rotor bar, as said in a sentence: "smooth-top rasp bar". */
const BAR_NAMES: Readonly<Record<BarKind, string>> = {
  rasp: 'rasp bar',
  'smooth-rasp': 'smooth-top rasp bar',
  'spike-rasp': 'spike rasp bar',
  straight: 'straight bar',
  discharge: 'discharge bar',
};

/** "fine-wire", "perforated plate": the element type's name inside a sentence. */
export const elementTypeName = (t: ElementType): string => ELEMENT_NAMES[t];
/** "Fine-wire", "Perforated plate": the same name as a label (drawing, legend, palette, forms). */
export const elementTypeLabel = (t: ElementType): string => capitalise(ELEMENT_NAMES[t]);
/** "smooth-top rasp bar". */
export const barKindName = (k: BarKind): string => BAR_NAMES[k];
/** "Smooth-top rasp": the short label written on a bar in the drawing (the name without "bar"). */
export const barKindLabel = (k: BarKind): string => capitalise(BAR_NAMES[k].replace(/ bar$/, ''));

/** "a fine-wire element" is built from this: element, concave or grate. */
const roleNoun = (role: 'concave' | 'grate' | 'either'): string => (role === 'either' ? 'element' : role);

/** "wide-wire element" · "fine-wire concave" · "right cover plate" · "straight bar". */
export function partName(part: CatalogPart): string {
  switch (part.kind) {
    case 'element':
      return `${ELEMENT_NAMES[part.elementType]} ${roleNoun(part.role)}`;
    case 'cover-plate':
      return `${part.side} cover plate`;
    case 'rotor-bar':
      return BAR_NAMES[part.barKind];
  }
}

/** partName with the hand of an element: "left-hand wide-wire element". */
export function partNameWithHand(part: CatalogPart): string {
  return part.kind === 'element' ? `${part.hand}-hand ${partName(part)}` : partName(part);
}

/** "the left-hand wide-wire element CW-WW-L-04", or the bare number for an unknown part. */
export function partWithNumber(part: CatalogPart | undefined, partNumber: string): string {
  return part ? `the ${partNameWithHand(part)} ${partNumber}` : `part ${partNumber}`;
}

/** "an element", "a cover plate", "a rotor bar": the kind of part a slot takes. */
export const PART_KIND_WORDS: Readonly<Record<CatalogPart['kind'], string>> = {
  element: 'an element',
  'cover-plate': 'a cover plate',
  'rotor-bar': 'a rotor bar',
};

// ---------------------------------------------------------------------------------------------
// Places

const SETTING_NAMES: Readonly<Record<SettingField, string>> = {
  crop: 'crop',
  drum: 'rotor drum',
  rotorRpm: 'rotor speed',
  clearanceMm: 'concave clearance',
  vaneControl: 'vane control',
  vaneSetting: 'vane setting',
};

/** A half-position: "position 3, right". */
export const elementPlaceWords = (position: number, side: Side): string => `position ${position}, ${side}`;
/** A cover-plate slot: "cage-top section 2, left". */
export const coverPlaceWords = (section: number, side: Side): string => `cage-top section ${section}, ${side}`;
/** A place on the rotor: "rotor row 1, position 4". */
export const barPlaceWords = (row: number, position: number): string => `rotor row ${row}, position ${position}`;
/** A whole row of rotor bars: "rotor row 1". */
export const barRowWords = (row: number): string => `rotor row ${row}`;
/** A setting beside the diagram: "concave clearance". */
export const settingWords = (field: SettingField): string => SETTING_NAMES[field];

/**
 * The one phrasing of a slot, inside a sentence: "position 3, right" · "cage-top section 2,
 * left" · "rotor row 1, position 4" · "rotor speed". Start a sentence with `placeLabel`.
 */
export function placeWords(place: Place): string {
  switch (place.kind) {
    case 'element':
      return elementPlaceWords(place.position, place.side);
    case 'cover':
      return coverPlaceWords(place.section, place.side);
    case 'bar':
      return barPlaceWords(place.row, place.position);
    case 'setting':
      return settingWords(place.field);
  }
}

/** placeWords at the start of a line or sentence: "Position 3, right". */
export const placeLabel = (place: Place): string => capitalise(placeWords(place));

/** "wide-wire element at position 3, right", or "empty at position 3, right". */
export function partAtPlaceWords(part: CatalogPart | undefined, place: Place): string {
  return part ? `${partName(part)} at ${placeWords(place)}` : `empty at ${placeWords(place)}`;
}

// ---------------------------------------------------------------------------------------------
// Severity and openings

/** "Blocks fit", "Hurts the crop", "Advice". */
export const severityWords = (s: Severity): string =>
  s === 'blocks-fit' ? 'Blocks fit' : s === 'hurts-crop' ? 'Hurts the crop' : 'Advice';

/**
 * An element's opening as people describe it: a round hole by its diameter ("round holes 14 mm
 * across"), a slot by its width and length ("opening 5 mm × 25 mm"); a blank plate has none.
 */
export function openingWords(part: CatalogPart, units: UnitSystem): string | null {
  if (part.kind !== 'element') return null;
  const o = part.openingMm;
  if (!o) return 'no opening';
  if (isRoundHole(o)) return `round holes ${formatLength(mm(o.width), units)} across`;
  return `opening ${formatLength(mm(o.width), units)} × ${formatLength(mm(o.length), units)}`;
}

// ---------------------------------------------------------------------------------------------
// Crops as nouns

interface CropWords {
  /** The crop as the subject of a sentence: "soybeans", "edible beans", "wheat". */
  noun: string;
  /** Whether the noun takes a plural verb: "edible beans want", "wheat wants". */
  plural: boolean;
  /** The crop before another noun: "a soybean cage", "an oat kernel", "the field-pea program". */
  adj: string;
  /** One kernel or seed of the crop: "soybean kernel", "pea", "sunflower seed". */
  kernel: string;
}

const CROP_WORDS: Readonly<Record<CropId, CropWords>> = {
  wheat: { noun: 'wheat', plural: false, adj: 'wheat', kernel: 'wheat kernel' },
  barley: { noun: 'barley', plural: false, adj: 'barley', kernel: 'barley kernel' },
  oats: { noun: 'oats', plural: true, adj: 'oat', kernel: 'oat kernel' },
  canola: { noun: 'canola', plural: false, adj: 'canola', kernel: 'canola seed' },
  'field-peas': { noun: 'field peas', plural: true, adj: 'field-pea', kernel: 'pea' },
  lentils: { noun: 'lentils', plural: true, adj: 'lentil', kernel: 'lentil' },
  soybeans: { noun: 'soybeans', plural: true, adj: 'soybean', kernel: 'soybean kernel' },
  'edible-beans': { noun: 'edible beans', plural: true, adj: 'edible-bean', kernel: 'bean' },
  corn: { noun: 'corn', plural: false, adj: 'corn', kernel: 'corn kernel' },
  rice: { noun: 'rice', plural: false, adj: 'rice', kernel: 'rice grain' },
  sunflower: { noun: 'sunflower', plural: false, adj: 'sunflower', kernel: 'sunflower seed' },
  'grass-seed': { noun: 'grass seed', plural: false, adj: 'grass-seed', kernel: 'grass seed' },
  sorghum: { noun: 'sorghum', plural: false, adj: 'sorghum', kernel: 'sorghum kernel' },
  hemp: { noun: 'hemp', plural: false, adj: 'hemp', kernel: 'hemp seed' },
};

/** "soybeans", "edible beans", "wheat": the crop inside a sentence. */
export const cropNoun = (id: CropId): string => CROP_WORDS[id].noun;
/** "Soybeans", "Wheat": the crop at the start of a sentence. */
export const cropSubject = (id: CropId): string => capitalise(CROP_WORDS[id].noun);
/** "soybean", "oat": the crop before another noun ("a soybean cage"). */
export const cropAdjective = (id: CropId): string => CROP_WORDS[id].adj;
/** The verb that agrees with the crop: cropVerb('edible-beans', 'wants', 'want') = "want". */
export const cropVerb = (id: CropId, singular: string, pluralForm: string): string => (CROP_WORDS[id].plural ? pluralForm : singular);
/** "Edible beans want", "Wheat wants": the crop and its verb at the start of a sentence. */
export const cropSays = (id: CropId, singular: string, pluralForm: string): string =>
  `${cropSubject(id)} ${cropVerb(id, singular, pluralForm)}`;
/** "soybean kernel", "pea": one kernel of the crop, without article. */
export const kernelOf = (id: CropId): string => CROP_WORDS[id].kernel;
/** "a soybean kernel", "an oat kernel", "a pea". */
export const aKernelOf = (id: CropId): string => withArticle(CROP_WORDS[id].kernel);
/** "soybean kernels", "peas": in the number `n` asks for (plural by default). */
export const kernelsOf = (id: CropId, n = 2): string => plural(n, CROP_WORDS[id].kernel);
