import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { findUnstorable, isStorableText, storableString } from '~/lib/domain/text';

// PostgreSQL documentation, "Character Types": the character with code zero cannot be stored in text.
// RFC 8259 §8.2: JSON escapes may encode an unpaired surrogate, which is no Unicode character.
describe('text the store can keep', () => {
  it('accepts ordinary text, accents, emoji (a proper surrogate pair) and other control characters', () => {
    for (const s of ['', 'Larkspur Farms', 'Ödön’s rotor', '🌾 wheat', 'tab\there', 'line\nbreak']) expect(isStorableText(s), s).toBe(true);
  });

  it('refuses NUL and lone surrogates wherever they sit', () => {
    for (const s of ['\u0000', 'a\u0000b', 'end\u0000', '\ud800', 'x\ud83cy', '\udc00x', 'x\udfff', '🌾\ud800', '\ude00🌾'])
      expect(isStorableText(s), JSON.stringify(s)).toBe(false);
  });

  it('agrees with String.prototype.isWellFormed plus a NUL check on any string', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary' }), (s) => {
        const wellFormed = (s as string & { isWellFormed(): boolean }).isWellFormed();
        expect(isStorableText(s)).toBe(wellFormed && !s.includes('\u0000'));
      }),
      { numRuns: 500 },
    );
  });

  it('names the first bad value or key by its path', () => {
    expect(findUnstorable({ a: 'fine', b: [1, 'ok', { c: 'x\u0000' }] })).toBe('b.2.c');
    expect(findUnstorable({ lines: [{ partNumber: 'A' }, { partNumber: '\ud800' }] })).toBe('lines.1.partNumber');
    expect(findUnstorable({ measurements: { 'k\u0000ey': 1 } })).toBe('measurements.k\\0ey');
    expect(findUnstorable('\u0000')).toBe('body');
    expect(findUnstorable({ q: 'a\u0000' }, ['query'])).toBe('query.q');
    expect(findUnstorable({ a: 'fine', n: 1, t: true, z: null, list: [['deep', ['deeper']]] })).toBeNull();
  });

  it('walks deep nesting without overflowing the stack', () => {
    let v: unknown = 'bad\u0000';
    for (let i = 0; i < 500_000; i++) v = [v]; // what a 1 MB body of brackets can hold
    const started = performance.now();
    expect(findUnstorable(v)).toMatch(/^0(\.0)*$/);
    expect(performance.now() - started).toBeLessThan(2000);
  });

  it('storableString refuses them in a zod schema with a message', () => {
    const s = storableString().trim().max(10);
    expect(s.safeParse(' ok ').data).toBe('ok');
    const bad = s.safeParse('a\u0000');
    expect(bad.success).toBe(false);
    expect(bad.error!.issues[0]!.message).toMatch(/cannot be stored/);
  });
});
