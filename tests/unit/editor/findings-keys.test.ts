import { describe, expect, it } from 'vitest';
import { findingKeys } from '~/components/editor/FindingsList';
import { demoCatalog, tamarackM4 } from '~/lib/domain/demo-catalog';
import { starterLayout } from '~/lib/domain/starter';
import { checkLayout } from '~/lib/domain/rules';
import type { Finding, Layout } from '~/lib/domain/schemas';

describe('findings list keys', () => {
  it('keep each finding’s key when an edit adds a finding above it', () => {
    const base = starterLayout(tamarackM4, 'wheat', demoCatalog);
    const before = checkLayout(tamarackM4, demoCatalog, base);
    const layout: Layout = {
      ...base,
      elements: base.elements.map((e) => (e.position === 3 && e.side === 'right' ? { ...e, partNumber: 'CW-WW-L-04' } : e)),
    };
    const after = checkLayout(tamarackM4, demoCatalog, layout);
    expect(after.length).toBeGreaterThan(before.length);
    const keysBefore = new Map(findingKeys(before).map((k, i) => [k, before[i]!.code]));
    const keysAfter = findingKeys(after);
    // Every finding that was there keeps its key; the new one has a key of its own.
    for (const [k, code] of keysBefore) expect(keysAfter, `${code} keeps ${k}`).toContain(k);
    expect(new Set(keysAfter).size).toBe(keysAfter.length);
    expect(keysAfter.some((k) => k.startsWith('FIT_HAND_MISMATCH@element:3:right'))).toBe(true);
  });

  it('tell two findings with the same code and places apart', () => {
    const f: Finding = {
      code: 'X',
      severity: 'advice',
      title: 't',
      explanation: 'e',
      fix: 'f',
      places: [{ kind: 'element', position: 1, side: 'left' }],
    } as unknown as Finding;
    expect(findingKeys([f, f])).toEqual(['X@element:1:left', 'X@element:1:left#1']);
  });
});
