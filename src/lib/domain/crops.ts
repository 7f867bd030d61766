/**
 * Crop programs: what the cage needs to know about each crop.
 *
 * Every number carries its source. "[mem]" marks a value from memory with no source found
 * (good enough for demo defaults, never a test's expected value); "common practice" marks a fact
 * of the trade with no published source.
 */
import type { CropId, ElementType } from './schemas';
import type { ClearanceWindow, CropProgram, KernelSize, Sourced, SpeedRange } from './crop-schemas';
import { bushelsPerTonne } from './units';
import { CROP_ID_VALUES } from './values';

export type { ClearanceWindow, CropProgram, KernelSize, Sourced, SpeedRange };

// Sources, written once so each citation reads the same everywhere.
const SRC = {
  tabatabaeefar: 'Tabatabaeefar, Int. Agrophysics 17:207 (2003)',
  tavakoli: 'Tavakoli et al., IJABE 2(4):84 (2009)',
  zareiforoush: 'Zareiforoush et al., RJASET (2009)',
  kibar: 'Kibar & Öztürk, Int. Agrophysics 22:239 (2008)',
  sezer: 'Sezer et al., African J. Biotechnology (dent maize)',
  yalcin: 'Yalçın et al., J. Food Engineering 79:731 (2007)',
  seifi: 'Seifi & Alimardani, Modern Applied Science',
  razavi: 'Razavi et al., J. Agric. Sci. Technol. 11:309 (2009)',
  isik2007: 'Isik, Pakistan J. Biological Sciences (2007)',
  sallam: 'Sallam & Al-mosanief (2022)',
  isik2013: 'Isik, J. Food Agric. Environ. (2013), large dry bean',
  uw: 'University of Wisconsin Extension, "Harvest Time Math 101" (US standard)',
  usda: 'USDA standard bushel weight (via "Test weight")',
  alberta: 'Government of Alberta, after Canada Grains Council (1999)',
  smallgrains: 'smallgrains.org, "How to Estimate Grain Harvest Losses" (2003)',
  isu: 'Iowa State University Extension (Hanna, 2017)',
  ccc: 'Canola Council of Canada (2012) seeds/ft² table',
  manitoba: 'Manitoba Agriculture, field pea harvest guidance: 300–400 rpm on rotary machines (11.9–15.9 m/s on a 760 mm rotor)',
  ndsuPeas:
    'North Dakota State University Extension, Crop & Pest Report (30 July 2008), field pea harvest: 350–500 rpm, the lowest speed that threshes (on a 762 mm rotor)',
  peasStart:
    'where NDSU Crop & Pest Report (30 July 2008, 350–500 rpm) and Manitoba Agriculture (300–400 rpm) agree: 350–400 rpm, starting at the lowest speed that threshes',
  agrophysics1994: 'International Agrophysics (1994), dry-bean threshing on a peg drum: 9.04–10.17 m/s optimum (laboratory)',
  stepon: 'Steponavičius et al. (2017), corn-ear threshing tests at 11.0, 14.1 and 17.3 m/s, Journal of Vibroengineering',
  steponStart: 'Steponavičius et al. (2017), Journal of Vibroengineering: the lower two of the tested speeds, 11.0 and 14.1 m/s',
  harrisonTested:
    'Harrison (1975), cylinder-speed tests in wheat, Canadian Agricultural Engineering 17(1):55–58: 533 mm cylinder at 700–1,100 rpm (19.5–30.7 m/s)',
  harrisonBest:
    'Harrison (1975), Canadian Agricultural Engineering 17(1):55–58: wheat at 10 % moisture threshed best below 800 rpm (22.3 m/s)',
  ndsuEb25: 'North Dakota State University Extension (2007), EB-25 "Sunflower Production": 220 rpm on a 30 in rotor (8.8 m/s)',
  memSunflower: '[mem] window around the 220 rpm of NDSU Extension EB-25 (2007), 7.5–10.5 m/s',
  memSmall: '[mem] small grains ≈ 25–35 m/s',
  memCornSoy: '[mem] corn and soybeans ≈ 10–20 m/s',
  memPulse: '[mem] pulses and beans ≈ 7–15 m/s',
  memCob: '[mem] about the cob diameter (20–30 mm)',
  cp: 'common practice, no published source',
  cpPeas: 'common practice, no published source; as wide as still threshes all pods (NDSU Crop & Pest Report, 30 July 2008)',
  mem: '[mem]',
} as const;

