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
