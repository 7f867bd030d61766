import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { demoCatalog, sedgeS6, tamarackM4 } from '~/lib/domain/demo-catalog';
import { starterLayout } from '~/lib/domain/starter';
import {
  assessWear,
  buildChecklist,
  checklistKind,
  clearanceReadingKey,
  clearanceTolerance,
  conditionsFor,
  countSeverities,
  measurementAllowed,
  parseClearanceReadingKey,
  replacementLines,
  suggestSeverity,
  surveyClearance,
  surveyFromMeasurements,
  WEAR_REPLACE_MM,
  type ClearanceReading,
} from '~/lib/domain/inspection';
import { MM_PER_INCH } from '~/lib/domain/units';
import type { Layout } from '~/lib/domain/schemas';

const wheat = starterLayout(tamarackM4, 'wheat', demoCatalog);
const corn = starterLayout(sedgeS6, 'corn', demoCatalog);
const withPlate: Layout = { ...wheat, coverPlates: [{ section: 2, side: 'right', partNumber: 'CW-CP-R-04' }] };

describe('buildChecklist', () => {
  it('lists every installed element front to rear, left before right, then plates, bar rows and the survey', () => {
    const lines = buildChecklist(tamarackM4, withPlate, demoCatalog);
    const keys = lines.map((l) => l.placeKey);
    expect(keys).toEqual([
      'element:1:left',
      'element:1:right',
      'element:2:left',
      'element:2:right',
      'element:3:left',
      'element:3:right',
      'element:4:left',
      'element:4:right',
      'cover:2:right',
      'row:1',
      'row:2',
      'row:3',
      'row:4',
      'survey',
    ]);
    expect(lines.map((l) => l.kind)).toEqual([...Array(8).fill('element'), 'cover', 'row', 'row', 'row', 'row', 'survey']);
  });

  it('keeps the part number of each element and names it in the label', () => {
    const lines = buildChecklist(tamarackM4, wheat, demoCatalog);
    const p2l = lines.find((l) => l.placeKey === 'element:2:left')!;
    const installed = wheat.elements.find((e) => e.position === 2 && e.side === 'left')!;
    expect(p2l.partNumber).toBe(installed.partNumber);
    const name = demoCatalog.find((p) => p.partNumber === installed.partNumber)!.name;
    expect(p2l.label).toBe(`Position 2, left: ${name}`);
  });

  it('describes a rotor bar row by what is bolted in it', () => {
    // Corn on the split family: one straight bar across the in-line mounts (positions 2 and 3)
    // of rows 2 and 4, so row 2 carries four rasp bars and ONE straight bar (five parts).
    const lines = buildChecklist(sedgeS6, corn, demoCatalog);
    const row2 = lines.find((l) => l.placeKey === 'row:2')!;
    const row1 = lines.find((l) => l.placeKey === 'row:1')!;
    expect(row2.partNumber).toBeNull();
    expect(row2.label).toMatch(/^Rotor row 2: 5 bars \(/);
    expect(row2.label).toContain('1 straight (one across two in-line mounts)');
    expect(row1.label).not.toContain('straight');
  });

  it('leaves out empty half-positions and rows with no bars', () => {
    const sparse: Layout = {
      ...wheat,
      elements: wheat.elements.filter((e) => e.position !== 3),
      rotorBars: wheat.rotorBars.filter((b) => b.row !== 4),
    };
    const keys = buildChecklist(tamarackM4, sparse, demoCatalog).map((l) => l.placeKey);
    expect(keys).not.toContain('element:3:left');
    expect(keys).not.toContain('row:4');
    expect(keys).toContain('row:3');
  });

  it('starts the survey from the clearance set on the machine', () => {
    const survey = buildChecklist(tamarackM4, wheat, demoCatalog).at(-1)!;
    expect(survey.kind).toBe('survey');
    expect(survey.measurements).toEqual({ setClearanceMm: wheat.clearanceMm, toleranceMm: clearanceTolerance(wheat.clearanceMm) });
  });

  it('gives each kind of line the findings that make sense for it', () => {
    expect(conditionsFor('element').map((c) => c.id)).toEqual(['bent-bars', 'wires-missing', 'edge-wear', 'weld-cracked', 'bolts-loose']);
    expect(conditionsFor('cover').map((c) => c.id)).toEqual(['weld-cracked', 'bolts-loose', 'plate-warped']);
    expect(conditionsFor('row').map((c) => c.id)).not.toContain('wires-missing');
    expect(conditionsFor('survey')).toEqual([]);
  });

  it('reads the kind back from a stored place key and refuses strangers', () => {
    expect(checklistKind('element:4:right')).toBe('element');
    expect(checklistKind('cover:2:left')).toBe('cover');
    expect(checklistKind('row:3')).toBe('row');
    expect(checklistKind('survey')).toBe('survey');
    expect(checklistKind('element:4:middle')).toBeNull();
    expect(checklistKind('bar:1:2')).toBeNull();
  });
});

describe('assessWear (replace past about 6 mm, a quarter inch: common practice, no published source)', () => {
  it('replaces past the limit, not at it', () => {
    expect(assessWear(6).verdict).toBe('watch');
    expect(assessWear(6.1).verdict).toBe('replace');
    expect(assessWear(9).remainingMm).toBe(-3);
  });

  it('warns from two thirds of the limit', () => {
    expect(assessWear(3.9).verdict).toBe('ok');
    expect(assessWear(4).verdict).toBe('watch');
    expect(assessWear(0).verdict).toBe('ok');
  });

  it('agrees with the quarter-inch rule within the "about" (1 in = 25.4 mm exactly, NIST Handbook 44)', () => {
    const quarterInch = 0.25 * MM_PER_INCH; // 6.35 mm
    expect(quarterInch - WEAR_REPLACE_MM).toBeLessThan(0.5);
    expect(assessWear(quarterInch).verdict).toBe('replace');
  });

  it('scales the warning with a different limit and refuses nonsense', () => {
    expect(assessWear(3.1, 4.5).verdict).toBe('watch');
    expect(assessWear(2.9, 4.5).verdict).toBe('ok');
    expect(() => assessWear(-1)).toThrow(RangeError);
    expect(() => assessWear(Number.NaN)).toThrow(RangeError);
  });

  it('never says ok past the limit nor replace within it (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 50, noNaN: true }), (d) => {
        const v = assessWear(d).verdict;
        return d > WEAR_REPLACE_MM ? v === 'replace' : v !== 'replace';
      }),
    );
  });
});

