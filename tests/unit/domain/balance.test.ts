/**
 * Rotor balance and matched sets (rules/rotor-bars.ts, rotor.ts).
 *
 * Sources of the values checked here:
 * - F = m·r·ω² (centripetal force of an out-of-balance mass): any standard mechanics text, e.g.
 *   Meriam & Kraige, Engineering Mechanics: Dynamics, ch. 3.
 * - Permissible residual unbalance e·ω ≤ G, grade G 16 for parts of agricultural machinery:
 *   ISO 21940-11 (the grade from memory of the standard's table).
 * - 1 lbf = 4.4482216152605 N: NIST SP 811, Appendix B.
 * - Bars on opposite rows are a matched set of one kind and mass; straight bars span a pair of
 *   in-line mounts; spike rasp bars go on those mounts when it is off: common practice, no
 *   published source.
 * - Masses, rotor mass and drum diameter are the invented demo catalog's (demo-catalog.ts).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkLayout, cropIdSchema, demoCatalog, type CatalogPart, type Finding, type Layout, type MachineFamily } from '~/lib/domain';
import { billOfMaterials } from '~/lib/domain/planner/bom';
import { rotorModel } from '~/lib/domain/rotor';
import { catalog, codes, modular, setBar, split, start } from './helpers';

const mass = (pn: string) => demoCatalog.find((p) => p.partNumber === pn)!.massKg;
const omega = (rpm: number) => (2 * Math.PI * rpm) / 60;
const unbalanced = (fs: Finding[]) => fs.filter((f) => f.code === 'BAR_UNBALANCED');
const check = (l: Layout, family: MachineFamily = modular) => checkLayout(family, catalog, l);

describe('the three layouts the review found silent', () => {
  it('wheat with every rotor bar removed: every row is an empty-mount finding', () => {
    const l = { ...start('wheat'), rotorBars: [] };
    const empty = check(l).filter((f) => f.code === 'BAR_PLACE_EMPTY');
    expect(empty.map((f) => f.places.length)).toEqual([4, 4, 4, 4]);
    expect(empty.every((f) => f.severity === 'hurts-crop')).toBe(true);
    // Nothing anywhere is balanced against nothing: no balance finding for an empty rotor.
    expect(unbalanced(check(l))).toEqual([]);
  });

  it('wheat with row 1 removed: empty mounts, and each position out of balance against row 3 (blocks fit)', () => {
    const base = start('wheat');
    const l = { ...base, rotorBars: base.rotorBars.filter((b) => b.row !== 1) };
    const fs = check(l);
    expect(codes(fs)).toContain('BAR_PLACE_EMPTY');
    const u = unbalanced(fs);
    expect(u.map((f) => f.places)).toEqual(
      [1, 2, 3, 4].map((p) => [
        { kind: 'bar', row: 1, position: p },
        { kind: 'bar', row: 3, position: p },
      ]),
    );
    // Position 3 of row 3 carries a rasp bar: F = m·r·ω² with m its mass, r = 762 mm / 2.
    const f3 = u[2]!;
    const F = mass('CW-BR-RS-04') * 0.381 * omega(base.rotorRpm) ** 2;
    expect(f3.explanation).toContain(`${Math.round(F)} N (${Math.round(F / 4.4482216152605)} lbf)`);
    expect(f3.explanation).toContain('rotor row 3, position 3');
    expect(f3.severity).toBe('blocks-fit');
  });

  it('wheat with one discharge bar at row 1, position 4: a balance finding naming row 3, position 4', () => {
    const base = start('wheat');
    const fs = check(setBar(base, 1, 4, 'CW-BR-DC-04'));
    const u = unbalanced(fs);
    expect(u).toHaveLength(1);
    expect(u[0]!.places).toEqual([
      { kind: 'bar', row: 1, position: 4 },
      { kind: 'bar', row: 3, position: 4 },
    ]);
    expect(u[0]!.explanation).toContain('rotor row 3, position 4');
    const dm = mass('CW-BR-DC-04') - mass('CW-BR-RS-04'); // 8.1 − 6.8 kg
    const F = dm * 0.381 * omega(base.rotorRpm) ** 2;
    const allowed = 480 * 0.016 * omega(base.rotorRpm); // ISO 21940-11, G 16, 480 kg demo rotor
    expect(u[0]!.explanation).toContain(`${Math.round(F)} N`);
    expect(u[0]!.explanation).toContain(`at most ${Math.round(allowed)} N`);
    expect(u[0]!.severity).toBe(F > allowed ? 'blocks-fit' : 'hurts-crop');
    expect(F > allowed).toBe(true);
  });
});

describe('severity threshold and mass tolerance', () => {
  // A second rasp bar of the same kind, a little heavier: as a dealer's catalog might list.
  const heavier = (kg: number): CatalogPart[] => [
    ...demoCatalog,
    {
      kind: 'rotor-bar',
      partNumber: 'CW-BR-RS-04H',
      name: 'Rasp bar, heavier',
      fitGroup: 'tamarack',
      barKind: 'rasp',
      massKg: kg,
      priceCents: 9000,
    },
  ];
  const run = (kg: number, rpm: number) =>
    checkLayout(modular, heavier(kg), { ...setBar(start('wheat'), 2, 3, 'CW-BR-RS-04H'), rotorRpm: rpm });

  it('two bars of one kind within 50 g are a matched set', () => {
    expect(unbalanced(run(6.84, 500))).toEqual([]);
  });
  it('100 g apart at 400 rpm is below what the rotor may carry: hurts crop, not blocks fit', () => {
    const u = unbalanced(run(6.9, 400));
    expect(u).toHaveLength(1);
    // F = 0.1 kg × 0.381 m × ω² ≈ 67 N; allowed 480 kg × 0.016 m/s × ω ≈ 322 N (ISO 21940-11 G 16).
    expect(0.1 * 0.381 * omega(400) ** 2).toBeLessThan(480 * 0.016 * omega(400));
    expect(u[0]!.severity).toBe('hurts-crop');
    expect(u[0]!.places).toEqual([
      { kind: 'bar', row: 2, position: 3 },
      { kind: 'bar', row: 4, position: 3 },
    ]);
  });
  it('the same difference blocks fit once F = m·r·ω² passes M·G·ω (a faster rotor)', () => {
    // 0.6 kg: F = 0.6 × 0.381 × ω² against 480 × 0.016 × ω; F passes it above ω ≈ 33.6 rad/s (≈ 321 rpm).
    expect(unbalanced(run(7.4, 300))[0]!.severity).toBe('hurts-crop');
    expect(unbalanced(run(7.4, 400))[0]!.severity).toBe('blocks-fit');
  });
  it('different kinds of one mass still do not match', () => {
    const sameMass: CatalogPart[] = demoCatalog.map((p) => (p.partNumber === 'CW-BR-SR-04' ? { ...p, massKg: mass('CW-BR-RS-04') } : p));
    const u = unbalanced(checkLayout(modular, sameMass, setBar(start('wheat'), 2, 3, 'CW-BR-SR-04')));
    expect(u).toHaveLength(1);
    expect(u[0]!.severity).toBe('hurts-crop');
    expect(u[0]!.explanation).toMatch(/matched set of one kind/);
  });
});

describe('straight bars span a pair of in-line mounts', () => {
  it('the corn starter lists one straight bar per pair, and the bill of materials orders two, not four', () => {
    const corn = start('corn');
    const straight = corn.rotorBars.filter((b) => b.partNumber === 'CW-BR-ST-04');
    expect(straight).toEqual([
      { row: 1, position: 1, partNumber: 'CW-BR-ST-04' },
      { row: 3, position: 1, partNumber: 'CW-BR-ST-04' },
    ]);
    expect(corn.rotorBars.some((b) => (b.row === 1 || b.row === 3) && b.position === 2)).toBe(false);
    expect(check(corn)).toEqual([]);
    const bom = billOfMaterials(catalog, corn, null, {});
    expect(bom.lines.find((l) => l.partNumber === 'CW-BR-ST-04')!.quantity).toBe(2);
    expect(check(start('corn', split), split)).toEqual([]);
  });
  it('small grains: spike rasp bars on the in-line mounts the straight bar leaves', () => {
    const wheat = start('wheat');
    const inLine = wheat.rotorBars.filter((b) => modular.rotorBarPlaces.find((p) => p.row === b.row && p.position === b.position)!.inLine);
    expect(inLine.map((b) => b.partNumber)).toEqual(['CW-BR-SP-04', 'CW-BR-SP-04', 'CW-BR-SP-04', 'CW-BR-SP-04']);
  });
  it('a straight bar on one row only is out of balance at both mounts it spans', () => {
    const corn = start('corn');
    const l = setBar(
      setBar({ ...corn, rotorBars: corn.rotorBars.filter((b) => !(b.row === 3 && b.position === 1)) }, 3, 1, 'CW-BR-SP-04'),
      3,
      2,
      'CW-BR-SP-04',
    );
    const u = unbalanced(check(l));
    expect(u.map((f) => f.places[0])).toEqual([
      { kind: 'bar', row: 1, position: 1 },
      { kind: 'bar', row: 1, position: 2 },
    ]);
  });
  it('a straight bar listed at the rear mount of its pair is refused and named', () => {
    const corn = start('corn');
    const l = { ...corn, rotorBars: corn.rotorBars.map((b) => (b.row === 1 && b.position === 1 ? { ...b, position: 2 } : b)) };
    const f = check(setBar(l, 1, 1, 'CW-BR-SP-04')).find((x) => x.code === 'BAR_STRAIGHT_NOT_IN_LINE')!;
    expect(f.title).toBe('Straight bar listed at the rear of its pair');
    expect(f.fix).toMatch(/position 1 of row 1/);
  });
});

describe('properties (fast-check)', () => {
  const families = [modular, split];
  // A balanced rotor: a starter layout for any family, crop and drum (the starter is balanced),
  // then mirrored replacements of non-straight bars on opposite places.
  const arbBalanced = fc
    .record({
      family: fc.constantFrom(...families),
      crop: fc.constantFrom(...cropIdSchema.options),
      slim: fc.boolean(),
      rpm: fc.integer({ min: 250, max: 1200 }),
      swaps: fc.array(fc.record({ i: fc.nat(), kind: fc.constantFrom('RS', 'SR', 'SP', 'DC') }), { maxLength: 4 }),
    })
    .map(({ family, crop, slim, rpm, swaps }) => {
      const drum = slim && family.drumOptions.some((d) => d.id === 'slim') ? 'slim' : 'full';
      let l: Layout = { ...start(crop, family, { drum }), rotorRpm: rpm };
      const m = rotorModel(family);
      const code = family === modular ? '04' : '06';
      const free = family.rotorBarPlaces.filter((p) => {
        const k = `${p.row}:${p.position}`;
        const o = m.oppositeRow.get(p.row)!;
        const ok = (key: string) => !m.spanByFront.has(key) && !m.spanByRear.has(key);
        return p.row < o && ok(k) && ok(`${o}:${p.position}`);
      });
      for (const s of swaps) {
        const p = free[s.i % free.length]!;
        const pn = `CW-BR-${s.kind}-${code}`;
        l = setBar(setBar(l, p.row, p.position, pn), m.oppositeRow.get(p.row)!, p.position, pn);
      }
      return { family, layout: l };
    });

  it('every balanced rotor raises no balance finding', () => {
    fc.assert(
      fc.property(arbBalanced, ({ family, layout }) => unbalanced(check(layout, family)).length === 0),
      { numRuns: 300 },
    );
  });

  it('removing any bar from a balanced rotor always raises a balance finding naming its place', () => {
    fc.assert(
      fc.property(arbBalanced, fc.nat(), ({ family, layout }, i) => {
        const gone = layout.rotorBars[i % layout.rotorBars.length]!;
        const l = { ...layout, rotorBars: layout.rotorBars.filter((b) => b !== gone) };
        const u = unbalanced(check(l, family));
        return u.some((f) => f.places.some((p) => p.kind === 'bar' && p.row === gone.row && p.position === gone.position));
      }),
      { numRuns: 300 },
    );
  });

  it('adding a mirrored pair (same part on opposite places) never raises one', () => {
    fc.assert(
      fc.property(arbBalanced, fc.nat(), fc.constantFrom('RS', 'SR', 'SP', 'ST', 'DC'), ({ family, layout }, i, kind) => {
        const m = rotorModel(family);
        const p = family.rotorBarPlaces.filter((x) => x.row < (m.oppositeRow.get(x.row) ?? 0))[i % (family.rotorBarPlaces.length / 2)]!;
        const o = m.oppositeRow.get(p.row)!;
        // Empty the two places first (and the rears of their spans), then add the pair.
        const span = m.spanByFront.get(`${p.row}:${p.position}`) ?? m.spanByRear.get(`${p.row}:${p.position}`);
        const positions = span ? [span.front, span.rear] : [p.position];
        const cleared = {
          ...layout,
          rotorBars: layout.rotorBars.filter((b) => !((b.row === p.row || b.row === o) && positions.includes(b.position))),
        };
        const at = kind === 'ST' && span ? span.front : p.position;
        const pn = `CW-BR-${kind}-${family === modular ? '04' : '06'}`;
        let l = setBar(setBar(cleared, p.row, at, pn), o, at, pn);
        if (span && kind !== 'ST') for (const q of positions) l = setBar(setBar(l, p.row, q, pn), o, q, pn);
        return unbalanced(check(l, family)).length === 0;
      }),
      { numRuns: 300 },
    );
  });
});
