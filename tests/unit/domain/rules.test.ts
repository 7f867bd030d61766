import { afterAll, describe, expect, it } from 'vitest';
import {
  checkLayout,
  cropIds,
  cropPrograms,
  demoCatalog,
  kernelPassage,
  findingCodeSchema,
  findingSchema,
  type Finding,
  type FindingCode,
  type Layout,
  type MachineFamily,
} from '~/lib/domain';
import { catalog, codes, modular, removeElement, setBar, setElement, split, start } from './helpers';

// Every code must be shown firing somewhere in this file; the last test checks that.
const fired = new Set<FindingCode>();

function run(layout: Layout, family: MachineFamily = modular, cat: Parameters<typeof checkLayout>[1] = catalog): Finding[] {
  const findings = checkLayout(family, cat, layout);
  for (const f of findings) {
    fired.add(f.code);
    expect(() => findingSchema.parse(f)).not.toThrow();
  }
  return findings;
}

function only(findings: Finding[], code: FindingCode): Finding[] {
  return findings.filter((f) => f.code === code);
}

function expectFires(findings: Finding[], code: FindingCode, severity: Finding['severity']): Finding {
  const hits = only(findings, code);
  expect(hits.length, `${code} in ${codes(findings).join(', ')}`).toBeGreaterThan(0);
  expect(hits[0]!.severity).toBe(severity);
  return hits[0]!;
}

describe('starter layouts are clean', () => {
  it('no findings for wheat on the modular cage with the full drum', () => {
    expect(run(start('wheat'))).toEqual([]);
  });
  it('no findings for corn on the split cage', () => {
    expect(run(start('corn', split), split)).toEqual([]);
  });
});

describe('layout against its family', () => {
  it('LAYOUT_FAMILY_MISMATCH fires when the layout names another family, not otherwise', () => {
    const f = expectFires(run({ ...start('wheat'), familyId: 'sedge-s6' }), 'LAYOUT_FAMILY_MISMATCH', 'blocks-fit');
    expect(f.places).toEqual([]);
    expect(codes(run(start('wheat')))).not.toContain('LAYOUT_FAMILY_MISMATCH');
  });
  it('LAYOUT_DUPLICATE_PLACE fires for two elements in one half-position', () => {
    const l = start('wheat');
    const dup = { ...l, elements: [...l.elements, { position: 1, side: 'left' as const, partNumber: 'CW-WW-L-04' }] };
    const f = expectFires(run(dup), 'LAYOUT_DUPLICATE_PLACE', 'blocks-fit');
    expect(f.places).toEqual([{ kind: 'element', position: 1, side: 'left' }]);
  });
  it('LAYOUT_DUPLICATE_PLACE fires for two cover plates or two bars in one place', () => {
    const l = start('rice');
    const c = l.coverPlates[0]!;
    expectFires(run({ ...l, coverPlates: [c, c] }), 'LAYOUT_DUPLICATE_PLACE', 'blocks-fit');
    const b = l.rotorBars[0]!;
    expectFires(run({ ...l, rotorBars: [...l.rotorBars, b] }), 'LAYOUT_DUPLICATE_PLACE', 'blocks-fit');
  });
  it('FIT_DRUM_UNAVAILABLE fires for a slim drum on a family with the full drum only', () => {
    const f = expectFires(run({ ...start('wheat', split), drum: 'slim' }, split), 'FIT_DRUM_UNAVAILABLE', 'blocks-fit');
    expect(f.places).toEqual([{ kind: 'setting', field: 'drum' }]);
    expect(codes(run({ ...start('wheat'), drum: 'slim' }))).not.toContain('FIT_DRUM_UNAVAILABLE');
  });
  it('FIT_VANE_CONTROL_UNAVAILABLE fires for a vane control the family lacks', () => {
    expectFires(run({ ...start('wheat', split), vaneControl: 'powered' }, split), 'FIT_VANE_CONTROL_UNAVAILABLE', 'blocks-fit');
    expect(codes(run({ ...start('wheat'), vaneControl: 'powered' }))).not.toContain('FIT_VANE_CONTROL_UNAVAILABLE');
  });
});

