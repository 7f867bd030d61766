/**
 * Words for hours, part history and wear forecasts on the pages (numbers and dates through the
 * one formatter each, places through the vocabulary).
 */
import { formatDate, formatNumber } from '~/lib/domain/format';
import { parsePlaceKey } from '~/lib/domain/places';
import { placeLabel } from '~/lib/domain/vocabulary';
import type { ForecastStatus } from '~/lib/domain/wear-forecast';

/** "1,234 h", "66.7 h": a tenth of an hour where there is one below 1,000 h, whole hours above. */
export function hoursText(h: number | null | undefined, locale?: string): string {
  if (h === null || h === undefined || !Number.isFinite(h)) return '—';
  const tenths = Math.round(h * 10) / 10;
  return `${formatNumber(h, { digits: Math.abs(h) < 1000 && !Number.isInteger(tenths) ? 1 : 0, locale })} h`;
}

/** "Position 3, right" for a stored place key. */
export function placeKeyLabel(key: string): string {
  const place = parsePlaceKey(key);
  return place ? placeLabel(place) : key;
}

export const ORIGIN_WORDS: Record<'start' | 'new' | 'shelf' | 'moved', string> = {
  start: 'in the machine when its history began',
  new: 'new part',
  shelf: 'from the farm’s shelf',
  moved: 'moved from another place',
};

export const REMOVED_WORDS: Record<'shelf' | 'moved', string> = {
  shelf: 'to the farm’s shelf',
  moved: 'moved to another place',
};

export const SOURCE_WORDS: Record<'inspection' | 'job_card' | 'loss_check' | 'manual', string> = {
  inspection: 'inspection',
  job_card: 'job card',
  loss_check: 'loss check',
  manual: 'by hand',
};

/** The forecast in a line: "about 120 h left · around 3 Sept 2027", "at the limit now", … */
export function forecastText(
  f: { status: ForecastStatus; hoursLeft: number | null },
  limitDate: Date | string | null,
  locale?: string,
): string {
  switch (f.status) {
    case 'no-trend':
      return 'no trend yet (fewer than two measurements)';
    case 'no-wear':
      return 'not wearing measurably: no date';
    case 'now':
      return 'at the wear limit now: replace before the next season';
    case 'ahead':
      return `about ${hoursText(f.hoursLeft, locale)} left${limitDate ? ` · around ${formatDate(limitDate, { locale, timeZone: 'UTC' })}` : ''}`;
  }
}