const canada = (buPerTonne: number) => ({ value: buPerTonne, source: SRC.alberta });

/** Rotary machines measure about 762 mm (30 in) across the rasp bars (common practice). */
const ROTARY_MM = 762;
/** A tip-speed range given in m/s. */
const ms = (minMs: number, maxMs: number, source: string): SpeedRange => ({ minMs, maxMs, source });
/** A range published in rpm on a rotor of `diameterMm`, kept as tip speed. */
const rpmOn = (lo: number, hi: number, diameterMm: number, source: string): SpeedRange => ({
  minMs: (Math.PI * (diameterMm / 1000) * lo) / 60,
  maxMs: (Math.PI * (diameterMm / 1000) * hi) / 60,
  source,
});

const WIDE_CLEARANCE =
  'Start with the rotor at the slow end of its window and the concave at the wide end; tighten only as losses call for it (Iowa State University Extension, Hanna). Fix unthreshed loss with clearance before speed (University of Wisconsin, "Combine Adjustments").';

type Draft = Omit<CropProgram, 'passingSizeMm' | 'vanes'>;

const VANE_SOURCE =
  'common practice, no published source: slower vanes keep crop longer in the threshing zone for hard threshing; faster vanes move it on for capacity';

/** The vane settings that suit a crop and those that work against it (common practice). */
function vanesFor(d: Draft): CropProgram['vanes'] {
  if (d.threshability === 'hard') return { suits: ['very-slow', 'slow'], against: ['fast'], source: VANE_SOURCE };
  if (d.fragile) return { suits: ['medium', 'fast'], against: ['very-slow'], source: VANE_SOURCE };
  if (d.threshability === 'easy') return { suits: ['medium', 'fast'], against: [], source: VANE_SOURCE };
  return { suits: ['slow', 'medium', 'fast'], against: [], source: VANE_SOURCE };
}

