import { describe, expect, it } from 'vitest';
import {
  basisFor,
  computeLossCheck,
  cropLossBasis,
  cropPrograms,
  estimateCropLoss,
  frameAreaFt2,
  kernelsPerFt2,
  lossCheckInputSchema,
  lossTargetFor,
  type LossCheckInput,
} from '~/lib/domain';

type Counts = { preHarvest?: number[]; header?: number[]; behindMachine?: number[] };

/** A check with one frame of 1 ft², no kernels anywhere unless given. */
const base = ({ preHarvest = [0], header = [0], behindMachine = [0], ...over }: Partial<LossCheckInput> & Counts = {}): LossCheckInput => ({
  crop: 'wheat',
  frame: { by: 'area', area: 1, unit: 'ft2' },
  counts: { preHarvest, header, behindMachine },
  cutWidth: 30,
  spreadWidth: 30,
  widthUnit: 'ft',
  expectedYield: { value: 60, unit: 'bu/ac' },
  ...over,
});

describe('basis: kernels per unit area for 1 bu/ac', () => {
  it('wheat defaults to the published count: smallgrains.org (2003), hard red spring wheat 20 kernels/ft² ≈ 1 bu/ac', () => {
    const b = cropLossBasis(cropPrograms.wheat);
    expect(b.kind).toBe('published');
    expect(b.kernelsPerFt2PerBuAc).toBe(20);
    expect(b.source).toMatch(/smallgrains\.org/);
    // 10 kernels/ft² are 0.5 bu/ac on the published basis (the weight rule would say 0.474).
    const e = estimateCropLoss(cropPrograms.wheat, 10, 'ft2');
    expect(e.buPerAc).toBeCloseTo(0.5, 9);
    expect(e.basis.kind).toBe('published');
  });
  it('barley 14 and oats 10 kernels/ft² ≈ 1 bu/ac (smallgrains.org, 2003)', () => {
    expect(cropLossBasis(cropPrograms.barley).kernelsPerFt2PerBuAc).toBe(14);
    expect(cropLossBasis(cropPrograms.oats).kernelsPerFt2PerBuAc).toBe(10);
  });
  it('corn 2 and soybeans 4 per ft² ≈ 1 bu/ac (Iowa State University Extension, Hanna 2017)', () => {
    const corn = computeLossCheck(base({ crop: 'corn', header: [2], behindMachine: [2], expectedYield: { value: 200, unit: 'bu/ac' } }));
    expect(corn.basis.kind).toBe('published');
    expect(corn.header.buPerAc).toBeCloseTo(1, 9);
    const soy = computeLossCheck(base({ crop: 'soybeans', header: [4], behindMachine: [4], expectedYield: { value: 60, unit: 'bu/ac' } }));
    expect(soy.header.buPerAc).toBeCloseTo(1, 9);
  });
  it('canola has no single published count: the weight rule with its TSW 4 g gives 130 seeds/ft² (Canola Council of Canada 2012 table, ±1)', () => {
    const b = cropLossBasis(cropPrograms.canola);
    expect(b.kind).toBe('crop-weight');
    expect(Math.abs(b.kernelsPerFt2PerBuAc - 130)).toBeLessThanOrEqual(1);
  });
  it('own thousand-seed weight: Canola Council of Canada (2012), TSW 2 g → 261, 3 g → 174, 5 g → 104 seeds/ft² (±1)', () => {
    for (const [tsw, seeds] of [
      [2, 261],
      [3, 174],
      [5, 104],
    ] as const) {
      const b = basisFor(cropPrograms.canola, { kind: 'own-weight', tkwG: tsw });
      expect(b.kind).toBe('own-weight');
      expect(Math.abs(b.kernelsPerFt2PerBuAc - seeds)).toBeLessThanOrEqual(1);
    }
  });
  it('a typed count per m² is converted to per ft² (1 m² = 10.7639 ft², NIST Handbook 44)', () => {
    const b = basisFor(cropPrograms.wheat, { kind: 'typed', kernels: 215.278, per: 'm2' });
    expect(b.kind).toBe('typed');
    expect(b.kernelsPerFt2PerBuAc).toBeCloseTo(20, 3);
  });
  it('the result names the basis used', () => {
    const r = computeLossCheck(base({ basis: { kind: 'own-weight', tkwG: 40 } }));
    expect(r.basis.kind).toBe('own-weight');
    expect(r.basis.tkwG).toBe(40);
    expect(r.basis.source).toMatch(/your TKW 40 g/);
  });
});