describe('parts', () => {
  it('PART_UNKNOWN fires for a part number not in the catalog, and says nothing else about that place', () => {
    const fs = run(setElement(start('wheat'), 2, 'left', 'CW-ZZ-L-99'));
    const f = expectFires(fs, 'PART_UNKNOWN', 'blocks-fit');
    expect(f.places).toEqual([{ kind: 'element', position: 2, side: 'left' }]);
    expect(f.title).toContain('CW-ZZ-L-99');
    expect(codes(fs)).toEqual(['PART_UNKNOWN']);
  });
  it('PART_UNKNOWN fires for unknown cover plates and bars too', () => {
    expectFires(
      run({ ...start('rice'), coverPlates: [{ section: 2, side: 'right', partNumber: 'CW-CP-X-99' }] }),
      'PART_UNKNOWN',
      'blocks-fit',
    );
    expectFires(run(setBar(start('wheat'), 1, 1, 'CW-BR-XX-04')), 'PART_UNKNOWN', 'blocks-fit');
  });
  it('PART_WRONG_KIND fires for a cover plate placed as an element', () => {
    const f = expectFires(run(setElement(start('wheat'), 1, 'left', 'CW-CP-L-04')), 'PART_WRONG_KIND', 'blocks-fit');
    expect(f.explanation).toContain('cover plate');
    expect(codes(run(start('wheat')))).not.toContain('PART_WRONG_KIND');
  });
  it('PART_WRONG_KIND fires for an element placed as a rotor bar', () => {
    expectFires(run(setBar(start('wheat'), 1, 1, 'CW-FW-L-04')), 'PART_WRONG_KIND', 'blocks-fit');
  });
  it('FIT_GROUP_FOREIGN fires for a part of another family', () => {
    const fs = run(setElement(start('wheat'), 1, 'left', 'CW-FW-L-06C'));
    const f = expectFires(fs, 'FIT_GROUP_FOREIGN', 'blocks-fit');
    expect(f.explanation).toContain('sedge');
    expect(codes(fs)).toEqual(['FIT_GROUP_FOREIGN']);
    expect(codes(run(start('wheat', split), split))).not.toContain('FIT_GROUP_FOREIGN');
  });
});

describe('elements', () => {
  it('FIT_POSITION_UNKNOWN fires for a position the cage does not have', () => {
    const f = expectFires(run(setElement(start('wheat'), 5, 'left', 'CW-WW-L-04')), 'FIT_POSITION_UNKNOWN', 'blocks-fit');
    expect(f.places).toEqual([{ kind: 'element', position: 5, side: 'left' }]);
  });
  it('FIT_HAND_MISMATCH fires for a left-hand element in the right half', () => {
    const fs = run(setElement(start('wheat'), 2, 'right', 'CW-FW-L-04'));
    const f = expectFires(fs, 'FIT_HAND_MISMATCH', 'blocks-fit');
    expect(f.places).toEqual([{ kind: 'element', position: 2, side: 'right' }]);
    expect(f.explanation).toMatch(/12\.7 mm/);
  });
  it('FIT_HAND_MISMATCH does not fire for correctly handed elements', () => {
    expect(codes(run(setElement(start('wheat'), 2, 'right', 'CW-FW-R-04')))).not.toContain('FIT_HAND_MISMATCH');
  });
  it('FIT_HAND_MISMATCH fires for a left cover plate on the right side', () => {
    const l = { ...start('rice'), coverPlates: [{ section: 2, side: 'right' as const, partNumber: 'CW-CP-L-04' }] };
    const f = expectFires(run(l), 'FIT_HAND_MISMATCH', 'blocks-fit');
    expect(f.places).toEqual([{ kind: 'cover', section: 2, side: 'right' }]);
  });
  it('FIT_ZONE_FORBIDDEN fires for a concave at the rear of a split cage', () => {
    const f = expectFires(run(setElement(start('wheat', split), 4, 'left', 'CW-WW-L-06C'), split), 'FIT_ZONE_FORBIDDEN', 'blocks-fit');
    expect(f.explanation).toMatch(/concaves fit the front/);
  });
  it('FIT_ZONE_FORBIDDEN fires for a grate in front on a split cage', () => {
    expectFires(run(setElement(start('wheat', split), 1, 'right', 'CW-FW-R-06G'), split), 'FIT_ZONE_FORBIDDEN', 'blocks-fit');
  });
  it('FIT_ZONE_FORBIDDEN does not fire when a modular element moves from front to rear', () => {
    const l = setElement(start('wheat'), 4, 'left', 'CW-FW-L-04');
    expect(codes(run(l))).not.toContain('FIT_ZONE_FORBIDDEN');
  });
  it('FIT_EMPTY_POSITION fires for each empty half-position', () => {
    const fs = run(removeElement(removeElement(start('wheat'), 3, 'left'), 3, 'right'));
    const hits = only(fs, 'FIT_EMPTY_POSITION');
    expect(hits.map((h) => h.places[0])).toEqual([
      { kind: 'element', position: 3, side: 'left' },
      { kind: 'element', position: 3, side: 'right' },
    ]);
    expect(hits[0]!.severity).toBe('blocks-fit');
    expect(hits[0]!.fix).toContain('wide-wire');
  });
  it('FIT_EMPTY_POSITION does not fire when a half-position holds an unknown part (that is PART_UNKNOWN)', () => {
    expect(codes(run(setElement(start('wheat'), 3, 'left', 'CW-ZZ-L-99')))).not.toContain('FIT_EMPTY_POSITION');
  });
});

