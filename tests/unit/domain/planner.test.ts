import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  checkLayout,
  checkPlacement,
  cropIds,
  cropPrograms,
  demoCatalog,
  demoFamilies,
  indexCatalog,
  LAYOUT_FORMAT,
  machineFamilySchema,
  catalogPartSchema,
  starterLayout,
  type CatalogPart,
  type CropId,
  type ElementPart,
  type ElementType,
  type Layout,
  type MachineFamily,
  type Side,
} from '~/lib/domain';
import {
  billOfMaterials,
  planCropChange,
  solveAssignment,
  WORK_CAUTIONS,
  type Plan,
  type PlanMode,
  type PlanOk,
} from '~/lib/domain/planner';
import { workSteps } from '~/lib/domain/planner/steps';
import type { SlotOutcome, Unit } from '~/lib/domain/planner/solve';
import { catalog, modular, split } from './helpers';

function ok(plan: Plan): PlanOk {
  if (!plan.ok) throw new Error(`no plan: ${plan.reasons.map((r) => r.message).join(' | ')}`);
  return plan;
}

/** Every demo machine kind: family × drum × vane control. */
const machines = demoFamilies.flatMap((family) =>
  family.drumOptions.flatMap((d) => family.vaneControls.map((vaneControl) => ({ family, drum: d.id, vaneControl }))),
);

/** Every part of the family's catalog, as many as the family has places. */
function fullShelf(family: MachineFamily): Record<string, number> {
  const n = family.positions.length * 2 + family.rotorBarPlaces.length + 4;
  return Object.fromEntries(demoCatalog.filter((p) => p.fitGroup === family.fitGroup).map((p) => [p.partNumber, n]));
}

/** A farm's handful of spares: the first position's elements of the installed layout. */
function farmShelf(installed: Layout | null): Record<string, number> {
  return Object.fromEntries((installed?.elements ?? []).filter((e) => e.position === 1).map((e) => [e.partNumber, 1]));
}

const KIND_ORDER = ['remove', 'move', 'swap', 'install', 'buy'];

