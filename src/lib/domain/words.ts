/**
 * Small helpers for words on the screen: a count with its noun in the right number, a noun with
 * its indefinite article, a list joined as people say it. Pure (the domain imports nothing but
 * zod and itself). Places and parts are named in `vocabulary.ts`.
 */

const PLURAL = new Intl.PluralRules('en-GB');

/** Whether English takes the singular noun for `n` ("1 kernel", "0 kernels", "1.5 kernels"). */
export const isSingular = (n: number): boolean => PLURAL.select(n) === 'one';

/** The noun in the number `n` asks for: plural(1, 'kernel') = 'kernel'; irregular plurals are given. */
export function plural(n: number, one: string, many = `${one}s`): string {
  return isSingular(n) ? one : many;
}

/** "1 photo", "2 photos", "0 photos"; irregular plurals are given: count(3, 'person', 'people'). */
export function countOf(n: number, one: string, many = `${one}s`): string {
  return `${n} ${plural(n, one, many)}`;
}

/** Words heard with "an" although spelt with a consonant, and the reverse. */
const AN_BY_SOUND = /^(hour|honest|honou?r|heir)/i;
const A_BY_SOUND = /^(uni|use|usu|uti|eu|one|once|ewe)/i;

/** "a machine", "an inspection", "an hour", "a unit": the article by the first sound. */
export function withArticle(noun: string): string {
  const w = noun.trim();
  const an = AN_BY_SOUND.test(w) || (/^[aeiou]/i.test(w) && !A_BY_SOUND.test(w)) || /^[0-9]*8/.test(w);
  return `${an ? 'an' : 'a'} ${w}`;
}

/** "1, 2 and 3". */
export function listWords(items: readonly (string | number)[]): string {
  if (items.length <= 1) return items.join('');
  // Items that hold commas themselves ("position 3, right") are parted by semicolons.
  const sep = items.some((i) => String(i).includes(',')) ? '; ' : ', ';
  return `${items.slice(0, -1).join(sep)} and ${items[items.length - 1]}`;
}

export function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** 2.345 → "2.35 mm": a length in millimetres to two places at most. */
export const fmtMm = (n: number): string => `${(Math.round(n * 100) / 100).toString()} mm`;
