import { describe, expect, it } from 'vitest';
import { verdict } from '../../../bench/verdict.mjs';

describe('bench verdicts', () => {
  it('a figure over its budget is over, whatever the script said', () => {
    expect(verdict({ value: 48, budget: '≤ 33 ms', ok: true })).toBe('over');
    expect(verdict({ value: 0.38 * 100, budget: '≥ 50 %', ok: true })).toBe('over');
    expect(verdict({ value: 2, budget: '0', ok: true })).toBe('over');
    expect(verdict({ value: '161.2', budget: '≤ 160 KB', ok: true })).toBe('over');
  });

  it('a figure within budget is yes, unless the script reported a failure (errors, missing page)', () => {
    expect(verdict({ value: 33, budget: '≤ 33 ms', ok: true })).toBe('yes');
    expect(verdict({ value: 60, budget: '≥ 50 %', ok: true })).toBe('yes');
    expect(verdict({ value: 0, budget: '0', ok: true })).toBe('yes');
    expect(verdict({ value: 12, budget: '≤ 25 ms', ok: false })).toBe('NO');
    expect(verdict({ value: 'page missing', budget: '≤ 160 KB', ok: false })).toBe('NO');
  });

  it('reference figures are not judged', () => {
    expect(verdict({ value: 1234, budget: '(reference)', ok: true })).toBe('—');
    expect(verdict({ value: 1234, budget: '', ok: true })).toBe('—');
  });
});
