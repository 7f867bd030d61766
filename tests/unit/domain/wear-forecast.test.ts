import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  DEFAULT_SEASON_HOURS,
  DEMO_SEASON_WINDOW,
  WEAR_REPLACE_MM,
  dateAtHours,
  fitWearTrend,
  forecastWear,
  reachesWithin,
  seasonDays,
  seasonDaysBetween,
  usualSeasonHours,
  type SeasonWindow,
  type WearPoint,
} from '~/lib/domain/wear-forecast';

const day = (iso: string) => new Date(`${iso}T00:00:00Z`);

describe('least-squares wear trend', () => {
  it('fits an exact line through points on it', () => {
    // hand-computed: (0,1) (100,2) (200,3) lie on w = 1 + 0.01·h
    const t = fitWearTrend([
      { hours: 0, wearMm: 1 },
      { hours: 100, wearMm: 2 },
      { hours: 200, wearMm: 3 },
    ])!;
    expect(t.b).toBeCloseTo(0.01, 12);
    expect(t.a).toBeCloseTo(1, 12);
    expect(t.n).toBe(3);
  });

  it('fits scattered points by least squares', () => {
    // hand-computed: h̄ = 200, w̄ = 3; Σ(h−h̄)(w−w̄) = (−100)(−1) + (100)(0) + (0)(1) = 100;
    // Σ(h−h̄)² = 20 000; b = 0.005 mm/h; a = 3 − 0.005·200 = 2 mm
    const t = fitWearTrend([
      { hours: 100, wearMm: 2 },
      { hours: 300, wearMm: 3 },
      { hours: 200, wearMm: 4 },
    ])!;
    expect(t.b).toBeCloseTo(0.005, 12);
    expect(t.a).toBeCloseTo(2, 12);
  });

  it('draws no line through fewer than two points, or through points at the same hours', () => {
    expect(fitWearTrend([])).toBeNull();
    expect(fitWearTrend([{ hours: 50, wearMm: 2 }])).toBeNull();
    expect(
      fitWearTrend([
        { hours: 50, wearMm: 2 },
        { hours: 50, wearMm: 3 },
      ]),
    ).toBeNull();
  });
});

describe('wear forecast', () => {
  it('uses the replace rule of the inspection as its limit', () => {
    // the inspection replaces a bar worn past about 6 mm: common practice, no published source
    expect(WEAR_REPLACE_MM).toBe(6);
    expect(forecastWear([], 0).limitMm).toBe(6);
  });

  it('gives the hours left to the limit along the fitted line', () => {
    // hand-computed: w = 1 + 0.01·h; at 200 h the line reads 3 mm; (6 − 3) / 0.01 = 300 h left; limit at 500 h
    const f = forecastWear(
      [
        { hours: 0, wearMm: 1 },
        { hours: 100, wearMm: 2 },
        { hours: 200, wearMm: 3 },
      ],
      200,
    );
    expect(f.status).toBe('ahead');
    expect(f.wearNowMm).toBeCloseTo(3, 9);
    expect(f.hoursLeft).toBeCloseTo(300, 9);
    expect(f.limitAtHours).toBeCloseTo(500, 9);
  });

  it('counts from today’s hours, not from the last measurement', () => {
    // hand-computed: w = 2 + 0.005·h; at 400 h the line reads 4 mm; (6 − 4) / 0.005 = 400 h left
    const f = forecastWear(
      [
        { hours: 100, wearMm: 2 },
        { hours: 300, wearMm: 3 },
        { hours: 200, wearMm: 4 },
      ],
      400,
    );
    expect(f.hoursLeft).toBeCloseTo(400, 9);
    expect(f.hoursNow).toBe(400);
  });

  it('says no trend with fewer than two measurements', () => {
    expect(forecastWear([{ hours: 10, wearMm: 2 }], 100)).toMatchObject({ status: 'no-trend', hoursLeft: null, trend: null });
    expect(forecastWear([], 100).status).toBe('no-trend');
  });

  it('never gives a date when the line does not rise', () => {
    // hand-computed: equal wear → b = 0; falling wear → b < 0
    expect(
      forecastWear(
        [
          { hours: 0, wearMm: 2 },
          { hours: 100, wearMm: 2 },
        ],
        300,
      ),
    ).toMatchObject({ status: 'no-wear', hoursLeft: null });
    expect(
      forecastWear(
        [
          { hours: 0, wearMm: 3 },
          { hours: 100, wearMm: 2 },
        ],
        300,
      ).status,
    ).toBe('no-wear');
  });

  it('says "now" when the latest measurement is past the limit, trend or not', () => {
    expect(forecastWear([{ hours: 10, wearMm: 6.5 }], 10)).toMatchObject({ status: 'now', hoursLeft: 0 });
    // past the limit even where the readings scatter downwards
    expect(
      forecastWear(
        [
          { hours: 0, wearMm: 7 },
          { hours: 100, wearMm: 6.2 },
        ],
        100,
      ).status,
    ).toBe('now');
  });

  it('says "now" when the line is at the limit at today’s hours although the last measurement was not', () => {
    // hand-computed: w = 1 + 0.02·h; at 300 h the line reads 7 mm > 6 mm
    const f = forecastWear(
      [
        { hours: 0, wearMm: 1 },
        { hours: 100, wearMm: 3 },
      ],
      300,
    );
    expect(f).toMatchObject({ status: 'now', hoursLeft: 0 });
    expect(f.limitAtHours).toBeCloseTo(250, 9);
  });

  it('a depth equal to the limit is not past it (replace is deeper than the limit), but the line is there', () => {
    // hand-computed: w = 4 + 0.02·h reads 6 mm at 100 h: 0 h left
    const f = forecastWear(
      [
        { hours: 0, wearMm: 4 },
        { hours: 100, wearMm: 6 },
      ],
      100,
    );
    expect(f.status).toBe('now');
    expect(f.hoursLeft).toBe(0);
  });

  it('reachesWithin: "now" always, "ahead" when the hours left fit, never without wear', () => {
    const ahead = forecastWear(
      [
        { hours: 0, wearMm: 1 },
        { hours: 100, wearMm: 2 },
      ],
      100,
    ); // 400 h left (hand-computed: (6 − 2) / 0.01)
    expect(reachesWithin(ahead, 400)).toBe(true);
    expect(reachesWithin(ahead, 399)).toBe(false);
    expect(reachesWithin(forecastWear([{ hours: 0, wearMm: 7 }], 0), 0)).toBe(true);
    expect(reachesWithin(forecastWear([{ hours: 0, wearMm: 2 }], 0), 1e9)).toBe(false);
  });
});

