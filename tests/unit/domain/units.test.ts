import { describe, expect, it } from 'vitest';
import {
  KGHA_PER_LB_BUAC,
  M2_PER_ACRE,
  MS_PER_FPM,
  acresToHa,
  buPerAc,
  buPerAcToKgPerHa,
  bushelsPerTonne,
  feetPerMinute,
  formatLength,
  formatSpeed,
  fpmToMs,
  haToAcres,
  inch,
  inchToMm,
  kg,
  kgPerHa,
  kgPerHaToBuPerAc,
  kgToLb,
  lb,
  lbToKg,
  lbPerBuFromBushelsPerTonne,
  metresPerSecond,
  mm,
  mmToInch,
  msToFpm,
} from '~/lib/domain';

describe('unit conversions (NIST Handbook 44, Appendix C)', () => {
  it('1 in = 25.4 mm exactly — NIST HB44', () => {
    expect(inchToMm(inch(1))).toBe(25.4);
    expect(mmToInch(mm(762))).toBeCloseTo(30, 12);
  });
  it('1 lb = 0.45359237 kg exactly — NIST HB44', () => {
    expect(lbToKg(lb(1))).toBe(0.45359237);
    expect(kgToLb(kg(0.45359237))).toBeCloseTo(1, 12);
  });
  it('1 acre = 43,560 ft² = 4,046.8564224 m² — NIST HB44', () => {
    expect(M2_PER_ACRE).toBeCloseTo(4046.8564224, 9);
  });
  it('1 ha = 2.4710538 ac — NIST HB44', () => {
    expect(haToAcres(1)).toBeCloseTo(2.4710538, 7);
    expect(acresToHa(haToAcres(3.7))).toBeCloseTo(3.7, 12);
  });
  it('1 ft/min = 0.00508 m/s — NIST HB44', () => {
    expect(MS_PER_FPM).toBeCloseTo(0.00508, 15);
    expect(fpmToMs(feetPerMinute(1000))).toBeCloseTo(5.08, 12);
    expect(msToFpm(metresPerSecond(5.08))).toBeCloseTo(1000, 9);
  });
  it('1 US bushel = 2,150.42 in³ = 35.239 L (Univ. of Wisconsin Extension, "Harvest Time Math 101")', () => {
    const litres = (2150.42 * inchToMm(inch(1)) ** 3) / 1e6;
    expect(litres).toBeCloseTo(35.239, 3);
  });
});

describe('kg/ha per bu/ac = lb/bu × 1.12085116 (reference-values "Units" check row)', () => {
  it('factor 1.12085116', () => {
    expect(KGHA_PER_LB_BUAC).toBeCloseTo(1.12085116, 8);
  });
  const cases: [string, number, number][] = [
    ['wheat 60 lb', 60, 67.25],
    ['corn 56 lb', 56, 62.77],
    ['barley 48 lb', 48, 53.8],
    ['oats 32 lb', 32, 35.87],
    ['canola 50 lb', 50, 56.04],
    ['rice 45 lb', 45, 50.44],
  ];
  for (const [name, lbPerBu, expected] of cases) {
    it(`${name}: 1 bu/ac = ${expected} kg/ha`, () => {
      expect(Math.abs(buPerAcToKgPerHa(buPerAc(1), lbPerBu) - expected)).toBeLessThanOrEqual(0.005);
      expect(kgPerHaToBuPerAc(kgPerHa(expected), lbPerBu)).toBeCloseTo(1, 3);
    });
  }
});

describe('Canadian bushels per tonne (Government of Alberta, after Canada Grains Council 1999)', () => {
  const cases: [string, number, number][] = [
    ['wheat, soybeans, peas (60 lb)', 60, 36.744],
    ['canola (50 lb)', 50, 44.092],
    ['oats (34 lb Canadian bushel)', 34, 64.842],
    ['barley (48 lb)', 48, 45.93],
    ['corn, rye, flax (56 lb)', 56, 39.368],
    ['sunflower (30 lb)', 30, 73.487],
  ];
  for (const [name, lbPerBu, perTonne] of cases) {
    it(`${name}: ${perTonne} bu/t`, () => {
      expect(Math.abs(bushelsPerTonne(lbPerBu) - perTonne)).toBeLessThanOrEqual(0.001);
      expect(lbPerBuFromBushelsPerTonne(perTonne)).toBeCloseTo(lbPerBu, 2);
    });
  }
});

describe('formatting', () => {
  it('lengths in mm and in', () => {
    expect(formatLength(mm(12.7), 'metric')).toBe('12.7 mm');
    expect(formatLength(mm(12.7), 'imperial')).toBe('0.50 in');
    expect(formatLength(mm(762), 'metric')).toBe('762 mm');
    expect(formatLength(mm(762), 'imperial')).toBe('30.0 in');
  });
  it('speeds in m/s and ft/min', () => {
    expect(formatSpeed(metresPerSecond(8.78), 'metric')).toBe('8.8 m/s');
    expect(formatSpeed(metresPerSecond(5.08), 'imperial')).toBe('1000 ft/min');
  });
});