describe('the clearance survey (unevenness beyond a tolerance: common practice, no published source)', () => {
  const even = (mm: number): ClearanceReading[] =>
    tamarackM4.positions.flatMap((p) =>
      (['left', 'right'] as const).flatMap((side) => (['front', 'rear'] as const).map((end) => ({ position: p.index, side, end, mm }))),
    );

  it('scales the tolerance with the set clearance, with a floor', () => {
    expect(clearanceTolerance(10)).toBe(2); // wheat-like setting
    expect(clearanceTolerance(25)).toBe(5); // corn-like setting: a few mm hardly matters
    expect(clearanceTolerance(4)).toBe(1.5);
  });

  it('finds nothing on an even cage', () => {
    const s = surveyClearance(tamarackM4, even(10), 2, 10);
    expect(s.readingCount).toBe(16);
    expect(s.findings).toEqual([]);
    expect(s.uneven).toBe(false);
    expect(s.positions.every((p) => p.spreadMm === 0)).toBe(true);
  });

  it('flags a position that sits crooked across the rotor, naming the wider side', () => {
    const r = even(10).map((x) => (x.position === 2 && x.side === 'left' && x.end === 'front' ? { ...x, mm: 13 } : x));
    const s = surveyClearance(tamarackM4, r, 2);
    expect(s.uneven).toBe(true);
    const sideToSide = s.findings.filter((f) => f.kind === 'side-to-side');
    expect(sideToSide).toHaveLength(1);
    expect(sideToSide[0]).toMatchObject({ position: 2, where: 'front', differenceMm: 3 });
    expect(sideToSide[0]!.message).toBe('Position 2, front: the left side is 3.0 mm wider than the other (left 13.0, right 10.0 mm)');
    // The same reading also tilts the left side front to rear.
    expect(s.findings.filter((f) => f.kind === 'front-to-rear')).toMatchObject([{ position: 2, where: 'left', differenceMm: 3 }]);
    expect(s.positions.find((p) => p.position === 2)).toMatchObject({ minMm: 10, maxMm: 13, spreadMm: 3, uneven: true });
    expect(s.positions.find((p) => p.position === 1)!.uneven).toBe(false);
  });

  it('lets the same 3 mm pass at a corn setting (tolerance 5 mm) but not at a wheat setting', () => {
    const r = even(25).map((x) => (x.position === 1 && x.side === 'right' ? { ...x, mm: 28 } : x));
    expect(surveyClearance(tamarackM4, r, clearanceTolerance(25), 25).uneven).toBe(false);
    const w = even(10).map((x) => (x.position === 1 && x.side === 'right' ? { ...x, mm: 13 } : x));
    expect(surveyClearance(tamarackM4, w, clearanceTolerance(10), 10).uneven).toBe(true);
  });

  it('does not flag a difference exactly at the tolerance', () => {
    const r = even(10).map((x) => (x.position === 3 && x.side === 'right' ? { ...x, mm: 12 } : x));
    expect(surveyClearance(tamarackM4, r, 2).findings).toEqual([]);
  });

  it('compares threshing-zone readings with the set clearance, not separating ones', () => {
    const r = even(14); // everything 4 mm wider than set
    const s = surveyClearance(tamarackM4, r, 2, 10);
    const off = s.findings.filter((f) => f.kind === 'off-setting');
    expect(new Set(off.map((f) => f.position))).toEqual(new Set([1, 2])); // positions 3–4 separate
    expect(off).toHaveLength(8);
    expect(off[0]!.message).toBe('Position 1, left, front: 14.0 mm measured against 10.0 mm set');
  });

  it('skips pairs with a reading missing', () => {
    const r: ClearanceReading[] = [
      { position: 1, side: 'left', end: 'front', mm: 10 },
      { position: 1, side: 'right', end: 'rear', mm: 20 },
    ];
    const s = surveyClearance(tamarackM4, r, 2);
    expect(s.findings).toEqual([]);
    expect(s.positions[0]).toMatchObject({ readings: { 'left-front': 10, 'right-rear': 20 }, spreadMm: 10 });
    expect(s.positions[1]).toMatchObject({ minMm: null, spreadMm: null });
  });

  it('reads a survey back from stored measurements', () => {
    const m = {
      setClearanceMm: 10,
      toleranceMm: 2,
      [clearanceReadingKey(2, 'left', 'front')]: 10,
      [clearanceReadingKey(2, 'right', 'front')]: 14.5,
    };
    const s = surveyFromMeasurements(tamarackM4, m);
    expect(s.readingCount).toBe(2);
    expect(s.findings.map((f) => f.kind)).toEqual(['side-to-side', 'off-setting']);
    expect(parseClearanceReadingKey('clearance:2:left:front')).toEqual({ position: 2, side: 'left', end: 'front' });
    expect(parseClearanceReadingKey('clearance:2:up:front')).toBeNull();
  });

  it('flags a pair exactly when the two readings differ by more than the tolerance (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 60, noNaN: true }),
        fc.double({ min: 0, max: 60, noNaN: true }),
        fc.double({ min: 0.5, max: 10, noNaN: true }),
        (a, b, tol) => {
          const r: ClearanceReading[] = [
            { position: 1, side: 'left', end: 'front', mm: a },
            { position: 1, side: 'right', end: 'front', mm: b },
          ];
          const d = Math.round(Math.abs(a - b) * 100) / 100;
          return surveyClearance(tamarackM4, r, tol).uneven === d > tol + 1e-9;
        },
      ),
    );
  });
});

