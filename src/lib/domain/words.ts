/**
 * Small helpers for words on the screen: a count with its noun in the right number, and a noun
 * with its indefinite article. Pure (the domain imports nothing but zod and itself).
 */

/** "1 photo", "2 photos", "0 photos"; irregular plurals are given: count(3, 'person', 'people'). */
export function countOf(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
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
