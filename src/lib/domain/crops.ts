/**
 * Crop programs: what the cage needs to know about each crop.
 *
 * Every number carries its source. "[mem]" marks a value from memory with no source found
 * (good enough for demo defaults, never a test's expected value); "common practice" marks a fact
 * of the trade with no published source.
 */
import { z } from 'zod';
import { cropIdSchema, elementTypeSchema, type CropId, type ElementType } from './schemas';
import { bushelsPerTonne } from './units';

const sourced = z.object({ value: z.number().positive(), source: z.string().min(1) });
export type Sourced = z.infer<typeof sourced>;

export const kernelSizeSchema = z.object({
  lengthMm: z.number().positive(),
  widthMm: z.number().positive(),
  thicknessMm: z.number().positive(),
  source: z.string().min(1),
});
export type KernelSize = z.infer<typeof kernelSizeSchema>;

export const cropProgramSchema = z.object({
  id: cropIdSchema,
  name: z.string(),
  kernel: kernelSizeSchema,
  /** min(width, thickness): the size that must get through an opening. */
  passingSizeMm: z.number().positive(),
  /** Thousand-kernel weight, grams. */
  tkwG: sourced,
  /** Cracks or splits easily: keep aggressive elements away (common practice). */
  fragile: z.boolean(),
  /** 'hard': heads or pods hold their grain; open threshing elements leave whitecaps. */
  threshability: z.enum(['easy', 'normal', 'hard']),
  /** Heavy, tough straw where the slim drum's extra capacity shows (common practice). */
  heavyStraw: z.boolean(),
  /** Long fibres that rope around the rotor. */
  stringy: z.boolean(),
  suggested: z.object({ threshing: elementTypeSchema, separating: elementTypeSchema }),
  /** Blank plates (no openings) have a place in this crop's cage (common practice: sunflower). */
  blankPlatesUsed: z.boolean().optional(),
  rotorBars: z.object({
    /** Straight interrupter bars across in-line rasp bars: wanted only where grain hides in husks. */
    straight: z.enum(['wanted', 'not-needed']),
    /** Discharge bars at the rear against roping. */
    discharge: z.enum(['wanted', 'not-needed']),
    advice: z.string(),
  }),
  /** Rotor tip-speed window, m/s; rpm is derived from the rotor diameter. */
  tipSpeedMs: z.object({ min: z.number().positive(), max: z.number().positive(), source: z.string().min(1) }),
  bushel: z.object({
    /** US bushel weight, lb/bu. */
    usLb: sourced,
    /** Canadian bushels per metric tonne, where published. */
    canadaPerTonne: sourced.nullable(),
  }),
  /** A published kernels-per-area rule of thumb: kernels per ft² ≈ 1 bu/ac loss. */
  publishedLossCount: sourced.nullable(),
  /** Where to start the concave clearance, mm (the starter layout uses it). */
  startClearanceMm: sourced,
  clearanceAdvice: z.string(),
  notes: z.string().optional(),
});
export type CropProgram = z.infer<typeof cropProgramSchema>;

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
  manitoba: 'Manitoba Agriculture: 300–400 rpm on rotary machines (11.9–15.9 m/s on a 760 mm rotor)',
  agrophysics1994: 'International Agrophysics (1994): 9.04–10.17 m/s optimum for dry beans (peg drum)',
  stepon: 'Steponavičius et al., J. Vibroengineering (2017): corn ears tested at 11.0–17.3 m/s',
  ndsuEb25: 'NDSU Extension EB-25 (2007): 220 rpm on a 30 in rotor (8.8 m/s); window width [mem]',
  memSmall: '[mem] small grains ≈ 25–35 m/s',
  memCornSoy: '[mem] corn and soybeans ≈ 10–20 m/s',
  memPulse: '[mem] pulses and beans ≈ 7–15 m/s',
  mem: '[mem]',
} as const;

const canada = (buPerTonne: number) => ({ value: buPerTonne, source: SRC.alberta });

const WIDE_CLEARANCE = 'Start with the rotor slow and the concave wide; tighten only as far as needed (Iowa State University Extension, Hanna). Fix unthreshed loss with clearance before speed (University of Wisconsin, "Combine Adjustments").';

