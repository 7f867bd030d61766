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
  type PurchaseAvailability,
  FIELD_CHECK_PATH,
  planSummaryWords,
} from '~/lib/domain/planner';
import { placeKey } from '~/lib/domain/places';
import { liftSeconds, ROTOR_ACCESS_SECONDS } from '~/lib/domain/planner/effort';
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

const PHASE_ORDER = ['parts', 'work', 'verify'];

/**
 * Follows the steps part by part and checks, after every step, that no half-position (element
 * or cover place, and no bar mount either) stands empty unless its part is at hand: loose with
 * the crew (taken off, from the shelf, delivered) or still on the machine somewhere, waiting to
 * move. Parts bought are at hand only after the parts steps (and a wait for anything on order).
 * At the end the machine must carry exactly the proposed layout.
 */
function followSteps(plan: PlanOk, installed: Layout | null, availability: Record<string, PurchaseAvailability> = {}) {
  const keyed = (l: Layout | null) => {
    const m = new Map<string, string>();
    for (const e of l?.elements ?? []) m.set(placeKey({ kind: 'element', position: e.position, side: e.side }), e.partNumber);
    for (const c of l?.coverPlates ?? []) m.set(placeKey({ kind: 'cover', section: c.section, side: c.side }), c.partNumber);
    for (const b of l?.rotorBars ?? []) m.set(placeKey({ kind: 'bar', row: b.row, position: b.position }), b.partNumber);
    return m;
  };
  const machine = keyed(installed);
  const final = keyed(plan.layout);
  const loose = new Map<string, number>();
  const add = (pn: string, n: number) => loose.set(pn, (loose.get(pn) ?? 0) + n);
  const phases = plan.steps.map((s) => PHASE_ORDER.indexOf(s.phase));
  expect(phases).toEqual([...phases].sort((a, b) => a - b));
  // Something bought without a known dealer-shelf stock is waited for before the work.
  const onOrder = plan.purchases.some((p) => availability[p.partNumber]?.at !== 'dealer-shelf');
  const firstWork = plan.steps.findIndex((s) => s.phase === 'work');
  if (onOrder && firstWork >= 0) expect(plan.steps[firstWork - 1]!.kind).toBe('wait');
  let partsDone = false;
  for (const step of plan.steps) {
    if (step.phase !== 'parts' && !partsDone) {
      partsDone = true;
      for (const p of plan.purchases) add(p.partNumber, p.quantity);
      for (const s of plan.steps.filter((x) => x.kind === 'fetch')) add(s.partNumbers[0]!, s.places.length);
    }
    if (step.phase !== 'work') continue;
    for (const op of step.ops) {
      const key = placeKey(op.place);
      if (op.op === 'off') {
        expect(machine.get(key), `step ${step.n}: ${key}`).toBe(op.partNumber);
        machine.delete(key);
        add(op.partNumber, 1);
      } else {
        expect(machine.has(key), `step ${step.n}: ${key} is taken`).toBe(false);
        expect(loose.get(op.partNumber) ?? 0, `step ${step.n}: ${op.partNumber} at hand`).toBeGreaterThan(0);
        add(op.partNumber, -1);
        machine.set(key, op.partNumber);
      }
    }
    // After this prefix of the steps: every empty place's part is at hand.
    const need = new Map<string, number>();
    for (const [key, pn] of final) if (!machine.has(key)) need.set(pn, (need.get(pn) ?? 0) + 1);
    for (const [pn, n] of need) {
      const movable = [...machine].filter(([key, there]) => there === pn && final.get(key) !== pn).length;
      expect(n, `after step ${step.n}: ${pn}`).toBeLessThanOrEqual((loose.get(pn) ?? 0) + movable);
    }
  }
  expect(new Map([...machine].sort()), 'the machine ends as the plan says').toEqual(new Map([...final].sort()));
}

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
              // Steps come in working order (parts, work, set and verify), numbered, with the
              // cautions at the head, and never leave a place empty without its part at hand.
              followSteps(plan, installed);
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
      expect(plan.counts.effort).toEqual({ massKg: 0, seconds: 0, lifts: 0, rotorAccess: false });
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
    // Both spares come off the shelf first, then each place is filled the moment it is emptied.
    expect(p.steps.slice(0, 2).map((s) => s.text)).toEqual([
      "Take 2 × CW-RB-L-04 (left-hand round-bar element) from the farm's shelf, for position 1, left and position 2, left.",
      "Take 2 × CW-RB-R-04 (right-hand round-bar element) from the farm's shelf, for position 1, right and position 2, right.",
    ]);
    expect(p.steps[2]!.text).toMatch(/^Take off the left-hand fine-wire element CW-FW-L-04 at position 1, left and put it on the shelf/);
    expect(p.steps[3]!.text).toMatch(/^Fit the left-hand round-bar element CW-RB-L-04 \(from the shelf\) at position 1, left/);
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
    expect(straightBuy.text).toMatch(/^Order 2 × CW-BR-ST-04 .*\(each spans that mount and the in-line mount behind it\)/);
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
    expect(p.steps.filter((s) => s.phase === 'work').map((s) => s.kind)).toEqual(['move', 'install']);
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

