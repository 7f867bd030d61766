import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkHoursReading, hoursReadingSchema } from '~/lib/domain/machine-hours';

// An hour meter only counts up; a lower reading is a mistake unless it corrects the record
// (a meter replaced, a figure mistyped). Common practice, no published source. The separator
// turns only while the engine runs, so its meter cannot read more than the engine's.
describe('machine hours', () => {
  const last = { engineHours: 1200, separatorHours: 850 };

  it('accepts the first reading and readings that go up or stay', () => {
    expect(checkHoursReading(null, { engineHours: 10, separatorHours: 4 })).toEqual([]);
    expect(checkHoursReading(last, { engineHours: 1200, separatorHours: 850 })).toEqual([]);
    expect(checkHoursReading(last, { engineHours: 1260.5, separatorHours: 890 })).toEqual([]);
  });

  it('refuses a lower reading, naming each meter that went down', () => {
    const problems = checkHoursReading(last, { engineHours: 1199, separatorHours: 800 });
    expect(problems.map((p) => p.field)).toEqual(['engineHours', 'separatorHours']);
    expect(problems[0]!.message).toContain('lower than the last reading (1200)');
    expect(checkHoursReading(last, { engineHours: 1250, separatorHours: 849.9 }).map((p) => p.field)).toEqual(['separatorHours']);
  });

  it('keeps a lower reading when it carries a correction reason', () => {
    expect(checkHoursReading(last, { engineHours: 12, separatorHours: 8, correctionReason: 'meter replaced at 1200 h' })).toEqual([]);
  });

  it('refuses separator hours above engine hours, reason or not', () => {
    expect(checkHoursReading(null, { engineHours: 100, separatorHours: 101 }).map((p) => p.field)).toEqual(['separatorHours']);
    expect(
      checkHoursReading(last, { engineHours: 100, separatorHours: 101, correctionReason: 'meter replaced' }).map((p) => p.field),
    ).toEqual(['separatorHours']);
  });

  it('the schema refuses negative, non-finite and too-short reasons', () => {
    expect(hoursReadingSchema.safeParse({ engineHours: -1, separatorHours: 0 }).success).toBe(false);
    expect(hoursReadingSchema.safeParse({ engineHours: Infinity, separatorHours: 0 }).success).toBe(false);
    expect(hoursReadingSchema.safeParse({ engineHours: 5, separatorHours: 1, correctionReason: ' x ' }).success).toBe(false);
  });

  it('property: any reading at or above the last one on both meters (separator ≤ engine) is accepted', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 5000, noNaN: true }),
        fc.double({ min: 0, max: 5000, noNaN: true }),
        fc.double({ min: 0, max: 5000, noNaN: true }),
        (sep, extraEngine, up) => {
          const prev = { engineHours: sep + extraEngine, separatorHours: sep };
          const next = { engineHours: prev.engineHours + up + up, separatorHours: prev.separatorHours + up };
          return checkHoursReading(prev, next).length === 0;
        },
      ),
    );
  });
});