describe('seasons', () => {
  it('counts the days of the demo window', () => {
    // hand-computed: 15–31 July 17 + August 31 + September 30 + October 31 = 109 days
    expect(seasonDays(DEMO_SEASON_WINDOW)).toBe(109);
    // a window over the new year: November 30 + December 31 + January 31 + February 28 = 120 (2026–27)
    expect(seasonDays({ startMonth: 11, startDay: 1, endMonth: 2, endDay: 28 }, 2026)).toBe(120);
  });

  it('counts only in-season days between two instants', () => {
    // hand-computed: 1 Jan 2026 to 1 Jan 2027 holds one whole season
    expect(seasonDaysBetween(DEMO_SEASON_WINDOW, day('2026-01-01'), day('2027-01-01'))).toBeCloseTo(109, 9);
    // 1 Aug to 11 Aug: ten days, all in season
    expect(seasonDaysBetween(DEMO_SEASON_WINDOW, day('2026-08-01'), day('2026-08-11'))).toBeCloseTo(10, 9);
    expect(seasonDaysBetween(DEMO_SEASON_WINDOW, day('2026-11-05'), day('2027-03-01'))).toBe(0);
  });

  it('derives the usual hours per season from the readings', () => {
    // hand-computed: 218 h run over one whole season (109 days) → 218 h per season; the winter adds nothing
    const s = usualSeasonHours([
      { at: day('2025-07-15'), separatorHours: 1000 },
      { at: day('2025-11-01'), separatorHours: 1218 },
      { at: day('2026-07-15'), separatorHours: 1218 },
    ]);
    expect(s.from).toBe('readings');
    expect(s.hours).toBeCloseTo(218, 9);
    expect(s.seasonsCovered).toBeCloseTo(1, 9);
  });

  it('scales a part season up to a whole one', () => {
    // hand-computed: 1 Aug → 1 Oct is 61 in-season days with 122 h run: 2 h a day × 109 days = 218 h
    const s = usualSeasonHours([
      { at: day('2026-08-01'), separatorHours: 500 },
      { at: day('2026-10-01'), separatorHours: 622 },
    ]);
    expect(s.hours).toBeCloseTo(218, 9);
  });

  it('falls back to the default when the readings cover too little of a season, and leaves corrections out', () => {
    const short = usualSeasonHours([
      { at: day('2026-08-01'), separatorHours: 500 },
      { at: day('2026-08-11'), separatorHours: 530 },
    ]);
    expect(short).toMatchObject({ from: 'default', hours: DEFAULT_SEASON_HOURS });
    // the run ending in a correction (a meter replaced) counts neither its hours nor its days
    const corrected = usualSeasonHours([
      { at: day('2025-07-15'), separatorHours: 1000 },
      { at: day('2025-11-01'), separatorHours: 1218 },
      { at: day('2026-07-20'), separatorHours: 10, corrected: true },
      { at: day('2026-09-20'), separatorHours: 132 },
    ]);
    // hand-computed: 218 h in 109 days, then 122 h in 62 days (20 Jul → 20 Sep): 340 h / 171 days × 109
    expect(corrected.hours).toBeCloseTo((340 / 171) * 109, 9);
  });

  it('finds the date the hours are reached, running evenly over the season', () => {
    // hand-computed: 109 h a season is 1 h per season day; 50 h from 15 July 2026 → 3 September 2026
    expect(dateAtHours(50, 109, DEMO_SEASON_WINDOW, day('2026-01-01'))).toEqual(day('2026-09-03'));
    // from inside the season: 10 h from 1 August → 11 August
    expect(dateAtHours(10, 109, DEMO_SEASON_WINDOW, day('2026-08-01'))).toEqual(day('2026-08-11'));
    // over two seasons: 109 h in 2026, 41 h more from 15 July 2027 → 25 August 2027
    expect(dateAtHours(150, 109, DEMO_SEASON_WINDOW, day('2026-01-01'))).toEqual(day('2027-08-25'));
    // after the season ended this year: the next one
    expect(dateAtHours(10, 109, DEMO_SEASON_WINDOW, day('2026-12-02'))).toEqual(day('2027-07-25'));
  });

  it('gives no date for a machine that runs no hours, and "today" for no hours left', () => {
    expect(dateAtHours(10, 0, DEMO_SEASON_WINDOW, day('2026-01-01'))).toBeNull();
    expect(dateAtHours(0, 100, DEMO_SEASON_WINDOW, day('2026-01-01'))).toEqual(day('2026-01-01'));
    expect(dateAtHours(1e9, 100, DEMO_SEASON_WINDOW, day('2026-01-01'))).toBeNull();
  });

  it('handles a window over the new year', () => {
    const w: SeasonWindow = { startMonth: 11, startDay: 1, endMonth: 2, endDay: 28 };
    // hand-computed: 120 h over 120 days is 1 h a day; 70 h from 1 Nov 2026 → 10 January 2027
    expect(dateAtHours(70, 120, w, day('2026-10-01'))).toEqual(day('2027-01-10'));
  });
});