const drafts: Draft[] = [
  {
    id: 'wheat',
    name: 'Wheat',
    kernel: { lengthMm: 7.08, widthMm: 3.27, thicknessMm: 2.98, source: SRC.tabatabaeefar },
    tkwG: { value: 29.6, source: SRC.tabatabaeefar },
    fragile: false,
    threshability: 'normal',
    heavyStraw: true,
    stringy: false,
    suggested: { threshing: 'fine-wire', separating: 'wide-wire' },
    rotorBars: {
      straight: 'not-needed',
      discharge: 'not-needed',
      advice: 'Rasp bars only; straight bars cost power and are not needed in small grains (common practice).',
    },
    speed: { ranges: [ms(19.5, 30.7, SRC.harrisonTested)], start: ms(19.5, 22.3, SRC.harrisonBest) },
    bushel: { usLb: { value: 60, source: SRC.uw }, canadaPerTonne: canada(36.744) },
    publishedLossCount: { value: 20, source: `${SRC.smallgrains}, hard red spring wheat` },
    clearanceMm: { minMm: 6, maxMm: 18, source: SRC.cp },
    clearanceAdvice: WIDE_CLEARANCE,
    notes:
      'Harrison, Canadian Agricultural Engineering 17(1):55 (1975): wheat at 10 % moisture threshed best below 22.3 m/s on a 533 mm cylinder. Powered vanes moved through their range clean up hard-threshing wheat (common practice).',
  },
  {
    id: 'barley',
    name: 'Barley',
    kernel: { lengthMm: 8.91, widthMm: 3.3, thicknessMm: 2.58, source: SRC.tavakoli },
    tkwG: { value: 44.5, source: SRC.tavakoli },
    fragile: false,
    threshability: 'normal',
    heavyStraw: true,
    stringy: false,
    suggested: { threshing: 'fine-wire', separating: 'wide-wire' },
    rotorBars: { straight: 'not-needed', discharge: 'not-needed', advice: 'Rasp bars only (common practice).' },
    speed: { ranges: [ms(25, 35, SRC.memSmall)], start: null },
    bushel: { usLb: { value: 48, source: SRC.uw }, canadaPerTonne: canada(45.93) },
    publishedLossCount: { value: 14, source: SRC.smallgrains },
    clearanceMm: { minMm: 6, maxMm: 20, source: SRC.cp },
    clearanceAdvice: WIDE_CLEARANCE,
  },
  {
    id: 'oats',
    name: 'Oats',
    kernel: { lengthMm: 11, widthMm: 2.75, thicknessMm: 2.3, source: '[mem] ≈ 10–12 × 2.5–3 mm; thickness [mem]' },
    tkwG: { value: 32, source: '[mem] 25–40 g' },
    fragile: false,
    threshability: 'normal',
    heavyStraw: true,
    stringy: false,
    suggested: { threshing: 'fine-wire', separating: 'wide-wire' },
    rotorBars: { straight: 'not-needed', discharge: 'not-needed', advice: 'Rasp bars only (common practice).' },
    speed: { ranges: [ms(25, 35, SRC.memSmall)], start: null },
    bushel: {
      usLb: { value: 32, source: SRC.uw },
      canadaPerTonne: { value: 64.842, source: `${SRC.alberta}; Canadian oats bushel is 34 lb` },
    },
    publishedLossCount: { value: 10, source: SRC.smallgrains },
    clearanceMm: { minMm: 6, maxMm: 20, source: SRC.cp },
    clearanceAdvice: WIDE_CLEARANCE,
  },
  {
    id: 'canola',
    name: 'Canola',
    kernel: { lengthMm: 2.26, widthMm: 1.91, thicknessMm: 1.91, source: `${SRC.razavi}: L 1.93–2.26, Ø 1.48–1.91 (upper bounds used)` },
    tkwG: { value: 4, source: `${SRC.razavi}: 3.06–4.84 g (a value inside the range)` },
    fragile: false,
    threshability: 'easy',
    heavyStraw: false,
    stringy: false,
    suggested: { threshing: 'fine-wire', separating: 'wide-wire' },
    rotorBars: {
      straight: 'not-needed',
      discharge: 'not-needed',
      advice: 'Rasp bars only; straight bars are not needed in canola (common practice).',
    },
    speed: { ranges: [ms(18, 28, SRC.mem)], start: null },
    bushel: {
      usLb: { value: 50, source: `derived from ${SRC.alberta}: 44.0920 bu/t is a 50 lb bushel` },
      canadaPerTonne: canada(44.092),
    },
    publishedLossCount: null,
    clearanceMm: { minMm: 8, maxMm: 25, source: SRC.cp },
    clearanceAdvice: WIDE_CLEARANCE,
    notes: `Loss counts: ${SRC.ccc} — the seeds/ft² for 1 bu/ac depend on thousand-seed weight.`,
  },
  {
    id: 'field-peas',
    name: 'Field peas',
    kernel: { lengthMm: 7.8, widthMm: 6.41, thicknessMm: 5.55, source: SRC.yalcin },
    tkwG: { value: 177.7, source: SRC.yalcin },
    fragile: true,
    threshability: 'easy',
    heavyStraw: false,
    stringy: false,
    suggested: { threshing: 'round-bar', separating: 'wide-wire' },
    rotorBars: {
      straight: 'not-needed',
      discharge: 'not-needed',
      advice: 'Rasp bars only; pulses do not need straight bars (common practice).',
    },
    speed: {
      ranges: [rpmOn(350, 500, ROTARY_MM, SRC.ndsuPeas), ms(11.9, 15.9, SRC.manitoba)],
      start: rpmOn(350, 400, ROTARY_MM, SRC.peasStart),
    },
    bushel: { usLb: { value: 60, source: `derived from ${SRC.alberta}: 36.7440 bu/t is a 60 lb bushel` }, canadaPerTonne: canada(36.744) },
    publishedLossCount: null,
    clearanceMm: { minMm: 12, maxMm: 35, source: SRC.cpPeas },
    clearanceAdvice: 'Concave as wide as still threshes all pods (NDSU Crop & Pest Report, 2008); lowest rotor speed that threshes.',
    notes: 'NDSU Crop & Pest Report (30 July 2008): 350–500 rpm, the lowest speed that threshes.',
  },
  {
    id: 'lentils',
    name: 'Lentils',
    kernel: { lengthMm: 6.72, widthMm: 6.72, thicknessMm: 2.58, source: `${SRC.isik2007}: Ø 6.72, T 2.58` },
    tkwG: { value: 72, source: SRC.isik2007 },
    fragile: true,
    threshability: 'easy',
    heavyStraw: false,
    stringy: false,
    suggested: { threshing: 'round-bar', separating: 'wide-wire' },
    rotorBars: { straight: 'not-needed', discharge: 'not-needed', advice: 'Rasp bars only (common practice).' },
    speed: { ranges: [ms(7, 15, SRC.memPulse)], start: null },
    bushel: { usLb: { value: 60, source: '[mem] 60 lb' }, canadaPerTonne: null },
    publishedLossCount: null,
    clearanceMm: { minMm: 10, maxMm: 30, source: SRC.cp },
    clearanceAdvice: 'Concave as wide as still threshes all pods (NDSU Crop & Pest Report, 2008, for peas).',
  },
  {
    id: 'soybeans',
    name: 'Soybeans',
    kernel: { lengthMm: 7.24, widthMm: 6.79, thicknessMm: 5.78, source: SRC.kibar },
    tkwG: { value: 160, source: '[mem] 140–180 g' },
    fragile: true,
    threshability: 'easy',
    heavyStraw: false,
    stringy: false,
    suggested: { threshing: 'round-bar', separating: 'wide-wire' },
    rotorBars: { straight: 'not-needed', discharge: 'not-needed', advice: 'Rasp bars only (common practice).' },
    speed: { ranges: [ms(10, 20, SRC.memCornSoy)], start: null },
    bushel: { usLb: { value: 60, source: SRC.uw }, canadaPerTonne: canada(36.744) },
    publishedLossCount: { value: 4, source: SRC.isu },
    clearanceMm: { minMm: 12, maxMm: 30, source: SRC.cp },
    clearanceAdvice: `${WIDE_CLEARANCE} Loss target ≤ 2.75 % in soybeans (University of Nebraska).`,
  },
  {
    id: 'edible-beans',
    name: 'Edible beans',
    kernel: { lengthMm: 17.55, widthMm: 9.75, thicknessMm: 5.83, source: SRC.isik2013 },
    tkwG: { value: 643, source: SRC.isik2013 },
    fragile: true,
    threshability: 'easy',
    heavyStraw: false,
    stringy: false,
    suggested: { threshing: 'perforated', separating: 'wide-wire' },
    rotorBars: { straight: 'not-needed', discharge: 'not-needed', advice: 'Rasp bars only; no straight bars in beans (common practice).' },
    speed: { ranges: [ms(9.04, 10.17, SRC.agrophysics1994), ms(7, 15, SRC.memPulse)], start: ms(9.04, 10.17, SRC.agrophysics1994) },
    bushel: { usLb: { value: 60, source: '[mem] 60 lb' }, canadaPerTonne: null },
    publishedLossCount: null,
    clearanceMm: { minMm: 18, maxMm: 40, source: SRC.cp },
    clearanceAdvice: 'Wide concave and the gentlest elements; beans crack easily (common practice).',
  },
  {
    id: 'corn',
    name: 'Corn',
    kernel: { lengthMm: 10.54, widthMm: 7.26, thicknessMm: 4.57, source: SRC.sezer },
    tkwG: { value: 300, source: '[mem] 250–350 g' },
    fragile: false,
    threshability: 'normal',
    heavyStraw: false,
    stringy: false,
    suggested: { threshing: 'wide-wire', separating: 'skip-wire' },
    rotorBars: {
      straight: 'wanted',
      discharge: 'not-needed',
      advice:
        'Straight interrupter bars across the in-line rasp bars slow the crop so kernels hidden in husks come free (common practice); spike rasp bars take their place when they come off.',
    },
    speed: { ranges: [ms(11, 17.3, SRC.stepon)], start: ms(11, 14.1, SRC.steponStart) },
    bushel: { usLb: { value: 56, source: SRC.uw }, canadaPerTonne: canada(39.368) },
    publishedLossCount: { value: 2, source: SRC.isu },
    clearanceMm: { minMm: 20, maxMm: 30, source: SRC.memCob },
    clearanceAdvice:
      'Clearance about the cob diameter (20–30 mm, a rule of thumb with no published source), starting wide; round-bar elements for high-moisture corn (common practice).',
  },
  {
    id: 'rice',
    name: 'Rice',
    kernel: { lengthMm: 9.83, widthMm: 2.65, thicknessMm: 1.92, source: `${SRC.zareiforoush}, paddy` },
    tkwG: { value: 27.6, source: SRC.zareiforoush },
    fragile: false,
    threshability: 'hard',
    heavyStraw: true,
    stringy: false,
    suggested: { threshing: 'close-bar', separating: 'wide-wire' },
    rotorBars: { straight: 'not-needed', discharge: 'not-needed', advice: 'Rasp bars only (common practice).' },
    speed: { ranges: [ms(25, 35, SRC.memSmall)], start: null },
    bushel: { usLb: { value: 45, source: SRC.usda }, canadaPerTonne: null },
    publishedLossCount: null,
    clearanceMm: { minMm: 6, maxMm: 18, source: SRC.cp },
    clearanceAdvice: WIDE_CLEARANCE,
  },
  {
    id: 'sunflower',
    name: 'Sunflower',
    kernel: { lengthMm: 12.14, widthMm: 5.79, thicknessMm: 3.86, source: SRC.seifi },
    tkwG: { value: 80.3, source: SRC.seifi },
    fragile: false,
    threshability: 'easy',
    heavyStraw: false,
    stringy: false,
    suggested: { threshing: 'round-bar', separating: 'wide-wire' },
    blankPlatesUsed: true,
    rotorBars: { straight: 'not-needed', discharge: 'not-needed', advice: 'Rasp bars only (common practice).' },
    speed: { ranges: [ms(7.5, 10.5, SRC.memSunflower)], start: rpmOn(220, 220, ROTARY_MM, SRC.ndsuEb25) },
    bushel: {
      usLb: { value: 30, source: `derived from ${SRC.alberta}: 73.4870 bu/t is a 30 lb bushel` },
      canadaPerTonne: canada(73.487),
    },
    publishedLossCount: null,
    clearanceMm: { minMm: 18, maxMm: 40, source: SRC.cp },
    clearanceAdvice: 'Wide concave; a blank plate keeps whole heads from dropping through where needed (common practice).',
  },
  {
    id: 'grass-seed',
    name: 'Grass seed',
    kernel: { lengthMm: 6, widthMm: 1.5, thicknessMm: 1, source: '[mem] ryegrass-type seed' },
    tkwG: { value: 2, source: '[mem]' },
    fragile: false,
    threshability: 'hard',
    heavyStraw: true,
    stringy: false,
    suggested: { threshing: 'fine-wire', separating: 'fine-wire' },
    rotorBars: { straight: 'not-needed', discharge: 'not-needed', advice: 'Rasp bars only (common practice).' },
    speed: { ranges: [ms(20, 30, SRC.mem)], start: null },
    bushel: { usLb: { value: 24, source: '[mem] varies widely by species' }, canadaPerTonne: null },
    publishedLossCount: null,
    clearanceMm: { minMm: 4, maxMm: 15, source: SRC.cp },
    clearanceAdvice: WIDE_CLEARANCE,
  },
  {
    id: 'sorghum',
    name: 'Sorghum',
    kernel: { lengthMm: 4.61, widthMm: 4.41, thicknessMm: 3.19, source: SRC.sallam },
    tkwG: { value: 25, source: '[mem] 20–30 g' },
    fragile: false,
    threshability: 'normal',
    heavyStraw: false,
    stringy: false,
    suggested: { threshing: 'fine-wire', separating: 'wide-wire' },
    rotorBars: { straight: 'not-needed', discharge: 'not-needed', advice: 'Rasp bars only (common practice).' },
    speed: { ranges: [ms(18, 28, SRC.mem)], start: null },
    bushel: { usLb: { value: 56, source: SRC.usda }, canadaPerTonne: null },
    publishedLossCount: null,
    clearanceMm: { minMm: 8, maxMm: 25, source: SRC.cp },
    clearanceAdvice: WIDE_CLEARANCE,
  },
  {
    id: 'hemp',
    name: 'Hemp (grain)',
    kernel: { lengthMm: 4.5, widthMm: 3.5, thicknessMm: 3, source: '[mem]' },
    tkwG: { value: 17, source: '[mem] 12–20 g' },
    fragile: false,
    threshability: 'normal',
    heavyStraw: true,
    stringy: true,
    suggested: { threshing: 'wide-wire', separating: 'skip-wire' },
    rotorBars: {
      straight: 'not-needed',
      discharge: 'wanted',
      advice:
        'Discharge bars at the rear move stringy crop that ropes; an extra pair one position ahead, 180° from the rear ones, cuts rotor loss (common practice).',
    },
    speed: { ranges: [ms(15, 25, SRC.mem)], start: null },
    bushel: { usLb: { value: 44, source: '[mem]' }, canadaPerTonne: null },
    publishedLossCount: null,
    clearanceMm: { minMm: 10, maxMm: 30, source: SRC.cp },
    clearanceAdvice: WIDE_CLEARANCE,
  },
];

