import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  allPlaces,
  checkLayout,
  checkPlacement,
  computeSettings,
  cropIdSchema,
  demoCatalog,
  demoFamilies,
  drumIdSchema,
  findingSchema,
  handedCounterpart,
  layoutSchema,
  placeKey,
  placePart,
  settingPlaces,
  starterLayout,
  vaneControlSchema,
  vaneSettingSchema,
  type Finding,
  type Layout,
  type MachineFamily,
  type Side,
} from '~/lib/domain';
import { catalog } from './helpers';

const other = (s: Side): Side => (s === 'left' ? 'right' : 'left');
const familyArb = fc.constantFrom(...demoFamilies);
const cropArb = fc.constantFrom(...cropIdSchema.options);
const partNumbers = demoCatalog.map((p) => p.partNumber);
const partNumberArb = fc.oneof(
  { weight: 5, arbitrary: fc.constantFrom(...partNumbers) },
  { weight: 1, arbitrary: fc.stringMatching(/^[A-Z0-9]{2,4}(-[A-Z0-9]{1,4}){0,3}$/) },
);
const sideArb = fc.constantFrom<Side>('left', 'right');

/** Any schema-valid layout: random settings, random parts in random (possibly absent) places. */
const anyLayoutArb: fc.Arbitrary<{ family: MachineFamily; layout: Layout }> = fc
  .record({
    family: familyArb,
    familyId: fc.oneof(fc.constantFrom(...demoFamilies.map((f) => f.id)), fc.constant('other-family')),
    crop: cropArb,
    drum: fc.constantFrom(...drumIdSchema.options),
    vaneControl: fc.constantFrom(...vaneControlSchema.options),
    vaneSetting: fc.constantFrom(...vaneSettingSchema.options),
    rotorRpm: fc.integer({ min: 100, max: 1500 }),
    clearanceMm: fc.double({ min: 0.5, max: 80, noNaN: true }),
    elements: fc.uniqueArray(fc.record({ position: fc.integer({ min: 1, max: 8 }), side: sideArb, partNumber: partNumberArb }), {
      maxLength: 16,
      selector: (e) => `${e.position}:${e.side}`,
    }),
    coverPlates: fc.uniqueArray(fc.record({ section: fc.integer({ min: 1, max: 4 }), side: sideArb, partNumber: partNumberArb }), {
      maxLength: 4,
      selector: (c) => `${c.section}:${c.side}`,
    }),
    rotorBars: fc.uniqueArray(
      fc.record({ row: fc.integer({ min: 1, max: 5 }), position: fc.integer({ min: 1, max: 7 }), partNumber: partNumberArb }),
      {
        maxLength: 30,
        selector: (b) => `${b.row}:${b.position}`,
      },
    ),
  })
  .map(({ family, ...rest }) => ({ family, layout: layoutSchema.parse({ format: 'cagewright.layout/1', ...rest }) }));

/** A layout on its own family, mostly made of that family's parts in the family's places. */
const familyLayoutArb = familyArb.chain((family) => {
  const mine = demoCatalog.filter((p) => p.fitGroup === family.fitGroup && p.kind === 'element').map((p) => p.partNumber);
  const places = family.positions.flatMap((p) => (['left', 'right'] as const).map((side) => ({ position: p.index, side })));
  return fc
    .record({
      crop: cropArb,
      fill: fc.array(fc.option(fc.constantFrom(...mine), { nil: undefined }), { minLength: places.length, maxLength: places.length }),
      covers: fc.subarray(['left', 'right'] as const),
    })
    .map(({ crop, fill, covers }) => {
      const base = starterLayout(family, crop, demoCatalog);
      const elements = places.flatMap((pl, i) => (fill[i] ? [{ ...pl, partNumber: fill[i]! }] : []));
      const section = family.cageTopSections.find((s) => s.coverPlateSides.length)!.index;
      const coverPlates = covers.map((side) => ({
        section,
        side,
        partNumber: demoCatalog.find((p) => p.kind === 'cover-plate' && p.fitGroup === family.fitGroup && p.side === side)!.partNumber,
      }));
      return { family, layout: { ...base, elements, coverPlates } };
    });
});

function mirror(layout: Layout): Layout {
  const flip = <T extends { side: Side; partNumber: string }>(x: T): T => {
    const part = catalog.byPartNumber.get(x.partNumber);
    const side = other(x.side);
    const twin = part && handedCounterpart(catalog, part, side);
    return { ...x, side, partNumber: twin ? twin.partNumber : x.partNumber };
  };
  return { ...layout, elements: layout.elements.map(flip), coverPlates: layout.coverPlates.map(flip) };
}

