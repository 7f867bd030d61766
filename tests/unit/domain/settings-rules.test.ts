/**
 * Speed windows, concave clearance and vanes: the rules hold for every crop, drum and vane control,
 * and the checks named after a source assert that source's own figures.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  MECHANICAL_MIN_CLEARANCE_MM,
  VANE_SETTINGS,
  adviseVaneSetting,
  cropIdSchema,
  cropPrograms,
  demoFamilies,
  drumFor,
  inRpmWindow,
  rpmWindow,
  startRpm,
  vaneControlSchema,
  vaneSettingsFor,
  type CropId,
  type Layout,
} from '~/lib/domain';
import { check, codes, modular, start } from './helpers';

const crops = cropIdSchema.options;
const SPEED_CODES = ['CROP_RPM_OUTSIDE_WINDOW', 'CROP_RPM_OUTSIDE_START'];
const CLEARANCE_CODES = ['FIT_CLEARANCE_BELOW_MINIMUM', 'CROP_CLEARANCE_OUTSIDE_WINDOW'];
const VANE_CODES = ['FIT_VANE_SETTING_UNAVAILABLE', 'CROP_VANES_AGAINST_CROP', 'CROP_VANES_ADVICE'];

const w762 = (crop: CropId, drum: 'full' | 'slim' = 'full') => rpmWindow(crop, { id: drum, diameterMm: 762 });

describe('speed windows agree with their sources', () => {
  it('NDSU Crop & Pest Report (30 July 2008): field peas 350–500 rpm — both ends inside, exactly, on a 762 mm rotor', () => {
    const w = w762('field-peas');
    const ndsu = w.ranges.find((r) => /Crop & Pest Report/.test(r.source))!;
    expect([ndsu.lo, ndsu.hi]).toEqual([350, 500]);
    for (let n = 350; n <= 500; n++) expect(inRpmWindow(n, w), `${n} rpm`).toBe(true);
  });
  it('Harrison, Canadian Agricultural Engineering 17(1):55–58 (1975): wheat range 19.5–30.7 m/s, threshed best below 22.3 m/s', () => {
    const c = cropPrograms.wheat;
    const tested = c.speed.ranges.find((r) => /Harrison/.test(r.source))!;
    expect(tested.minMs).toBe(19.5);
    expect(tested.maxMs).toBe(30.7);
    expect(c.speed.start!.maxMs).toBe(22.3);
    // 22.3 m/s on a 762 mm rotor = 558.9 rpm: inside the start band, rounded outward.
    const w = w762('wheat');
    expect(w.start!.hi).toBe(559);
  });
  it('Steponavičius et al., Journal of Vibroengineering (2017): corn tested at 11.0–17.3 m/s', () => {
    const r = cropPrograms.corn.speed.ranges[0]!;
    expect([r.minMs, r.maxMs]).toEqual([11, 17.3]);
  });
  it('NDSU Extension EB-25 "Sunflower Production" (2007): a new sunflower layout starts at 220 rpm on a 30 in (762 mm) rotor', () => {
    expect(startRpm(w762('sunflower'))).toBe(220);
    expect(start('sunflower').rotorRpm).toBe(220);
  });
  it('International Agrophysics (1994): edible beans 9.04–10.17 m/s is the start band, 260 rpm (10.4 m/s) is advice, not "hurts crop"', () => {
    const f = check({ ...start('edible-beans'), rotorRpm: 260 });
    expect(codes(f)).toContain('CROP_RPM_OUTSIDE_START');
    expect(f.filter((x) => x.severity !== 'advice').map((x) => x.code)).not.toContain('CROP_RPM_OUTSIDE_WINDOW');
  });

  it('property: inside any cited range never "hurts crop"; outside all of them always does — every crop, both drums', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...crops),
        fc.constantFrom('full' as const, 'slim' as const),
        fc.integer({ min: 100, max: 1500 }),
        (crop, drum, n) => {
          const w = w762(crop, drum);
          const inside = w.ranges.some((r) => n >= r.lo && n <= r.hi);
          const f = check({ ...start(crop, modular, { drum }), rotorRpm: n });
          expect(codes(f).includes('CROP_RPM_OUTSIDE_WINDOW')).toBe(!inside);
          // The start band gives advice at most.
          for (const x of f.filter((x) => x.code === 'CROP_RPM_OUTSIDE_START')) expect(x.severity).toBe('advice');
        },
      ),
      { numRuns: 400 },
    );
  });
  it('every cited range, end to end, on the full drum: no "hurts crop" at either end; one rpm past the outermost ends does', () => {
    for (const crop of crops) {
      const w = w762(crop);
      for (const r of w.ranges) {
        for (const n of [r.lo, r.hi])
          expect(codes(check({ ...start(crop), rotorRpm: n })), `${crop} ${n}`).not.toContain('CROP_RPM_OUTSIDE_WINDOW');
      }
      const lo = Math.min(...w.ranges.map((r) => r.lo));
      const hi = Math.max(...w.ranges.map((r) => r.hi));
      expect(codes(check({ ...start(crop), rotorRpm: lo - 1 })), crop).toContain('CROP_RPM_OUTSIDE_WINDOW');
      expect(codes(check({ ...start(crop), rotorRpm: hi + 1 })), crop).toContain('CROP_RPM_OUTSIDE_WINDOW');
    }
  });
  it('the slim drum takes every range 100 rpm higher (common practice, no published source), and its starter starts there', () => {
    for (const crop of crops) {
      const full = w762(crop);
      const slim = w762(crop, 'slim');
      expect(slim.ranges.map((r) => [r.lo - 100, r.hi - 100])).toEqual(full.ranges.map((r) => [r.lo, r.hi]));
      expect(start(crop, modular, { drum: 'slim' }).rotorRpm).toBe(startRpm(full) + 100);
    }
  });
});

describe('concave clearance', () => {
  it('every crop carries a window, marked with its basis, above the mechanical minimum', () => {
    for (const crop of crops) {
      const c = cropPrograms[crop].clearanceMm;
      expect(c.minMm, crop).toBeGreaterThanOrEqual(MECHANICAL_MIN_CLEARANCE_MM);
      expect(c.maxMm, crop).toBeGreaterThan(c.minMm);
      expect(c.source, crop).toMatch(/common practice, no published source|\[mem\]/);
    }
  });
  it('property: below the mechanical minimum blocks fit; outside the window hurts the crop; inside raises nothing', () => {
    fc.assert(
      fc.property(fc.constantFrom(...crops), fc.integer({ min: 1, max: 1600 }), (crop, tenths) => {
        const mmValue = tenths / 20; // 0.05–80 mm
        if (mmValue < 0.5) return;
        const win = cropPrograms[crop].clearanceMm;
        const f = check({ ...start(crop), clearanceMm: mmValue });
        const got = f.filter((x) => CLEARANCE_CODES.includes(x.code));
        if (mmValue < MECHANICAL_MIN_CLEARANCE_MM)
          expect(got.map((x) => [x.code, x.severity])).toEqual([['FIT_CLEARANCE_BELOW_MINIMUM', 'blocks-fit']]);
        else if (mmValue < win.minMm || mmValue > win.maxMm)
          expect(got.map((x) => [x.code, x.severity])).toEqual([['CROP_CLEARANCE_OUTSIDE_WINDOW', 'hurts-crop']]);
        else expect(got).toEqual([]);
      }),
      { numRuns: 400 },
    );
  });
});

describe('vanes', () => {
  const controls = vaneControlSchema.options;
  it('bolt-set vanes take slow, medium and fast; linkage and powered vanes the whole range (common practice, no published source)', () => {
    expect(vaneSettingsFor('fixed')).toEqual(['slow', 'medium', 'fast']);
    expect(vaneSettingsFor('manual')).toEqual(VANE_SETTINGS);
    expect(vaneSettingsFor('powered')).toEqual(VANE_SETTINGS);
  });
  it('never advises a setting the machine cannot take: every crop × control × setting', () => {
    for (const crop of crops)
      for (const control of controls)
        for (const setting of VANE_SETTINGS) {
          const advised = adviseVaneSetting(control, cropPrograms[crop].vanes.suits, setting);
          expect(vaneSettingsFor(control), `${crop} ${control} ${setting}`).toContain(advised);
          const family = demoFamilies.find((f) => f.vaneControls.includes(control)) ?? modular;
          const l: Layout = { ...start(crop, family), vaneControl: control, vaneSetting: setting };
          for (const f of check(l, family).filter((x) => VANE_CODES.includes(x.code))) {
            const named = /(?:Set the vanes to|Try) (very slow|slow|medium|fast)\b/.exec(f.fix)?.[1];
            if (named)
              expect(
                vaneSettingsFor(control).map((v) => v.replace('-', ' ')),
                `${crop} ${control} ${setting}: ${f.fix}`,
              ).toContain(named);
          }
        }
  });
  it('hard-threshing crops: fast vanes hurt; crops that crack: very slow vanes hurt (common practice, no published source)', () => {
    for (const crop of crops) {
      const c = cropPrograms[crop];
      const l = (s: Layout['vaneSetting']) => ({ ...start(crop, modular, { vaneControl: 'powered' }), vaneSetting: s });
      const fastHurts = codes(check(l('fast'))).includes('CROP_VANES_AGAINST_CROP');
      const verySlowHurts = codes(check(l('very-slow'))).includes('CROP_VANES_AGAINST_CROP');
      expect(fastHurts, crop).toBe(c.threshability === 'hard');
      expect(verySlowHurts, crop).toBe(c.threshability !== 'hard' && c.fragile);
    }
  });
});

describe('starting settings start slow and wide', () => {
  it('every crop, family, drum and vane control: slow end of the speed window, wide end of the clearance window, vanes it can take; no settings finding but advice', () => {
    for (const family of demoFamilies)
      for (const drum of family.drumOptions)
        for (const control of family.vaneControls)
          for (const crop of crops) {
            const l = start(crop, family, { drum: drum.id, vaneControl: control });
            const w = rpmWindow(crop, { id: drum.id, diameterMm: drumFor(family, drum.id).diameterMm });
            const slowest = w.start ?? [...w.ranges].sort((a, b) => a.minRpm - b.minRpm)[0]!;
            // The first whole rpm at or above the slow end (of the start band where there is one).
            expect(l.rotorRpm, crop).toBeGreaterThanOrEqual(slowest.minRpm - 1e-6);
            expect(l.rotorRpm - 1, crop).toBeLessThan(slowest.minRpm - 1e-6);
            expect(l.clearanceMm, crop).toBe(cropPrograms[crop].clearanceMm.maxMm);
            expect(vaneSettingsFor(control)).toContain(l.vaneSetting);
            const bad = check(l, family).filter(
              (f) => [...SPEED_CODES, ...CLEARANCE_CODES, ...VANE_CODES].includes(f.code) && f.severity !== 'advice',
            );
            expect(
              bad.map((f) => f.code),
              `${family.id} ${drum.id} ${control} ${crop}`,
            ).toEqual([]);
          }
  });
});

describe('the planner proposes the same starting settings', () => {
  it('a slim-drum wheat machine going to each crop: slow end of the slim window, wide concave, vanes the control takes, no settings finding above advice', async () => {
    const { planCropChange } = await import('~/lib/domain/planner');
    const { catalog } = await import('./helpers');
    let planned = 0;
    for (const control of modular.vaneControls)
      for (const crop of crops) {
        const installed = start('wheat', modular, { drum: 'slim', vaneControl: control });
        const plan = planCropChange({ family: modular, catalog, installed, shelf: {}, crop, vaneControl: control });
        if (!plan.ok) continue;
        planned++;
        const w = rpmWindow(crop, { id: 'slim', diameterMm: 762 });
        expect(plan.layout.drum).toBe('slim');
        expect(plan.layout.rotorRpm, crop).toBe(startRpm(w));
        expect(plan.layout.clearanceMm, crop).toBe(cropPrograms[crop].clearanceMm.maxMm);
        expect(vaneSettingsFor(control)).toContain(plan.layout.vaneSetting);
        const bad = plan.findings.filter(
          (f) => [...SPEED_CODES, ...CLEARANCE_CODES, ...VANE_CODES].includes(f.code) && f.severity !== 'advice',
        );
        expect(
          bad.map((f) => f.code),
          `${control} ${crop}`,
        ).toEqual([]);
      }
    expect(planned).toBeGreaterThan(crops.length);
  });
});
