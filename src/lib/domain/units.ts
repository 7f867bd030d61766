/**
 * Units as types. A plain `number` says nothing about what it measures; these branded numbers
 * keep millimetres apart from inches and rpm apart from metres per second at compile time, at
 * no cost at run time. Make one with its named constructor (`mm(762)`), never with a cast.
 *
 * Conversion factors are exact by definition (NIST Handbook 44, Appendix C): 1 in = 25.4 mm,
 * 1 lb = 0.45359237 kg, 1 ft = 0.3048 m, hence 1 ft/min = 0.00508 m/s and
 * 1 acre = 43,560 ft² = 4,046.8564224 m².
 */
import { formatNumber } from './format';

declare const unitBrand: unique symbol;
/** A number tagged with the unit it is measured in. */
export type Branded<U extends string> = number & { readonly [unitBrand]: U };

export type Mm = Branded<'mm'>;
export type Inch = Branded<'in'>;
export type Rpm = Branded<'rpm'>;
export type MetresPerSecond = Branded<'m/s'>;
export type FeetPerMinute = Branded<'ft/min'>;
export type Kg = Branded<'kg'>;
export type Lb = Branded<'lb'>;
export type KgPerHa = Branded<'kg/ha'>;
export type BuPerAc = Branded<'bu/ac'>;

export const mm = (n: number): Mm => n as Mm;
export const inch = (n: number): Inch => n as Inch;
export const rpm = (n: number): Rpm => n as Rpm;
export const metresPerSecond = (n: number): MetresPerSecond => n as MetresPerSecond;
export const feetPerMinute = (n: number): FeetPerMinute => n as FeetPerMinute;
export const kg = (n: number): Kg => n as Kg;
export const lb = (n: number): Lb => n as Lb;
export const kgPerHa = (n: number): KgPerHa => n as KgPerHa;
export const buPerAc = (n: number): BuPerAc => n as BuPerAc;

export type UnitSystem = 'metric' | 'imperial';

// Exact definitions.
export const MM_PER_INCH = 25.4;
export const KG_PER_LB = 0.45359237;
export const M_PER_FT = 0.3048;
export const MS_PER_FPM = M_PER_FT / 60; // 0.00508
export const FT2_PER_ACRE = 43_560;
export const M2_PER_ACRE = FT2_PER_ACRE * M_PER_FT * M_PER_FT; // 4046.8564224
export const M2_PER_HA = 10_000;
export const FT2_PER_M2 = 1 / (M_PER_FT * M_PER_FT); // 10.7639…
/** kg/ha for 1 bu/ac of a 1 lb bushel: 0.45359237 kg / 0.40468564224 ha = 1.12085116… */
export const KGHA_PER_LB_BUAC = KG_PER_LB / (M2_PER_ACRE / M2_PER_HA);

export const inchToMm = (x: Inch): Mm => mm(x * MM_PER_INCH);
export const mmToInch = (x: Mm): Inch => inch(x / MM_PER_INCH);
export const fpmToMs = (x: FeetPerMinute): MetresPerSecond => metresPerSecond(x * MS_PER_FPM);
export const msToFpm = (x: MetresPerSecond): FeetPerMinute => feetPerMinute(x / MS_PER_FPM);
export const lbToKg = (x: Lb): Kg => kg(x * KG_PER_LB);
export const kgToLb = (x: Kg): Lb => lb(x / KG_PER_LB);
export const haToAcres = (ha: number): number => (ha * M2_PER_HA) / M2_PER_ACRE;
export const acresToHa = (ac: number): number => (ac * M2_PER_ACRE) / M2_PER_HA;
export const perFt2ToPerM2 = (perFt2: number): number => perFt2 * FT2_PER_M2;
export const perM2ToPerFt2 = (perM2: number): number => perM2 / FT2_PER_M2;

/** Yield or loss: bushels per acre to kilograms per hectare, for a bushel of `lbPerBu` pounds. */
export const buPerAcToKgPerHa = (x: BuPerAc, lbPerBu: number): KgPerHa => kgPerHa(x * lbPerBu * KGHA_PER_LB_BUAC);
/** Kilograms per hectare to bushels per acre, for a bushel of `lbPerBu` pounds. */
export const kgPerHaToBuPerAc = (x: KgPerHa, lbPerBu: number): BuPerAc => buPerAc(x / (lbPerBu * KGHA_PER_LB_BUAC));

