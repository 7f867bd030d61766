import { describe, expect, it } from 'vitest';
import { addDays, availabilityWords, purchaseAvailability, workStart, workStartWords } from '~/lib/domain/planner/availability';

// The rule checked here is the product's own (start today when all is at hand, else after the
// longest lead time); the lead times are invented test data. Calendar arithmetic: ISO 8601 days.
describe('purchase availability', () => {
  const stock = {
    A: { quantity: 4, leadDays: 7 },
    B: { quantity: 1, leadDays: 10 },
    C: { quantity: 0, leadDays: null },
  };

  it('is the dealer’s shelf only when it holds the whole quantity', () => {
    expect(
      purchaseAvailability(
        [
          { partNumber: 'A', quantity: 4 },
          { partNumber: 'B', quantity: 2 },
          { partNumber: 'C', quantity: 1 },
          { partNumber: 'D', quantity: 1 },
        ],
        stock,
      ),
    ).toEqual([
      { partNumber: 'A', source: 'dealer-shelf' },
      { partNumber: 'B', source: 'order', leadDays: 10 },
      { partNumber: 'C', source: 'order' },
      { partNumber: 'D', source: 'order' },
    ]);
  });

  it('does not read inherited keys as stock', () => {
    expect(purchaseAvailability([{ partNumber: 'toString', quantity: 1 }], {})).toEqual([{ partNumber: 'toString', source: 'order' }]);
  });
});

describe('work start', () => {
  it('is today when everything is at hand', () => {
    expect(workStart([{ partNumber: 'A', source: 'dealer-shelf' }], '2026-03-02')).toEqual({
      date: '2026-03-02',
      waitDays: 0,
      unknownLead: [],
    });
    expect(workStart([], '2026-03-02').date).toBe('2026-03-02');
  });

  it('is today plus the longest lead time, across month and year ends', () => {
    const a = [
      { partNumber: 'A', source: 'order', leadDays: 3 },
      { partNumber: 'B', source: 'order', leadDays: 14 },
      { partNumber: 'C', source: 'dealer-shelf' },
    ] as const;
    expect(workStart(a, '2026-12-25')).toEqual({ date: '2027-01-08', waitDays: 14, unknownLead: [] });
    // 2028 is a leap year (Gregorian rule): 28 Feb + 1 day is 29 Feb.
    expect(addDays('2028-02-28', 1)).toBe('2028-02-29');
    expect(addDays('2027-02-28', 1)).toBe('2027-03-01');
  });

  it('has no date while an order has no lead time', () => {
    expect(workStart([{ partNumber: 'X', source: 'order' }], '2026-03-02')).toEqual({ date: null, waitDays: 0, unknownLead: ['X'] });
  });

  it('says so in words, with the date through the date formatter', () => {
    expect(availabilityWords({ partNumber: 'A', source: 'dealer-shelf' })).toBe('on the dealer’s shelf');
    expect(availabilityWords({ partNumber: 'A', source: 'order', leadDays: 5 })).toBe('to order, about 5 days');
    expect(availabilityWords({ partNumber: 'A', source: 'order', leadDays: 1 })).toBe('to order, about 1 day');
    expect(workStartWords({ date: '2026-03-02', waitDays: 0, unknownLead: [] }, 'en-GB')).toBe('Today, 2 Mar 2026: every part is at hand');
    expect(workStartWords({ date: '2026-03-09', waitDays: 7, unknownLead: [] }, 'en-US')).toBe(
      'From about Mar 9, 2026, when the last order arrives (about 7 days)',
    );
    expect(workStartWords({ date: null, waitDays: 0, unknownLead: ['X'] })).toMatch(/no lead time is given for X/);
  });
});