describe('planner on every demo machine and crop', () => {
  for (const m of machines) {
    const label = `${m.family.name}, ${m.drum} drum, ${m.vaneControl} vanes`;
    for (const from of [null, ...cropIds] as (CropId | null)[]) {
      it(`${label}: from ${from ?? 'an empty cage'} to every crop, the plan passes every fit rule`, () => {
        let plans = 0;
        const installed = from ? starterLayout(m.family, from, demoCatalog, { drum: m.drum, vaneControl: m.vaneControl }) : null;
        for (const shelf of [{}, farmShelf(installed), fullShelf(m.family)])
          for (const to of cropIds)
            for (const mode of ['program', 'on-hand'] as const) {
              const plan = ok(
                planCropChange({ family: m.family, catalog, installed, shelf, crop: to, mode, drum: m.drum, vaneControl: m.vaneControl }),
              );
              const findings = checkLayout(m.family, catalog, plan.layout);
              const ctx = `${from ?? 'empty'} → ${to} (${mode})`;
              expect(
                findings.filter((f) => f.severity === 'blocks-fit'),
                ctx,
              ).toEqual([]);
              // The demo catalog has every program part, so the crop is served well too.
              expect(
                findings.filter((f) => f.severity === 'hurts-crop'),
                ctx,
              ).toEqual([]);
              expect(plan.layout.crop).toBe(to);
              expect(plan.layout.drum).toBe(m.drum);
              expect(plan.layout.vaneControl).toBe(m.vaneControl);
              expect(plan.findings).toEqual(findings);
              // Every half-position is filled, and each choice explains itself.
              expect(plan.layout.elements).toHaveLength(m.family.positions.length * 2);
              for (const c of plan.choices) expect(c.why.length, c.key).toBeGreaterThan(20);
              // Steps come in working order, numbered, with the cautions at the head.
              const kinds = plan.steps.map((s) => KIND_ORDER.indexOf(s.kind));
              expect(kinds).toEqual([...kinds].sort((a, b) => a - b));
              expect(plan.steps.map((s) => s.n)).toEqual(plan.steps.map((_, i) => i + 1));
              expect(plan.cautions).toBe(WORK_CAUTIONS);
              // What is bought is exactly what the layout needs beyond the machine and the shelf.
              const bom = billOfMaterials(catalog, plan.layout, installed, shelf);
              expect(plan.purchases.map((p) => [p.partNumber, p.quantity])).toEqual(bom.lines.map((l) => [l.partNumber, l.quantity]));
              expect(plan.counts.purchaseCents).toBe(bom.totalCents);
              plans++;
            }
        expect(plans).toBe(3 * cropIds.length * 2);
      });
    }

    it(`${label}: on a full shelf it buys nothing`, () => {
      for (const from of [null, ...cropIds] as (CropId | null)[]) {
        const installed = from ? starterLayout(m.family, from, demoCatalog, { drum: m.drum, vaneControl: m.vaneControl }) : null;
        for (const to of cropIds) {
          const plan = ok(
            planCropChange({
              family: m.family,
              catalog,
              installed,
              shelf: fullShelf(m.family),
              crop: to,
              drum: m.drum,
              vaneControl: m.vaneControl,
            }),
          );
          expect(plan.counts.purchases, `${from} → ${to}`).toBe(0);
          expect(plan.purchases).toEqual([]);
          expect(plan.steps.some((s) => s.kind === 'buy')).toBe(false);
        }
      }
    });
  }

  it('changes nothing when the machine already carries the crop program', () => {
    for (const crop of cropIds) {
      const installed = starterLayout(modular, crop, demoCatalog);
      const plan = ok(planCropChange({ family: modular, catalog, installed, shelf: {}, crop }));
      expect(plan.counts).toMatchObject({ purchases: 0, moves: 0, removed: 0 });
      expect(plan.steps).toEqual([]);
      expect(plan.layout).toEqual(installed);
    }
  });
});