/** Bushels in a metric tonne for a bushel of `lbPerBu` pounds (the Canadian way of quoting). */
export const bushelsPerTonne = (lbPerBu: number): number => 1000 / (lbPerBu * KG_PER_LB);
/** Pounds per bushel from bushels per tonne. */
export const lbPerBuFromBushelsPerTonne = (buPerT: number): number => 1000 / buPerT / KG_PER_LB;

/** A measurement's number: the one number formatter, fixed decimals, no "-0", no grouping. */
function fixed(n: number, digits: number): string {
  return formatNumber(n, { digits, grouping: false });
}

/**
 * A length for people: millimetres with one decimal below 100 mm (whole mm above), or inches
 * with two decimals (one above 10 in). `digits` overrides the decimals.
 */
export function formatLength(value: Mm, system: UnitSystem, digits?: number): string {
  if (system === 'imperial') {
    const inches = value / MM_PER_INCH;
    return `${fixed(inches, digits ?? (Math.abs(inches) >= 10 ? 1 : 2))} in`;
  }
  return `${fixed(value, digits ?? (Math.abs(value) >= 100 ? 0 : 1))} mm`;
}

/** A speed for people: m/s with one decimal, or whole ft/min. */
export function formatSpeed(value: MetresPerSecond, system: UnitSystem): string {
  if (system === 'imperial') return `${fixed(value / MS_PER_FPM, 0)} ft/min`;
  return `${fixed(value, 1)} m/s`;
}

/** A mass for people: kg or lb with one decimal. */
export function formatMass(value: Kg, system: UnitSystem): string {
  if (system === 'imperial') return `${fixed(value / KG_PER_LB, 1)} lb`;
  return `${fixed(value, 1)} kg`;
}

/** A yield or loss rate for people: kg/ha (whole) or bu/ac (one decimal). */
export function formatRate(value: KgPerHa, system: UnitSystem, lbPerBu: number): string {
  if (system === 'imperial') return `${fixed(kgPerHaToBuPerAc(value, lbPerBu), 1)} bu/ac`;
  return `${fixed(value, 0)} kg/ha`;
}

// A number as the rules write it: plain or grouped with commas, with an optional decimal part.
const NUM = String.raw`(\d{1,3}(?:,\d{3})+|\d+)(?:\.(\d+))?`;
const LENGTH_WORDS = new RegExp(String.raw`(?<![\w.])${NUM}(?:(\s?[–-]\s?)${NUM})?\s?mm\b(?![/²³])`, 'g');
const MASS_WORDS = new RegExp(String.raw`(?<![\w.])${NUM}\s?kg\b(?![/·])`, 'g');
const numberOf = (whole: string, decimals: string | undefined) => Number(whole.replace(/,/g, '') + (decimals ? `.${decimals}` : ''));

/**
 * Text the rules wrote in millimetres and kilograms (findings, advice) in the reader's units:
 * "a 5 mm opening", "10–20 mm", "6.8 kg apart" become inches and pounds for an imperial reader;
 * metric text is returned as it is. Rates (kg/ha) and compound units are left alone.
 */
export function textInUnits(text: string, system: UnitSystem): string {
  if (system === 'metric') return text;
  return text
    .replace(
      LENGTH_WORDS,
      (_all, w1: string, d1: string | undefined, dash: string | undefined, w2: string | undefined, d2: string | undefined) => {
        const a = numberOf(w1, d1);
        if (dash === undefined || w2 === undefined) return formatLength(mm(a), system);
        const b = numberOf(w2, d2);
        const digits = Math.max(a, b) / MM_PER_INCH >= 10 ? 1 : 2;
        return `${fixed(a / MM_PER_INCH, digits)}–${formatLength(mm(b), system, digits)}`;
      },
    )
    .replace(MASS_WORDS, (_all, w: string, d: string | undefined) => formatMass(kg(numberOf(w, d)), system));
}

/** A finding with its words in the reader's units (see `textInUnits`). */
export function findingInUnits<F extends { title: string; explanation: string; fix: string }>(finding: F, system: UnitSystem): F {
  if (system === 'metric') return finding;
  return {
    ...finding,
    title: textInUnits(finding.title, system),
    explanation: textInUnits(finding.explanation, system),
    fix: textInUnits(finding.fix, system),
  };
}
