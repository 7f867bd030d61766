/**
 * The crop-path illustration's model: how a class can picture the crop spiralling rearward
 * along the cage, heads being threshed, and grain falling through each element.
 *
 * AN ILLUSTRATION, NOT A SIMULATION. The numbers below are Cagewright's teaching scale, chosen
 * so the picture moves the right way when a layout changes (no published source):
 *  - the vane setting sets how many turns the crop makes over one position (slower vanes: more
 *    turns, so longer in each zone); every cover plate over a position adds to that;
 *  - heads are threshed at a rate that follows how hard the elements rub (the domain's
 *    ELEMENT_AGGRESSIVENESS), how readily the crop threshes, and less so in the separating zone;
 *  - threshed grain falls through a half-position in proportion to its open area after cover
 *    plates (the domain's COVER_PLATE_CLOSED_SHARE), and not at all where the kernel cannot pass
 *    the opening (the domain's passage margin) or through a blank plate;
 *  - what is still loose at the rear goes out over the rotor; heads still whole are whitecaps.
 * Pure: imports only the domain.
 */
import { COVER_PLATE_CLOSED_SHARE, ELEMENT_AGGRESSIVENESS, passageMargin } from '~/lib/domain/cage-metrics';
import { asCatalogIndex, type CatalogIndex } from '~/lib/domain/catalog';
import { cropPrograms } from '~/lib/domain/crops';
import type { CatalogPart, ElementType, Layout, MachineFamily, Side, VaneSetting, Zone } from '~/lib/domain/schemas';

/** Turns the crop makes over one position at each vane setting (teaching scale). */
export const TURNS_PER_POSITION: Readonly<Record<VaneSetting, number>> = {
  'very-slow': 2.9,
  slow: 2.2,
  medium: 1.6,
  fast: 1.2,
};
/** Each cover plate over a position holds the crop back this much longer there. */
export const COVER_PLATE_DWELL = 0.35;
const THRESH_RATE = 1.5;
const THRESHABILITY = { easy: 2, normal: 1, hard: 0.5 } as const;
const SEPARATING_THRESH = 0.35;
const FALL_RATE = 0.7;
const STEPS = 24;

export interface PathHalf {
  side: Side;
  partNumber: string | null;
  elementType: ElementType | null;
  /** Open share of the face after cover plates, 0..1. */
  openArea: number;
  /** A cover plate on this side lies over this half-position. */
  covered: boolean;
  /** The crop's kernel gets through the opening (null: empty or blank plate). */
  kernelPasses: boolean | null;
  /** Share of all grain that falls through here, 0..1. */
  fallShare: number;
}

export interface PathPosition {
  index: number;
  zone: Zone;
  /** Turns the crop makes over this position. */
  turns: number;
  /** Cover plates over this position (either side). */
  plates: number;
  halves: Record<Side, PathHalf>;
  /** Share of the crop still in whole heads on the way in and out. */
  headsIn: number;
  headsOut: number;
  /** Share of all grain threshed here. */
  threshedShare: number;
  /** Given a kernel is loose on entering, the chance it falls through here. */
  fallChance: number;
  /** Share of all grain fallen through the cage up to the end of this position. */
  fallenSoFar: number;
}

export interface CropPathModel {
  crop: string;
  vaneSetting: VaneSetting;
  positions: PathPosition[];
  /** Share of all grain through the cage, carried out over the rotor, and left in heads. */
  fallen: number;
  overRotor: number;
  unthreshed: number;
  /** Seconds a kernel takes from front to rear at the illustration's pace. */
  transitSeconds: number;
}

/** Turns per second in the animation (the illustration's pace, not the rotor's). */
export const TURNS_PER_SECOND = 0.8;

