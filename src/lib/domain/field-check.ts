/**
 * The field check: kernels counted in frames on the ground, turned into pre-harvest, header and
 * machine loss, in bu/ac, kg/ha, % of the expected yield and money, judged against a target, with
 * advice on where to look next.
 *
 * Where the kernels lie (the counting procedure of smallgrains.org, "How to Estimate Grain Harvest
 * Losses", 2003, and Iowa State University Extension PM 573/574):
 * - in front of the header, in standing crop: what fell before harvest (pre-harvest loss), P;
 * - behind the header, where the machine's spread has not landed: P plus the header's loss, H;
 * - behind the machine, in the spread: P and the header's loss at their own density, plus what
 *   the machine threw out, concentrated into the spread width, T.
 * So header loss = H − P and machine loss = (T − H) ÷ (cut width ÷ spread width): the total minus
 * the header and pre-harvest kernels, corrected for the concentration of the machine's part only.
 */
import { z } from 'zod';
import { cropPrograms, type CropProgram } from './crops';
import { cropLossBasis, weightBasis, type LossBasis } from './loss';
import { cropIdSchema, type CropId } from './schemas';
import { lossTargetFor, lossAdvice, type AdviceItem, type LossSign, lossSignSchema } from './field-check-advice';
import {
  FT2_PER_M2,
  KG_PER_LB,
  M_PER_FT,
  buPerAc,
  buPerAcToKgPerHa,
  kgPerHa,
  kgPerHaToBuPerAc,
  perFt2ToPerM2,
  perM2ToPerFt2,
} from './units';

export * from './field-check-advice';

// ---------------------------------------------------------------------------------------------
// Input

/** Kernels counted in one frame. */
const kernelCount = z.int({ error: 'give a whole number of kernels' }).min(0, 'a count cannot be negative').max(100_000);

const positive = (max: number, what: string) =>
  z
    .number({ error: `give the ${what} as a number` })
    .positive(`the ${what} must be greater than zero`)
    .max(max, `the ${what} is too large`);

/** The frame laid on the ground: its area, or its two sides. */
export const frameSchema = z.discriminatedUnion('by', [
  z.object({ by: z.literal('area'), area: positive(100, 'frame area'), unit: z.enum(['ft2', 'm2']) }),
  z.object({
    by: z.literal('sides'),
    length: positive(1000, 'frame length'),
    width: positive(1000, 'frame width'),
    unit: z.enum(['in', 'ft', 'cm', 'm']),
  }),
]);
export type Frame = z.infer<typeof frameSchema>;

/** Counts of several frames at one place; they are averaged. */
const countsSchema = z.array(kernelCount).min(1, 'count at least one frame').max(30, 'at most 30 frames');

/** Where the kernels-per-area figure for 1 bu/ac comes from. */
export const basisInputSchema = z.discriminatedUnion('kind', [
  /** The crop's published count where there is one, else the weight rule with the crop's TKW. */
  z.object({ kind: z.literal('default') }),
  /** The operator's own thousand-kernel weight, grams. */
  z.object({ kind: z.literal('own-weight'), tkwG: positive(2000, 'thousand-kernel weight') }),
  /** A count the operator types: kernels per ft² or m² for 1 bu/ac. */
  z.object({ kind: z.literal('typed'), kernels: positive(100_000, 'kernel count for 1 bu/ac'), per: z.enum(['ft2', 'm2']) }),
]);
export type BasisInput = z.infer<typeof basisInputSchema>;

