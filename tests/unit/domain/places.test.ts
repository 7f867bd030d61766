import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { allPlaces, parsePlaceKey, placeKey, placeSchema, settingPlaces, type Place } from '~/lib/domain';
import { modular, split } from './helpers';

describe('place keys', () => {
  it('read as documented', () => {
    expect(placeKey({ kind: 'element', position: 2, side: 'left' })).toBe('element:2:left');
    expect(placeKey({ kind: 'cover', section: 2, side: 'right' })).toBe('cover:2:right');
    expect(placeKey({ kind: 'bar', row: 1, position: 4 })).toBe('bar:1:4');
    expect(placeKey({ kind: 'setting', field: 'rotorRpm' })).toBe('setting:rotorRpm');
  });
  it('round-trip through parsePlaceKey', () => {
    const placeArb: fc.Arbitrary<Place> = fc.oneof(
      fc.record({
        kind: fc.constant('element' as const),
        position: fc.integer({ min: 1, max: 64 }),
        side: fc.constantFrom('left' as const, 'right' as const),
      }),
      fc.record({
        kind: fc.constant('cover' as const),
        section: fc.integer({ min: 1, max: 64 }),
        side: fc.constantFrom('left' as const, 'right' as const),
      }),
      fc.record({ kind: fc.constant('bar' as const), row: fc.integer({ min: 1, max: 64 }), position: fc.integer({ min: 1, max: 64 }) }),
      fc.constantFrom(...settingPlaces),
    );
    fc.assert(
      fc.property(placeArb, (p) => {
        expect(parsePlaceKey(placeKey(p))).toEqual(p);
      }),
    );
  });
  it('reject malformed keys', () => {
    for (const k of [
      '',
      'element',
      'element:2',
      'element:x:left',
      'element:2:up',
      'bar:1',
      'cover:0:left',
      'setting:speed',
      'element:2:left:extra',
      'element:-1:left',
      'element:1.5:left',
    ])
      expect(parsePlaceKey(k), k).toBeNull();
  });

  // parsePlaceKey checks without zod (the editor island does not load it); it must give the
  // schema's answer for any key, well formed or not.
  it('answer as placeSchema does, for any key', () => {
    const schemaAnswer = (key: string): Place | null => {
      const [kind, a, b, ...rest] = key.split(':');
      const int = (s: string | undefined) => (s !== undefined && /^\d+$/.test(s) ? Number(s) : NaN);
      const candidate =
        rest.length > 0
          ? null
          : kind === 'element'
            ? { kind, position: int(a), side: b }
            : kind === 'cover'
              ? { kind, section: int(a), side: b }
              : kind === 'bar'
                ? { kind, row: int(a), position: int(b) }
                : kind === 'setting' && b === undefined
                  ? { kind, field: a }
                  : null;
      if (candidate && kind !== 'setting' && b === undefined) return null;
      const parsed = placeSchema.safeParse(candidate);
      return parsed.success ? parsed.data : null;
    };
    const piece = fc.oneof(
      fc.constantFrom('element', 'cover', 'bar', 'setting', 'left', 'right', 'up', 'crop', 'rotorRpm', 'vaneSetting', 'speed', ''),
      fc.integer({ min: -2, max: 70 }).map(String),
      fc.constantFrom('0', '1', '64', '65', '007', '1.5', '1e1', ' 2', '２'),
      fc.string({ maxLength: 4 }),
    );
    fc.assert(
      fc.property(fc.array(piece, { minLength: 1, maxLength: 4 }), (pieces) => {
        const key = pieces.join(':');
        expect(parsePlaceKey(key), key).toEqual(schemaAnswer(key));
      }),
      { numRuns: 3000 },
    );
    for (const k of ['element:64:right', 'cover:1:left', 'bar:64:64', 'setting:vaneControl', 'element:007:left'])
      expect(parsePlaceKey(k), k).toEqual(schemaAnswer(k));
    expect(parsePlaceKey('element:007:left')).toEqual({ kind: 'element', position: 7, side: 'left' });
    expect(parsePlaceKey('bar:65:1')).toBeNull();
  });
});

describe('allPlaces: the drawing order', () => {
  it('walks cage top left, left half, right half, cage top right, then rotor rows — each band front to rear', () => {
    const keys = allPlaces(modular).map(placeKey);
    expect(keys.slice(0, 11)).toEqual([
      'cover:1:left',
      'cover:2:left',
      'cover:3:left',
      'element:1:left',
      'element:2:left',
      'element:3:left',
      'element:4:left',
      'element:1:right',
      'element:2:right',
      'element:3:right',
      'element:4:right',
    ]);
    expect(keys.slice(11, 14)).toEqual(['cover:1:right', 'cover:2:right', 'cover:3:right']);
    expect(keys.slice(14, 19)).toEqual(['bar:1:1', 'bar:1:2', 'bar:1:3', 'bar:1:4', 'bar:2:1']);
  });
  it('lists each place once, all valid', () => {
    for (const f of [modular, split]) {
      const places = allPlaces(f);
      expect(new Set(places.map(placeKey)).size).toBe(places.length);
      expect(places.length).toBe(f.cageTopSections.length * 2 + f.positions.length * 2 + f.rotorBarPlaces.length);
      for (const p of places) expect(() => placeSchema.parse(p)).not.toThrow();
    }
  });
});