describe('cover plates', () => {
  const plate = (section: number, side: 'left' | 'right', pn = side === 'left' ? 'CW-CP-L-04' : 'CW-CP-R-04') => ({
    section,
    side,
    partNumber: pn,
  });
  it('COVER_SECTION_UNKNOWN fires for a section the cage top does not have', () => {
    expectFires(run({ ...start('rice'), coverPlates: [plate(7, 'right')] }), 'COVER_SECTION_UNKNOWN', 'blocks-fit');
  });
  it('COVER_OUTSIDE_SECTION fires for a plate outside section 2', () => {
    const f = expectFires(run({ ...start('rice'), coverPlates: [plate(1, 'right')] }), 'COVER_OUTSIDE_SECTION', 'blocks-fit');
    expect(f.places).toEqual([{ kind: 'cover', section: 1, side: 'right' }]);
    expect(f.fix).toContain('section 2');
  });
  it('COVER_OUTSIDE_SECTION does not fire in section 2', () => {
    expect(codes(run({ ...start('rice'), coverPlates: [plate(2, 'right'), plate(2, 'left')] }))).not.toContain('COVER_OUTSIDE_SECTION');
  });
  it('COVER_VANE_LINKAGE fires for the left plate with powered vanes', () => {
    const l = { ...start('rice'), vaneControl: 'powered' as const, coverPlates: [plate(2, 'left')] };
    const f = expectFires(run(l), 'COVER_VANE_LINKAGE', 'blocks-fit');
    expect(f.places).toContainEqual({ kind: 'cover', section: 2, side: 'left' });
  });
  it('COVER_VANE_LINKAGE fires for the left plate with manual vanes (split cage)', () => {
    const l = { ...start('rice', split), coverPlates: [plate(2, 'left', 'CW-CP-L-06')] };
    expectFires(run(l, split), 'COVER_VANE_LINKAGE', 'blocks-fit');
  });
  it('COVER_VANE_LINKAGE does not fire for the left plate with fixed vanes, nor for the right plate with powered vanes', () => {
    expect(codes(run({ ...start('rice'), vaneControl: 'fixed', coverPlates: [plate(2, 'left')] }))).not.toContain('COVER_VANE_LINKAGE');
    expect(codes(run({ ...start('rice'), vaneControl: 'powered', coverPlates: [plate(2, 'right')] }))).not.toContain('COVER_VANE_LINKAGE');
  });
  it('COVER_UNSLOTTED_VANES: an unslotted plate over bolt-set (fixed) vanes, not a slotted one, nor on adjustable vanes', () => {
    // Slots let the vane bolts pass so bolt-set vanes can be moved with the plate on (common
    // practice, no published source). A catalog whose right plate has no slots:
    const unslottedCatalog = demoCatalog.map((p) => (p.kind === 'cover-plate' ? { ...p, slotted: false } : p));
    const fixed = { ...start('rice'), vaneControl: 'fixed' as const, coverPlates: [plate(2, 'right')] };
    const f = expectFires(run(fixed, modular, unslottedCatalog), 'COVER_UNSLOTTED_VANES', 'advice');
    expect(f.places).toEqual([
      { kind: 'cover', section: 2, side: 'right' },
      { kind: 'setting', field: 'vaneSetting' },
    ]);
    expect(f.explanation).toMatch(/bolts/);
    expect(codes(run(fixed))).not.toContain('COVER_UNSLOTTED_VANES');
    expect(codes(run({ ...fixed, vaneControl: 'powered' }, modular, unslottedCatalog))).not.toContain('COVER_UNSLOTTED_VANES');
  });
  it('COVER_NOT_NEEDED advises against plates in an easy crop, not in a hard-threshing one', () => {
    expectFires(run({ ...start('wheat'), coverPlates: [plate(2, 'right')] }), 'COVER_NOT_NEEDED', 'advice');
    expect(codes(run({ ...start('rice'), coverPlates: [plate(2, 'right')] }))).not.toContain('COVER_NOT_NEEDED');
  });
});