describe('frames', () => {
  it('a frame by its sides: 12 in × 12 in = 1 ft²; 1 m × 1 m = 10.7639 ft² (1 in = 25.4 mm, 1 ft = 0.3048 m exactly, NIST Handbook 44)', () => {
    expect(frameAreaFt2({ by: 'sides', length: 12, width: 12, unit: 'in' })).toBeCloseTo(1, 9);
    expect(frameAreaFt2({ by: 'sides', length: 100, width: 100, unit: 'cm' })).toBeCloseTo(10.7639104, 6);
    expect(frameAreaFt2({ by: 'area', area: 1, unit: 'm2' })).toBeCloseTo(10.7639104, 6);
  });
  it('several frames are averaged', () => {
    expect(kernelsPerFt2([10, 20, 30], 2)).toBe(10);
  });
});

describe('loss split and concentration (smallgrains.org, 2003: counts behind the machine are divided by cut ÷ spread width)', () => {
  it('pre-harvest, header and machine apart', () => {
    // Wheat on the published 20/ft²: standing 4, behind header 14, behind machine 14 + 6 × 12.
    const r = computeLossCheck(base({ preHarvest: [4], header: [14], behindMachine: [14 + 6 * 12], cutWidth: 30, spreadWidth: 5 }));
    expect(r.concentrationRatio).toBe(6); // Canola Council of Canada (2012): 30 ft cut, 5 ft spread → 6
    expect(r.preHarvest.buPerAc).toBeCloseTo(4 / 20, 9);
    expect(r.header.buPerAc).toBeCloseTo(10 / 20, 9);
    expect(r.machine.buPerAc).toBeCloseTo(12 / 20, 9);
    expect(r.harvest.buPerAc).toBeCloseTo(22 / 20, 9);
    expect(r.total.buPerAc).toBeCloseTo(26 / 20, 9);
  });
  it('no concentration when the spread covers the cut', () => {
    const r = computeLossCheck(base({ header: [0], behindMachine: [20] }));
    expect(r.concentrationRatio).toBe(1);
    expect(r.machine.buPerAc).toBeCloseTo(1, 9);
  });
  it('kernels in one frame for 1 bu/ac, outside and inside the spread', () => {
    const r = computeLossCheck(base({ frame: { by: 'area', area: 2, unit: 'ft2' }, cutWidth: 30, spreadWidth: 10 }));
    expect(r.kernelsPerFrameFor1BuAc.outsideSpread).toBeCloseTo(40, 9);
    expect(r.kernelsPerFrameFor1BuAc.inSpread).toBeCloseTo(120, 9);
  });
  it('fewer kernels behind the header than in standing crop: header loss 0, and said so', () => {
    const r = computeLossCheck(base({ preHarvest: [8], header: [6], behindMachine: [6] }));
    expect(r.header.buPerAc).toBe(0);
    expect(r.notes).toContain('header-below-standing');
  });
});

