import { describe, expect, it } from 'vitest';
import { cropPrograms, sourceInWords } from '~/lib/domain/crops';

/**
 * Words of the crop programs that reach the screen (advice, names, notes) never carry the data's
 * internal source marker; only `source` fields do, and they are shown through sourceInWords.
 */
function screenStrings(value: unknown, path: string, out: { path: string; text: string }[]) {
  if (typeof value === 'string') out.push({ path, text: value });
  else if (Array.isArray(value)) value.forEach((v, i) => screenStrings(v, `${path}.${i}`, out));
  else if (value && typeof value === 'object')
    for (const [k, v] of Object.entries(value)) {
      if (k === 'source' || k === 'sources') continue;
      screenStrings(v, `${path}.${k}`, out);
    }
  return out;
}

describe('crop program words', () => {
  it('no advice, name or note carries an internal source marker', () => {
    const found = screenStrings(cropPrograms, 'crops', []).filter((s) => /\[[a-z]+\]/i.test(s.text));
    expect(found).toEqual([]);
  });

  it('a source marker is said in words', () => {
    expect(sourceInWords('[mem] small grains ≈ 25–35 m/s')).toBe('rule of thumb, no published source: small grains ≈ 25–35 m/s');
    expect(sourceInWords('[mem]')).toBe('rule of thumb, no published source');
  });
});
