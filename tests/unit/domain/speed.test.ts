import { describe, expect, it } from 'vitest';
import {
  SLIM_DRUM_RPM_SHIFT,
  cropPrograms,
  feetPerMinute,
  fpmToMs,
  inRpmWindow,
  inch,
  inchToMm,
  mm,
  msToFpm,
  rpm,
  rpmForTipSpeed,
  rpmWindow,
  tipSpeed,
} from '~/lib/domain';

const fpm = (diameterIn: number, n: number) => msToFpm(tipSpeed(inchToMm(inch(diameterIn)), rpm(n)));

describe('tip speed v = π·D·n/60 (USDA Yearbook of Agriculture 1961 "Seeds")', () => {
  it('NDSU Extension EB-25 (2007): 22 in cylinder at 300 rpm ≈ 1,725 ft/min (within 1 %)', () => {
    expect(Math.abs(fpm(22, 300) / 1725 - 1)).toBeLessThan(0.01);
    expect(fpm(22, 300)).toBeCloseTo(1727.9, 1);
  });
  it('NDSU EB-25: the same speed needs 220 rpm on a 30 in rotor (within 1 %)', () => {
    expect(Math.abs(fpm(30, 220) / 1725 - 1)).toBeLessThan(0.01);
  });
  it('NDSU EB-25: and 390 rpm on a 17 in cylinder (within 1 %)', () => {
    expect(Math.abs(fpm(17, 390) / 1725 - 1)).toBeLessThan(0.01);
    expect(fpm(17, 390)).toBeCloseTo(1735.7, 1);
  });
  it('NDSU EB-25: 1,725 ft/min = 8.76 m/s (the source rounds to 0.01 m/s)', () => {
    // The source's own pair: its 1,725 ft/min reads as 8.76 m/s at 1 ft/min = 0.00508 m/s (NIST HB 44).
    expect(Math.abs(fpmToMs(feetPerMinute(1725)) - 8.76)).toBeLessThanOrEqual(0.005);
    // Our tip speed of its 22 in cylinder at 300 rpm agrees with the source's 8.76 m/s within its 1 % rounding of ft/min.
    expect(Math.abs(tipSpeed(inchToMm(inch(22)), rpm(300)) / 8.76 - 1)).toBeLessThan(0.01);
  });
  const harrison: [number, number][] = [
    [700, 19.5],
    [900, 25.1],
    [1100, 30.7],
    [800, 22.3],
  ];
  for (const [n, v] of harrison) {
    it(`Harrison, Can. Agric. Eng. 17(1):55 (1975): 533 mm cylinder at ${n} rpm = ${v} m/s (±0.1)`, () => {
      expect(Math.abs(tipSpeed(mm(533), rpm(n)) - v)).toBeLessThanOrEqual(0.1);
    });
  }
  it('rpmForTipSpeed inverts tipSpeed', () => {
    expect(rpmForTipSpeed(tipSpeed(mm(762), rpm(950)), mm(762))).toBeCloseTo(950, 9);
  });
});

describe('rpm window of a crop from its tip-speed window', () => {
  it('Manitoba Agriculture: field peas 300–400 rpm on a 760 mm rotor = 11.9–15.9 m/s', () => {
    const w = rpmWindow('field-peas', { id: 'full', diameterMm: 760 });
    const manitoba = w.ranges.find((r) => /Manitoba/.test(r.source))!;
    // The source rounds m/s to 0.1, which is about ±1.5 rpm on this rotor.
    expect(Math.abs(manitoba.lo - 300)).toBeLessThanOrEqual(1.5);
    expect(Math.abs(manitoba.hi - 400)).toBeLessThanOrEqual(1.5);
    expect(inRpmWindow(300, w) && inRpmWindow(400, w)).toBe(true);
  });
  it('NDSU EB-25: sunflower at 220 rpm on a 30 in rotor lies in the sunflower window', () => {
    const w = rpmWindow('sunflower', { id: 'full', diameterMm: inchToMm(inch(30)) });
    expect(inRpmWindow(220, w)).toBe(true);
  });
  it('International Agrophysics (1994): dry beans 9.04–10.17 m/s on a 762 mm rotor = about 227–255 rpm', () => {
    const w = rpmWindow('edible-beans', { id: 'full', diameterMm: 762 });
    const lab = w.ranges.find((r) => /International Agrophysics \(1994\)/.test(r.source))!;
    expect(lab.tipMinMs).toBe(9.04);
    expect(lab.tipMaxMs).toBe(10.17);
    expect(lab.lo).toBe(226); // 226.6 rounded down
    expect(lab.hi).toBe(255); // 254.9 rounded up
    // The lab optimum is the start band, not the whole window.
    expect(w.start).toMatchObject({ lo: 226, hi: 255 });
  });
  it('slim drum runs about 100 rpm faster in the same crop (common practice, no published source)', () => {
    const full = rpmWindow('wheat', { id: 'full', diameterMm: 762 });
    const slim = rpmWindow('wheat', { id: 'slim', diameterMm: 762 });
    expect(SLIM_DRUM_RPM_SHIFT).toBe(100);
    expect(slim.minRpm - full.minRpm).toBeCloseTo(100, 9);
    expect(slim.maxRpm - full.maxRpm).toBeCloseTo(100, 9);
    expect(slim.shiftRpm).toBe(100);
    expect(full.shiftRpm).toBe(0);
  });
  it('every crop window fits the layout rpm bounds on a 762 mm rotor, both drums', () => {
    for (const crop of Object.values(cropPrograms)) {
      for (const id of ['full', 'slim'] as const) {
        const w = rpmWindow(crop, { id, diameterMm: 762 });
        expect(w.minRpm).toBeGreaterThanOrEqual(100);
        expect(w.maxRpm).toBeLessThanOrEqual(1500);
        expect(w.minRpm).toBeLessThan(w.maxRpm);
      }
    }
  });
});