describe('properties', () => {
  it('checkLayout and computeSettings never throw on a schema-valid layout, and every finding is well formed', () => {
    fc.assert(
      fc.property(anyLayoutArb, ({ family, layout }) => {
        const findings = checkLayout(family, catalog, layout);
        for (const f of findings) findingSchema.parse(f);
        const s = computeSettings(family, catalog, layout);
        expect(Number.isFinite(s.tipSpeedMs)).toBe(true);
        expect(Number.isFinite(s.aggressivenessIndex)).toBe(true);
      }),
      { numRuns: 400 },
    );
  });

  it('mirroring the halves with correctly handed parts never leaves a hand finding', () => {
    fc.assert(
      fc.property(familyLayoutArb, ({ family, layout }) => {
        const before = checkLayout(family, catalog, layout).filter((f) => f.code === 'FIT_HAND_MISMATCH').length;
        const after = checkLayout(family, catalog, mirror(layout)).filter((f) => f.code === 'FIT_HAND_MISMATCH').length;
        expect(after).toBe(0);
        expect(after).toBeLessThanOrEqual(before);
      }),
      { numRuns: 300 },
    );
  });

  it('a clean layout stays clean after a swap of two half-positions that the rules allow at both places', () => {
    const arb = fc.record({ family: familyArb, crop: cropArb, a: fc.nat(), b: fc.nat(), side: sideArb });
    let allowedMoves = 0;
    fc.assert(
      fc.property(arb, ({ family, crop, a, b, side }) => {
        const layout = starterLayout(family, crop, demoCatalog);
        const serious = (fs: Finding[]) => fs.filter((f) => f.severity !== 'advice');
        expect(serious(checkLayout(family, catalog, layout))).toEqual([]);
        const row = layout.elements.filter((e) => e.side === side);
        const ea = row[a % row.length]!;
        const eb = row[b % row.length]!;
        const placeA = { kind: 'element', position: ea.position, side } as const;
        const placeB = { kind: 'element', position: eb.position, side } as const;
        const moved = placePart(placePart(layout, placeA, eb.partNumber), placeB, ea.partNumber);
        // Allowed: the rules raise nothing at either destination (what the editor's drop preview asks).
        const allowed =
          serious(checkPlacement(family, catalog, moved, placeA, eb.partNumber)).length === 0 &&
          serious(checkPlacement(family, catalog, moved, placeB, ea.partNumber)).length === 0;
        fc.pre(allowed);
        allowedMoves++;
        expect(serious(checkLayout(family, catalog, moved))).toEqual([]);
      }),
      { numRuns: 300 },
    );
    expect(allowedMoves).toBeGreaterThan(100);
  });

  it('a swap between zones of a split cage is never allowed (concaves front, grates rear)', () => {
    const family = demoFamilies.find((f) => f.cageKind === 'split')!;
    fc.assert(
      fc.property(cropArb, fc.integer({ min: 1, max: 3 }), fc.integer({ min: 4, max: 6 }), sideArb, (crop, front, rear, side) => {
        const layout = starterLayout(family, crop, demoCatalog);
        const at = (p: number) => layout.elements.find((e) => e.position === p && e.side === side)!.partNumber;
        const place = { kind: 'element', position: rear, side } as const;
        const moved = placePart(layout, place, at(front));
        expect(checkPlacement(family, catalog, moved, place, at(front)).map((f) => f.code)).toContain('FIT_ZONE_FORBIDDEN');
      }),
      { numRuns: 100 },
    );
  });

  it('every finding on a layout in its own family’s places is pinned to a place the diagram draws', () => {
    fc.assert(
      fc.property(familyLayoutArb, ({ family, layout }) => {
        const drawn = new Set([...allPlaces(family), ...settingPlaces].map(placeKey));
        for (const f of checkLayout(family, catalog, layout)) for (const p of f.places) expect(drawn.has(placeKey(p))).toBe(true);
      }),
      { numRuns: 300 },
    );
  });

  it('checkLayout is deterministic', () => {
    fc.assert(
      fc.property(anyLayoutArb, ({ family, layout }) => {
        expect(checkLayout(family, catalog, layout)).toEqual(checkLayout(family, demoCatalog, structuredClone(layout)));
      }),
      { numRuns: 100 },
    );
  });
});
