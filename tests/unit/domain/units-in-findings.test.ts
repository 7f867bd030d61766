/**
 * The rules write lengths in millimetres and masses in kilograms; a reader who chose inches sees
 * them in inches and pounds. Conversion factors: 1 in = 25.4 mm and 1 lb = 0.45359237 kg exactly
 * (international yard and pound agreement, 1959; NIST Handbook 44, Appendix C).
 */
import { describe, expect, it } from 'vitest';
import { checkLayout } from '~/lib/domain/rules';
import { demoCatalog, demoFamilies } from '~/lib/domain/demo-catalog';
import { starterLayout } from '~/lib/domain/starter';
import { findingInUnits, textInUnits } from '~/lib/domain/units';

describe('findings in the reader’s units', () => {
  it('turns millimetres, ranges and kilograms into inches and pounds (1 in = 25.4 mm, 1 lb = 0.45359237 kg)', () => {
    expect(textInUnits('a 5 mm opening, 0.7 mm short', 'imperial')).toBe('a 0.20 in opening, 0.03 in short');
    expect(textInUnits('a window of 10–20 mm', 'imperial')).toBe('a window of 0.39–0.79 in');
    expect(textInUnits('at r = 381 mm', 'imperial')).toBe('at r = 15.0 in');
    expect(textInUnits('6.8 kg apart; a 480 kg rotor', 'imperial')).toBe('15.0 lb apart; a 1058.2 lb rotor');
  });

  it('leaves metric text, rates, compound units and other numbers alone', () => {
    const text = 'a 5 mm opening, 62.77 kg/ha per bu/ac, 752 rpm, 30 m/s, 95 N·m';
    expect(textInUnits(text, 'metric')).toBe(text);
    expect(textInUnits('62.77 kg/ha, 752 rpm, 30 m/s, 95 N·m, 12 mm²', 'imperial')).toBe('62.77 kg/ha, 752 rpm, 30 m/s, 95 N·m, 12 mm²');
  });

  it('leaves no millimetre or kilogram in any finding of a mismatched demo layout for an imperial reader', () => {
    let seen = 0;
    for (const family of demoFamilies) {
      // A corn cage set up for wheat at an impossible clearance raises findings of every kind.
      const layout = { ...starterLayout(family, 'corn', demoCatalog), crop: 'wheat' as const, clearanceMm: 0.5 };
      for (const f of checkLayout(family, demoCatalog, layout)) {
        const shown = findingInUnits(f, 'imperial');
        for (const text of [shown.title, shown.explanation, shown.fix]) expect(text).not.toMatch(/\d\s?(mm|kg)\b(?![/·])/);
        if (/\bmm\b/.test(f.explanation + f.fix + f.title)) seen++;
      }
    }
    expect(seen).toBeGreaterThan(0);
  });
});
