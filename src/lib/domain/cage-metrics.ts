/**
 * What the arrangement of the cage does: kernel passage through each opening, open area of each
 * zone after cover plates, a threshing aggressiveness index and a capacity factor.
 * The index and the factor are Cagewright's own models for comparing layouts (no published
 * source); their formulas are written out here and in docs/layout-format.md.
 */
import type { CatalogIndex, FamilyIndex } from './catalog';
import { kernelDimsSorted, type CropProgram, type KernelSize } from './crops';
import type { ElementPart, ElementType, Layout, Opening, Side, VaneSetting, Zone } from './schemas';
import type { MetresPerSecond } from './units';

// ---------------------------------------------------------------------------------------------
// Kernel passage

/**
 * How much room a kernel has getting through an opening, mm (negative: it will not pass).
 * A kernel slips through a slot lying flat and lengthwise, so its smallest dimension must clear
 * the opening's width and its middle dimension the opening's length:
 *   margin = min(width − d₁, length − d₂), with d₁ ≤ d₂ ≤ d₃ the kernel's sorted dimensions.
 * d₁ is the crop's passing size, min(W, T). A blank plate (no opening) gives null.
 */
export function passageMargin(opening: Opening | null, kernel: KernelSize): number | null {
  if (!opening) return null;
  const [d1, d2] = kernelDimsSorted(kernel);
  return Math.min(opening.width - d1, opening.length - d2);
}

export interface ElementPassage {
  position: number;
  side: Side;
  partNumber: string;
  elementType: ElementType;
  openingMm: Opening | null;
  passingSizeMm: number;
  /** null for a blank plate. */
  marginMm: number | null;
  passes: boolean | null;
}

/** Passage margin of every known element in the layout (unknown part numbers are skipped). */
export function elementPassages(layout: Layout, catalog: CatalogIndex, crop: CropProgram): ElementPassage[] {
  const out: ElementPassage[] = [];
  for (const e of layout.elements) {
    const part = catalog.byPartNumber.get(e.partNumber);
    if (!part || part.kind !== 'element') continue;
    const marginMm = passageMargin(part.openingMm, crop.kernel);
    out.push({
      position: e.position,
      side: e.side,
      partNumber: e.partNumber,
      elementType: part.elementType,
      openingMm: part.openingMm,
      passingSizeMm: crop.passingSizeMm,
      marginMm,
      passes: marginMm === null ? null : marginMm > 0,
    });
  }
  return out;
}

// ---------------------------------------------------------------------------------------------
// Open area per zone

/**
 * Share of the open area of a half-position that a cover plate above it closes. Cagewright's
 * model: a plate on a cage-top section closes this share of every half-position on its side
 * under that section (no published source).
 */
export const COVER_PLATE_CLOSED_SHARE = 0.3;

export interface ZoneOpenArea {
  /** Mean open-area fraction of the zone's filled half-positions, before cover plates. */
  before: number;
  /** The same after cover plates. */
  after: number;
  /** Half-positions holding a known element / half-positions in the zone. */
  filled: number;
  total: number;
}

export type OpenAreaByZone = Record<Zone, ZoneOpenArea>;

/**
 * Open area of each zone: the mean open-area fraction over its half-positions holding a known
 * element (empty ones are a fit finding and are left out), with each half-position under a
 * valid cover plate reduced by COVER_PLATE_CLOSED_SHARE.
 */
export function openAreaByZone(layout: Layout, family: FamilyIndex, catalog: CatalogIndex): OpenAreaByZone {
  const covered = new Set<string>();
  for (const c of layout.coverPlates) {
    const section = family.sectionByIndex.get(c.section);
    if (!section || !section.coverPlateSides.includes(c.side)) continue;
    const part = catalog.byPartNumber.get(c.partNumber);
    if (!part || part.kind !== 'cover-plate') continue;
    for (const p of section.positions) covered.add(`${p}:${c.side}`);
  }
  const acc: Record<Zone, { before: number; after: number; filled: number; total: number }> = {
    threshing: { before: 0, after: 0, filled: 0, total: 0 },
    separating: { before: 0, after: 0, filled: 0, total: 0 },
  };
  for (const p of family.family.positions) acc[p.zone].total += 2;
  for (const e of layout.elements) {
    const zone = family.zoneByPosition[e.position];
    const part = catalog.byPartNumber.get(e.partNumber);
    if (!zone || !part || part.kind !== 'element') continue;
    const a = acc[zone];
    a.filled += 1;
    a.before += part.openArea;
    a.after += covered.has(`${e.position}:${e.side}`) ? part.openArea * (1 - COVER_PLATE_CLOSED_SHARE) : part.openArea;
  }
  const finish = (a: (typeof acc)[Zone]): ZoneOpenArea => ({
    before: a.filled ? a.before / a.filled : 0,
    after: a.filled ? a.after / a.filled : 0,
    filled: a.filled,
    total: a.total,
  });
  return { threshing: finish(acc.threshing), separating: finish(acc.separating) };
}