describe('rotor bars', () => {
  it('BAR_PLACE_UNKNOWN fires for a row the rotor does not have', () => {
    expectFires(run(setBar(start('wheat'), 9, 1, 'CW-BR-RS-04')), 'BAR_PLACE_UNKNOWN', 'blocks-fit');
  });
  it('BAR_STRAIGHT_NOT_IN_LINE fires where the rasp bars are not in line', () => {
    const f = expectFires(run(setBar(start('corn'), 2, 1, 'CW-BR-ST-04')), 'BAR_STRAIGHT_NOT_IN_LINE', 'blocks-fit');
    expect(f.places).toEqual([{ kind: 'bar', row: 2, position: 1 }]);
  });
  it('BAR_STRAIGHT_NOT_IN_LINE does not fire where the rasp bars are in line', () => {
    expect(codes(run(setBar(start('corn'), 1, 1, 'CW-BR-ST-04')))).not.toContain('BAR_STRAIGHT_NOT_IN_LINE');
  });
  it('BAR_DISCHARGE_NOT_REAR fires for discharge bars in front', () => {
    const f = expectFires(run(setBar(start('hemp'), 2, 1, 'CW-BR-DC-04')), 'BAR_DISCHARGE_NOT_REAR', 'hurts-crop');
    expect(f.places).toEqual([{ kind: 'bar', row: 2, position: 1 }]);
  });
  it('hemp starter (opposite rear pair plus an opposite extra pair) raises no finding', () => {
    const fs = run(start('hemp'));
    expect(fs).toEqual([]);
  });
  it('an extra discharge pair one position ahead may sit on any opposite rows', () => {
    // hemp starter: rear pair rows 1 and 3 (0°, 180°); extra pair rows 2 and 4 at position 3.
    let l = start('hemp');
    l = setBar(setBar(l, 2, 3, 'CW-BR-RS-04'), 4, 3, 'CW-BR-RS-04');
    l = setBar(setBar(l, 1, 3, 'CW-BR-DC-04'), 3, 3, 'CW-BR-DC-04');
    expect(run(l)).toEqual([]);
  });
  it('BAR_DISCHARGE_EXTRA_NOT_OPPOSITE fires for extras with no rear pair', () => {
    let l = start('hemp');
    l = setBar(setBar(l, 1, 4, 'CW-BR-RS-04'), 3, 4, 'CW-BR-RS-04');
    const f = expectFires(run(l), 'BAR_DISCHARGE_EXTRA_NOT_OPPOSITE', 'hurts-crop');
    expect(f.places).toEqual([
      { kind: 'bar', row: 2, position: 3 },
      { kind: 'bar', row: 4, position: 3 },
    ]);
  });
  it('a single extra discharge bar is a balance finding naming the opposite place', () => {
    const l = setBar(start('hemp'), 4, 3, 'CW-BR-RS-04');
    const f = expectFires(run(l), 'BAR_UNBALANCED', 'blocks-fit');
    expect(f.places).toEqual([
      { kind: 'bar', row: 2, position: 3 },
      { kind: 'bar', row: 4, position: 3 },
    ]);
  });
  it('BAR_PLACE_EMPTY fires, per row, for mounts that carry nothing', () => {
    const l = { ...start('wheat'), rotorBars: start('wheat').rotorBars.filter((b) => !(b.row === 2 && b.position >= 3)) };
    const f = expectFires(run(l), 'BAR_PLACE_EMPTY', 'hurts-crop');
    expect(f.places).toEqual([
      { kind: 'bar', row: 2, position: 3 },
      { kind: 'bar', row: 2, position: 4 },
    ]);
    expect(f.title).toBe('Rotor bar row 2: nothing at positions 3 and 4');
  });
  it('BAR_UNDER_STRAIGHT fires for a second straight bar on one pair, and for a bar under a straight one', () => {
    // One straight bar spans both in-line mounts (common practice): a second at position 2 is one too many.
    const twice = expectFires(run(setBar(start('corn'), 1, 2, 'CW-BR-ST-04')), 'BAR_UNDER_STRAIGHT', 'blocks-fit');
    expect(twice.title).toBe('Two straight bars on one pair of mounts');
    expect(twice.places[0]).toEqual({ kind: 'bar', row: 1, position: 2 });
    const under = expectFires(run(setBar(start('corn'), 3, 2, 'CW-BR-SP-04')), 'BAR_UNDER_STRAIGHT', 'blocks-fit');
    expect(under.explanation).toMatch(/positions 1 and 2/);
  });
  it('BAR_STRAIGHT_NOT_NEEDED fires for straight bars in wheat, not in corn', () => {
    const f = expectFires(run(setBar(start('wheat'), 1, 1, 'CW-BR-ST-04')), 'BAR_STRAIGHT_NOT_NEEDED', 'hurts-crop');
    expect(f.explanation).toMatch(/power/);
    expect(codes(run(start('corn')))).not.toContain('BAR_STRAIGHT_NOT_NEEDED');
  });
  it('BAR_STRAIGHT_SUGGESTED advises straight bars for corn without them', () => {
    const l = { ...start('corn'), rotorBars: start('wheat').rotorBars };
    const f = expectFires(run(l), 'BAR_STRAIGHT_SUGGESTED', 'advice');
    // One straight bar per pair of in-line mounts: pinned to the front mount of each pair.
    expect(f.places).toEqual([
      { kind: 'bar', row: 1, position: 1 },
      { kind: 'bar', row: 3, position: 1 },
    ]);
    expect(f.fix).toMatch(/2 bars/);
    expect(codes(run(start('corn')))).not.toContain('BAR_STRAIGHT_SUGGESTED');
  });
  it('BAR_DISCHARGE_SUGGESTED advises discharge bars for hemp without them', () => {
    const l = { ...start('hemp'), rotorBars: start('wheat').rotorBars };
    const f = expectFires(run(l), 'BAR_DISCHARGE_SUGGESTED', 'advice');
    expect(f.places.every((p) => p.kind === 'bar' && p.position === 4)).toBe(true);
    expect(codes(run(start('wheat')))).not.toContain('BAR_DISCHARGE_SUGGESTED');
  });
});