describe('measurements and suggested severity', () => {
  it('accepts wear on elements and rows, readings only for positions the family has', () => {
    expect(measurementAllowed('element', tamarackM4, 'wearMm')).toEqual({ max: 50 });
    expect(measurementAllowed('cover', tamarackM4, 'wearMm')).toBeNull();
    expect(measurementAllowed('survey', tamarackM4, 'clearance:4:left:rear')).not.toBeNull();
    expect(measurementAllowed('survey', tamarackM4, 'clearance:5:left:rear')).toBeNull();
    expect(measurementAllowed('survey', sedgeS6, 'clearance:5:left:rear')).not.toBeNull();
    expect(measurementAllowed('element', tamarackM4, 'clearance:1:left:rear')).toBeNull();
  });

  it('suggests watch for any finding and replace for wear past the limit', () => {
    expect(suggestSeverity('element', [], {})).toBe('ok');
    expect(suggestSeverity('element', ['wires-missing'], {})).toBe('watch');
    expect(suggestSeverity('element', [], { wearMm: 7 })).toBe('replace');
    expect(suggestSeverity('row', ['bent-bars'], { wearMm: 2 })).toBe('watch');
    expect(suggestSeverity('cover', [], { wearMm: 9 })).toBe('ok');
  });

  it('suggests watch for an uneven survey', () => {
    const m = { toleranceMm: 2, 'clearance:1:left:front': 10, 'clearance:1:right:front': 15 };
    expect(suggestSeverity('survey', [], m, tamarackM4)).toBe('watch');
    expect(suggestSeverity('survey', [], { ...m, 'clearance:1:right:front': 11 }, tamarackM4)).toBe('ok');
  });

  it('counts severities', () => {
    expect(countSeverities([{ severity: 'ok' }, { severity: 'replace' }, { severity: 'replace' }])).toEqual({
      ok: 1,
      watch: 0,
      replace: 2,
      total: 3,
    });
  });
});