export const lossCheckInputBaseSchema = z.object({
  crop: cropIdSchema,
  frame: frameSchema,
  counts: z.object({
    /** In front of the header, in standing crop. */
    preHarvest: countsSchema,
    /** Behind the header, outside the machine's spread. */
    header: countsSchema,
    /** Behind the machine, in its spread. */
    behindMachine: countsSchema,
  }),
  cutWidth: positive(200, 'cut width'),
  /** The width the machine spreads or windrows its residue over. */
  spreadWidth: positive(200, 'spread width'),
  widthUnit: z.enum(['ft', 'm']),
  basis: basisInputSchema.default({ kind: 'default' }),
  expectedYield: z.object({ value: positive(100_000, 'expected yield'), unit: z.enum(['bu/ac', 'kg/ha']) }),
  price: z
    .object({
      value: z.number({ error: 'give the price as a number' }).min(0, 'the price cannot be negative').max(1_000_000),
      per: z.enum(['bu', 't']),
      currency: z
        .string()
        .trim()
        .max(8)
        .regex(/^[^<>&"]*$/, 'use letters or a symbol')
        .default(''),
    })
    .nullable()
    .optional(),
  /** The user's own target, % of the expected yield lost by harvest (header + machine). */
  targetPct: z
    .number({ error: 'give the target as a number' })
    .positive('the target must be greater than zero')
    .max(50)
    .nullable()
    .optional(),
  /** What the operator saw behind the machine. */
  signs: z.array(lossSignSchema).max(3).default([]),
});

/** Cross-field checks of the widths (the API's record schema runs them too). */
export function checkWidths(v: { cutWidth: number; spreadWidth: number; widthUnit: 'ft' | 'm' }, ctx: z.RefinementCtx) {
  // A spread narrower than a foot is no spread: most likely a slip of the unit.
  const narrowest = v.widthUnit === 'ft' ? 1 : 0.3;
  if (v.spreadWidth < narrowest)
    ctx.addIssue({ code: 'custom', path: ['spreadWidth'], message: `the spread width must be at least ${narrowest} ${v.widthUnit}` });
  else if (v.spreadWidth > v.cutWidth)
    ctx.addIssue({ code: 'custom', path: ['spreadWidth'], message: 'the spread width cannot be wider than the cut width' });
}

export const lossCheckInputSchema = lossCheckInputBaseSchema.superRefine(checkWidths);
export type LossCheckInput = z.input<typeof lossCheckInputSchema>;
export type LossCheckParsed = z.output<typeof lossCheckInputSchema>;

// ---------------------------------------------------------------------------------------------
// Computation

const M2_PER_FT2 = 1 / FT2_PER_M2;
const LENGTH_M: Record<'in' | 'ft' | 'cm' | 'm', number> = { in: 0.0254, ft: M_PER_FT, cm: 0.01, m: 1 };

/** The frame's area in ft². */
export function frameAreaFt2(frame: Frame): number {
  if (frame.by === 'area') return frame.unit === 'ft2' ? frame.area : frame.area * FT2_PER_M2;
  const m2 = frame.length * LENGTH_M[frame.unit] * frame.width * LENGTH_M[frame.unit];
  return m2 * FT2_PER_M2;
}

/** Kernels per ft² from the counts of several frames of one size (their mean over the frame). */
export function kernelsPerFt2(counts: readonly number[], areaFt2: number): number {
  if (counts.length === 0) throw new RangeError('count at least one frame');
  if (counts.some((c) => !(c >= 0))) throw new RangeError('a count cannot be negative');
  if (!(areaFt2 > 0)) throw new RangeError('the frame area must be positive');
  return counts.reduce((a, b) => a + b, 0) / counts.length / areaFt2;
}

export function basisFor(crop: CropProgram, input: BasisInput): LossBasis {
  switch (input.kind) {
    case 'default':
      return cropLossBasis(crop);
    case 'own-weight':
      return weightBasis(crop, input.tkwG);
    case 'typed': {
      const ft2 = input.per === 'ft2' ? input.kernels : perM2ToPerFt2(input.kernels);
      return { kind: 'typed', kernelsPerFt2PerBuAc: ft2, kernelsPerM2PerBuAc: perFt2ToPerM2(ft2), tkwG: null, source: 'your own count' };
    }
  }
}

/** One loss figure in every unit the field check shows. */
export interface LossFigure {
  kernelsPerFt2: number;
  kernelsPerM2: number;
  buPerAc: number;
  kgPerHa: number;
  /** % of the expected yield. */
  pctOfYield: number;
  /** Money per acre and per hectare at the price entered; null without a price. */
  moneyPerAc: number | null;
  moneyPerHa: number | null;
}

export type LossPart = 'preHarvest' | 'header' | 'machine';
export type CheckNote = 'header-below-standing' | 'machine-below-header';

export interface LossCheckResult {
  crop: CropId;
  basis: LossBasis;
  lbPerBu: number;
  frameAreaFt2: number;
  frameAreaM2: number;
  /** Cut width ÷ spread width. */
  concentrationRatio: number;
  /** Kernels in one frame that make 1 bu/ac: in standing crop or behind the header, and in the spread. */
  kernelsPerFrameFor1BuAc: { outsideSpread: number; inSpread: number };
  /** Mean kernels per ft² as counted at each place (before any subtraction). */
  counted: { preHarvest: number; header: number; behindMachine: number };
  preHarvest: LossFigure;
  header: LossFigure;
  machine: LossFigure;
  /** Header + machine: what harvesting lost (what the verdict judges). */
  harvest: LossFigure;
  /** Everything on the ground: pre-harvest + header + machine. */
  total: LossFigure;
  expectedYieldBuPerAc: number;
  expectedYieldKgPerHa: number;
  price: { value: number; per: 'bu' | 't'; currency: string } | null;
  target: { pct: number; source: string; isDefault: boolean };
  verdict: 'within' | 'over';
  /** Share of the harvest loss at the header (0..1), null when nothing was lost. */
  headerShare: number | null;
  advice: AdviceItem[];
  notes: CheckNote[];
}

/** Runs the field check. The input must have passed `lossCheckInputSchema`. */
export function computeLossCheck(raw: LossCheckInput): LossCheckResult {
  const input = lossCheckInputSchema.parse(raw);
  const crop = cropPrograms[input.crop];
  const basis = basisFor(crop, input.basis);
  const lbPerBu = crop.bushel.usLb.value;
  const area = frameAreaFt2(input.frame);
  const ratio = input.cutWidth / input.spreadWidth;
  if (!(ratio >= 1)) throw new RangeError('the spread width cannot be wider than the cut width');

  const P = kernelsPerFt2(input.counts.preHarvest, area);
  const H = kernelsPerFt2(input.counts.header, area);
  const T = kernelsPerFt2(input.counts.behindMachine, area);
  const notes: CheckNote[] = [];
  if (H < P) notes.push('header-below-standing');
  if (T < H) notes.push('machine-below-header');
  const parts: Record<LossPart, number> = {
    preHarvest: P,
    header: Math.max(0, H - P),
    machine: Math.max(0, T - H) / ratio,
  };

  const yieldBuAc =
    input.expectedYield.unit === 'bu/ac' ? input.expectedYield.value : kgPerHaToBuPerAc(kgPerHa(input.expectedYield.value), lbPerBu);
  const price = input.price ?? null;
  /** Money per bushel at the price entered (a tonne holds 1000 / (lb/bu × 0.45359237) bushels). */
  const pricePerBu = price ? (price.per === 'bu' ? price.value : (price.value * lbPerBu * KG_PER_LB) / 1000) : null;

  const figure = (perFt2: number): LossFigure => {
    const bu = perFt2 / basis.kernelsPerFt2PerBuAc;
    const kg = buPerAcToKgPerHa(buPerAc(bu), lbPerBu);
    return {
      kernelsPerFt2: perFt2,
      kernelsPerM2: perFt2ToPerM2(perFt2),
      buPerAc: bu,
      kgPerHa: kg,
      pctOfYield: (bu / yieldBuAc) * 100,
      moneyPerAc: pricePerBu === null ? null : bu * pricePerBu,
      moneyPerHa: pricePerBu === null ? null : bu * pricePerBu * (10_000 / (43_560 * M_PER_FT * M_PER_FT)),
    };
  };

  const harvestFt2 = parts.header + parts.machine;
  const harvest = figure(harvestFt2);
  const defaultTarget = lossTargetFor(input.crop);
  const target = input.targetPct
    ? { pct: input.targetPct, source: 'your own target', isDefault: false }
    : { pct: defaultTarget.pct, source: defaultTarget.source, isDefault: true };
  const verdict = harvest.pctOfYield <= target.pct + 1e-9 ? 'within' : 'over';
  const headerShare = harvestFt2 > 0 ? parts.header / harvestFt2 : null;

  return {
    crop: input.crop,
    basis,
    lbPerBu,
    frameAreaFt2: area,
    frameAreaM2: area * M2_PER_FT2,
    concentrationRatio: ratio,
    kernelsPerFrameFor1BuAc: { outsideSpread: basis.kernelsPerFt2PerBuAc * area, inSpread: basis.kernelsPerFt2PerBuAc * area * ratio },
    counted: { preHarvest: P, header: H, behindMachine: T },
    preHarvest: figure(parts.preHarvest),
    header: figure(parts.header),
    machine: figure(parts.machine),
    harvest,
    total: figure(parts.preHarvest + harvestFt2),
    expectedYieldBuPerAc: yieldBuAc,
    expectedYieldKgPerHa: buPerAcToKgPerHa(buPerAc(yieldBuAc), lbPerBu),
    price: price ? { value: price.value, per: price.per, currency: price.currency } : null,
    target,
    verdict,
    headerShare,
    advice: lossAdvice({
      verdict,
      headerShare,
      machinePct: figure(parts.machine).pctOfYield,
      targetPct: target.pct,
      signs: input.signs as LossSign[],
    }),
    notes,
  };
}