describe('crop', () => {
  it('CROP_OPENING_TOO_SMALL fires for fine-wire with field peas (5 mm wires, 5.55 mm pea)', () => {
    const f = expectFires(run(setElement(start('field-peas'), 3, 'left', 'CW-FW-L-04')), 'CROP_OPENING_TOO_SMALL', 'hurts-crop');
    expect(f.places).toEqual([{ kind: 'element', position: 3, side: 'left' }]);
    expect(f.explanation).toContain('5.55 mm');
  });
  it('CROP_OPENING_TOO_SMALL does not fire for fine-wire with wheat, nor for a blank plate', () => {
    expect(codes(run(start('wheat')))).not.toContain('CROP_OPENING_TOO_SMALL');
    expect(codes(run(setElement(start('sunflower'), 1, 'left', 'CW-BL-L-04')))).not.toContain('CROP_OPENING_TOO_SMALL');
  });
  // Blank plates belong in crops such as sunflower, where whole heads must not drop through;
  // elsewhere they close separating area (common practice, no published source).
  it('CROP_BLANK_PLATE fires for a blank plate in wheat, in either zone', () => {
    const f = expectFires(run(setElement(start('wheat'), 3, 'right', 'CW-BL-R-04')), 'CROP_BLANK_PLATE', 'hurts-crop');
    expect(f.places).toEqual([{ kind: 'element', position: 3, side: 'right' }]);
    expect(f.fix).toContain('wide-wire');
    expect(expectFires(run(setElement(start('wheat'), 1, 'left', 'CW-BL-L-04')), 'CROP_BLANK_PLATE', 'hurts-crop').fix).toContain(
      'fine-wire',
    );
  });
  it('CROP_BLANK_PLATE does not fire in sunflower, nor for perforated plates in edible beans', () => {
    expect(codes(run(setElement(start('sunflower'), 1, 'left', 'CW-BL-L-04')))).not.toContain('CROP_BLANK_PLATE');
    expect(codes(run(start('edible-beans')))).not.toContain('CROP_BLANK_PLATE');
  });
  it('CROP_AGGRESSIVE_FRAGILE fires for close-bar with soybeans', () => {
    expectFires(run(setElement(start('soybeans'), 1, 'left', 'CW-CB-L-04')), 'CROP_AGGRESSIVE_FRAGILE', 'hurts-crop');
  });
  it('CROP_AGGRESSIVE_FRAGILE does not fire for close-bar with rice or round-bar with soybeans', () => {
    expect(codes(run(setElement(start('rice'), 1, 'left', 'CW-CB-L-04')))).not.toContain('CROP_AGGRESSIVE_FRAGILE');
    expect(codes(run(start('soybeans')))).not.toContain('CROP_AGGRESSIVE_FRAGILE');
  });
  it('CROP_OPEN_HARD_THRESHING fires for wide-wire in the threshing zone in rice', () => {
    const f = expectFires(run(setElement(start('rice'), 2, 'right', 'CW-WW-R-04')), 'CROP_OPEN_HARD_THRESHING', 'hurts-crop');
    expect(f.explanation).toMatch(/whitecaps/);
  });
  it('CROP_OPEN_HARD_THRESHING does not fire for wide-wire in the separating zone, nor in wheat', () => {
    expect(codes(run(start('rice')))).not.toContain('CROP_OPEN_HARD_THRESHING');
    expect(codes(run(setElement(start('wheat'), 1, 'left', 'CW-WW-L-04')))).not.toContain('CROP_OPEN_HARD_THRESHING');
  });
});

