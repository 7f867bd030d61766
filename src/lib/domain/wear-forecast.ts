/**
 * Wear forecast for one part: how fast it wears against the separator hours it has run, and when
 * it reaches the wear limit.
 *
 * The model: wear = a + b·h, where h is the part's separator hours in service (hours run on every
 * machine it was bolted in, since it was first installed) and wear is the depth measured under a
 * straight edge at inspections, in millimetres. `a` and `b` are the ordinary least-squares fit
 * over all the part's measurements since install:
 *
 *   b = Σ(h − h̄)(w − w̄) / Σ(h − h̄)²,   a = w̄ − b·h̄
 *
 * Hours left = (limit − (a + b·h_now)) / b, where h_now is the part's hours today. The limit is
 * the one the inspection's replace rule uses for a wear measurement (`WEAR_REPLACE_MM`).
 *
 * Rules a technician would check:
 * - the latest measurement already past the limit: "now" (replace before the next season);
 * - fewer than two measurements at different hours: no trend, no date;
 * - slope ≤ 0 (it does not wear, or the readings scatter): never a date (nor below MIN_WEAR_RATE);
 * - the line at today's hours already at or past the limit: "now".
 *
 * The date follows from the machine's usual separator hours per season, run evenly over the
 * season's calendar window (see `usualSeasonHours` and `dateAtHours`).
 *
 * Pure: no framework, no store, no clock (the caller passes "today").
 */
import { WEAR_REPLACE_MM } from './inspection/wear';

export { WEAR_REPLACE_MM };

/** One wear measurement: the part's hours in service when it was taken, and the depth in mm. */
export interface WearPoint {
  hours: number;
  wearMm: number;
}

/** The fitted line wear = a + b·hours (a in mm, b in mm per separator hour). */
export interface WearTrend {
  a: number;
  b: number;
  /** How many measurements the line was fitted over. */
  n: number;
}

/**
 * Ordinary least squares over the points. Null when there are fewer than two points or all were
 * taken at the same hours (no line can be drawn through them).
 */
export function fitWearTrend(points: readonly WearPoint[]): WearTrend | null {
  const n = points.length;
  if (n < 2) return null;
  const hMean = points.reduce((s, p) => s + p.hours, 0) / n;
  const wMean = points.reduce((s, p) => s + p.wearMm, 0) / n;
  let sxx = 0;
  let sxy = 0;
  for (const p of points) {
    sxx += (p.hours - hMean) ** 2;
    sxy += (p.hours - hMean) * (p.wearMm - wMean);
  }
  // Points closer together than a hundredth of an hour count as one.
  if (sxx < 1e-4) return null;
  const b = sxy / sxx;
  return { a: wMean - b * hMean, b, n };
}

/**
 * A slope below this (mm per separator hour: a millimetre in a million hours) is no wear at all;
 * it keeps rounding noise in the readings from turning into a date centuries away.
 */
export const MIN_WEAR_RATE = 1e-6;

export type ForecastStatus =
  /** Fewer than two measurements at different hours. */
  | 'no-trend'
  /** The line does not rise: the part does not wear measurably; never a date. */
  | 'no-wear'
  /** Already past the limit (measured), or the line is there at today's hours. */
  | 'now'
  /** Reaches the limit after `hoursLeft` more separator hours. */
  | 'ahead';

export interface WearForecast {
  status: ForecastStatus;
  trend: WearTrend | null;
  limitMm: number;
  /** The part's hours in service today (at least the hours of its latest measurement). */
  hoursNow: number;
  /** The line's wear at today's hours (null without a trend). */
  wearNowMm: number | null;
  /** The latest measurement (by hours), or null when none. */
  latest: WearPoint | null;
  /** Separator hours left to the limit: 0 when "now", null without a trend or without wear. */
  hoursLeft: number | null;
  /** The part's hours in service when the line reaches the limit (null unless "ahead" or "now" by trend). */
  limitAtHours: number | null;
}

/**
 * The forecast for one part. `hoursNow` is the part's hours in service today; `limitMm` the wear
 * limit (the inspection's replace rule by default). A measurement is "past the limit" when it is
 * deeper than the limit, as the replace rule says (`assessWear`).
 */
export function forecastWear(points: readonly WearPoint[], hoursNow: number, limitMm: number = WEAR_REPLACE_MM): WearForecast {
  const sorted = [...points].sort((p, q) => p.hours - q.hours);
  const latest = sorted.at(-1) ?? null;
  const now = Math.max(hoursNow, latest?.hours ?? 0);
  const trend = fitWearTrend(sorted);
  const wearNowMm = trend ? trend.a + trend.b * now : null;
  const base = { trend, limitMm, hoursNow: now, wearNowMm, latest };
  if (latest && latest.wearMm > limitMm)
    return { ...base, status: 'now', hoursLeft: 0, limitAtHours: trend && trend.b > 0 ? (limitMm - trend.a) / trend.b : null };
  if (!trend) return { ...base, status: 'no-trend', hoursLeft: null, limitAtHours: null };
  if (trend.b < MIN_WEAR_RATE) return { ...base, status: 'no-wear', hoursLeft: null, limitAtHours: null };
  const limitAtHours = (limitMm - trend.a) / trend.b;
  const hoursLeft = limitAtHours - now;
  if (hoursLeft <= 0) return { ...base, status: 'now', hoursLeft: 0, limitAtHours };
  return { ...base, status: 'ahead', hoursLeft, limitAtHours };
}

// ---------------------------------------------------------------------------------------------
// Seasons: when the hours are run