function finish(d: Draft): CropProgram {
  return { ...d, passingSizeMm: Math.min(d.kernel.widthMm, d.kernel.thicknessMm), vanes: vanesFor(d) };
}

export const cropPrograms: Readonly<Record<CropId, CropProgram>> = Object.freeze(
  Object.fromEntries(drafts.map((d) => [d.id, finish(d)])) as Record<CropId, CropProgram>,
);

export const cropIds: readonly CropId[] = CROP_ID_VALUES;

export function cropProgram(id: CropId): CropProgram {
  return cropPrograms[id];
}

/**
 * Below this concave clearance the rasp bars can touch the concave as the rotor deflects under
 * load: no crop runs there (common practice, no published source).
 */
export const MECHANICAL_MIN_CLEARANCE_MM = 2;

/** Elements that rub hard: bad news for crops that crack (common practice). */
export const AGGRESSIVE_ELEMENT_TYPES: ReadonlySet<ElementType> = new Set(['fine-wire', 'close-bar']);
/** Elements that let heads through early: bad news for hard-threshing crops (common practice). */
export const OPEN_ELEMENT_TYPES: ReadonlySet<ElementType> = new Set(['wide-wire', 'skip-wire', 'round-bar', 'perforated']);

/** The three kernel dimensions, smallest first. */
export function kernelDimsSorted(k: KernelSize): [number, number, number] {
  const d = [k.lengthMm, k.widthMm, k.thicknessMm].sort((a, b) => a - b);
  return [d[0]!, d[1]!, d[2]!];
}

/** Geometric mean diameter (L·W·T)^(1/3), mm. */
export function geometricMeanDiameter(k: KernelSize): number {
  return Math.cbrt(k.lengthMm * k.widthMm * k.thicknessMm);
}

/** Sphericity: geometric mean diameter over length. */
export function sphericity(k: KernelSize): number {
  return geometricMeanDiameter(k) / k.lengthMm;
}

/** Canadian bushels per tonne implied by the US bushel weight (for crops with no published figure). */
export function impliedBushelsPerTonne(crop: CropProgram): number {
  return crop.bushel.canadaPerTonne?.value ?? bushelsPerTonne(crop.bushel.usLb.value);
}

/**
 * A source note as people read it: values kept from memory carry "[mem]" in the data (so tests
 * can tell them apart); on screen that reads as a rule of thumb with no published source.
 */
export function sourceInWords(source: string): string {
  return source
    .replace(/\[mem\]\s*/g, 'rule of thumb, no published source: ')
    .replace(/: $/, '')
    .trim();
}
