import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { demoCatalog, sedgeS6, tamarackM4 } from '~/lib/domain/demo-catalog';
import { starterLayout } from '~/lib/domain/starter';
import {
  describeDifference,
  describePlace,
  diffLayouts,
  diffPlaceKeys,
  diffPlaces,
  isSameLayout,
  type LayoutDifference,
} from '~/lib/domain/diff';
import { layoutSchema, type Layout } from '~/lib/domain/schemas';

const wheat = starterLayout(tamarackM4, 'wheat', demoCatalog);
const peas = starterLayout(tamarackM4, 'field-peas', demoCatalog);

const clone = (l: Layout): Layout => structuredClone(l);

describe('diffLayouts', () => {
  it('finds nothing between a layout and a copy of itself', () => {
    const d = diffLayouts(wheat, clone(wheat));
    expect(d.differences).toEqual([]);
    expect(d.familyChanged).toBe(false);
    expect(d.counts).toEqual({ elements: 0, coverPlates: 0, rotorBars: 0, settings: 0 });
    expect(isSameLayout(wheat, clone(wheat))).toBe(true);
  });

  it('names a swapped element by its half-position with both part numbers', () => {
    const b = clone(wheat);
    const i = b.elements.findIndex((e) => e.position === 2 && e.side === 'left');
    b.elements[i] = { ...b.elements[i]!, partNumber: 'CW-WW-L-04' };
    const before = wheat.elements[i]!.partNumber;
    expect(before).not.toBe('CW-WW-L-04');
    const d = diffLayouts(wheat, b);
    expect(d.differences).toEqual([
      { kind: 'element', place: { kind: 'element', position: 2, side: 'left' }, change: 'changed', before, after: 'CW-WW-L-04' },
    ]);
    expect(describeDifference(d.differences[0]!)).toBe(`Position 2, left: ${before} → CW-WW-L-04`);
  });

  it('tells an added from a removed part', () => {
    const a: Layout = { ...clone(wheat), coverPlates: [{ section: 2, side: 'right', partNumber: 'CW-CP-R-04' }] };
    const b = clone(wheat);
    const removed = b.elements.splice(
      b.elements.findIndex((e) => e.position === 4 && e.side === 'right'),
      1,
    )[0]!;
    b.coverPlates = [{ section: 2, side: 'left', partNumber: 'CW-CP-L-04' }];
    const d = diffLayouts(a, b);
    const element = d.differences.find((x) => x.kind === 'element')!;
    expect(element).toMatchObject({ change: 'removed', before: removed.partNumber, after: null });
    const cover = d.differences.filter((x) => x.kind === 'cover');
    expect(cover.map((c) => c.change)).toEqual(['added', 'removed']);
    expect(cover[1]).toMatchObject({ place: { kind: 'cover', section: 2, side: 'right' }, before: 'CW-CP-R-04', after: null });
    expect(cover[0]).toMatchObject({ place: { kind: 'cover', section: 2, side: 'left' }, before: null, after: 'CW-CP-L-04' });
    expect(describeDifference(cover[0]!)).toBe('Cage-top section 2, left: CW-CP-L-04 added');
    expect(describeDifference(element)).toBe(`Position 4, right: ${removed.partNumber} removed`);
  });

  it('lists settings first, in the editor order, with both values', () => {
    const b = { ...clone(wheat), rotorRpm: wheat.rotorRpm + 50, crop: 'barley' as const, clearanceMm: 22.5 };
    const d = diffLayouts(wheat, b);
    expect(d.differences.map((x) => x.place)).toEqual([
      { kind: 'setting', field: 'crop' },
      { kind: 'setting', field: 'rotorRpm' },
      { kind: 'setting', field: 'clearanceMm' },
    ]);
    expect(d.differences[1]).toMatchObject({ before: wheat.rotorRpm, after: wheat.rotorRpm + 50 });
    expect(d.counts.settings).toBe(3);
  });

  it('orders part differences along the rotor, left before right, then plates, then bars', () => {
    const d = diffLayouts(wheat, peas);
    const kinds = d.differences.map((x) => x.kind);
    const firstPart = kinds.findIndex((k) => k !== 'setting');
    expect(kinds.slice(0, firstPart).every((k) => k === 'setting')).toBe(true);
    const rank = { setting: 0, element: 1, cover: 2, bar: 3 } as const;
    for (let i = 1; i < kinds.length; i++) expect(rank[kinds[i]!]).toBeGreaterThanOrEqual(rank[kinds[i - 1]!]);
    const elements = d.differences.filter((x) => x.kind === 'element').map((x) => x.place as { position: number; side: string });
    for (let i = 1; i < elements.length; i++) {
      const p = elements[i - 1]!;
      const q = elements[i]!;
      expect(p.position < q.position || (p.position === q.position && p.side === 'left' && q.side === 'right')).toBe(true);
    }
  });

  it('flags a pair of layouts from different families', () => {
    const other = starterLayout(sedgeS6, 'wheat', demoCatalog);
    expect(diffLayouts(wheat, other).familyChanged).toBe(true);
    expect(isSameLayout(wheat, { ...clone(wheat), familyId: 'sedge-s6' })).toBe(false);
  });

  it('gives the places and their keys for a diagram highlight', () => {
    const b = clone(wheat);
    b.rotorBars = b.rotorBars.filter((r) => !(r.row === 1 && r.position === 3));
    b.vaneSetting = 'fast';
    const d = diffLayouts(wheat, b);
    expect(diffPlaces(d)).toEqual([
      { kind: 'setting', field: 'vaneSetting' },
      { kind: 'bar', row: 1, position: 3 },
    ]);
    expect([...diffPlaceKeys(d.differences)]).toEqual(['setting:vaneSetting', 'bar:1:3']);
    expect(describePlace({ kind: 'bar', row: 1, position: 3 })).toBe('Rotor row 1, position 3');
  });
});

