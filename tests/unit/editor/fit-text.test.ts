import { describe, expect, it } from 'vitest';
import { fitLabel, textWidth } from '~/components/cage/fit-text';

describe('labels that fit their slot', () => {
  it('takes the first wording that fits, else cuts the last one short', () => {
    expect(textWidth('abcd', 10)).toBeCloseTo(24);
    expect(fitLabel(['Straight · in line · Blocks fit', 'Straight · Blocks fit', 'Straight'], 120, 10)).toBe('Straight');
    expect(fitLabel(['Rasp · Blocks fit', 'Rasp'], 120, 10)).toBe('Rasp · Blocks fit');
    const cut = fitLabel(['A very long description of a part'], 60, 10);
    expect(cut.endsWith('…')).toBe(true);
    expect(textWidth(cut, 10)).toBeLessThanOrEqual(60);
    expect(fitLabel(['x'], 3, 10)).toBe('');
    expect(fitLabel(['', 'Rasp'], 100, 10)).toBe('Rasp');
  });
});