// ---------------------------------------------------------------------------------------------
// Properties

const point = fc.record({
  hours: fc.integer({ min: 0, max: 3000 }),
  wearMm: fc.double({ min: 0, max: 5.9, noNaN: true }),
});

describe('forecast properties', () => {
  it('a part that does not wear never gets a date', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: 3000 }), { minLength: 0, maxLength: 12 }),
        fc.double({ min: 0, max: 6, noNaN: true }),
        fc.double({ min: 0, max: 0.01, noNaN: true }),
        fc.integer({ min: 0, max: 2000 }),
        (hours, start, drop, extra) => {
          // wear that stays level or falls as the hours rise, never past the limit
          const sorted = [...hours].sort((a, b) => a - b);
          const points: WearPoint[] = sorted.map((h) => ({ hours: h, wearMm: Math.max(0, start - drop * h) }));
          const now = (sorted.at(-1) ?? 0) + extra;
          const f = forecastWear(points, now);
          expect(f.status === 'ahead' || f.status === 'now').toBe(false);
          expect(f.hoursLeft).toBeNull();
          if (f.hoursLeft !== null) expect(dateAtHours(f.hoursLeft, 200, DEMO_SEASON_WINDOW, new Date(0))).toBeNull();
        },
      ),
    );
  });

  const leftOf = (p: readonly WearPoint[], now: number) => {
    const f = forecastWear(p, now);
    return f.status === 'now' ? 0 : f.status === 'ahead' ? f.hoursLeft! : f.status === 'no-wear' ? Infinity : null;
  };

  it('more wear never gives more hours left (the same extra depth on every measurement)', () => {
    fc.assert(
      fc.property(fc.array(point, { minLength: 2, maxLength: 10 }), fc.double({ min: 0, max: 3, noNaN: true }), (points, more) => {
        const now = Math.max(...points.map((p) => p.hours));
        const before = leftOf(points, now);
        const after = leftOf(
          points.map((p) => ({ ...p, wearMm: p.wearMm + more })),
          now,
        );
        if (before === null || after === null) return;
        expect(after).toBeLessThanOrEqual(before + 1e-6 * Math.max(1, Math.abs(before)));
      }),
    );
  });

  it('more wear never gives more hours left (a deeper latest measurement)', () => {
    fc.assert(
      fc.property(fc.array(point, { minLength: 2, maxLength: 10 }), fc.double({ min: 0, max: 3, noNaN: true }), (points, more) => {
        const sorted = [...points].sort((p, q) => p.hours - q.hours);
        const now = sorted.at(-1)!.hours;
        const deeper = sorted.map((p, i) => (i === sorted.length - 1 ? { ...p, wearMm: p.wearMm + more } : p));
        const before = leftOf(sorted, now);
        const after = leftOf(deeper, now);
        if (before === null || after === null) return;
        expect(after).toBeLessThanOrEqual(before + 1e-6 * Math.max(1, Math.abs(before)));
      }),
    );
  });
});
