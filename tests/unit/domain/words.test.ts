import { describe, expect, it } from 'vitest';
import { countOf, listWords, plural, withArticle } from '~/lib/domain/words';
import { aKernelOf, cropAdjective, cropNoun, cropSays, kernelsOf } from '~/lib/domain/vocabulary';
import { cropIds } from '~/lib/domain/crops';

// English usage: the article follows the first sound; common practice, no published source.
describe('words', () => {
  it('counts with the noun in the right number', () => {
    expect(countOf(1, 'photo')).toBe('1 photo');
    expect(countOf(0, 'photo')).toBe('0 photos');
    expect(countOf(2, 'photo')).toBe('2 photos');
    expect(countOf(2, 'person', 'people')).toBe('2 people');
  });
  it('puts the right indefinite article', () => {
    expect(withArticle('inspection')).toBe('an inspection');
    expect(withArticle('plan')).toBe('a plan');
    expect(withArticle('layout')).toBe('a layout');
    expect(withArticle('element')).toBe('an element');
    expect(withArticle('hour')).toBe('an hour');
    expect(withArticle('unit')).toBe('a unit');
    expect(withArticle('open request')).toBe('an open request');
  });
});

import { inRpmWindow, rpmWindowWhole, rpmWindowWords, type RpmWindow } from '~/lib/domain/speed';
import { planSummaryWords, type PlanOk } from '~/lib/domain/planner';

describe('one rpm window everywhere', () => {
  // A window whose ends fall between whole rpm (invented numbers for the check).
  const w = { minRpm: 533.4, maxRpm: 721.6, ranges: [{ lo: 533, hi: 722 }] } as unknown as RpmWindow;
  it('shows the whole-rpm window that inRpmWindow judges by', () => {
    expect(rpmWindowWhole(w)).toEqual({ lo: 533, hi: 722 });
    expect(rpmWindowWords(w)).toBe('533–722 rpm');
    expect(inRpmWindow(533, w)).toBe(true);
    expect(inRpmWindow(532, w)).toBe(false);
    expect(inRpmWindow(722, w)).toBe(true);
    expect(inRpmWindow(723, w)).toBe(false);
  });
});

describe('plan headline', () => {
  const plan = (purchases: number, lifts: number, settings: number, seconds = 0, massKg = 0, rotorAccess = false) =>
    ({
      counts: { purchases, moves: lifts, effort: { lifts, seconds, massKg, rotorAccess } },
      settings: Array.from({ length: settings }, () => ({})),
      units: 'metric',
    }) as unknown as PlanOk;
  it('says "nothing to change" only when nothing changes, and the effort in time and mass lifted', () => {
    expect(planSummaryWords(plan(0, 0, 0))).toBe('Nothing to buy, nothing to change.');
    expect(planSummaryWords(plan(0, 0, 2))).toBe('Nothing to buy, no part to take off, move or fit, 2 settings to change.');
    expect(planSummaryWords(plan(1, 3, 1, 2460, 131.5))).toBe('1 part to buy, about 41 min of work, 131.5 kg lifted, 1 setting to change.');
    // Above an hour the time is rounded to 5 minutes.
    expect(planSummaryWords(plan(2, 12, 0, 3 * 3600 + 22 * 60, 412, true))).toBe(
      '2 parts to buy, about 3 h 20 min of work, 412.0 kg lifted (rotor access included).',
    );
  });
  it("takes the number from the language's plural rules (Intl.PluralRules), fractions included", () => {
    // English: only exactly 1 takes the singular (Unicode CLDR plural rules, "en").
    expect(countOf(1.5, 'kernel')).toBe('1.5 kernels');
    expect(countOf(0.5, 'kernel')).toBe('0.5 kernels');
    expect(plural(1, 'it', 'them')).toBe('it');
    expect(plural(3, 'it arrives', 'they arrive')).toBe('they arrive');
  });
  it('parts a list whose items hold commas by semicolons', () => {
    expect(listWords(['position 1, left', 'position 2, left', 'position 3, right'])).toBe(
      'position 1, left; position 2, left and position 3, right',
    );
    expect(listWords([1, 2, 3])).toBe('1, 2 and 3');
  });
  it('says crops as nouns, with their kernels and the verb that agrees', () => {
    expect(aKernelOf('soybeans')).toBe('a soybean kernel');
    expect(aKernelOf('oats')).toBe('an oat kernel');
    expect(cropSays('edible-beans', 'wants', 'want')).toBe('Edible beans want');
    expect(cropSays('wheat', 'wants', 'want')).toBe('Wheat wants');
    expect(kernelsOf('field-peas')).toBe('peas');
    expect(kernelsOf('corn', 1)).toBe('corn kernel');
    expect(cropAdjective('soybeans')).toBe('soybean');
    for (const id of cropIds) {
      expect(cropNoun(id)).toBe(cropNoun(id).toLowerCase());
      expect(aKernelOf(id)).toMatch(/^an? /);
    }
  });
});
