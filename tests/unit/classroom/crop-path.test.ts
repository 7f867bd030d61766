import { describe, expect, it } from 'vitest';
import { cropPathModel, kernelFate, seeded, TURNS_PER_POSITION } from '~/lib/classroom/crop-path';
import { demoCatalog, tamarackM4, sedgeS6 } from '~/lib/domain/demo-catalog';
import { starterLayout } from '~/lib/domain/starter';
import type { Layout } from '~/lib/domain/schemas';

// The crop-path view is a teaching illustration on Cagewright's own scale (no published
// source); these tests hold it to the directions the trade describes (common practice).

const wheat = starterLayout(tamarackM4, 'wheat', demoCatalog);
const withElement = (layout: Layout, position: number, type: string): Layout => ({
  ...layout,
  elements: layout.elements.map((e) =>
    e.position === position ? { ...e, partNumber: `CW-${type}-${e.side === 'left' ? 'L' : 'R'}-04` } : e,
  ),
});

describe('cropPathModel', () => {
  it('accounts for all the grain: through the cage, over the rotor or still in heads', () => {
    for (const crop of ['wheat', 'field-peas', 'corn', 'edible-beans'] as const) {
      for (const family of [tamarackM4, sedgeS6]) {
        const m = cropPathModel(family, demoCatalog, starterLayout(family, crop, demoCatalog));
        expect(m.fallen + m.overRotor + m.unthreshed).toBeCloseTo(1, 9);
        const byHalves = m.positions.reduce((s, p) => s + p.halves.left.fallShare + p.halves.right.fallShare, 0);
        expect(byHalves).toBeCloseTo(m.fallen, 9);
        expect(m.positions.map((p) => p.index)).toEqual(family.positions.map((p) => p.index));
      }
    }
  });

  it('lets nothing through a blank plate', () => {
    const m = cropPathModel(tamarackM4, demoCatalog, withElement(wheat, 3, 'BL'));
    expect(m.positions[2]!.halves.left.fallShare).toBe(0);
    expect(m.positions[2]!.halves.right.fallShare).toBe(0);
    expect(m.positions[2]!.halves.left.kernelPasses).toBeNull();
  });

  it('lets more through an open element than a fine one in the same place', () => {
    const fine = cropPathModel(tamarackM4, demoCatalog, withElement(wheat, 3, 'FW'));
    const open = cropPathModel(tamarackM4, demoCatalog, withElement(wheat, 3, 'SW'));
    expect(open.positions[2]!.halves.left.fallShare).toBeGreaterThan(fine.positions[2]!.halves.left.fallShare);
    expect(open.overRotor).toBeLessThan(fine.overRotor);
  });

  it('lets no peas through openings narrower than the pea', () => {
    const peasInFineWire = { ...withElement(withElement(wheat, 1, 'FW'), 2, 'FW'), crop: 'field-peas' as const };
    const m = cropPathModel(tamarackM4, demoCatalog, peasInFineWire);
    expect(m.positions[0]!.halves.left.kernelPasses).toBe(false);
    expect(m.positions[0]!.halves.left.fallShare).toBe(0);
  });

  it('keeps heads longer in the threshing zone under a cover plate, so fewer leave unthreshed', () => {
    const hard = { ...wheat, coverPlates: [] };
    const plated = { ...wheat, coverPlates: [{ section: 2, side: 'right' as const, partNumber: 'CW-CP-R-04' }] };
    const a = cropPathModel(tamarackM4, demoCatalog, hard);
    const b = cropPathModel(tamarackM4, demoCatalog, plated);
    expect(b.positions[1]!.turns).toBeGreaterThan(a.positions[1]!.turns);
    expect(b.positions[1]!.plates).toBe(1);
    expect(b.positions[1]!.halves.right.covered).toBe(true);
    expect(b.positions[1]!.halves.right.openArea).toBeLessThan(a.positions[1]!.halves.right.openArea);
    expect(b.positions[1]!.headsOut).toBeLessThan(a.positions[1]!.headsOut);
    expect(b.unthreshed).toBeLessThan(a.unthreshed);
  });

  it('ignores a plate on a section without a seat on that side', () => {
    const misplaced = { ...wheat, coverPlates: [{ section: 1, side: 'right' as const, partNumber: 'CW-CP-R-04' }] };
    const m = cropPathModel(tamarackM4, demoCatalog, misplaced);
    expect(m.positions.every((p) => p.plates === 0)).toBe(true);
  });

  it('moves the crop faster with faster vanes, and threshes less on the way', () => {
    const order = ['very-slow', 'slow', 'medium', 'fast'] as const;
    const models = order.map((v) => cropPathModel(tamarackM4, demoCatalog, wheat, { vaneSetting: v }));
    for (let i = 1; i < models.length; i++) {
      expect(models[i]!.transitSeconds).toBeLessThan(models[i - 1]!.transitSeconds);
      expect(models[i]!.unthreshed).toBeGreaterThan(models[i - 1]!.unthreshed);
      expect(models[i]!.positions[0]!.turns).toBe(TURNS_PER_POSITION[order[i]!]);
    }
  });

  it('threshes an easy crop sooner than a hard one on the same cage', () => {
    const easy = cropPathModel(tamarackM4, demoCatalog, { ...wheat, crop: 'canola' });
    const hard = cropPathModel(tamarackM4, demoCatalog, { ...wheat, crop: 'wheat' });
    expect(easy.positions[0]!.headsOut).toBeLessThan(hard.positions[0]!.headsOut);
  });
});

describe('kernelFate', () => {
  it('draws fates in about the shares the model gives', () => {
    const m = cropPathModel(tamarackM4, demoCatalog, wheat);
    const random = seeded(7);
    const n = 20_000;
    let falls = 0;
    let over = 0;
    let heads = 0;
    for (let i = 0; i < n; i++) {
      const f = kernelFate(m, random);
      if (f.kind === 'falls') {
        falls++;
        expect(f.position).toBeGreaterThanOrEqual(f.threshedAt);
        expect(f.fallFrac).toBeGreaterThanOrEqual(0);
        expect(f.fallFrac).toBeLessThan(1);
      } else if (f.kind === 'over-rotor') over++;
      else heads++;
    }
    expect(heads / n).toBeCloseTo(m.unthreshed, 1);
    expect(falls / n).toBeCloseTo(m.fallen, 1);
    expect(over / n).toBeCloseTo(m.overRotor, 1);
  });

  it('never drops a kernel where the model lets nothing through', () => {
    const m = cropPathModel(tamarackM4, demoCatalog, withElement(wheat, 3, 'BL'));
    const random = seeded(11);
    for (let i = 0; i < 5000; i++) {
      const f = kernelFate(m, random);
      if (f.kind === 'falls') expect(f.position).not.toBe(2);
    }
  });
});
