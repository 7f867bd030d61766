import { describe, expect, it } from 'vitest';
import { bushelsPerTonne, cropIdSchema, cropProgramSchema, cropPrograms, geometricMeanDiameter, sphericity } from '~/lib/domain';

describe('crop programs', () => {
  it('cover all 14 crops and match their schema', () => {
    expect(Object.keys(cropPrograms).sort()).toEqual([...cropIdSchema.options].sort());
    for (const c of Object.values(cropPrograms)) expect(() => cropProgramSchema.parse(c)).not.toThrow();
  });
  it('name a source for every kernel size, TKW, tip-speed window and bushel weight', () => {
    for (const c of Object.values(cropPrograms)) {
      expect(c.kernel.source.length, c.id).toBeGreaterThan(2);
      expect(c.tkwG.source.length, c.id).toBeGreaterThan(2);
      for (const r of c.speed.ranges) expect(r.source.length, c.id).toBeGreaterThan(2);
      if (c.speed.start) expect(c.speed.start.source.length, c.id).toBeGreaterThan(2);
      expect(c.clearanceMm.source.length, c.id).toBeGreaterThan(2);
      expect(c.bushel.usLb.source.length, c.id).toBeGreaterThan(2);
    }
  });
  it('passing size is min(width, thickness)', () => {
    for (const c of Object.values(cropPrograms)) expect(c.passingSizeMm).toBe(Math.min(c.kernel.widthMm, c.kernel.thicknessMm));
    expect(cropPrograms.wheat.passingSizeMm).toBe(2.98);
  });
  it('straight interrupter bars are wanted in corn only; discharge bars in hemp (common practice)', () => {
    const straight = Object.values(cropPrograms)
      .filter((c) => c.rotorBars.straight === 'wanted')
      .map((c) => c.id);
    const discharge = Object.values(cropPrograms)
      .filter((c) => c.rotorBars.discharge === 'wanted')
      .map((c) => c.id);
    expect(straight).toEqual(['corn']);
    expect(discharge).toEqual(['hemp']);
  });
});

describe('kernel sizes against the published table', () => {
  const gmd: [keyof typeof cropPrograms, number, string][] = [
    ['barley', 4.23, 'Tavakoli et al., IJABE 2(4):84 (2009)'],
    ['soybeans', 6.57, 'Kibar & Öztürk, Int. Agrophysics 22:239 (2008)'],
    ['corn', 7.04, 'Sezer et al., African J. Biotechnology'],
    ['sunflower', 6.47, 'Seifi & Alimardani, Modern Applied Science'],
  ];
  for (const [id, expected, source] of gmd) {
    it(`geometric mean diameter of ${id} = ${expected} mm (±0.02) — ${source}`, () => {
      expect(Math.abs(geometricMeanDiameter(cropPrograms[id].kernel) - expected)).toBeLessThanOrEqual(0.02);
    });
  }
  const sph: [keyof typeof cropPrograms, number, string][] = [
    ['barley', 0.476, 'Tavakoli et al. (2009)'],
    ['rice', 0.375, 'Zareiforoush et al., RJASET (2009)'],
    ['soybeans', 0.91, 'Kibar & Öztürk (2008)'],
    ['field-peas', 0.836, 'Yalçın et al., J. Food Engineering 79:731 (2007)'],
  ];
  for (const [id, expected, source] of sph) {
    it(`sphericity of ${id} = ${expected} (±0.005) — ${source}`, () => {
      expect(Math.abs(sphericity(cropPrograms[id].kernel) - expected)).toBeLessThanOrEqual(0.005);
    });
  }
});

describe('bushel weights', () => {
  const us: [keyof typeof cropPrograms, number][] = [
    ['corn', 56],
    ['soybeans', 60],
    ['wheat', 60],
    ['barley', 48],
    ['oats', 32],
  ];
  for (const [id, lbPerBu] of us) {
    it(`US ${id} ${lbPerBu} lb/bu — University of Wisconsin Extension, "Harvest Time Math 101"`, () => {
      expect(cropPrograms[id].bushel.usLb.value).toBe(lbPerBu);
    });
  }
  it('US sorghum 56 lb, rice 45 lb — USDA (via "Test weight")', () => {
    expect(cropPrograms.sorghum.bushel.usLb.value).toBe(56);
    expect(cropPrograms.rice.bushel.usLb.value).toBe(45);
  });
  it('Canadian bu/tonne — Government of Alberta after Canada Grains Council (1999)', () => {
    expect(cropPrograms.wheat.bushel.canadaPerTonne?.value).toBe(36.744);
    expect(cropPrograms.canola.bushel.canadaPerTonne?.value).toBe(44.092);
    expect(cropPrograms.oats.bushel.canadaPerTonne?.value).toBe(64.842);
    expect(cropPrograms.barley.bushel.canadaPerTonne?.value).toBe(45.93);
    expect(cropPrograms.corn.bushel.canadaPerTonne?.value).toBe(39.368);
    expect(cropPrograms.sunflower.bushel.canadaPerTonne?.value).toBe(73.487);
  });
  it('Canada and the US differ for oats (34 vs 32 lb) — Government of Alberta (1999)', () => {
    expect(Math.abs(bushelsPerTonne(34) - cropPrograms.oats.bushel.canadaPerTonne!.value)).toBeLessThan(0.001);
    expect(Math.abs(bushelsPerTonne(cropPrograms.oats.bushel.usLb.value) - 64.842)).toBeGreaterThan(1);
  });
  it('canola 50 lb/bu follows from 44.0920 bu/t — Government of Alberta (1999)', () => {
    expect(cropPrograms.canola.bushel.usLb.value).toBeCloseTo(50, 2);
  });
});