describe('kernel passage with a margin', () => {
  // Kernel sizes: maize (dent) 10.54 × 7.26 × 4.57 mm, Sezer et al., African J. Biotechnology;
  // wheat 7.08 × 3.27 × 2.98 mm, Tabatabaeefar, Int. Agrophysics 17:207 (2003); dry bean (large)
  // 17.55 × 9.75 × 5.83 mm, Isik (2013); sunflower 12.14 × 5.79 × 3.86 mm, Seifi & Alimardani.
  // Larger kernels ×1.13: the published canola range Ø 1.48–1.91 mm (Razavi et al., 2009) has its
  // upper end 13 % above its middle. Margin 10 %, at least 0.5 mm: common practice, no published source.
  const everywhere = (layout: Layout, pn: (side: 'left' | 'right') => string): Layout => {
    let l = layout;
    for (const p of modular.positions) for (const side of ['left', 'right'] as const) l = setElement(l, p.index, side, pn(side));
    return l;
  };
  const fineWire = (side: 'left' | 'right') => `CW-FW-${side === 'left' ? 'L' : 'R'}-04`;

  it('fine-wire everywhere in corn (5 mm against a 4.57 mm mean thickness) is tight at every half-position', () => {
    const findings = run(everywhere(start('corn'), fineWire));
    const tight = only(findings, 'CROP_OPENING_TIGHT');
    expect(tight).toHaveLength(8);
    expect(tight[0]!.severity).toBe('hurts-crop');
    // 4.57 × 1.13 = 5.16 mm; margin max(0.5, 0.516) = 0.52 mm; 5 − 5.16 − 0.52 = −0.68 mm.
    expect(tight[0]!.explanation).toContain('4.57 mm on average');
    expect(tight[0]!.explanation).toContain('5.16 mm on the larger ones');
    expect(tight[0]!.explanation).toContain('0.68 mm short');
    expect(tight[0]!.title).toBe('Opening tight for the larger corn kernels');
    expect(codes(findings)).not.toContain('CROP_OPENING_TOO_SMALL');
  });
  it('kernelPassage: corn in fine-wire is tight, wheat in fine-wire passes with room to spare', () => {
    const corn = kernelPassage({ width: 5, length: 25 }, cropPrograms.corn.kernel);
    expect(corn.verdict).toBe('tight');
    expect(corn.largerSizeMm).toBeCloseTo(4.57 * 1.13, 6);
    expect(corn.spareMm!).toBeCloseTo(5 - 4.57 * 1.13 - Math.max(0.5, 0.1 * 4.57 * 1.13), 6);
    const wheat = kernelPassage({ width: 5, length: 25 }, cropPrograms.wheat.kernel);
    expect(wheat.verdict).toBe('passes');
    // 2.98 × 1.13 = 3.37 mm + 0.5 mm margin → 1.13 mm to spare in a 5 mm slot.
    expect(wheat.spareMm!).toBeCloseTo(5 - 2.98 * 1.13 - 0.5, 6);
    expect(kernelPassage(null, cropPrograms.wheat.kernel).verdict).toBe('closed');
    // Canola's stored size is the published upper bound already (Razavi et al., 2009): factor 1.
    expect(kernelPassage({ width: 5, length: 25 }, cropPrograms.canola.kernel).largerSizeMm).toBeCloseTo(1.91, 6);
  });
  it("a round hole is judged by its diameter against the kernel's middle size", () => {
    // Perforated plate: 14 mm round holes. A large dry bean is 9.75 mm wide (Isik, 2013).
    const bean = kernelPassage({ width: 14, length: 14 }, cropPrograms['edible-beans'].kernel);
    expect(bean.opening).toBe('hole');
    expect(bean.meanSizeMm).toBe(9.75);
    expect(bean.verdict).toBe('passes');
    // A 9 mm round hole passes a bean's 5.83 mm thickness but not its 9.75 mm width.
    const small = kernelPassage({ width: 9, length: 9 }, cropPrograms['edible-beans'].kernel);
    expect(small.verdict).toBe('blocked');
    expect(small.meanMarginMm!).toBeCloseTo(9 - 9.75, 6);
  });
  it('the too-small finding describes a round hole by its diameter and the kernel size that matters', () => {
    const beans = start('edible-beans');
    const f = expectFires(run(setElement(beans, 3, 'left', 'CW-FW-L-04')), 'CROP_OPENING_TOO_SMALL', 'hurts-crop');
    expect(f.explanation).toContain('5 mm × 25 mm slots');
    expect(f.explanation).toContain('by its thickness, its smallest size');
    expect(f.explanation).toContain('an average bean');
  });
  it('wheat, barley and oats starter cages stay clean of passage findings', () => {
    for (const crop of ['wheat', 'barley', 'oats', 'canola', 'rice', 'sorghum'] as const) {
      expect(codes(run(start(crop))).filter((c) => c.startsWith('CROP_OPENING'))).toEqual([]);
    }
  });
  it('CROP_SKIP_WIRE_SMALL_GRAIN fires for skip-wire in the threshing zone in wheat, not in the separating zone nor in corn', () => {
    const f = expectFires(run(setElement(start('wheat'), 1, 'left', 'CW-SW-L-04')), 'CROP_SKIP_WIRE_SMALL_GRAIN', 'hurts-crop');
    expect(f.places).toEqual([{ kind: 'element', position: 1, side: 'left' }]);
    expect(f.title).toBe('Skip-wire leaves wheat heads unthreshed');
    expect(codes(run(setElement(start('barley'), 2, 'right', 'CW-SW-R-04')))).toContain('CROP_SKIP_WIRE_SMALL_GRAIN');
    expect(codes(run(setElement(start('wheat'), 4, 'left', 'CW-SW-L-04')))).not.toContain('CROP_SKIP_WIRE_SMALL_GRAIN');
    expect(codes(run(setElement(start('corn'), 1, 'left', 'CW-SW-L-04')))).not.toContain('CROP_SKIP_WIRE_SMALL_GRAIN');
  });
  it('CROP_CLOSE_BAR_SMALL_SEED fires for close-bar in canola and grass seed, not in rice', () => {
    const f = expectFires(run(setElement(start('canola'), 1, 'left', 'CW-CB-L-04')), 'CROP_CLOSE_BAR_SMALL_SEED', 'hurts-crop');
    expect(f.title).toBe('Close-bar grinds canola straw to chaff');
    expect(codes(run(setElement(start('grass-seed'), 3, 'right', 'CW-CB-R-04')))).toContain('CROP_CLOSE_BAR_SMALL_SEED');
    expect(codes(run(start('rice')))).not.toContain('CROP_CLOSE_BAR_SMALL_SEED');
  });
  it('ZONE_NO_OPEN_AREA: a blank separating zone raises it in every crop; a sunflower cage blank everywhere raises it for both zones', () => {
    const blank = (side: 'left' | 'right') => `CW-BL-${side === 'left' ? 'L' : 'R'}-04`;
    for (const crop of cropIds) {
      let l = start(crop);
      for (const p of modular.positions)
        if (p.zone === 'separating') for (const side of ['left', 'right'] as const) l = setElement(l, p.index, side, blank(side));
      const f = only(run(l), 'ZONE_NO_OPEN_AREA');
      expect(
        f.map((x) => x.title),
        crop,
      ).toEqual(['No open area in the separating zone']);
      expect(f[0]!.places).toHaveLength(4);
    }
    const sunflower = run(everywhere(start('sunflower'), blank));
    expect(
      only(sunflower, 'ZONE_NO_OPEN_AREA')
        .map((x) => x.title)
        .sort(),
    ).toEqual(['No open area in the separating zone', 'No open area in the threshing zone']);
    // A few blank plates in sunflower (whole heads kept up) raise nothing.
    expect(codes(run(setElement(start('sunflower'), 1, 'left', 'CW-BL-L-04')))).not.toContain('ZONE_NO_OPEN_AREA');
  });
});

