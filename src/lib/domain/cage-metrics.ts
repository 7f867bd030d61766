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

/**
 * The larger kernels of a crop. A mean size lets half the kernels through that the larger half
 * cannot pass, so passage is judged against kernels above the mean: each dimension times
 * LARGER_KERNEL_FACTOR. Basis: the one published size range among the crop data, canola's
 * diameter 1.48–1.91 mm (Razavi et al., J. Agric. Sci. Technol. 11:309, 2009), has its upper end
 * 13 % above its middle (1.91 / 1.695 = 1.127); the same spread is assumed for every crop whose
 * source gives a mean only — an extrapolation, said so wherever it is shown. Crops whose stored
 * size already is a published upper bound (canola) take factor 1.
 */
export const LARGER_KERNEL_FACTOR = 1.13;
export const LARGER_KERNEL_BASIS = 'taken 13 % above the mean, the spread of the published canola size range, Razavi et al. 2009';

/**
 * Room a moving kernel needs beyond its own size to drop through an opening: 10 % of that size
 * and at least 0.5 mm. Common practice, no published source: kernels meet the wires sliding and
 * turning, with chaff around them, so an opening only just as wide as the kernel lets few through.
 */
export const PASSAGE_MARGIN_SHARE = 0.1;
export const PASSAGE_MARGIN_MIN_MM = 0.5;
export const PASSAGE_MARGIN_BASIS = '10 % of the kernel size and at least 0.5 mm, common practice, no published source';

/** True when the crop's stored kernel size is already a published upper bound. */
const sizeIsUpperBound = (kernel: KernelSize): boolean => /upper bound/i.test(kernel.source);

export type PassageVerdict = 'passes' | 'tight' | 'blocked' | 'closed';

export interface KernelPassage {
  verdict: PassageVerdict;
  /** slot: the kernel's smallest size must clear the width; hole: its middle size the diameter. */
  opening: 'slot' | 'hole' | null;
  /** The kernel size that decides passage (smallest for a slot, middle for a round hole), mean. */
  meanSizeMm: number;
  /** The same size of the larger kernels. */
  largerSizeMm: number;
  /** The room asked for beyond the larger kernel's size. */
  requiredMarginMm: number;
  /** The opening's decisive dimension (slot width, or hole diameter). */
  openingMm: number | null;
  /** Opening minus the mean kernel (negative: the average kernel does not pass). */
  meanMarginMm: number | null;
  /** Opening minus the larger kernel minus the required margin (negative: tight). */
  spareMm: number | null;
}

/**
 * How the crop's kernels get through an opening, judged on the larger kernels with a margin:
 * closed (no opening), blocked (the mean kernel does not pass, passageMargin ≤ 0), tight (the
 * larger kernels do not pass with PASSAGE_MARGIN to spare) or passes.
 */
export function kernelPassage(opening: Opening | null, kernel: KernelSize): KernelPassage {
  const [d1, d2] = kernelDimsSorted(kernel);
  const factor = sizeIsUpperBound(kernel) ? 1 : LARGER_KERNEL_FACTOR;
  const round = opening !== null && isRoundHole(opening);
  const meanSizeMm = round ? d2 : d1;
  const largerSizeMm = meanSizeMm * factor;
  const requiredMarginMm = Math.max(PASSAGE_MARGIN_MIN_MM, PASSAGE_MARGIN_SHARE * largerSizeMm);
  if (!opening)
    return {
      verdict: 'closed',
      opening: null,
      meanSizeMm,
      largerSizeMm,
      requiredMarginMm,
      openingMm: null,
      meanMarginMm: null,
      spareMm: null,
    };
  const meanMarginMm = passageMargin(opening, kernel)!;
  // The larger kernel must clear both ways (smallest size across, middle size along).
  const spareMm = Math.min(opening.width - d1 * factor, opening.length - d2 * factor) - requiredMarginMm;
  const verdict: PassageVerdict = meanMarginMm <= 0 ? 'blocked' : spareMm < 0 ? 'tight' : 'passes';
  return {
    verdict,
    opening: round ? 'hole' : 'slot',
    meanSizeMm,
    largerSizeMm,
    requiredMarginMm,
    openingMm: opening.width,
    meanMarginMm,
    spareMm,
  };
}

/** An opening whose width equals its length is a round hole (schemas.ts, `openingSchema`). */
export const isRoundHole = (o: Opening): boolean => o.width === o.length;

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
  /** Judged on the larger kernels with a margin (kernelPassage). */
  verdict: PassageVerdict;
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
      verdict: kernelPassage(part.openingMm, crop.kernel).verdict,
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

/**
 * Separating open area of the reference cage the capacity factor is measured against: 50 %, the
 * open area of a wide-wire separating zone (Cagewright's reference, no published source).
 */
export const CAPACITY_REFERENCE_OPEN_AREA = 0.5;

export interface CapacityFactor {
  /** The product of the parts below; 1 = a full-drum cage whose separating zone is 50 % open. */
  value: number;
  drum: number;
  /** Separating open area after cover plates over the reference open area. */
  separation: number;
}

/**
 * Capacity factor (Cagewright's model for comparing layouts, no published source):
 *
 *   capacity = drum × separation,  separation = A_sep / 0.5
 *
 * drum = 1.2 for the slim drum in a heavy-straw crop (common practice), else 1; A_sep = the
 * separating zone's mean open-area fraction after cover plates (openAreaByZone). Grain leaves the
 * straw through the separating zone's openings, so the crop the machine can take before rotor
 * loss climbs is taken as proportional to that open area: a blank separating zone scores 0,
 * wide-wire (50 % open) 1. Limits: linear and relative only — it ignores straw condition,
 * moisture, feed rate, rotor speed and where in the zone the open area lies, and it says nothing
 * about tonnes per hour.
 */
export function capacityFactor(drumId: string, crop: CropProgram, openArea: OpenAreaByZone): CapacityFactor {
  const drum = drumId === 'slim' && crop.heavyStraw ? 1 + SLIM_DRUM_CAPACITY_GAIN : 1;
  const separation = openArea.separating.after / CAPACITY_REFERENCE_OPEN_AREA;
  return { value: drum * separation, drum, separation };
}

/** The capacity model and its limits in a sentence, shown wherever the factor is. */
export const CAPACITY_MODEL_WORDS =
  'Our own comparison scale: separating open area after cover plates against a 50 % open (wide-wire) separating zone, × 1.2 for the slim drum in heavy straw. Linear and relative only: it ignores straw condition, feed rate and speed, and is not tonnes per hour.';

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
