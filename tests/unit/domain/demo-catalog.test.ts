import { describe, expect, it } from 'vitest';
import { cropIdSchema, demoCatalog, demoFamilies, elementTypeSchema, layoutSchema, partNumberSchema, starterLayout } from '~/lib/domain';
import { catalog, check } from './helpers';

describe('demo catalog (invented data)', () => {
  it('has unique part numbers of our own pattern', () => {
    const numbers = demoCatalog.map((p) => p.partNumber);
    expect(new Set(numbers).size).toBe(numbers.length);
    for (const n of numbers) {
      expect(() => partNumberSchema.parse(n)).not.toThrow();
      expect(n).toMatch(/^CW-[A-Z]{2}-[A-Z]{1,2}-0[46][CG]?$/);
    }
  });
  it('covers every element type in both hands for each family (concave and grate on the split cage)', () => {
    for (const f of demoFamilies) {
      const roles = f.cageKind === 'split' ? ['concave', 'grate'] : ['either'];
      for (const t of elementTypeSchema.options)
        for (const hand of ['left', 'right'])
          for (const role of roles)
            expect(
              demoCatalog.some(
                (p) => p.kind === 'element' && p.fitGroup === f.fitGroup && p.elementType === t && p.hand === hand && p.role === role,
              ),
              `${f.id} ${t} ${hand} ${role}`,
            ).toBe(true);
    }
  });
  it('has cover plates for each side and every rotor bar kind for each family', () => {
    for (const f of demoFamilies) {
      for (const side of ['left', 'right'])
        expect(demoCatalog.some((p) => p.kind === 'cover-plate' && p.fitGroup === f.fitGroup && p.side === side)).toBe(true);
      for (const k of ['rasp', 'smooth-rasp', 'spike-rasp', 'straight', 'discharge'])
        expect(demoCatalog.some((p) => p.kind === 'rotor-bar' && p.fitGroup === f.fitGroup && p.barKind === k)).toBe(true);
    }
  });
  it('the two families differ in cage kind, drum options and vane controls', () => {
    const [a, b] = demoFamilies;
    expect(a!.cageKind).not.toBe(b!.cageKind);
    expect(a!.drumOptions.map((d) => d.id)).not.toEqual(b!.drumOptions.map((d) => d.id));
    expect(a!.vaneControls).not.toEqual(b!.vaneControls);
  });
  it('blank plates have no opening and no open area; every other element has both', () => {
    for (const p of demoCatalog)
      if (p.kind === 'element') {
        if (p.elementType === 'blank') expect([p.openingMm, p.openArea]).toEqual([null, 0]);
        else expect(p.openingMm && p.openArea > 0).toBeTruthy();
      }
  });
});

describe('starterLayout', () => {
  for (const f of demoFamilies)
    for (const crop of cropIdSchema.options)
      it(`${f.id} in ${crop}: schema-valid and advice-only on every drum and vane control`, () => {
        for (const d of f.drumOptions)
          for (const vaneControl of f.vaneControls) {
            const l = starterLayout(f, crop, demoCatalog, { drum: d.id, vaneControl });
            expect(layoutSchema.parse(l)).toEqual(l);
            expect(check(l, f).filter((x) => x.severity !== 'advice')).toEqual([]);
            expect(l.elements).toHaveLength(f.positions.length * 2);
          }
      });
  it('uses the crop’s suggested element per zone', () => {
    const f = demoFamilies[0]!;
    const l = starterLayout(f, 'edible-beans', demoCatalog);
    const typeAt = (p: number) => {
      const part = catalog.byPartNumber.get(l.elements.find((e) => e.position === p)!.partNumber)!;
      return part.kind === 'element' ? part.elementType : null;
    };
    expect(typeAt(1)).toBe('perforated');
    expect(typeAt(4)).toBe('wide-wire');
  });
});