type Draft = Omit<CropProgram, 'passingSizeMm'>;

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
    rotorBars: { straight: 'not-needed', discharge: 'not-needed', advice: 'Rasp bars only; straight bars cost power and are not needed in small grains (common practice).' },
    tipSpeedMs: { min: 25, max: 35, source: SRC.memSmall },
    bushel: { usLb: { value: 60, source: SRC.uw }, canadaPerTonne: canada(36.744) },
    publishedLossCount: { value: 20, source: `${SRC.smallgrains}, hard red spring wheat` },
    startClearanceMm: { value: 10, source: '[mem]' },
    clearanceAdvice: WIDE_CLEARANCE,
    notes: 'Harrison, Canadian Agricultural Engineering 17(1):55 (1975): wheat at 10 % moisture threshed best below 22.3 m/s on a 533 mm cylinder. Powered vanes moved through their range clean up hard-threshing wheat (common practice).',
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
    tipSpeedMs: { min: 25, max: 35, source: SRC.memSmall },
    bushel: { usLb: { value: 48, source: SRC.uw }, canadaPerTonne: canada(45.93) },
    publishedLossCount: { value: 14, source: SRC.smallgrains },
    startClearanceMm: { value: 12, source: '[mem]' },
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
    tipSpeedMs: { min: 25, max: 35, source: SRC.memSmall },
    bushel: { usLb: { value: 32, source: SRC.uw }, canadaPerTonne: { value: 64.842, source: `${SRC.alberta}; Canadian oats bushel is 34 lb` } },
    publishedLossCount: { value: 10, source: SRC.smallgrains },
    startClearanceMm: { value: 12, source: '[mem]' },
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
    rotorBars: { straight: 'not-needed', discharge: 'not-needed', advice: 'Rasp bars only; straight bars are not needed in canola (common practice).' },
    tipSpeedMs: { min: 18, max: 28, source: SRC.mem },
    bushel: {
      usLb: { value: 50, source: `derived from ${SRC.alberta}: 44.0920 bu/t is a 50 lb bushel` },
      canadaPerTonne: canada(44.092),
    },
    publishedLossCount: null,
    startClearanceMm: { value: 15, source: '[mem]' },
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
    rotorBars: { straight: 'not-needed', discharge: 'not-needed', advice: 'Rasp bars only; pulses do not need straight bars (common practice).' },
    tipSpeedMs: { min: 11.9, max: 15.9, source: SRC.manitoba },
    bushel: { usLb: { value: 60, source: `derived from ${SRC.alberta}: 36.7440 bu/t is a 60 lb bushel` }, canadaPerTonne: canada(36.744) },
    publishedLossCount: null,
    startClearanceMm: { value: 25, source: '[mem]' },
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
    tipSpeedMs: { min: 7, max: 15, source: SRC.memPulse },
    bushel: { usLb: { value: 60, source: '[mem] 60 lb' }, canadaPerTonne: null },
    publishedLossCount: null,
    startClearanceMm: { value: 20, source: '[mem]' },
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
    tipSpeedMs: { min: 10, max: 20, source: SRC.memCornSoy },
    bushel: { usLb: { value: 60, source: SRC.uw }, canadaPerTonne: canada(36.744) },
    publishedLossCount: { value: 4, source: SRC.isu },
    startClearanceMm: { value: 20, source: '[mem]' },
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
    tipSpeedMs: { min: 9.04, max: 10.17, source: SRC.agrophysics1994 },
    bushel: { usLb: { value: 60, source: '[mem] 60 lb' }, canadaPerTonne: null },
    publishedLossCount: null,
    startClearanceMm: { value: 30, source: '[mem]' },
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
      advice: 'Straight interrupter bars across the in-line rasp bars slow the crop so kernels hidden in husks come free (common practice); spike rasp bars take their place when they come off.',
    },
    tipSpeedMs: { min: 11, max: 17.3, source: SRC.stepon },
    bushel: { usLb: { value: 56, source: SRC.uw }, canadaPerTonne: canada(39.368) },
    publishedLossCount: { value: 2, source: SRC.isu },
    startClearanceMm: { value: 25, source: '[mem] about the cob diameter (20–30 mm)' },
    clearanceAdvice: 'Clearance about the cob diameter (20–30 mm, a rule of thumb with no published source); round-bar elements for high-moisture corn (common practice).',
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
    tipSpeedMs: { min: 25, max: 35, source: SRC.memSmall },
    bushel: { usLb: { value: 45, source: SRC.usda }, canadaPerTonne: null },
    publishedLossCount: null,
    startClearanceMm: { value: 10, source: '[mem]' },
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
    tipSpeedMs: { min: 7.5, max: 10.5, source: SRC.ndsuEb25 },
    bushel: {
      usLb: { value: 30, source: `derived from ${SRC.alberta}: 73.4870 bu/t is a 30 lb bushel` },
      canadaPerTonne: canada(73.487),
    },
    publishedLossCount: null,
    startClearanceMm: { value: 25, source: '[mem]' },
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
    tipSpeedMs: { min: 20, max: 30, source: SRC.mem },
    bushel: { usLb: { value: 24, source: '[mem] varies widely by species' }, canadaPerTonne: null },
    publishedLossCount: null,
    startClearanceMm: { value: 8, source: '[mem]' },
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
    tipSpeedMs: { min: 18, max: 28, source: SRC.mem },
    bushel: { usLb: { value: 56, source: SRC.usda }, canadaPerTonne: null },
    publishedLossCount: null,
    startClearanceMm: { value: 15, source: '[mem]' },
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
      advice: 'Discharge bars at the rear move stringy crop that ropes; an extra pair one position ahead, 180° from the rear ones, cuts rotor loss (common practice).',
    },
    tipSpeedMs: { min: 15, max: 25, source: SRC.mem },
    bushel: { usLb: { value: 44, source: '[mem]' }, canadaPerTonne: null },
    publishedLossCount: null,
    startClearanceMm: { value: 20, source: '[mem]' },
    clearanceAdvice: WIDE_CLEARANCE,
  },
];

function finish(d: Draft): CropProgram {
  return { ...d, passingSizeMm: Math.min(d.kernel.widthMm, d.kernel.thicknessMm) };
}

export const cropPrograms: Readonly<Record<CropId, CropProgram>> = Object.freeze(
  Object.fromEntries(drafts.map((d) => [d.id, finish(d)])) as Record<CropId, CropProgram>,
);

export const cropIds: readonly CropId[] = cropIdSchema.options;

export function cropProgram(id: CropId): CropProgram {
  return cropPrograms[id];
}

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
  return source.replace(/\[mem\]\s*/g, 'rule of thumb, no published source: ').replace(/: $/, '').trim();
}
