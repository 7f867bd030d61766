/**
 * Grain loss from kernels counted on the ground behind the machine.
 *
 * Rule: kernels per ft² that make 1 bu/ac = (lb/bu × 453.59237 g/lb / 43,560 ft²/ac) / (TKW g / 1000).
 * Counts taken behind the machine lie in the discharge swath, so they are divided by the
 * concentration ratio (cut width / discharge width) before conversion.
 */
import type { CropProgram } from './crops';
import { FT2_PER_ACRE, KG_PER_LB, buPerAc, buPerAcToKgPerHa, perFt2ToPerM2, perM2ToPerFt2, type BuPerAc, type KgPerHa } from './units';

/** Kernels per ft² on the ground equal to a loss of 1 bu/ac. */
export function kernelsPerFt2PerBuAc(lbPerBu: number, tkwG: number): number {
  const gramsPerFt2 = (lbPerBu * KG_PER_LB * 1000) / FT2_PER_ACRE;
  return gramsPerFt2 / (tkwG / 1000);
}

/** Kernels per m² on the ground equal to a loss of 1 bu/ac. */
export function kernelsPerM2PerBuAc(lbPerBu: number, tkwG: number): number {
  return perFt2ToPerM2(kernelsPerFt2PerBuAc(lbPerBu, tkwG));
}

/** Cut width over discharge width (e.g. 30 ft header, 5 ft discharge → 6). */
export function concentrationRatio(cutWidth: number, dischargeWidth: number): number {
  if (!(cutWidth > 0) || !(dischargeWidth > 0)) throw new RangeError('widths must be positive');
  return cutWidth / dischargeWidth;
}

export interface LossInput {
  /** Kernels counted per unit area. */
  count: number;
  /** The area unit the count refers to. */
  per: 'ft2' | 'm2';
  /** 1 when counted in the spread (behind the header); cut/discharge width behind the machine. */
  concentrationRatio: number;
  lbPerBu: number;
  tkwG: number;
  /**
   * Kernels per ft² that make 1 bu/ac when a published count or the operator's own count is the
   * basis; absent, the weight rule above is used with `lbPerBu` and `tkwG`.
   */
  kernelsPerFt2PerBuAc?: number;
  /** Expected yield, bu/ac, to express the loss as a share. */
  yieldBuPerAc?: number;
}

export interface LossEstimate {
  kernelsPerFt2: number;
  kernelsPerFt2PerBuAc: number;
  buPerAc: BuPerAc;
  kgPerHa: KgPerHa;
  /** Loss as a share of yield (0..1), when a yield was given. */
  share: number | null;
}

export function estimateLoss(input: LossInput): LossEstimate {
  if (!(input.concentrationRatio >= 1)) throw new RangeError('concentration ratio must be at least 1');
  if (!(input.count >= 0)) throw new RangeError('count must not be negative');
  const perFt2 = input.per === 'ft2' ? input.count : perM2ToPerFt2(input.count);
  const spread = perFt2 / input.concentrationRatio;
  if (input.kernelsPerFt2PerBuAc !== undefined && !(input.kernelsPerFt2PerBuAc > 0))
    throw new RangeError('kernels per ft² for 1 bu/ac must be positive');
  const rule = input.kernelsPerFt2PerBuAc ?? kernelsPerFt2PerBuAc(input.lbPerBu, input.tkwG);
  const loss = buPerAc(spread / rule);
  return {
    kernelsPerFt2: spread,
    kernelsPerFt2PerBuAc: rule,
    buPerAc: loss,
    kgPerHa: buPerAcToKgPerHa(loss, input.lbPerBu),
    share: input.yieldBuPerAc && input.yieldBuPerAc > 0 ? loss / input.yieldBuPerAc : null,
  };
}

/** Where the kernels-per-area figure for 1 bu/ac comes from. */
export type LossBasisKind = 'published' | 'crop-weight' | 'own-weight' | 'typed';

export interface LossBasis {
  kind: LossBasisKind;
  kernelsPerFt2PerBuAc: number;
  kernelsPerM2PerBuAc: number;
  /** Thousand-kernel weight behind a weight-based basis, grams. */
  tkwG: number | null;
  /** Who says so: the publication, the crop's weight source, or the operator. */
  source: string;
}

/**
 * The default basis for a crop: its published count (Iowa State, smallgrains.org) where one
 * exists, otherwise the weight rule with the crop's bushel weight and thousand-kernel weight.
 */
export function cropLossBasis(crop: CropProgram): LossBasis {
  if (crop.publishedLossCount) {
    const k = crop.publishedLossCount.value;
    return {
      kind: 'published',
      kernelsPerFt2PerBuAc: k,
      kernelsPerM2PerBuAc: perFt2ToPerM2(k),
      tkwG: null,
      source: crop.publishedLossCount.source,
    };
  }
  return weightBasis(
    crop,
    crop.tkwG.value,
    'crop-weight',
    `weight rule with ${crop.bushel.usLb.value} lb/bu and TKW ${crop.tkwG.value} g (${crop.tkwG.source})`,
  );
}

/** The weight rule with a given thousand-kernel weight (the operator's own, or the crop's). */
export function weightBasis(
  crop: CropProgram,
  tkwG: number,
  kind: 'crop-weight' | 'own-weight' = 'own-weight',
  source = `weight rule with ${crop.bushel.usLb.value} lb/bu and your TKW ${tkwG} g`,
): LossBasis {
  if (!(tkwG > 0)) throw new RangeError('thousand-kernel weight must be positive');
  const k = kernelsPerFt2PerBuAc(crop.bushel.usLb.value, tkwG);
  return { kind, kernelsPerFt2PerBuAc: k, kernelsPerM2PerBuAc: perFt2ToPerM2(k), tkwG, source };
}

/** Loss estimate for a crop on a basis: by default the crop's published count (cropLossBasis). */
export function estimateCropLoss(
  crop: CropProgram,
  count: number,
  per: 'ft2' | 'm2',
  ratio = 1,
  yieldBuPerAc?: number,
  basis: LossBasis = cropLossBasis(crop),
): LossEstimate & { basis: LossBasis } {
  const estimate = estimateLoss({
    count,
    per,
    concentrationRatio: ratio,
    lbPerBu: crop.bushel.usLb.value,
    tkwG: basis.tkwG ?? crop.tkwG.value,
    kernelsPerFt2PerBuAc: basis.kernelsPerFt2PerBuAc,
    yieldBuPerAc,
  });
  return { ...estimate, basis };
}