export function cropPathModel(
  family: MachineFamily,
  catalog: readonly CatalogPart[] | CatalogIndex,
  layout: Layout,
  overrides: { vaneSetting?: VaneSetting } = {},
): CropPathModel {
  const cat = asCatalogIndex(catalog);
  const crop = cropPrograms[layout.crop];
  const vaneSetting = overrides.vaneSetting ?? layout.vaneSetting;

  // Cover plates that sit on a seat of their section, and the positions they lie over.
  const coveredHalves = new Set<string>();
  const platesOver = new Map<number, number>();
  for (const c of layout.coverPlates) {
    const section = family.cageTopSections.find((s) => s.index === c.section);
    const part = cat.byPartNumber.get(c.partNumber);
    if (!section || !section.coverPlateSides.includes(c.side) || part?.kind !== 'cover-plate') continue;
    for (const p of section.positions) {
      coveredHalves.add(`${p}:${c.side}`);
      platesOver.set(p, (platesOver.get(p) ?? 0) + 1);
    }
  }

  const placed = new Map(layout.elements.map((e) => [`${e.position}:${e.side}`, e.partNumber] as const));
  const half = (position: number, side: Side): PathHalf => {
    const partNumber = placed.get(`${position}:${side}`) ?? null;
    const part = partNumber ? cat.byPartNumber.get(partNumber) : undefined;
    const element = part?.kind === 'element' ? part : null;
    const covered = coveredHalves.has(`${position}:${side}`);
    const margin = element ? passageMargin(element.openingMm, crop.kernel) : null;
    return {
      side,
      partNumber,
      elementType: element?.elementType ?? null,
      openArea: element ? element.openArea * (covered ? 1 - COVER_PLATE_CLOSED_SHARE : 1) : 0,
      covered,
      kernelPasses: margin === null ? null : margin > 0,
      fallShare: 0,
    };
  };

  let heads = 1;
  let loose = 0;
  let fallen = 0;
  let totalTurns = 0;
  const positions: PathPosition[] = family.positions.map((p) => {
    const halves = { left: half(p.index, 'left'), right: half(p.index, 'right') };
    const plates = platesOver.get(p.index) ?? 0;
    const turns = TURNS_PER_POSITION[vaneSetting] * (1 + COVER_PLATE_DWELL * plates);
    totalTurns += turns;
    const rub =
      ((halves.left.elementType ? ELEMENT_AGGRESSIVENESS[halves.left.elementType] : 0) +
        (halves.right.elementType ? ELEMENT_AGGRESSIVENESS[halves.right.elementType] : 0)) /
      2;
    const threshRate = THRESH_RATE * rub * THRESHABILITY[crop.threshability] * (p.zone === 'threshing' ? 1 : SEPARATING_THRESH);
    const through = (h: PathHalf) => (h.kernelPasses ? FALL_RATE * h.openArea : 0);
    const fallL = through(halves.left);
    const fallR = through(halves.right);
    const headsIn = heads;
    const dt = turns / STEPS;
    for (let i = 0; i < STEPS; i++) {
      const t = heads * (1 - Math.exp(-threshRate * dt));
      heads -= t;
      loose += t;
      const f = loose * (1 - Math.exp(-(fallL + fallR) * dt));
      loose -= f;
      fallen += f;
      if (fallL + fallR > 0) {
        halves.left.fallShare += (f * fallL) / (fallL + fallR);
        halves.right.fallShare += (f * fallR) / (fallL + fallR);
      }
    }
    return {
      index: p.index,
      zone: p.zone,
      turns,
      plates,
      halves,
      headsIn,
      headsOut: heads,
      threshedShare: headsIn - heads,
      fallChance: 1 - Math.exp(-(fallL + fallR) * turns),
      fallenSoFar: fallen,
    };
  });

  return {
    crop: crop.name,
    vaneSetting,
    positions,
    fallen,
    overRotor: loose,
    unthreshed: heads,
    transitSeconds: totalTurns / TURNS_PER_SECOND,
  };
}

// ---------------------------------------------------------------------------------------------
// Fates of single kernels, for the animation

export type KernelFate =
  | { kind: 'falls'; threshedAt: number; threshFrac: number; position: number; side: Side; fallFrac: number }
  | { kind: 'over-rotor'; threshedAt: number; threshFrac: number }
  | { kind: 'unthreshed' };

/** A small seeded generator (mulberry32), so the picture is the same on every showing. */
export function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * Where one kernel is threshed and where it ends up, drawn from the model: threshed in the
 * first position whose threshing catches it, then falling through the first position whose
 * chance catches it (on a side in proportion to the two halves), else out over the rotor.
 */
export function kernelFate(model: CropPathModel, random: () => number): KernelFate {
  let threshedAt = -1;
  for (let i = 0; i < model.positions.length; i++) {
    const p = model.positions[i]!;
    const chance = p.headsIn > 0 ? p.threshedShare / p.headsIn : 0;
    if (random() < chance) {
      threshedAt = i;
      break;
    }
  }
  if (threshedAt < 0) return { kind: 'unthreshed' };
  const threshFrac = random() * 0.8;
  for (let i = threshedAt; i < model.positions.length; i++) {
    const p = model.positions[i]!;
    // Threshed part-way through its position, a kernel has only the rest of it to fall.
    const chance = i === threshedAt ? 1 - Math.pow(1 - p.fallChance, 1 - threshFrac) : p.fallChance;
    if (random() < chance) {
      const l = p.halves.left.kernelPasses ? p.halves.left.openArea : 0;
      const r = p.halves.right.kernelPasses ? p.halves.right.openArea : 0;
      const side: Side = random() * (l + r) < l ? 'left' : 'right';
      const start = i === threshedAt ? threshFrac : 0;
      return { kind: 'falls', threshedAt, threshFrac, position: i, side, fallFrac: start + random() * (1 - start) * 0.9 };
    }
  }
  return { kind: 'over-rotor', threshedAt, threshFrac };
}