describe('a wheat machine going to peas, corn and rice', () => {
  const wheat = starterLayout(modular, 'wheat', demoCatalog, { drum: 'slim', vaneControl: 'powered' });
  const plan = (crop: CropId, shelf: Record<string, number> = {}, mode: PlanMode = 'program') =>
    ok(planCropChange({ family: modular, catalog, installed: wheat, shelf, crop, mode, drum: 'slim', vaneControl: 'powered' }));

  it('peas: the fine-wire elements in front come off (too small for peas) and round-bar elements go in', () => {
    const p = plan('field-peas');
    expect(p.removals.map((r) => r.key)).toEqual(['element:1:left', 'element:2:left', 'element:1:right', 'element:2:right']);
    expect(p.removals[0]!.why).toMatch(/too small for peas/);
    expect(p.purchases.map((x) => [x.partNumber, x.quantity])).toEqual([
      ['CW-RB-L-04', 2],
      ['CW-RB-R-04', 2],
    ]);
    expect(p.counts).toMatchObject({ purchases: 4, kept: 20, moves: 8 });
    expect(p.choices.find((c) => c.key === 'element:3:left')).toMatchObject({ source: 'kept', after: 'CW-WW-L-04' });
  });

  it('peas with round-bar elements on the shelf: fitted from the shelf, nothing bought', () => {
    const p = plan('field-peas', { 'CW-RB-L-04': 2, 'CW-RB-R-04': 5 });
    expect(p.counts).toMatchObject({ purchases: 0, fromShelf: 4, moves: 8 });
    expect(p.steps.filter((s) => s.kind === 'install')).toHaveLength(4);
    expect(p.steps[4]!.text).toMatch(/^Fit the left-hand round-bar element CW-RB-L-04 from the shelf at position 1, left/);
  });

  it('corn: the wide-wire elements move forward instead of being bought, skip-wire goes behind', () => {
    const p = plan('corn');
    const moves = p.steps.filter((s) => s.kind === 'move');
    expect(moves.map((s) => s.text)).toEqual([
      expect.stringMatching(/^Move the left-hand wide-wire element CW-WW-L-04 from position 3, left to position 1, left/),
      expect.stringMatching(/^Move the left-hand wide-wire element CW-WW-L-04 from position 4, left to position 2, left/),
      expect.stringMatching(/^Move the right-hand wide-wire element CW-WW-R-04 from position 3, right to position 1, right/),
      expect.stringMatching(/^Move the right-hand wide-wire element CW-WW-R-04 from position 4, right to position 2, right/),
    ]);
    // Straight bars across the in-line mounts, as the corn program wants: ONE bar spans each
    // pair of in-line mounts (common practice, no published source), so two pairs need two bars,
    // not one per mount.
    expect(p.purchases.map((x) => [x.partNumber, x.quantity])).toEqual([
      ['CW-SW-L-04', 2],
      ['CW-SW-R-04', 2],
      ['CW-BR-ST-04', 2],
    ]);
    const straightBuy = p.steps.find((s) => s.kind === 'buy' && s.partNumbers.includes('CW-BR-ST-04'))!;
    expect(straightBuy.text).toMatch(/^Order 2 × CW-BR-ST-04 .* each spanning that mount and the in-line mount behind it/);
    expect(straightBuy.places).toEqual([
      { kind: 'bar', row: 1, position: 1 },
      { kind: 'bar', row: 3, position: 1 },
    ]);
    const removedBars = p.removals.filter((r) => r.place.kind === 'bar');
    expect(removedBars).toHaveLength(4);
    // The rear mount of each pair comes free because the straight bar takes it, and the step says so.
    const rearOff = p.steps.find((s) => s.kind === 'remove' && /rotor row 1, position 2/i.test(s.text))!;
    expect(rearOff.text).toMatch(/the straight bar from position 1 takes this mount too/);
    // Every moved element is heavy: the step says how to lift it.
    for (const s of moves) {
      expect(s.heavy).toBe(true);
      expect(s.text).toMatch(/helper or a lifting aid/);
    }
  });

  it('rice: close-bar in front and the right cover plate; the left plate never goes on powered vanes', () => {
    const p = plan('rice');
    expect(p.layout.coverPlates).toEqual([{ section: 2, side: 'right', partNumber: 'CW-CP-R-04' }]);
    const withLeft = { ...wheat, coverPlates: [{ section: 2, side: 'left' as const, partNumber: 'CW-CP-L-04' }] };
    const q = ok(
      planCropChange({ family: modular, catalog, installed: withLeft, shelf: {}, crop: 'rice', drum: 'slim', vaneControl: 'powered' }),
    );
    const off = q.removals.find((r) => r.key === 'cover:2:left');
    expect(off?.why).toMatch(/vane linkage/);
    expect(q.layout.coverPlates.map((c) => c.side)).toEqual(['right']);
  });

  it('rice on fixed vanes keeps a left cover plate that is already on', () => {
    const fixed = { ...starterLayout(modular, 'rice', demoCatalog, { vaneControl: 'fixed' }) };
    fixed.coverPlates = [...fixed.coverPlates, { section: 2, side: 'left', partNumber: 'CW-CP-L-04' }];
    const p = ok(planCropChange({ family: modular, catalog, installed: fixed, shelf: {}, crop: 'rice', vaneControl: 'fixed' }));
    expect(p.layout.coverPlates.map((c) => c.side).sort()).toEqual(['left', 'right']);
    expect(p.counts.moves).toBe(0);
  });

  it('settings follow the crop program: rotor speed, clearance and vanes', () => {
    const p = plan('field-peas');
    const fields = p.settings.map((s) => s.field);
    expect(fields).toEqual(expect.arrayContaining(['rotorRpm', 'clearanceMm', 'vaneSetting']));
    expect(p.settings.find((s) => s.field === 'clearanceMm')).toMatchObject({
      before: cropPrograms.wheat.clearanceMm.maxMm,
      after: cropPrograms['field-peas'].clearanceMm.maxMm,
    });
  });

  it('the fingerprint changes when the shelf changes the plan, and not otherwise', () => {
    expect(plan('field-peas').fingerprint).toBe(plan('field-peas', { 'CW-FW-L-04': 3 }).fingerprint);
    expect(plan('field-peas').fingerprint).not.toBe(plan('field-peas', { 'CW-RB-L-04': 1 }).fingerprint);
  });
});