// ---------------------------------------------------------------------------------------------
// Threshing aggressiveness index

/** How hard each element type rubs the crop, 0..1 (Cagewright's scale). */
export const ELEMENT_AGGRESSIVENESS: Readonly<Record<ElementType, number>> = {
  'close-bar': 1.0,
  'fine-wire': 0.8,
  blank: 0.6,
  'wide-wire': 0.55,
  'skip-wire': 0.4,
  'round-bar': 0.35,
  perforated: 0.25,
};

/** Slower vanes keep crop longer in the threshing zone. */
export const VANE_AGGRESSIVENESS: Readonly<Record<VaneSetting, number>> = {
  'very-slow': 1.3,
  slow: 1.15,
  medium: 1.0,
  fast: 0.85,
};

export const AGGRESSIVENESS_REF_TIP_SPEED_MS = 25;
export const AGGRESSIVENESS_REF_CLEARANCE_MM = 15;

export interface AggressivenessInput {
  /** Element types in the threshing zone's half-positions; null for an empty one. */
  threshingElements: readonly (ElementType | null)[];
  tipSpeed: MetresPerSecond;
  clearanceMm: number;
  vaneSetting: VaneSetting;
  coverPlates: number;
  straightBars: number;
}

/**
 * Threshing aggressiveness index (Cagewright's model, for comparing layouts; no published source):
 *
 *   AI = 100 × E × (v / 25 m/s) × clamp(√(15 mm / c), 0.5, 2) × V × (1 + 0.1·P + 0.05·S)
 *
 * E: mean ELEMENT_AGGRESSIVENESS over the threshing zone's half-positions (empty counts 0);
 * v: rotor tip speed; c: concave clearance; V: VANE_AGGRESSIVENESS of the vane setting;
 * P: cover plates fitted; S: straight interrupter bars fitted.
 * A fine-wire threshing zone at 25 m/s, 15 mm, medium vanes and no plates scores 80.
 */
export function aggressivenessIndex(i: AggressivenessInput): number {
  const n = i.threshingElements.length;
  let sum = 0;
  for (const t of i.threshingElements) if (t) sum += ELEMENT_AGGRESSIVENESS[t];
  const e = n ? sum / n : 0;
  const speed = i.tipSpeed / AGGRESSIVENESS_REF_TIP_SPEED_MS;
  const clearance = Math.min(2, Math.max(0.5, Math.sqrt(AGGRESSIVENESS_REF_CLEARANCE_MM / i.clearanceMm)));
  const extras = 1 + 0.1 * i.coverPlates + 0.05 * i.straightBars;
  return 100 * e * speed * clearance * VANE_AGGRESSIVENESS[i.vaneSetting] * extras;
}

// ---------------------------------------------------------------------------------------------
// Capacity factor

/** The slim drum gives about 20 % more capacity in heavy, tough crops (common practice). */
export const SLIM_DRUM_CAPACITY_GAIN = 0.2;

export interface CapacityFactor {
  /** The product of the parts below; 1 = a full-drum cage without cover plates. */
  value: number;
  drum: number;
  separation: number;
}

/**
 * Capacity factor (Cagewright's model): drum × separation, where drum = 1.2 for the slim drum in
 * a heavy-straw crop (common practice) and 1 otherwise, and separation = the separating zone's
 * open area after cover plates over its open area before them (cover plates trade capacity for
 * threshing).
 */
export function capacityFactor(drumId: string, crop: CropProgram, openArea: OpenAreaByZone): CapacityFactor {
  const drum = drumId === 'slim' && crop.heavyStraw ? 1 + SLIM_DRUM_CAPACITY_GAIN : 1;
  const sep = openArea.separating;
  const separation = sep.before > 0 ? sep.after / sep.before : 1;
  return { value: drum * separation, drum, separation };
}

/** Element types in the threshing zone, one per half-position (null when empty or unknown). */
export function threshingElementTypes(layout: Layout, family: FamilyIndex, catalog: CatalogIndex): (ElementType | null)[] {
  const byPlace = new Map<string, ElementPart>();
  for (const e of layout.elements) {
    const part = catalog.byPartNumber.get(e.partNumber);
    if (part && part.kind === 'element') byPlace.set(`${e.position}:${e.side}`, part);
  }
  const out: (ElementType | null)[] = [];
  for (const p of family.family.positions) {
    if (p.zone !== 'threshing') continue;
    for (const side of ['left', 'right'] as const) out.push(byPlace.get(`${p.index}:${side}`)?.elementType ?? null);
  }
  return out;
}