describe('findings read as a person says them', () => {
  it('crop names are nouns, with the verb that agrees', () => {
    const beans = run(setElement(start('edible-beans'), 1, 'left', 'CW-FW-L-04'));
    const fragile = expectFires(beans, 'CROP_AGGRESSIVE_FRAGILE', 'hurts-crop');
    expect(fragile.explanation).toMatch(/^Edible beans crack and split easily; a fine-wire element/);
    const wheat = run(setElement(start('wheat'), 3, 'right', 'CW-BL-R-04'));
    expect(expectFires(wheat, 'CROP_BLANK_PLATE', 'hurts-crop').title).toBe('Blank plate in a wheat cage');
    const soy = run(setElement(start('soybeans'), 3, 'right', 'CW-BL-R-04'));
    expect(expectFires(soy, 'CROP_BLANK_PLATE', 'hurts-crop').title).toBe('Blank plate in a soybean cage');
    const soyFine = expectFires(run(setElement(start('soybeans'), 3, 'left', 'CW-FW-L-04')), 'CROP_OPENING_TOO_SMALL', 'hurts-crop');
    expect(soyFine.title).toBe('Opening too small for soybeans');
    expect(soyFine.explanation).toContain('an average soybean kernel');
    const rice = run(setElement(start('rice'), 1, 'left', 'CW-WW-L-04'));
    expect(expectFires(rice, 'CROP_OPEN_HARD_THRESHING', 'hurts-crop').explanation).toMatch(/^Rice is hard to thresh/);
    for (const f of [...beans, ...wheat, ...soy, ...rice])
      expect(`${f.title} ${f.explanation} ${f.fix}`).not.toMatch(/\b(soybeans|edible beans|field peas) (kernel|cage|heads|program)\b/i);
  });
});

