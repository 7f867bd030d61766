import { afterAll, describe, expect, it } from 'vitest';
import {
  checkLayout,
  demoCatalog,
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

function run(layout: Layout, family: MachineFamily = modular): Finding[] {
  const findings = checkLayout(family, catalog, layout);
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
    expectFires(run({ ...start('rice'), coverPlates: [{ section: 2, side: 'right', partNumber: 'CW-CP-X-99' }] }), 'PART_UNKNOWN', 'blocks-fit');
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
  const plate = (section: number, side: 'left' | 'right', pn = side === 'left' ? 'CW-CP-L-04' : 'CW-CP-R-04') => ({ section, side, partNumber: pn });
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
  it('hemp starter (rear pair plus extra pair opposite) raises no discharge finding', () => {
    const fs = run(start('hemp'));
    expect(fs).toEqual([]);
  });
  it('BAR_DISCHARGE_EXTRA_NOT_OPPOSITE fires for an extra pair on the same rows as the rear pair', () => {
    // hemp starter: rear pair rows 1, 2 (0°, 90°); extras on rows 3, 4 (180°, 270°). Put extras on 1, 2.
    let l = start('hemp');
    l = setBar(setBar(l, 3, 3, 'CW-BR-RS-04'), 4, 3, 'CW-BR-RS-04');
    l = setBar(setBar(l, 1, 3, 'CW-BR-DC-04'), 2, 3, 'CW-BR-DC-04');
    const f = expectFires(run(l), 'BAR_DISCHARGE_EXTRA_NOT_OPPOSITE', 'hurts-crop');
    expect(f.places).toEqual([
      { kind: 'bar', row: 1, position: 3 },
      { kind: 'bar', row: 2, position: 3 },
    ]);
  });
  it('BAR_DISCHARGE_EXTRA_NOT_OPPOSITE fires for extras with no rear pair', () => {
    let l = start('hemp');
    l = setBar(setBar(l, 1, 4, 'CW-BR-RS-04'), 2, 4, 'CW-BR-RS-04');
    expectFires(run(l), 'BAR_DISCHARGE_EXTRA_NOT_OPPOSITE', 'hurts-crop');
  });
  it('BAR_DISCHARGE_EXTRA_NOT_OPPOSITE fires for a single extra bar', () => {
    const l = setBar(start('hemp'), 4, 3, 'CW-BR-RS-04');
    expectFires(run(l), 'BAR_DISCHARGE_EXTRA_NOT_OPPOSITE', 'hurts-crop');
  });
  it('BAR_STRAIGHT_NOT_NEEDED fires for straight bars in wheat, not in corn', () => {
    const f = expectFires(run(setBar(start('wheat'), 1, 1, 'CW-BR-ST-04')), 'BAR_STRAIGHT_NOT_NEEDED', 'hurts-crop');
    expect(f.explanation).toMatch(/power/);
    expect(codes(run(start('corn')))).not.toContain('BAR_STRAIGHT_NOT_NEEDED');
  });
  it('BAR_STRAIGHT_SUGGESTED advises straight bars for corn without them', () => {
    const l = { ...start('corn'), rotorBars: start('wheat').rotorBars };
    const f = expectFires(run(l), 'BAR_STRAIGHT_SUGGESTED', 'advice');
    expect(f.places.length).toBe(modular.rotorBarPlaces.filter((p) => p.inLine).length);
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
    expect(expectFires(run(setElement(start('wheat'), 1, 'left', 'CW-BL-L-04')), 'CROP_BLANK_PLATE', 'hurts-crop').fix).toContain('fine-wire');
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
    expect(expectFires(run({ ...start('corn', split), clearanceMm: 3 }, split), 'CROP_CLEARANCE_OUTSIDE_WINDOW', 'hurts-crop').title).toMatch(/too tight/);
    expect(expectFires(run({ ...start('wheat'), clearanceMm: 40 }), 'CROP_CLEARANCE_OUTSIDE_WINDOW', 'hurts-crop').title).toMatch(/too wide/);
    expect(codes(run({ ...start('wheat'), clearanceMm: 12 }))).not.toContain('CROP_CLEARANCE_OUTSIDE_WINDOW');
  });
  it('FIT_VANE_SETTING_UNAVAILABLE: bolt-set vanes cannot be set very slow, and the fix names a setting they take', () => {
    const f = expectFires(run({ ...start('wheat', modular, { vaneControl: 'fixed' }), vaneSetting: 'very-slow' }), 'FIT_VANE_SETTING_UNAVAILABLE', 'blocks-fit');
    expect(f.explanation).toMatch(/in the shop/);
    expect(f.fix).toMatch(/Set the vanes to (slow|medium|fast)\b/);
    expect(codes(run({ ...start('wheat', modular, { vaneControl: 'powered' }), vaneSetting: 'very-slow' }))).not.toContain('FIT_VANE_SETTING_UNAVAILABLE');
  });
  it('CROP_VANES_AGAINST_CROP: rice with fast vanes hurts the crop (common practice: slow vanes for hard threshing)', () => {
    const f = expectFires(run({ ...start('rice', modular, { vaneControl: 'powered' }), vaneSetting: 'fast' }), 'CROP_VANES_AGAINST_CROP', 'hurts-crop');
    expect(f.fix).toMatch(/very slow|slow/);
    expect(f.fix).toMatch(/from the cab/);
    // On bolt-set vanes the advice is slow, never very slow (they cannot take it).
    const g = expectFires(run({ ...start('rice', modular, { vaneControl: 'fixed' }), vaneSetting: 'fast' }), 'CROP_VANES_AGAINST_CROP', 'hurts-crop');
    expect(g.fix).toMatch(/^Set the vanes to slow /);
  });
  it('CROP_VANES_ADVICE: wheat on very slow vanes is advice only', () => {
    expectFires(run({ ...start('wheat', modular, { vaneControl: 'powered' }), vaneSetting: 'very-slow' }), 'CROP_VANES_ADVICE', 'advice');
  });
  it('DRUM_SLIM_ADVICE advises on the slim drum, not on the full drum', () => {
    const f = expectFires(run({ ...start('wheat', modular, { drum: 'slim' }) }), 'DRUM_SLIM_ADVICE', 'advice');
    expect(f.explanation).toMatch(/20 %/);
    expect(codes(run(start('wheat')))).not.toContain('DRUM_SLIM_ADVICE');
  });
});

describe('ordering', () => {
  it('lists blocking findings first, then crop findings, then advice', () => {
    let l: Layout = { ...start('wheat'), drum: 'slim', rotorRpm: 300 };
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