// Invented test parts: every element type in both hands, with their own masses, plus a dearer
// but lighter second wide-wire (so money and effort pull different ways).
const SPEC: Record<ElementType, { w: number; l: number; open: number; price: number; kg: number } | null> = {
  'fine-wire': { w: 5, l: 25, open: 0.38, price: 1000, kg: 44 },
  'wide-wire': { w: 14, l: 40, open: 0.5, price: 900, kg: 41 },
  'skip-wire': { w: 28, l: 40, open: 0.62, price: 800, kg: 37 },
  'round-bar': { w: 12, l: 45, open: 0.45, price: 1100, kg: 47 },
  perforated: { w: 14, l: 14, open: 0.32, price: 700, kg: 39 },
  blank: null,
  'close-bar': { w: 4, l: 20, open: 0.28, price: 1200, kg: 49 },
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
        massKg: (s?.kg ?? 33) + (hand === 'left' ? 0.5 : 0),
        priceCents: (s?.price ?? 500) * 100,
      }),
    );
  }
for (const hand of ['left', 'right'] as Side[])
  pairParts.push({
    ...(pairParts.find((p) => p.partNumber === `TP-WW-${hand[0]!.toUpperCase()}`) as ElementPart),
    partNumber: `TP-WW-${hand[0]!.toUpperCase()}-2`,
    priceCents: 95_000,
    massKg: 22,
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

/**
 * Tries every way of filling the four places from the machine, the shelf or a purchase of any
 * acceptable part, and returns the best [money spent, parts bought, effort in seconds]: every
 * part on the machine that does not stay where it is comes off (one lift), every part fitted
 * at a new place (moved, from the shelf or new) is one lift (planner/effort.ts: invented planning
 * figures, common practice, no published source).
 */
function bruteForce(installed: Layout, shelf: Record<string, number>, crop: CropId, mode: PlanMode) {
  const accept = acceptable(crop, mode);
  const lift = (pn: string) => liftSeconds('element', pairCatalog.byPartNumber.get(pn)?.massKg);
  const units = installed.elements.map((e) => ({ pn: e.partNumber, at: `${e.position}:${e.side}` }));
  const left = { ...shelf };
  const usedUnits = new Set<number>();
  let best: [number, number, number] | null = null;
  const better = (a: readonly number[], b: readonly number[]) => {
    for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return a[i]! < b[i]!;
    return false;
  };
  const visit = (i: number, money: number, buys: number, effort: number) => {
    if (i === SLOTS.length) {
      // Every part that did not stay where it is comes off once.
      const off = units.reduce((sum, u, k) => sum + (keptUnits.has(k) ? 0 : lift(u.pn)), 0);
      const cost: [number, number, number] = [money, buys, effort + off];
      if (!best || better(cost, best)) best = cost;
      return;
    }
    const slot = SLOTS[i]!;
    const key = `${slot.position}:${slot.side}`;
    for (const pn of accept[i]!) {
      units.forEach((u, k) => {
        if (u.pn !== pn || usedUnits.has(k)) return;
        usedUnits.add(k);
        const stays = u.at === key;
        if (stays) keptUnits.add(k);
        visit(i + 1, money, buys, effort + (stays ? 0 : lift(pn)));
        keptUnits.delete(k);
        usedUnits.delete(k);
      });
      if ((left[pn] ?? 0) > 0) {
        left[pn]!--;
        visit(i + 1, money, buys, effort + lift(pn));
        left[pn]!++;
      }
      visit(i + 1, money + pairCatalog.byPartNumber.get(pn)!.priceCents, buys + 1, effort + lift(pn));
    }
  };
  const keptUnits = new Set<number>();
  visit(0, 0, 0, 0);
  return best!;
}

const lift = (pn: string) => liftSeconds('element', pairCatalog.byPartNumber.get(pn)!.massKg);

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
    // Four parts each lifted off and on again: 8 lifts (planner/effort.ts figures).
    const seconds = 2 * (lift('TP-SW-L') + lift('TP-SW-R') + lift('TP-WW-L') + lift('TP-WW-R'));
    expect(bruteForce(installed, {}, 'corn', 'program')).toEqual([0, 0, seconds]);
    expect([plan.counts.purchaseCents, plan.counts.purchases, plan.counts.effort.seconds]).toEqual([0, 0, seconds]);
    expect(plan.counts.effort).toMatchObject({ lifts: 8, massKg: 2 * (37.5 + 37 + 41.5 + 41), rotorAccess: false });
    expect(plan.steps.filter((s) => s.phase === 'work').map((s) => s.kind)).toEqual(['swap', 'swap']);
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
          expect([plan.counts.purchaseCents, plan.counts.purchases, plan.counts.effort.seconds]).toEqual(
            bruteForce(installed, shelf, crop, mode),
          );
          followSteps(plan, installed);
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
  }, 60_000);
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
        'fit the part set aside at position 1, left. About 45 kg (98 lb) each: lift with a helper or a lifting aid.',
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