describe('parts that cannot stay', () => {
  it('takes off unknown parts, other families’ parts and wrong-hand elements, saying why', () => {
    const wheat = starterLayout(modular, 'wheat', demoCatalog);
    const odd: Layout = {
      ...wheat,
      elements: wheat.elements.map((e) =>
        e.position === 1 && e.side === 'left'
          ? { ...e, partNumber: 'CW-ZZ-L-99' }
          : e.position === 2 && e.side === 'left'
            ? { ...e, partNumber: 'CW-FW-L-06C' }
            : e.position === 3 && e.side === 'right'
              ? { ...e, partNumber: 'CW-WW-L-04' }
              : e,
      ),
    };
    const p = ok(planCropChange({ family: modular, catalog, installed: odd, shelf: {}, crop: 'wheat' }));
    const why = Object.fromEntries(p.removals.map((r) => [r.key, r.why]));
    expect(why['element:1:left']).toMatch(/catalog does not know/);
    expect(why['element:2:left']).toMatch(/another machine family/);
    // The left-hand element in the right half is not needed on the left (both wide-wire places
    // there already hold one), so it comes off.
    expect(why['element:3:right']).toMatch(/left-hand element never fits the right half/);
    expect(checkLayout(modular, catalog, p.layout).filter((f) => f.severity !== 'advice')).toEqual([]);
  });

  it('a left-hand element in the right half moves to a left place that needs it', () => {
    const wheat = starterLayout(modular, 'wheat', demoCatalog);
    // The left fine-wire element sits in the right half and position 1 left is empty.
    const misplaced: Layout = {
      ...wheat,
      elements: [
        ...wheat.elements.filter((e) => !(e.position === 1 && e.side === 'left') && !(e.position === 1 && e.side === 'right')),
        { position: 1, side: 'right', partNumber: 'CW-FW-L-04' },
      ],
    };
    const p = ok(planCropChange({ family: modular, catalog, installed: misplaced, shelf: { 'CW-FW-R-04': 1 }, crop: 'wheat' }));
    expect(p.counts).toMatchObject({ purchases: 0, moved: 1, fromShelf: 1, moves: 2 });
    expect(p.steps.map((s) => s.kind)).toEqual(['move', 'install']);
  });
});

