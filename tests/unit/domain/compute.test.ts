import { describe, expect, it } from 'vitest';
import {
  COVER_PLATE_CLOSED_SHARE,
  aggressivenessIndex,
  computeSettings,
  cropPrograms,
  metresPerSecond,
  passageMargin,
  type AggressivenessInput,
} from '~/lib/domain';
import { catalog, modular, setElement, split, start } from './helpers';

describe('kernel passage margin (smallest kernel dimension against the opening width, middle against its length)', () => {
  it('wheat (Tabatabaeefar 2003: 7.08 × 3.27 × 2.98 mm) through a 5 × 25 mm opening: 2.02 mm to spare', () => {
    expect(passageMargin({ width: 5, length: 25 }, cropPrograms.wheat.kernel)).toBeCloseTo(2.02, 9);
  });
  it('field peas (Yalçın et al. 2007: passing size 5.55 mm) do not pass 5 mm wires', () => {
    expect(passageMargin({ width: 5, length: 25 }, cropPrograms['field-peas'].kernel)).toBeCloseTo(-0.55, 9);
  });
  it('the middle dimension must clear the length: a 10 × 8 mm slot stops edible beans (Isik 2013: 9.75 mm wide)', () => {
    expect(passageMargin({ width: 10, length: 8 }, cropPrograms['edible-beans'].kernel)).toBeCloseTo(8 - 9.75, 9);
  });
  it('a blank plate has no opening', () => {
    expect(passageMargin(null, cropPrograms.wheat.kernel)).toBeNull();
  });
});

describe('aggressiveness index (Cagewright model, formula in cage-metrics.ts and docs/layout-format.md)', () => {
  const base: AggressivenessInput = {
    threshingElements: ['fine-wire', 'fine-wire', 'fine-wire', 'fine-wire'],
    tipSpeed: metresPerSecond(25),
    clearanceMm: 15,
    vaneSetting: 'medium',
    coverPlates: 0,
    straightBars: 0,
  };
  it('reference point: fine-wire threshing zone, 25 m/s, 15 mm, medium vanes = 80', () => {
    expect(aggressivenessIndex(base)).toBeCloseTo(80, 9);
  });
  it('rises with speed, slower vanes, tighter clearance, cover plates and straight bars; falls with gentler elements', () => {
    const ai = (o: Partial<AggressivenessInput>) => aggressivenessIndex({ ...base, ...o });
    const ref = ai({});
    expect(ai({ tipSpeed: metresPerSecond(30) })).toBeGreaterThan(ref);
    expect(ai({ vaneSetting: 'very-slow' })).toBeGreaterThan(ref);
    expect(ai({ clearanceMm: 8 })).toBeGreaterThan(ref);
    expect(ai({ coverPlates: 1 })).toBeGreaterThan(ref);
    expect(ai({ straightBars: 2 })).toBeGreaterThan(ref);
    expect(ai({ threshingElements: ['round-bar', 'round-bar', 'round-bar', 'round-bar'] })).toBeLessThan(ref);
    expect(ai({ threshingElements: ['fine-wire', null, 'fine-wire', null] })).toBeCloseTo(ref / 2, 9);
  });
  it('clearance effect is bounded (×0.5 to ×2)', () => {
    const at = (c: number) => aggressivenessIndex({ ...base, clearanceMm: c });
    expect(at(0.5)).toBeCloseTo(160, 9);
    expect(at(80)).toBeCloseTo(40, 9);
  });
});