/**
 * The calendar window in which a machine runs its separator hours, month 1–12 and day. A window
 * whose end comes before its start runs over the new year (for example November to February).
 */
export interface SeasonWindow {
  startMonth: number;
  startDay: number;
  endMonth: number;
  endDay: number;
}

/** The demo's harvest win, 15 July to 31 October (an invented demo setting). */
export const DEMO_SEASON_WINDOW: SeasonWindow = { startMonth: 7, startDay: 15, endMonth: 10, endDay: 31 };

/**
 * Separator hours per season assumed for a machine whose readings do not cover enough of a
 * season to tell (an invented demo setting, not a figure from any source).
 */
export const DEFAULT_SEASON_HOURS = 250;

/** Readings must cover at least this share of one season's days before they say how much it runs. */
export const MIN_SEASON_SHARE = 0.5;

const DAY_MS = 86_400_000;
const utcDay = (y: number, m: number, d: number) => Date.UTC(y, m - 1, d);

/** Season `year`'s first day (00:00 UTC) and the day after its last (the window is whole days). */
export function seasonSpan(win: SeasonWindow, year: number): { start: number; end: number } {
  const start = utcDay(year, win.startMonth, win.startDay);
  const wraps = win.endMonth * 100 + win.endDay < win.startMonth * 100 + win.startDay;
  const end = utcDay(wraps ? year + 1 : year, win.endMonth, win.endDay) + DAY_MS;
  return { start, end };
}

/** Days in one season (the window's whole days; 15 Jul – 31 Oct is 109). */
export function seasonDays(win: SeasonWindow, year = 2025): number {
  const { start, end } = seasonSpan(win, year);
  return Math.round((end - start) / DAY_MS);
}

/** How many in-season days lie between two instants (fractions of days count). */
export function seasonDaysBetween(win: SeasonWindow, from: Date, to: Date): number {
  const a = from.getTime();
  const b = to.getTime();
  if (!(b > a)) return 0;
  let days = 0;
  for (let y = new Date(a).getUTCFullYear() - 1; y <= new Date(b).getUTCFullYear(); y++) {
    const { start, end } = seasonSpan(win, y);
    const lo = Math.max(a, start);
    const hi = Math.min(b, end);
    if (hi > lo) days += (hi - lo) / DAY_MS;
  }
  return days;
}

export interface HoursReadingAt {
  at: Date;
  separatorHours: number;
  /** A correction: the meter was read wrongly before, or replaced; the run up to it is not counted. */
  corrected?: boolean;
}

export interface SeasonHours {
  /** Separator hours the machine usually runs in one season. */
  hours: number;
  /** 'readings': derived from the machine's readings; 'default': too few readings to tell. */
  from: 'readings' | 'default';
  /** How many seasons' worth of days the readings covered. */
  seasonsCovered: number;
}

/**
 * The machine's usual separator hours per season, from its readings: the separator hours run
 * between the first and the last reading, divided by the in-season days between them, times the
 * days of one season (the hours per harvest day, over a whole harvest). Runs that end in a
 * correction are left out, and so are their days. When the readings cover less than half a
 * season's days, or show no hours run, `fallback` applies.
 */
export function usualSeasonHours(
  readings: readonly HoursReadingAt[],
  win: SeasonWindow = DEMO_SEASON_WINDOW,
  fallback = DEFAULT_SEASON_HOURS,
): SeasonHours {
  const sorted = [...readings].sort((p, q) => p.at.getTime() - q.at.getTime());
  let hours = 0;
  let days = 0;
  for (let i = 1; i < sorted.length; i++) {
    const prev = sorted[i - 1]!;
    const next = sorted[i]!;
    if (next.corrected) continue;
    hours += Math.max(0, next.separatorHours - prev.separatorHours);
    days += seasonDaysBetween(win, prev.at, next.at);
  }
  const perSeason = seasonDays(win);
  const covered = days / perSeason;
  if (covered < MIN_SEASON_SHARE || hours <= 0) return { hours: fallback, from: 'default', seasonsCovered: covered };
  return { hours: (hours / days) * perSeason, from: 'readings', seasonsCovered: covered };
}

/** Give up looking for the date after this many seasons. */
export const MAX_SEASONS_AHEAD = 50;

/**
 * The day `hoursLeft` more separator hours are reached, running `hoursPerSeason` evenly over each
 * season's days from `from` on (time outside the window adds no hours). Null when the machine
 * runs no hours, or the date lies more than MAX_SEASONS_AHEAD seasons away.
 */
export function dateAtHours(hoursLeft: number, hoursPerSeason: number, win: SeasonWindow, from: Date): Date | null {
  if (!(hoursPerSeason > 0) || !Number.isFinite(hoursLeft)) return null;
  const t0 = from.getTime();
  if (hoursLeft <= 0) return new Date(t0);
  const perDay = hoursPerSeason / seasonDays(win);
  let left = hoursLeft;
  const firstYear = new Date(t0).getUTCFullYear() - 1;
  for (let y = firstYear; y <= firstYear + MAX_SEASONS_AHEAD + 1; y++) {
    const { start, end } = seasonSpan(win, y);
    const lo = Math.max(t0, start);
    if (end <= lo) continue;
    const can = ((end - lo) / DAY_MS) * perDay;
    if (left <= can) return new Date(lo + (left / perDay) * DAY_MS);
    left -= can;
  }
  return null;
}

/** Whether a forecast reaches its limit within `hours` more separator hours ("now" always does). */
export function reachesWithin(f: WearForecast, hours: number): boolean {
  if (f.status === 'now') return true;
  return f.status === 'ahead' && f.hoursLeft !== null && f.hoursLeft <= hours;
}