describe('the two modes', () => {
  it('on-hand fits suitable spares instead of buying the program’s own part, and says so', () => {
    const installed = starterLayout(split, 'wheat', demoCatalog);
    const shelf = { 'CW-WW-L-06C': 3, 'CW-WW-R-06C': 3 };
    const program = ok(planCropChange({ family: split, catalog, installed, shelf, crop: 'field-peas', mode: 'program' }));
    const onHand = ok(planCropChange({ family: split, catalog, installed, shelf, crop: 'field-peas', mode: 'on-hand' }));
    expect(program.counts.purchases).toBe(6);
    expect(program.purchases.map((p) => p.partNumber)).toEqual(['CW-RB-L-06C', 'CW-RB-R-06C']);
    expect(onHand.counts.purchases).toBe(0);
    const front = onHand.choices.filter((c) => c.place.kind === 'element' && c.place.position <= 3);
    expect(front.every((c) => c.source === 'shelf' && c.rank > 0 && /program's choice is round-bar/.test(c.why))).toBe(true);
    expect(onHand.notes.join(' ')).toMatch(/6 places hold a part other than the field-pea program's own choice/);
    expect(checkLayout(split, catalog, onHand.layout).filter((f) => f.severity !== 'advice')).toEqual([]);
  });

  it('on-hand does not buy a cover plate the program would fit', () => {
    const installed = starterLayout(modular, 'wheat', demoCatalog);
    const p = ok(planCropChange({ family: modular, catalog, installed, shelf: {}, crop: 'rice', mode: 'on-hand' }));
    expect(p.layout.coverPlates).toEqual([]);
    expect(p.choices.find((c) => c.key === 'cover:2:right')).toMatchObject({ source: 'empty' });
  });
});

describe('no possible plan', () => {
  it('says which half-positions nothing in the catalog can fill, and why', () => {
    const noRightGrates = demoCatalog.filter((p) => !(p.kind === 'element' && p.role === 'grate' && p.hand === 'right'));
    const plan = planCropChange({ family: split, catalog: noRightGrates, installed: null, shelf: {}, crop: 'wheat' });
    expect(plan.ok).toBe(false);
    if (plan.ok) return;
    expect(plan.reasons.map((r) => r.place)).toEqual([4, 5, 6].map((position) => ({ kind: 'element', position, side: 'right' })));
    expect(plan.reasons[0]!.message).toMatch(/catalog has no right-hand grate for the Sedge S6/);
    expect(plan.cautions).toBe(WORK_CAUTIONS);
  });

  it('says when the only parts that fit would hurt the crop', () => {
    const onlyFineGrates = demoCatalog.filter(
      (p) => !(p.kind === 'element' && p.role === 'grate' && p.hand === 'right' && p.elementType !== 'fine-wire'),
    );
    const plan = planCropChange({ family: split, catalog: onlyFineGrates, installed: null, shelf: {}, crop: 'edible-beans' });
    expect(plan.ok).toBe(false);
    if (plan.ok) return;
    expect(plan.reasons).toHaveLength(3);
    expect(plan.reasons[0]!.message).toMatch(
      /None of the right-hand grates in the catalog suits edible beans.*fine-wire: its opening is too small/,
    );
  });

  it('falls back to the closest suitable element when the program’s own is missing from the catalog', () => {
    const noRoundBar = demoCatalog.filter((p) => !(p.kind === 'element' && p.elementType === 'round-bar'));
    const plan = ok(planCropChange({ family: modular, catalog: noRoundBar, installed: null, shelf: {}, crop: 'field-peas' }));
    const front = plan.choices.filter((c) => c.place.kind === 'element' && c.place.position <= 2);
    expect(front.every((c) => c.rank > 0 && /catalog has no .*round-bar element/.test(c.why))).toBe(true);
    expect(checkLayout(modular, noRoundBar, plan.layout).filter((f) => f.severity !== 'advice')).toEqual([]);
  });
});

// -------------------------------------------------------------------------------------------
// Exactness: a small cage where every assignment can be tried.

const pair: MachineFamily = machineFamilySchema.parse({
  id: 'test-pair',
  name: 'Test Pair',
  fitGroup: 'test-pair',
  cageKind: 'modular',
  positions: [
    { index: 1, zone: 'threshing' },
    { index: 2, zone: 'separating' },
  ],
  drumOptions: [{ id: 'full', label: 'Full drum', diameterMm: 762 }],
  vaneControls: ['fixed'],
  cageTopSections: [],
  rotorBarRows: [],
  rotorBarPlaces: [],
  rearPosition: 2,
});

// Invented test parts: every element type in both hands, plus a dearer second wide-wire.
const SPEC: Record<ElementType, { w: number; l: number; open: number; price: number } | null> = {
  'fine-wire': { w: 5, l: 25, open: 0.38, price: 1000 },
  'wide-wire': { w: 14, l: 40, open: 0.5, price: 900 },
  'skip-wire': { w: 28, l: 40, open: 0.62, price: 800 },
  'round-bar': { w: 12, l: 45, open: 0.45, price: 1100 },
  perforated: { w: 14, l: 14, open: 0.32, price: 700 },
  blank: null,
  'close-bar': { w: 4, l: 20, open: 0.28, price: 1200 },
};
const pairParts: CatalogPart[] = [];
for (const [type, s] of Object.entries(SPEC) as [ElementType, (typeof SPEC)[ElementType]][])
  for (const hand of ['left', 'right'] as Side[]) {
    const code =
      type
        .split('-')
        .map((w) => w[0]!.toUpperCase())
        .join('') + (type === 'perforated' ? 'F' : '');
    pairParts.push(
      catalogPartSchema.parse({
        kind: 'element',
        partNumber: `TP-${code}-${hand[0]!.toUpperCase()}`,
        name: `${type} ${hand}`,
        fitGroup: 'test-pair',
        elementType: type,
        role: 'either',
        hand,
        zones: ['threshing', 'separating'],
        openingMm: s ? { width: s.w, length: s.l } : null,
        openArea: s?.open ?? 0,
        massKg: 40,
        priceCents: (s?.price ?? 500) * 100,
      }),
    );
  }
for (const hand of ['left', 'right'] as Side[])
  pairParts.push({
    ...(pairParts.find((p) => p.partNumber === `TP-WW-${hand[0]!.toUpperCase()}`) as ElementPart),
    partNumber: `TP-WW-${hand[0]!.toUpperCase()}-2`,
    priceCents: 95_000,
  });
const pairCatalog = indexCatalog(pairParts);
const foreign = 'CW-FW-L-04'; // a part of another family
const SLOTS = [1, 2].flatMap((position) => (['left', 'right'] as Side[]).map((side) => ({ kind: 'element' as const, position, side })));

function pairLayout(crop: CropId, elements: Layout['elements']): Layout {
  return {
    format: LAYOUT_FORMAT,
    familyId: pair.id,
    crop,
    drum: 'full',
    vaneControl: 'fixed',
    vaneSetting: 'medium',
    rotorRpm: 500,
    clearanceMm: 15,
    elements,
    coverPlates: [],
    rotorBars: [],
  };
}

/**
 * The acceptable parts of each place, decided by the rules themselves: no 'blocks-fit' and no
 * 'hurts-crop' finding at the place; in program mode only the crop's own element type when the
 * catalog has one that is acceptable there.
 */
function acceptable(crop: CropId, mode: PlanMode): string[][] {
  const base = pairLayout(crop, []);
  return SLOTS.map((place) => {
    const zone = place.position === 1 ? 'threshing' : 'separating';
    const ok = pairParts.filter(
      (p) => !checkPlacement(pair, pairCatalog, base, place, p.partNumber).some((f) => f.severity !== 'advice'),
    ) as ElementPart[];
    const own = ok.filter((p) => p.elementType === cropPrograms[crop].suggested[zone]);
    // A blank plate (no opening) is never a stand-in for another element.
    const others = ok.filter((p) => p.elementType !== 'blank' || own.includes(p));
    return (mode === 'program' && own.length ? own : others).map((p) => p.partNumber);
  });
}

/** Tries every way of filling the four places from the machine, the shelf or a purchase. */
function bruteForce(installed: Layout, shelf: Record<string, number>, crop: CropId, mode: PlanMode) {
  const accept = acceptable(crop, mode);
  const units = installed.elements.map((e) => ({ pn: e.partNumber, at: `${e.position}:${e.side}` }));
  const left = { ...shelf };
  const usedUnits = new Set<number>();
  let best: [number, number] | null = null;
  const visit = (i: number, buys: number, kept: number, fitted: number) => {
    if (i === SLOTS.length) {
      const cost: [number, number] = [buys, units.length - kept + fitted];
      if (!best || cost[0] < best[0] || (cost[0] === best[0] && cost[1] < best[1])) best = cost;
      return;
    }
    const slot = SLOTS[i]!;
    const key = `${slot.position}:${slot.side}`;
    for (const pn of accept[i]!) {
      units.forEach((u, k) => {
        if (u.pn !== pn || usedUnits.has(k)) return;
        usedUnits.add(k);
        visit(i + 1, buys, kept + (u.at === key ? 1 : 0), fitted);
        usedUnits.delete(k);
      });
      if ((left[pn] ?? 0) > 0) {
        left[pn]!--;
        visit(i + 1, buys, kept, fitted + 1);
        left[pn]!++;
      }
      visit(i + 1, buys + 1, kept, fitted + 1);
    }
  };
  visit(0, 0, 0, 0);
  return best!;
}

describe('exactness against exhaustive search', () => {
  it('matches a hand-built case whose optimum is two swaps', () => {
    // Skip-wire in front and wide-wire behind; corn wants them the other way round.
    const installed = pairLayout('wheat', [
      { position: 1, side: 'left', partNumber: 'TP-SW-L' },
      { position: 1, side: 'right', partNumber: 'TP-SW-R' },
      { position: 2, side: 'left', partNumber: 'TP-WW-L' },
      { position: 2, side: 'right', partNumber: 'TP-WW-R' },
    ]);
    const plan = ok(planCropChange({ family: pair, catalog: pairCatalog, installed, shelf: {}, crop: 'corn' }));
    expect(bruteForce(installed, {}, 'corn', 'program')).toEqual([0, 4]);
    expect([plan.counts.purchases, plan.counts.moves]).toEqual([0, 4]);
    expect(plan.steps.map((s) => s.kind)).toEqual(['swap', 'swap']);
    expect(plan.steps[0]!.text).toMatch(
      /^Swap the left-hand skip-wire element TP-SW-L at position 1, left with the left-hand wide-wire element TP-WW-L at position 2, left/,
    );
  });

  it('matches exhaustive search on random machines, shelves, crops and modes', () => {
    const partNumbers = [...pairParts.map((p) => p.partNumber), foreign, 'TP-ZZ-L'];
    fc.assert(
      fc.property(
        fc.array(fc.option(fc.constantFrom(...partNumbers), { nil: null }), { minLength: 4, maxLength: 4 }),
        fc.array(fc.tuple(fc.constantFrom(...pairParts.map((p) => p.partNumber)), fc.integer({ min: 1, max: 3 })), { maxLength: 5 }),
        fc.constantFrom(...cropIds),
        fc.constantFrom<PlanMode>('program', 'on-hand'),
        (fill, shelfList, crop, mode) => {
          const elements = SLOTS.flatMap((s, i) => (fill[i] ? [{ position: s.position, side: s.side, partNumber: fill[i]! }] : []));
          const installed = pairLayout('wheat', elements);
          const shelf: Record<string, number> = {};
          for (const [pn, q] of shelfList) shelf[pn] = (shelf[pn] ?? 0) + q;
          const plan = ok(planCropChange({ family: pair, catalog: pairCatalog, installed, shelf, crop, mode }));
          expect([plan.counts.purchases, plan.counts.moves]).toEqual(bruteForce(installed, shelf, crop, mode));
          // And the layout it proposes is one the exhaustive search accepts.
          const accept = acceptable(crop, mode);
          SLOTS.forEach((s, i) => {
            const e = plan.layout.elements.find((x) => x.position === s.position && x.side === s.side);
            expect(accept[i]).toContain(e?.partNumber);
          });
        },
      ),
      { numRuns: 250, seed: 20260 },
    );
  });
});

describe('the assignment solver', () => {
  it('finds the optimum of small matrices, checked against all permutations', () => {
    fc.assert(
      fc.property(
        fc
          .integer({ min: 1, max: 5 })
          .chain((n) =>
            fc
              .tuple(fc.constant(n), fc.integer({ min: n, max: n + 2 }))
              .chain(([n, m]) =>
                fc.tuple(
                  fc.constant(n),
                  fc.constant(m),
                  fc.array(fc.integer({ min: -50, max: 50 }), { minLength: n * m, maxLength: n * m }),
                ),
              ),
          ),
        ([n, m, flat]) => {
          const { colOfRow, total } = solveAssignment(n, m, (i, j) => flat[i * m + j]!);
          expect(new Set(colOfRow).size).toBe(n);
          let best = Infinity;
          const used = new Array<boolean>(m).fill(false);
          const go = (i: number, sum: number) => {
            if (i === n) return void (best = Math.min(best, sum));
            for (let j = 0; j < m; j++)
              if (!used[j]) {
                used[j] = true;
                go(i + 1, sum + flat[i * m + j]!);
                used[j] = false;
              }
          };
          go(0, 0);
          expect(total).toBe(best);
        },
      ),
      { numRuns: 300, seed: 7 },
    );
  });

  it('respects forbidden pairs', () => {
    const { colOfRow } = solveAssignment(2, 2, (i, j) => (i === j ? Infinity : 1));
    expect([...colOfRow]).toEqual([1, 0]);
  });
});

describe('working order', () => {
  it('rotates three parts that stand in each other’s way through one set aside', () => {
    const part = (pn: string) => pairCatalog.byPartNumber.get(pn)!;
    const at = (position: number) => ({ kind: 'element' as const, position, side: 'left' as const });
    const unit = (pn: string, position: number): Unit => ({
      source: 'installed',
      partNumber: pn,
      part: part(pn),
      at: at(position),
      atKey: `element:${position}:left`,
    });
    const moved = (pn: string, from: number, to: number): SlotOutcome => ({
      slot: { place: at(to), key: `element:${to}:left`, candidates: [], empty: null },
      source: 'moved',
      candidate: { part: part(pn), rank: 0, why: 'test' },
      unit: unit(pn, from),
    });
    const steps = workSteps([moved('TP-FW-L', 1, 2), moved('TP-WW-L', 2, 3), moved('TP-SW-L', 3, 1)], []);
    expect(steps).toHaveLength(1);
    expect(steps[0]!.kind).toBe('swap');
    // Position 3 is emptied first, so the part from 2 can go there, then the part from 1 to 2.
    expect(steps[0]!.text).toBe(
      'Rotate 3 parts: take off the left-hand skip-wire element TP-SW-L at position 3, left and set it aside; ' +
        'move the left-hand wide-wire element TP-WW-L from position 2, left to position 3, left; ' +
        'move the left-hand fine-wire element TP-FW-L from position 1, left to position 2, left; ' +
        'fit the part set aside at position 1, left. About 40 kg (88 lb) each: lift with a helper or a lifting aid.',
    );
  });

  it('moves along a chain from its free end', () => {
    const part = (pn: string) => pairCatalog.byPartNumber.get(pn)!;
    const at = (position: number) => ({ kind: 'element' as const, position, side: 'left' as const });
    const unit = (pn: string, position: number): Unit => ({
      source: 'installed',
      partNumber: pn,
      part: part(pn),
      at: at(position),
      atKey: `element:${position}:left`,
    });
    const moved = (pn: string, from: number, to: number): SlotOutcome => ({
      slot: { place: at(to), key: `element:${to}:left`, candidates: [], empty: null },
      source: 'moved',
      candidate: { part: part(pn), rank: 0, why: 'test' },
      unit: unit(pn, from),
    });
    // 1 → 2 → 3, and the part at 3 comes off: first the removal, then 2 → 3, then 1 → 2.
    const steps = workSteps([moved('TP-FW-L', 1, 2), moved('TP-WW-L', 2, 3)], [{ unit: unit('TP-SW-L', 3), why: 'test' }]);
    expect(steps.map((s) => [s.kind, s.places.map((p) => (p.kind === 'element' ? p.position : 0))])).toEqual([
      ['remove', [3]],
      ['move', [2, 3]],
      ['move', [1, 2]],
    ]);
  });
});