describe('replacementLines', () => {
  const lines = buildChecklist(tamarackM4, withPlate, demoCatalog);
  const mark = (keys: string[]) =>
    lines.map((l) => ({ ...l, severity: keys.includes(l.placeKey) ? ('replace' as const) : ('ok' as const) }));

  it('orders the same part number and hand for a flagged element', () => {
    const { lines: out, unknown } = replacementLines(mark(['element:2:left']), withPlate, demoCatalog, tamarackM4);
    const pn = withPlate.elements.find((e) => e.position === 2 && e.side === 'left')!.partNumber;
    const part = demoCatalog.find((p) => p.partNumber === pn)!;
    expect(unknown).toEqual([]);
    expect(out).toEqual([{ partNumber: pn, description: part.name, hand: 'left', quantity: 1, unitPriceCents: part.priceCents }]);
  });

  it('adds up equal part numbers and keeps hands apart', () => {
    // Fine-wire in positions 1 and 2 on both sides for wheat: two left, two right.
    const { lines: out } = replacementLines(
      mark(['element:1:left', 'element:2:left', 'element:1:right', 'element:2:right']),
      withPlate,
      demoCatalog,
      tamarackM4,
    );
    expect(out.map((l) => [l.hand, l.quantity])).toEqual([
      ['left', 2],
      ['right', 2],
    ]);
    expect(out[0]!.partNumber).toMatch(/-L-/);
    expect(out[1]!.partNumber).toMatch(/-R-/);
  });

  it('replaces a cover plate by the same plate and a rotor bar row by the bars in it and in its opposite row', () => {
    const { lines: out } = replacementLines(mark(['cover:2:right', 'row:1']), withPlate, demoCatalog, tamarackM4);
    expect(out[0]).toMatchObject({ partNumber: 'CW-CP-R-04', hand: 'right', quantity: 1 });
    // Bars are replaced as matched sets (common practice, no published source): row 1 brings
    // row 3, 180° around on this rotor, with it.
    const barsInRows1And3 = withPlate.rotorBars.filter((b) => b.row === 1 || b.row === 3).length;
    expect(barsInRows1And3).toBe(8);
    expect(out.slice(1).reduce((n, l) => n + l.quantity, 0)).toBe(barsInRows1And3);
    expect(out.slice(1).every((l) => l.hand === null)).toBe(true);
  });

  it('orders a row and its opposite once, whichever of the two are marked', () => {
    const one = replacementLines(mark(['row:3']), withPlate, demoCatalog, tamarackM4).lines;
    const both = replacementLines(mark(['row:1', 'row:3']), withPlate, demoCatalog, tamarackM4).lines;
    expect(both).toEqual(one);
    expect(one.reduce((n, l) => n + l.quantity, 0)).toBe(8);
    const rows2And4 = replacementLines(mark(['row:2']), withPlate, demoCatalog, tamarackM4).lines;
    const want = withPlate.rotorBars.filter((b) => b.row === 2 || b.row === 4).length;
    expect(rows2And4.reduce((n, l) => n + l.quantity, 0)).toBe(want);
  });

  it('orders nothing for watch or ok lines, nor for the survey', () => {
    const watched = lines.map((l) => ({ ...l, severity: 'watch' as const }));
    expect(replacementLines(watched, withPlate, demoCatalog, tamarackM4).lines).toEqual([]);
    const survey = lines.map((l) => ({ ...l, severity: l.placeKey === 'survey' ? ('replace' as const) : ('ok' as const) }));
    expect(replacementLines(survey, withPlate, demoCatalog, tamarackM4).lines).toEqual([]);
  });

  it('reports parts missing from the catalog instead of inventing them', () => {
    const { lines: out, unknown } = replacementLines(
      [{ placeKey: 'element:1:left', partNumber: 'CW-XX-L-99', severity: 'replace' }],
      null,
      demoCatalog,
      tamarackM4,
    );
    expect(out).toEqual([]);
    expect(unknown).toEqual(['CW-XX-L-99']);
  });
});
