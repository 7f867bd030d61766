import { describe, expect, it } from 'vitest';
import {
  DEFAULT_CURRENCY,
  currencyCodeSchema,
  formatDate,
  formatDateTime,
  formatLength,
  formatMoney,
  formatNumber,
  isCurrencyCode,
  isoDay,
  localeFromAcceptLanguage,
  moneyAmount,
  mm,
} from '~/lib/domain';
import { planCropChange } from '~/lib/domain/planner';
import { catalog, modular } from './helpers';
import { demoCatalog } from '~/lib/domain/demo-catalog';
import { starterLayout } from '~/lib/domain/starter';

// Intl output is the CLDR data shipped with Node (full ICU); the separators and symbols checked
// here are those of CLDR for each locale.
const nb = (s: string) => s.replace(/[\u00a0\u202f]/g, ' ');

describe('money: whole cents of an ISO 4217 currency, the currency always shown', () => {
  it('shows the currency the way the locale writes it', () => {
    expect(formatMoney(524000, 'CAD', 'en-GB')).toBe('CA$5,240.00');
    expect(formatMoney(524000, 'EUR', 'en-GB')).toBe('€5,240.00');
    expect(formatMoney(524000, 'USD', 'en-US')).toBe('$5,240.00');
    expect(nb(formatMoney(524000, 'EUR', 'de-DE'))).toBe('5.240,00 €');
    expect(formatMoney(5, 'USD', 'en-US')).toBe('$0.05');
  });
  it('never shows a bare number, even for an unknown currency (falls back to the catalog currency)', () => {
    expect(DEFAULT_CURRENCY).toBe('USD');
    expect(formatMoney(100, 'XYZ!', 'en-US')).toBe('$1.00');
    expect(formatMoney(100, undefined, 'en-US')).toBe('$1.00');
  });
  it('files carry the plain amount (the currency goes in its own column)', () => {
    expect(moneyAmount(118500)).toBe('1185.00');
    expect(moneyAmount(7)).toBe('0.07');
  });
  it('accepts ISO 4217 codes only, upper-casing what was typed', () => {
    expect(isCurrencyCode('EUR')).toBe(true);
    expect(isCurrencyCode('eur')).toBe(false);
    expect(isCurrencyCode('EURO')).toBe(false);
    expect(isCurrencyCode('$')).toBe(false);
    expect(isCurrencyCode('QQQ')).toBe(false);
    expect(currencyCodeSchema.parse(' cad ')).toBe('CAD');
    expect(currencyCodeSchema.safeParse('dollars').success).toBe(false);
  });
});

describe('numbers', () => {
  it('fixed decimals, grouping on request, no negative zero', () => {
    expect(formatNumber(1234.5, { digits: 2 })).toBe('1,234.50');
    expect(formatNumber(1234.5, { digits: 1, grouping: false })).toBe('1234.5');
    expect(formatNumber(-0.01, { digits: 1 })).toBe('0.0');
    expect(nb(formatNumber(1234.5, { digits: 2, locale: 'de-DE' }))).toBe('1.234,50');
  });
  it('lengths go through it and keep their unit (1 in = 25.4 mm exactly, NIST Handbook 44, Appendix C)', () => {
    expect(formatLength(mm(25), 'imperial')).toBe('0.98 in');
    expect(formatLength(mm(254), 'imperial')).toBe('10.0 in');
    expect(formatLength(mm(25), 'metric')).toBe('25.0 mm');
    expect(formatLength(mm(-0.01), 'metric')).toBe('0.0 mm');
  });
});

describe('dates through Intl, in the reader’s locale', () => {
  const d = new Date('2026-03-02T14:05:09Z');
  it('puts day, month and year in the locale’s order', () => {
    expect(formatDate(d, { locale: 'en-GB', timeZone: 'UTC' })).toBe('2 Mar 2026');
    expect(formatDate(d, { locale: 'en-US', timeZone: 'UTC' })).toBe('Mar 2, 2026');
    expect(formatDate(d, { locale: 'de-DE', timeZone: 'UTC', month: 'long' })).toBe('2. März 2026');
    expect(formatDate(d, { locale: 'en-GB', timeZone: 'UTC', year: false })).toBe('2 Mar');
  });
  it('adds the time of day, seconds on request', () => {
    expect(nb(formatDateTime(d, { locale: 'en-GB', timeZone: 'UTC' }))).toBe('2 Mar 2026, 14:05');
    expect(nb(formatDateTime(d, { locale: 'en-GB', timeZone: 'UTC', seconds: true }))).toBe('2 Mar 2026, 14:05:09');
    expect(nb(formatDateTime(d, { locale: 'en-US', timeZone: 'UTC' }))).toBe('Mar 2, 2026, 02:05 PM');
  });
  it('says "—" for a date that is not one, and gives ISO days for files', () => {
    expect(formatDate('not a date')).toBe('—');
    expect(isoDay(d)).toBe('2026-03-02');
    expect(isoDay(new Date('2026-03-02T23:30:00Z'), 'Asia/Tokyo')).toBe('2026-03-03');
  });
  it('takes the locale from Accept-Language, never throwing on what a client sends', () => {
    expect(localeFromAcceptLanguage('de-CH,de;q=0.9,en;q=0.8')).toBe('de-CH');
    expect(localeFromAcceptLanguage('en-US,en;q=0.9')).toBe('en-US');
    expect(localeFromAcceptLanguage('fr;q=0.2, en-CA;q=0.8')).toBe('en-CA');
    expect(localeFromAcceptLanguage(null)).toBe('en-GB');
    expect(localeFromAcceptLanguage('*')).toBe('en-GB');
    expect(localeFromAcceptLanguage('\u0000<script>;q=abc, ,,;;')).toBe('en-GB');
    expect(localeFromAcceptLanguage('x'.repeat(500))).toBe('en-GB');
  });
});

describe('the planner speaks the reader’s units (issue: "25 mm" to a user who chose inches)', () => {
  it('gives the clearance change in inches for imperial readers and in millimetres otherwise', () => {
    const family = modular;
    const installed = starterLayout(family, 'wheat', demoCatalog);
    const corn = starterLayout(family, 'corn', demoCatalog);
    expect(installed.clearanceMm).not.toBe(corn.clearanceMm);
    const words = (units: 'metric' | 'imperial') => {
      const plan = planCropChange({ family, catalog, installed, shelf: {}, crop: 'corn', units });
      if (!plan.ok) throw new Error('no plan');
      return plan.settings.find((s) => s.field === 'clearanceMm')!.text;
    };
    // 1 in = 25.4 mm exactly (NIST Handbook 44, Appendix C).
    const inches = (v: number) => formatLength(mm(v), 'imperial');
    expect(words('imperial')).toBe(`Set the concave clearance to ${inches(corn.clearanceMm)} (now ${inches(installed.clearanceMm)}).`);
    expect(words('imperial')).not.toMatch(/\bmm\b/);
    expect(words('metric')).toContain(formatLength(mm(corn.clearanceMm), 'metric'));
  });
});
