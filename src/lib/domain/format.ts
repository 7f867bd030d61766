/**
 * One formatter each for numbers, money and dates, all through Intl, so every screen, sheet,
 * e-mail and CSV says the same thing the same way. Lengths, masses and speeds in the person's
 * unit system are in `units.ts` (they call `formatNumber`).
 *
 * Money is whole cents of an ISO 4217 currency (the dealer's, see `currency` on the dealer's
 * organisation); the currency is always shown, as the locale writes it ("$1,185.00", "€1,185.00",
 * "CA$1,185.00").
 */
/** The locale used when the person's own is not known (and on the server for e-mails and CSV). */
export const DEFAULT_LOCALE = 'en-GB';
/** The currency of the shared catalog's list prices, and of a dealer that has not chosen one. */
export const DEFAULT_CURRENCY = 'USD';

const knownCurrencies: ReadonlySet<string> = new Set(
  typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('currency') : [],
);

/** Whether `code` is an ISO 4217 currency code this runtime knows (three capital letters). */
export function isCurrencyCode(code: string): boolean {
  return /^[A-Z]{3}$/.test(code) && (knownCurrencies.size === 0 || knownCurrencies.has(code));
}

/** A locale this runtime supports, else the default: never throws on what a browser sends. */
export function safeLocale(locale: string | null | undefined): string {
  if (!locale) return DEFAULT_LOCALE;
  try {
    return Intl.NumberFormat.supportedLocalesOf([locale])[0] ?? DEFAULT_LOCALE;
  } catch {
    return DEFAULT_LOCALE;
  }
}

/** The first supported language of an Accept-Language header ("de-CH,de;q=0.9" → "de-CH"). */
export function localeFromAcceptLanguage(header: string | null | undefined): string {
  if (!header) return DEFAULT_LOCALE;
  const tags = header
    .split(',')
    .map((part) => {
      const [tag = '', ...params] = part.trim().split(';');
      const q = params.map((p) => /^\s*q=([0-9.]+)\s*$/.exec(p)?.[1]).find(Boolean);
      return { tag: tag.trim(), q: q === undefined ? 1 : Number(q) };
    })
    .filter((t) => t.tag && t.tag !== '*' && t.tag.length <= 35 && Number.isFinite(t.q) && t.q > 0)
    .sort((a, b) => b.q - a.q);
  for (const t of tags) {
    const found = safeLocale(t.tag);
    if (found !== DEFAULT_LOCALE || t.tag.toLowerCase().startsWith('en')) return found;
  }
  return DEFAULT_LOCALE;
}

const cache = new Map<string, Intl.NumberFormat | Intl.DateTimeFormat>();
function numberFormat(locale: string, options: Intl.NumberFormatOptions): Intl.NumberFormat {
  const key = `n|${locale}|${JSON.stringify(options)}`;
  let f = cache.get(key) as Intl.NumberFormat | undefined;
  if (!f) cache.set(key, (f = new Intl.NumberFormat(safeLocale(locale), options)));
  return f;
}
function dateFormat(locale: string, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const key = `d|${locale}|${JSON.stringify(options)}`;
  let f = cache.get(key) as Intl.DateTimeFormat | undefined;
  if (!f) cache.set(key, (f = new Intl.DateTimeFormat(safeLocale(locale), options)));
  return f;
}

export interface NumberOptions {
  /** Exactly this many decimals (default 0). */
  digits?: number;
  /** Thousands separators (default true). Measurements beside a unit leave them out. */
  grouping?: boolean;
  locale?: string;
}

/** A number for people: fixed decimals, no "-0". */
export function formatNumber(n: number, { digits = 0, grouping = true, locale = DEFAULT_LOCALE }: NumberOptions = {}): string {
  const rounded = Number(n.toFixed(digits));
  const value = Object.is(rounded, -0) || rounded === 0 ? 0 : n;
  return numberFormat(locale, { minimumFractionDigits: digits, maximumFractionDigits: digits, useGrouping: grouping }).format(value);
}

/** Whole cents of `currency` with the currency shown: formatMoney(118500, 'EUR') → "€1,185.00". */
export function formatMoney(cents: number, currency: string = DEFAULT_CURRENCY, locale: string = DEFAULT_LOCALE): string {
  const code = isCurrencyCode(currency) ? currency : DEFAULT_CURRENCY;
  return numberFormat(locale, { style: 'currency', currency: code, currencyDisplay: 'symbol' }).format(cents / 100);
}

/** Money as a plain amount for files (CSV): "1185.00", the currency in its own column. */
export function moneyAmount(cents: number): string {
  return (cents / 100).toFixed(2);
}

export interface DateOptions {
  locale?: string;
  /** IANA zone; the server's own when left out. Dates that mean a calendar day pass 'UTC'. */
  timeZone?: string;
  /** 'long' spells the month ("2 March 2026"), 'short' abbreviates it (default). */
  month?: 'long' | 'short';
  /** Leave the year out (lists of recent things). */
  year?: boolean;
}

const asDate = (d: Date | string | number) => (d instanceof Date ? d : new Date(d));

/** A calendar date for people, in the locale's own order: "2 Mar 2026", "Mar 2, 2026", "2. März 2026". */
export function formatDate(
  d: Date | string | number,
  { locale = DEFAULT_LOCALE, timeZone, month = 'short', year = true }: DateOptions = {},
): string {
  const date = asDate(d);
  if (Number.isNaN(date.getTime())) return '—';
  return dateFormat(locale, { day: 'numeric', month, ...(year ? { year: 'numeric' } : {}), ...(timeZone ? { timeZone } : {}) }).format(
    date,
  );
}

/** A date with the time of day: "2 Mar 2026, 14:05". `seconds` adds the seconds. */
export function formatDateTime(
  d: Date | string | number,
  { locale = DEFAULT_LOCALE, timeZone, month = 'short', year = true, seconds = false }: DateOptions & { seconds?: boolean } = {},
): string {
  const date = asDate(d);
  if (Number.isNaN(date.getTime())) return '—';
  return dateFormat(locale, {
    day: 'numeric',
    month,
    ...(year ? { year: 'numeric' } : {}),
    hour: '2-digit',
    minute: '2-digit',
    ...(seconds ? { second: '2-digit' } : {}),
    ...(timeZone ? { timeZone } : {}),
  }).format(date);
}

/** A calendar day as ISO 8601 (YYYY-MM-DD) in the given zone (default UTC): for file names and inputs. */
export function isoDay(d: Date | string | number, timeZone = 'UTC'): string {
  const date = asDate(d);
  return dateFormat('en-CA', { year: 'numeric', month: '2-digit', day: '2-digit', timeZone }).format(date);
}