// Property checks over generated layouts of the modular family.
const partNumbers = demoCatalog.filter((p) => p.fitGroup === 'tamarack').map((p) => p.partNumber);
const side = fc.constantFrom('left' as const, 'right' as const);
const pn = fc.constantFrom(...partNumbers);
const layoutArb: fc.Arbitrary<Layout> = fc
  .record({
    elements: fc.uniqueArray(fc.record({ position: fc.integer({ min: 1, max: 4 }), side, partNumber: pn }), {
      selector: (e) => `${e.position}:${e.side}`,
      maxLength: 8,
    }),
    coverPlates: fc.uniqueArray(fc.record({ section: fc.integer({ min: 1, max: 3 }), side, partNumber: pn }), {
      selector: (c) => `${c.section}:${c.side}`,
      maxLength: 6,
    }),
    rotorBars: fc.uniqueArray(
      fc.record({ row: fc.integer({ min: 1, max: 4 }), position: fc.integer({ min: 1, max: 4 }), partNumber: pn }),
      {
        selector: (r) => `${r.row}:${r.position}`,
        maxLength: 16,
      },
    ),
    rotorRpm: fc.integer({ min: 100, max: 1500 }),
    vaneSetting: fc.constantFrom('very-slow' as const, 'slow' as const, 'medium' as const, 'fast' as const),
    crop: fc.constantFrom('wheat' as const, 'canola' as const, 'corn' as const),
  })
  .map((r) => layoutSchema.parse({ ...wheat, ...r }));

function apply(a: Layout, diffs: readonly LayoutDifference[]): Layout {
  const out = clone(a);
  for (const d of diffs) {
    if (d.kind === 'setting') {
      (out as Record<string, unknown>)[d.field] = d.after;
      continue;
    }
    const p = d.place as Record<string, unknown>;
    const same = (x: Record<string, unknown>) => Object.entries(p).every(([k, v]) => k === 'kind' || x[k] === v);
    const list = (d.kind === 'element' ? out.elements : d.kind === 'cover' ? out.coverPlates : out.rotorBars) as Record<string, unknown>[];
    const i = list.findIndex(same);
    if (i >= 0) list.splice(i, 1);
    if (d.after !== null) {
      const { kind: _k, ...where } = p;
      list.push({ ...where, partNumber: d.after });
    }
  }
  return out;
}

describe('diffLayouts properties', () => {
  it('applying the differences of a → b to a gives a layout with no differences from b', () => {
    fc.assert(
      fc.property(layoutArb, layoutArb, (a, b) => {
        const d = diffLayouts(a, b);
        expect(diffLayouts(apply(a, d.differences), b).differences).toEqual([]);
      }),
      { numRuns: 300 },
    );
  });

  it('is symmetric: b → a has the same places, with added and removed swapped', () => {
    fc.assert(
      fc.property(layoutArb, layoutArb, (a, b) => {
        const ab = diffLayouts(a, b).differences;
        const ba = diffLayouts(b, a).differences;
        expect(ba.map((x) => x.place)).toEqual(ab.map((x) => x.place));
        const flip = { added: 'removed', removed: 'added', changed: 'changed' } as const;
        ba.forEach((x, i) => {
          expect(x.change).toBe(flip[ab[i]!.change]);
          expect(x.before).toEqual(ab[i]!.after);
        });
      }),
      { numRuns: 300 },
    );
  });

  it('never lists a place twice, and counts add up', () => {
    fc.assert(
      fc.property(layoutArb, layoutArb, (a, b) => {
        const d = diffLayouts(a, b);
        expect(diffPlaceKeys(d).size).toBe(d.differences.length);
        const c = d.counts;
        expect(c.elements + c.coverPlates + c.rotorBars + c.settings).toBe(d.differences.length);
      }),
      { numRuns: 200 },
    );
  });
});

describe('diff module purity', () => {
  it('imports only zod and relative domain modules', () => {
    const src = readFileSync(new URL('../../../src/lib/domain/diff.ts', import.meta.url), 'utf8');
    const imports = [...src.matchAll(/from\s+'([^']+)'/g)].map((m) => m[1]!);
    expect(imports.length).toBeGreaterThan(0);
    for (const i of imports) expect(i === 'zod' || i.startsWith('./')).toBe(true);
  });
});