describe('parts before spanners', () => {
  const wheat = starterLayout(modular, 'wheat', demoCatalog);
  const corn = (extra: Partial<Parameters<typeof planCropChange>[0]> = {}) =>
    ok(planCropChange({ family: modular, catalog, installed: wheat, shelf: {}, crop: 'corn', ...extra }));

  it('wheat to corn with an empty shelf: order, wait, then one session that never leaves a place without its part', () => {
    const p = corn();
    expect(p.purchases.length).toBeGreaterThan(0);
    const phases = p.steps.map((s) => s.phase);
    const firstWork = phases.indexOf('work');
    // Every purchase is ordered before anything comes off, and the work waits for the delivery.
    expect(p.steps.slice(0, firstWork).map((s) => s.kind)).toEqual([...p.purchases.map(() => 'buy'), 'wait']);
    expect(p.steps[firstWork - 1]!.text).toMatch(/^Wait until every part on order has arrived: the work below starts only when/);
    expect(p.steps.some((s) => s.phase === 'work' && /when (it arrives|they arrive)/.test(s.text))).toBe(false);
    followSteps(p, wheat);
    // Each new skip-wire element goes in right after the part it replaces comes out.
    const work = p.steps.filter((s) => s.phase === 'work');
    work.forEach((s, i) => {
      if (s.kind !== 'install') return;
      const key = placeKey(s.places[0]!);
      const before = work[i - 1]!;
      expect(
        before.ops.some((o) => o.op === 'off' && placeKey(o.place) === key),
        s.text,
      ).toBe(true);
    });
    expect(p.cautions).toBe(WORK_CAUTIONS);
  });

  it('set and verify come last, in order, with the vanes set the way the machine has them', () => {
    const words: Record<string, RegExp> = {
      fixed: /^Set the vanes to \w[\w ]*: bolt-set vanes, so move the vane bolts .* by hand \(engine off, rotor stopped\)\.$/,
      manual: /^Set the vanes to \w[\w ]* at the linkage on the machine \(engine off\)\.$/,
      powered: /^Set the vanes to \w[\w ]* from the cab/,
    };
    for (const vaneControl of modular.vaneControls) {
      const installed = starterLayout(modular, 'wheat', demoCatalog, { vaneControl });
      const p = ok(planCropChange({ family: modular, catalog, installed, shelf: {}, crop: 'corn', vaneControl }));
      const verify = p.steps.filter((s) => s.phase === 'verify');
      expect(verify.map((s) => s.text)).toEqual([
        expect.stringMatching(/^Set the rotor speed to \d+ rpm \(now \d+ rpm\)\.$/),
        expect.stringMatching(/^Zero and level the concave/),
        expect.stringMatching(/^Set the concave clearance to [\d.]+ mm from that zero \(now [\d.]+ mm\)\.$/),
        expect.stringMatching(installed.vaneSetting === p.layout.vaneSetting ? /^Check the vanes are at/ : words[vaneControl]!),
        expect.stringMatching(/^Turn the rotor by hand/),
        // The demo catalog's invented torques: 130 N·m for elements, 95 N·m for rotor bars.
        expect.stringMatching(
          /^Check the bolts of every part fitted or moved with a torque wrench: .*to 95 N·m \(70 lbf·ft\); .*elements.* to 130 N·m \(96 lbf·ft\)\.$/,
        ),
        expect.stringMatching(/^Put every guard and shield back/),
        expect.stringMatching(/^Test-run: everyone clear of the machine/),
        expect.stringMatching(/^Check the losses in the first field/),
      ]);
      expect(verify.at(-1)!.link).toBe(FIELD_CHECK_PATH);
      expect(verify.every((s) => s.ops.length === 0)).toBe(true);
    }
  });

  it('the vanes are set by hand with bolts when the machine has bolt-set vanes and the setting changes', () => {
    const installed = { ...starterLayout(modular, 'wheat', demoCatalog, { vaneControl: 'fixed' }), vaneSetting: 'fast' as const };
    const p = ok(planCropChange({ family: modular, catalog, installed, shelf: {}, crop: 'corn', vaneControl: 'fixed' }));
    expect(p.layout.vaneSetting).not.toBe('fast');
    expect(p.steps.find((s) => /vanes/.test(s.text) && s.phase === 'verify')!.text).toMatch(/move the vane bolts/);
  });

  it('without a torque in the catalog the bolts are checked to the torque in the operator’s manual', () => {
    const bare = demoCatalog.map((p) => ({ ...p, boltTorqueNm: undefined }));
    const p = ok(planCropChange({ family: modular, catalog: bare, installed: wheat, shelf: {}, crop: 'corn' }));
    expect(p.steps.find((s) => /bolts of every part/.test(s.text))!.text).toBe(
      'Check the bolts of every part fitted or moved to the torque in the operator’s manual.',
    );
    // In inches, the torque reads in lbf·ft first.
    const imperial = corn({ units: 'imperial' });
    expect(imperial.steps.find((s) => /torque wrench/.test(s.text))!.text).toMatch(/130 N·m/);
    expect(imperial.steps.find((s) => /torque wrench/.test(s.text))!.text).toMatch(/96 lbf·ft \(130 N·m\)/);
  });

  it('marks each purchase as on the dealer’s shelf or to order with its wait, and waits only for what is on order', () => {
    const pns = corn().purchases.map((p) => p.partNumber);
    const onShelf = corn({ availability: Object.fromEntries(pns.map((pn) => [pn, { at: 'dealer-shelf' }])) });
    expect(onShelf.steps.filter((s) => s.phase === 'parts').map((s) => s.kind)).toEqual(pns.map(() => 'buy'));
    for (const s of onShelf.steps.filter((x) => x.kind === 'buy'))
      expect(s.text).toMatch(/^Collect \d+ × .* from the dealer, on the dealer's shelf, for /);
    followSteps(onShelf, wheat, Object.fromEntries(pns.map((pn) => [pn, { at: 'dealer-shelf' }])));

    const availability: Record<string, PurchaseAvailability> = Object.fromEntries(
      pns.map((pn, i) => [pn, i === 0 ? { at: 'to-order', leadDays: 12, expectedOn: '2026-12-14' } : { at: 'dealer-shelf' }]),
    );
    const mixed = corn({ availability });
    const first = mixed.steps.find((s) => s.kind === 'buy' && s.partNumbers[0] === pns[0])!;
    expect(first.text).toMatch(/^Order \d+ × .* from the dealer, to order, about 12 days \(expected 14 Dec 2026\), for /);
    const wait = mixed.steps.find((s) => s.kind === 'wait')!;
    expect(wait.text).toMatch(/^Wait until every part on order has arrived \(about 12 days \(expected 14 Dec 2026\)\)/);
    followSteps(mixed, wheat, availability);
  });

  it('property: no prefix of the steps leaves an empty place whose part is not at hand', () => {
    const partNumbers = [...pairParts.map((p) => p.partNumber), foreign];
    fc.assert(
      fc.property(
        fc.array(fc.option(fc.constantFrom(...partNumbers), { nil: null }), { minLength: 4, maxLength: 4 }),
        fc.array(fc.tuple(fc.constantFrom(...pairParts.map((p) => p.partNumber)), fc.integer({ min: 1, max: 3 })), { maxLength: 5 }),
        fc.constantFrom(...cropIds),
        fc.constantFrom<PlanMode>('program', 'on-hand'),
        fc.dictionary(
          fc.constantFrom(...pairParts.map((p) => p.partNumber)),
          fc.oneof(
            fc.constant<PurchaseAvailability>({ at: 'dealer-shelf' }),
            fc.integer({ min: 1, max: 60 }).map((leadDays): PurchaseAvailability => ({ at: 'to-order', leadDays })),
          ),
        ),
        (fill, shelfList, crop, mode, availability) => {
          const elements = SLOTS.flatMap((s, i) => (fill[i] ? [{ position: s.position, side: s.side, partNumber: fill[i]! }] : []));
          const installed = pairLayout('wheat', elements);
          const shelf: Record<string, number> = {};
          for (const [pn, q] of shelfList) shelf[pn] = (shelf[pn] ?? 0) + q;
          const plan = ok(planCropChange({ family: pair, catalog: pairCatalog, installed, shelf, crop, mode, availability }));
          followSteps(plan, installed, availability);
        },
      ),
      { numRuns: 300, seed: 14 },
    );
  }, 60_000);
});

describe('effort that means effort', () => {
  it('adds up the catalog masses lifted and the handling minutes, with the rotor access once when a bar is touched', () => {
    const wheat = starterLayout(modular, 'wheat', demoCatalog);
    const p = ok(planCropChange({ family: modular, catalog, installed: wheat, shelf: {}, crop: 'corn' }));
    // Counted again from the plan's own choices and removals: every part taken off is lifted
    // once, every part fitted at a new place once (a moved part both).
    const mass = (pn: string) => catalog.byPartNumber.get(pn)!.massKg;
    const kind = (pn: string) => {
      const k = catalog.byPartNumber.get(pn)!.kind;
      return k === 'element' ? 'element' : k === 'cover-plate' ? 'cover' : 'bar';
    };
    const lifts = [
      ...p.removals.map((r) => r.partNumber),
      ...p.choices.filter((c) => c.source === 'moved').flatMap((c) => [c.after!, c.after!]),
      ...p.choices.filter((c) => c.source === 'shelf' || c.source === 'buy').map((c) => c.after!),
    ];
    const barTouched = lifts.some((pn) => kind(pn) === 'bar');
    expect(barTouched).toBe(true);
    expect(p.counts.effort.lifts).toBe(lifts.length);
    expect(p.counts.effort.massKg).toBeCloseTo(
      lifts.reduce((s, pn) => s + mass(pn), 0),
      5,
    );
    expect(p.counts.effort.rotorAccess).toBe(true);
    // Invented planning figures (planner/effort.ts; common practice, no published source).
    expect(p.counts.effort.seconds).toBe(lifts.reduce((s, pn) => s + liftSeconds(kind(pn), mass(pn)), 0) + ROTOR_ACCESS_SECONDS);
    // A rotor bar is a fraction of an element's effort.
    expect(liftSeconds('bar', mass('CW-BR-RS-04'))).toBeLessThan(liftSeconds('element', mass('CW-WW-L-04')) / 2);
    expect(planSummaryWords(p)).toMatch(
      /^\d+ parts to buy, about \d+ h( \d+ min)? of work, [\d.]+ kg lifted \(rotor access included\), \d+ settings to change\.$/,
    );
    const imperial = ok(planCropChange({ family: modular, catalog, installed: wheat, shelf: {}, crop: 'corn', units: 'imperial' }));
    expect(planSummaryWords(imperial)).toMatch(/[\d.]+ lb lifted/);
  });

  it('no rotor access when no bar is touched', () => {
    const wheat = starterLayout(modular, 'wheat', demoCatalog);
    const p = ok(planCropChange({ family: modular, catalog, installed: wheat, shelf: {}, crop: 'field-peas' }));
    expect(p.choices.filter((c) => c.place.kind === 'bar').every((c) => c.source === 'kept' || c.source === 'empty')).toBe(true);
    expect(p.removals.some((r) => r.place.kind === 'bar')).toBe(false);
    expect(p.counts.effort.rotorAccess).toBe(false);
    const seconds = (pn: string) => liftSeconds('element', catalog.byPartNumber.get(pn)!.massKg);
    expect(p.counts.effort.seconds).toBe(
      p.removals.reduce((s, r) => s + seconds(r.partNumber), 0) +
        p.choices.filter((c) => c.source === 'buy' || c.source === 'shelf').reduce((s, c) => s + seconds(c.after!), 0) +
        2 * p.choices.filter((c) => c.source === 'moved').reduce((s, c) => s + seconds(c.after!), 0),
    );
  });

  it('spends less money before it saves effort, and saves effort before it follows the program more closely', () => {
    // Position 1 left is empty; wide-wire suits it in corn. Buying the lighter but dearer
    // TP-WW-L-2 would be less effort; the cheaper TP-WW-L wins on money.
    const installed = pairLayout('corn', [
      { position: 1, side: 'right', partNumber: 'TP-WW-R' },
      { position: 2, side: 'left', partNumber: 'TP-SW-L' },
      { position: 2, side: 'right', partNumber: 'TP-SW-R' },
    ]);
    const p = ok(planCropChange({ family: pair, catalog: pairCatalog, installed, shelf: {}, crop: 'corn' }));
    expect(p.purchases.map((x) => x.partNumber)).toEqual(['TP-WW-L']);
    // With both on the shelf, money is equal (nothing bought) and the lighter part is fitted.
    const q = ok(planCropChange({ family: pair, catalog: pairCatalog, installed, shelf: { 'TP-WW-L': 1, 'TP-WW-L-2': 1 }, crop: 'corn' }));
    expect(q.purchases).toEqual([]);
    expect(q.layout.elements.find((e) => e.position === 1 && e.side === 'left')!.partNumber).toBe('TP-WW-L-2');
    expect(q.counts.effort.seconds).toBe(lift('TP-WW-L-2'));
  });
});