describe('units, share of yield, money, target and verdict', () => {
  it('kg/ha = bu/ac × lb/bu × 1.12085116: wheat 67.25 kg/ha per bu/ac (reference values, NIST Handbook 44 factors)', () => {
    const r = computeLossCheck(base({ behindMachine: [20] }));
    expect(r.machine.kgPerHa).toBeCloseTo(67.25, 2);
  });
  it('expected yield in kg/ha is converted with the crop bushel (wheat 60 lb, University of Wisconsin "Harvest Time Math 101")', () => {
    const r = computeLossCheck(base({ behindMachine: [20], expectedYield: { value: 67.25 * 50, unit: 'kg/ha' } }));
    expect(r.expectedYieldBuPerAc).toBeCloseTo(50, 2);
    expect(r.machine.pctOfYield).toBeCloseTo(2, 2);
  });
  it('money per acre and hectare at a price per bushel or per tonne (1 ha = 2.4710538 ac)', () => {
    const perBu = computeLossCheck(base({ behindMachine: [20], price: { value: 7, per: 'bu', currency: '$' } }));
    expect(perBu.machine.moneyPerAc).toBeCloseTo(7, 9);
    expect(perBu.machine.moneyPerHa).toBeCloseTo(7 * 2.4710538, 5);
    // A wheat tonne holds 36.744 bushels (Government of Alberta, after Canada Grains Council 1999).
    const perT = computeLossCheck(base({ behindMachine: [20], price: { value: 367.44, per: 't', currency: '$' } }));
    expect(perT.machine.moneyPerAc).toBeCloseTo(10, 2);
    const none = computeLossCheck(base({ behindMachine: [20] }));
    expect(none.machine.moneyPerAc).toBeNull();
  });
  it('default targets: small grains 3 % (smallgrains.org 2003), soybeans 2.75 % (University of Nebraska), canola 2 % (Saskatchewan Pulse Growers / PAMI)', () => {
    expect(lossTargetFor('wheat').pct).toBe(3);
    expect(lossTargetFor('soybeans').pct).toBe(2.75);
    expect(lossTargetFor('canola').pct).toBe(2);
    expect(lossTargetFor('corn').source).toMatch(/common practice/);
  });
  it('verdict against the default or the user target', () => {
    // 1.5 bu/ac of 60 = 2.5 % → within 3 %, over a user target of 2 %.
    const within = computeLossCheck(base({ behindMachine: [30] }));
    expect(within.harvest.pctOfYield).toBeCloseTo(2.5, 9);
    expect(within.verdict).toBe('within');
    expect(within.target.isDefault).toBe(true);
    const over = computeLossCheck(base({ behindMachine: [30], targetPct: 2 }));
    expect(over.verdict).toBe('over');
    expect(over.target).toMatchObject({ pct: 2, isDefault: false });
  });
  it('pre-harvest loss does not count against the harvest target', () => {
    const r = computeLossCheck(base({ preHarvest: [40], header: [40], behindMachine: [40] }));
    expect(r.total.pctOfYield).toBeCloseTo((100 * 2) / 60, 9);
    expect(r.harvest.pctOfYield).toBe(0);
    expect(r.verdict).toBe('within');
  });
});

describe('advice from where the loss is (common practice)', () => {
  it('header first when most of the loss is at the header', () => {
    const r = computeLossCheck(base({ header: [40], behindMachine: [42] }));
    expect(r.advice[0]!.area).toBe('header');
  });
  it('threshing, separating and cleaning from what was seen behind the machine', () => {
    const r = computeLossCheck(base({ behindMachine: [60], signs: ['unthreshed', 'in-chaff'] }));
    expect(r.advice.map((a) => a.area)).toEqual(['threshing', 'cleaning']);
    expect(r.advice.every((a) => a.source.length > 0)).toBe(true);
  });
  it('machine loss without a sign: says how to tell them apart', () => {
    const r = computeLossCheck(base({ behindMachine: [60] }));
    expect(r.advice[0]!.area).toBe('general');
    expect(r.advice[0]!.text).toMatch(/threshing.*separating.*cleaning/);
  });
});

describe('bad input is refused with the field named', () => {
  const fieldOf = (input: unknown) => {
    const p = lossCheckInputSchema.safeParse(input);
    return p.success ? null : p.error.issues.map((i) => i.path.join('.'));
  };
  it('negative counts', () => {
    expect(fieldOf(base({ header: [3, -1] }))).toContain('counts.header.1');
  });
  it('zero widths', () => {
    expect(fieldOf(base({ cutWidth: 0 }))).toContain('cutWidth');
    expect(fieldOf(base({ spreadWidth: 0 }))).toContain('spreadWidth');
  });
  it('a spread wider than the cut', () => {
    expect(fieldOf(base({ cutWidth: 20, spreadWidth: 25 }))).toEqual(['spreadWidth']);
  });
  it('a spread narrower than a foot (0.3 m) is taken for a slip of the unit', () => {
    expect(fieldOf(base({ spreadWidth: 0.5 }))).toEqual(['spreadWidth']);
    expect(fieldOf(base({ spreadWidth: 0.5, cutWidth: 9, widthUnit: 'm' }))).toBeNull();
    expect(fieldOf(base({ spreadWidth: 0.2, cutWidth: 9, widthUnit: 'm' }))).toEqual(['spreadWidth']);
  });
  it('a zero frame, no frames counted, a zero TKW', () => {
    expect(fieldOf(base({ frame: { by: 'sides', length: 0, width: 10, unit: 'in' } }))).toContain('frame.length');
    expect(fieldOf(base({ preHarvest: [] }))).toContain('counts.preHarvest');
    expect(fieldOf(base({ basis: { kind: 'own-weight', tkwG: 0 } }))).toContain('basis.tkwG');
  });
});