describe('settings', () => {
  it('CROP_RPM_OUTSIDE_WINDOW fires for wheat at 300 rpm (too slow) and 1400 rpm (too fast)', () => {
    const slow = expectFires(run({ ...start('wheat'), rotorRpm: 300 }), 'CROP_RPM_OUTSIDE_WINDOW', 'hurts-crop');
    expect(slow.places).toEqual([{ kind: 'setting', field: 'rotorRpm' }]);
    expect(slow.title).toMatch(/too slow/);
    const fast = expectFires(run({ ...start('wheat'), rotorRpm: 1400 }), 'CROP_RPM_OUTSIDE_WINDOW', 'hurts-crop');
    expect(fast.title).toMatch(/too fast/);
  });
  it('CROP_RPM_OUTSIDE_WINDOW follows the slim-drum shift: 420 rpm suits edible beans on the slim drum, not the full one', () => {
    // Full drum: widest cited range 7–15 m/s ([mem]) = 175–376 rpm on 762 mm; slim: +100 rpm (common practice).
    expect(codes(run({ ...start('edible-beans'), drum: 'full', rotorRpm: 420 }))).toContain('CROP_RPM_OUTSIDE_WINDOW');
    expect(codes(run({ ...start('edible-beans'), drum: 'slim', rotorRpm: 420 }))).not.toContain('CROP_RPM_OUTSIDE_WINDOW');
  });
  it('CROP_RPM_OUTSIDE_START: edible beans at 260 rpm are inside a cited range (no "hurts crop") but above the laboratory optimum', () => {
    // International Agrophysics (1994): 9.04–10.17 m/s = 226.6–254.9 rpm on 762 mm; 260 rpm = 10.4 m/s.
    const f = run({ ...start('edible-beans'), rotorRpm: 260 });
    expect(codes(f)).not.toContain('CROP_RPM_OUTSIDE_WINDOW');
    expect(expectFires(f, 'CROP_RPM_OUTSIDE_START', 'advice').explanation).toMatch(/International Agrophysics \(1994\)/);
  });
  it('field peas at 480 rpm (NDSU Crop & Pest Report, 30 July 2008: 350–500 rpm) and wheat at 22 m/s (Harrison 1975: best below 22.3 m/s) do not hurt the crop', () => {
    expect(codes(run({ ...start('field-peas'), rotorRpm: 480 }))).not.toContain('CROP_RPM_OUTSIDE_WINDOW');
    // 551 rpm on 762 mm = 21.98 m/s.
    expect(codes(run({ ...start('wheat'), rotorRpm: 551 }))).not.toContain('CROP_RPM_OUTSIDE_WINDOW');
    expect(codes(run({ ...start('field-peas'), rotorRpm: 501 }))).toContain('CROP_RPM_OUTSIDE_WINDOW');
  });
  it('FIT_CLEARANCE_BELOW_MINIMUM: wheat at 0.5 mm blocks fit', () => {
    const f = expectFires(run({ ...start('wheat'), clearanceMm: 0.5 }), 'FIT_CLEARANCE_BELOW_MINIMUM', 'blocks-fit');
    expect(f.places).toEqual([{ kind: 'setting', field: 'clearanceMm' }]);
  });
  it('CROP_CLEARANCE_OUTSIDE_WINDOW: corn at 3 mm is too tight, wheat at 40 mm too wide (common practice windows)', () => {
    expect(
      expectFires(run({ ...start('corn', split), clearanceMm: 3 }, split), 'CROP_CLEARANCE_OUTSIDE_WINDOW', 'hurts-crop').title,
    ).toMatch(/too tight/);
    expect(expectFires(run({ ...start('wheat'), clearanceMm: 40 }), 'CROP_CLEARANCE_OUTSIDE_WINDOW', 'hurts-crop').title).toMatch(
      /too wide/,
    );
    expect(codes(run({ ...start('wheat'), clearanceMm: 12 }))).not.toContain('CROP_CLEARANCE_OUTSIDE_WINDOW');
  });
  it('FIT_VANE_SETTING_UNAVAILABLE: bolt-set vanes cannot be set very slow, and the fix names a setting they take', () => {
    const f = expectFires(
      run({ ...start('wheat', modular, { vaneControl: 'fixed' }), vaneSetting: 'very-slow' }),
      'FIT_VANE_SETTING_UNAVAILABLE',
      'blocks-fit',
    );
    expect(f.explanation).toMatch(/in the shop/);
    expect(f.fix).toMatch(/Set the vanes to (slow|medium|fast)\b/);
    expect(codes(run({ ...start('wheat', modular, { vaneControl: 'powered' }), vaneSetting: 'very-slow' }))).not.toContain(
      'FIT_VANE_SETTING_UNAVAILABLE',
    );
  });
  it('CROP_VANES_AGAINST_CROP: rice with fast vanes hurts the crop (common practice: slow vanes for hard threshing)', () => {
    const f = expectFires(
      run({ ...start('rice', modular, { vaneControl: 'powered' }), vaneSetting: 'fast' }),
      'CROP_VANES_AGAINST_CROP',
      'hurts-crop',
    );
    expect(f.fix).toMatch(/very slow|slow/);
    expect(f.fix).toMatch(/from the cab/);
    // On bolt-set vanes the advice is slow, never very slow (they cannot take it).
    const g = expectFires(
      run({ ...start('rice', modular, { vaneControl: 'fixed' }), vaneSetting: 'fast' }),
      'CROP_VANES_AGAINST_CROP',
      'hurts-crop',
    );
    expect(g.fix).toMatch(/^Set the vanes to slow /);
  });
  it('CROP_VANES_ADVICE: wheat on very slow vanes is advice only', () => {
    expectFires(run({ ...start('wheat', modular, { vaneControl: 'powered' }), vaneSetting: 'very-slow' }), 'CROP_VANES_ADVICE', 'advice');
  });
  it('DRUM_SLIM_ADVICE advises once, on a slim drum in a crop without heavy straw only', () => {
    // The slim drum's capacity gain shows in heavy, tough straw (common practice, no published
    // source): in soybeans it only adds tuning and rotor loss, so the advice appears, once.
    const soy = run({ ...start('soybeans', modular, { drum: 'slim' }) });
    const f = expectFires(soy, 'DRUM_SLIM_ADVICE', 'advice');
    expect(only(soy, 'DRUM_SLIM_ADVICE')).toHaveLength(1);
    expect(f.explanation).toMatch(/20 %/);
    expect(f.title).toMatch(/soybeans/);
    // Wheat is a heavy-straw crop: the slim drum is doing its job there, no advice.
    expect(codes(run(start('wheat', modular, { drum: 'slim' })))).not.toContain('DRUM_SLIM_ADVICE');
    expect(codes(run(start('soybeans')))).not.toContain('DRUM_SLIM_ADVICE');
  });
});

describe('ordering', () => {
  it('lists blocking findings first, then crop findings, then advice', () => {
    let l: Layout = { ...start('canola'), drum: 'slim', rotorRpm: 300 };
    l = setElement(l, 1, 'right', 'CW-FW-L-04');
    const ranks = run(l).map((f) => ['blocks-fit', 'hurts-crop', 'advice'].indexOf(f.severity));
    expect(ranks).toEqual([...ranks].sort((a, b) => a - b));
    expect(new Set(ranks).size).toBe(3);
  });
  it('accepts a plain catalog array as well as an index', () => {
    const l = setElement(start('wheat'), 1, 'right', 'CW-FW-L-04');
    expect(checkLayout(modular, demoCatalog, l)).toEqual(checkLayout(modular, catalog, l));
  });
});

afterAll(() => {
  // Every finding code has been seen firing on demo data.
  expect([...findingCodeSchema.options].filter((c) => !fired.has(c))).toEqual([]);
});