describe('computeSettings', () => {
  it('tip speed and rpm window for wheat on the full drum', () => {
    const l = start('wheat');
    const s = computeSettings(modular, catalog, l);
    expect(s.diameterMm).toBe(762);
    expect(s.tipSpeedMs).toBeCloseTo((Math.PI * 0.762 * l.rotorRpm) / 60, 9);
    expect(s.tipSpeedFpm).toBeCloseTo(s.tipSpeedMs / 0.00508, 6);
    expect(s.rpmInWindow).toBe(true);
    // Harrison, Canadian Agricultural Engineering 17(1):55–58 (1975): the cited wheat range.
    expect(s.rpmWindow.source).toMatch(/Harrison \(1975\)/);
  });
  it('kernel passage for every element, with blank plates as null', () => {
    const l = setElement(start('sunflower'), 1, 'left', 'CW-BL-L-04');
    const s = computeSettings(modular, catalog, l);
    expect(s.passage).toHaveLength(8);
    const blank = s.passage.find((p) => p.position === 1 && p.side === 'left')!;
    expect(blank.marginMm).toBeNull();
    expect(blank.passes).toBeNull();
    expect(s.passage.filter((p) => p.passes === true)).toHaveLength(7);
  });
  it('open area per zone, before and after a cover plate over positions 2–3 on the right', () => {
    const l = start('rice'); // close-bar (0.28) in front, wide-wire (0.5) at the rear, right plate on section 2
    expect(l.coverPlates).toEqual([{ section: 2, side: 'right', partNumber: 'CW-CP-R-04' }]);
    const s = computeSettings(modular, catalog, l);
    const k = 1 - COVER_PLATE_CLOSED_SHARE;
    expect(s.openArea.threshing.before).toBeCloseTo(0.28, 9);
    expect(s.openArea.threshing.after).toBeCloseTo((0.28 * 3 + 0.28 * k) / 4, 9);
    expect(s.openArea.separating.before).toBeCloseTo(0.5, 9);
    expect(s.openArea.separating.after).toBeCloseTo((0.5 * 3 + 0.5 * k) / 4, 9);
    expect(s.openArea.threshing).toMatchObject({ filled: 4, total: 4 });
  });
  it('a plate in a section that takes none changes no open area', () => {
    const l = { ...start('rice'), coverPlates: [{ section: 1, side: 'right' as const, partNumber: 'CW-CP-R-04' }] };
    const s = computeSettings(modular, catalog, l);
    expect(s.openArea.threshing.after).toBe(s.openArea.threshing.before);
  });
  it('capacity: slim drum about +20 % in heavy, tough crops (common practice, no published source)', () => {
    expect(computeSettings(modular, catalog, start('wheat', modular, { drum: 'slim' })).capacity.value).toBeCloseTo(1.2, 9);
    expect(computeSettings(modular, catalog, start('wheat')).capacity.value).toBe(1);
    expect(computeSettings(modular, catalog, start('field-peas', modular, { drum: 'slim' })).capacity.value).toBe(1);
  });
  it('capacity: cover plates over the separating zone cost capacity (Cagewright model)', () => {
    const c = computeSettings(modular, catalog, start('rice')).capacity;
    expect(c.separation).toBeLessThan(1);
    expect(c.value).toBeCloseTo(c.drum * c.separation, 12);
  });
  it('capacity follows separating open area: blank plates in every separating position score below wide-wire (Cagewright model, no published source)', () => {
    const wide = computeSettings(modular, catalog, start('wheat')).capacity;
    let blank = start('wheat');
    for (const p of modular.positions)
      if (p.zone === 'separating')
        for (const side of ['left', 'right'] as const) blank = setElement(blank, p.index, side, `CW-BL-${side === 'left' ? 'L' : 'R'}-04`);
    const closed = computeSettings(modular, catalog, blank).capacity;
    expect(closed.value).toBeLessThan(wide.value);
    expect(closed.value).toBe(0);
    // Half the separating half-positions blank: half the open area, half the capacity.
    const half = setElement(setElement(start('wheat'), 4, 'left', 'CW-BL-L-04'), 4, 'right', 'CW-BL-R-04');
    expect(computeSettings(modular, catalog, half).capacity.value).toBeCloseTo(0.5, 9);
    // Skip-wire (62 % open) separates more than wide-wire (50 %): 0.62 / 0.5 = 1.24.
    expect(computeSettings(modular, catalog, start('corn')).capacity.separation).toBeCloseTo(0.62 / 0.5, 9);
  });
  it('loss rule for the crop: canola, 50 lb bushel and 4 g TSW → 130 seeds/ft² (Canola Council of Canada 2012)', () => {
    const s = computeSettings(split, catalog, start('canola', split));
    expect(Math.round(s.lossRule.kernelsPerFt2PerBuAc)).toBe(130);
    expect(s.lossRule.published).toBeNull();
    expect(s.lossRule.basis.kind).toBe('crop-weight');
  });
  it('parts totals', () => {
    const s = computeSettings(split, catalog, start('wheat', split));
    expect(s.parts.count).toBe(6 * 2 + 24);
    expect(s.parts.totalPriceCents).toBeGreaterThan(0);
  });
  it('ignores unknown parts instead of failing', () => {
    const l = setElement(start('wheat'), 1, 'left', 'CW-ZZ-L-99');
    const s = computeSettings(modular, catalog, l);
    expect(s.passage).toHaveLength(7);
    expect(s.openArea.threshing.filled).toBe(3);
  });
});
