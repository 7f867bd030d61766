import { describe, expect, it } from 'vitest';
import { catalogPartSchema, demoCatalog, demoFamilies, layoutSchema, machineFamilySchema, machineFamilyBaseSchema } from '~/lib/domain';
import { start } from './helpers';

const paths = (r: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }) =>
  r.error?.issues.map((i) => i.path.join('.')) ?? [];

describe('layout schema', () => {
  it('accepts the starter layouts and keeps them as they are', () => {
    const l = start('wheat');
    expect(layoutSchema.parse(l)).toEqual(l);
    expect(layoutSchema.parse(JSON.parse(JSON.stringify(l)))).toEqual(l);
  });
  it('names the field of an absurd rotor speed', () => {
    expect(paths(layoutSchema.safeParse({ ...start('wheat'), rotorRpm: 20000 }))).toEqual(['rotorRpm']);
    expect(paths(layoutSchema.safeParse({ ...start('wheat'), rotorRpm: 850.5 }))).toEqual(['rotorRpm']);
    expect(paths(layoutSchema.safeParse({ ...start('wheat'), rotorRpm: 99 }))).toEqual(['rotorRpm']);
  });
  it('names the field of a clearance out of bounds', () => {
    expect(paths(layoutSchema.safeParse({ ...start('wheat'), clearanceMm: 0.2 }))).toEqual(['clearanceMm']);
    expect(paths(layoutSchema.safeParse({ ...start('wheat'), clearanceMm: 120 }))).toEqual(['clearanceMm']);
  });
  it('names missing and wrongly typed fields', () => {
    const { crop: _crop, ...noCrop } = start('wheat');
    expect(paths(layoutSchema.safeParse(noCrop))).toEqual(['crop']);
    expect(paths(layoutSchema.safeParse({ ...start('wheat'), crop: 'quinoa' }))).toEqual(['crop']);
    const l = start('wheat');
    const bad = { ...l, elements: [{ ...l.elements[0]!, side: 'middle' }, ...l.elements.slice(1)] };
    expect(paths(layoutSchema.safeParse(bad))).toEqual(['elements.0.side']);
    expect(paths(layoutSchema.safeParse({ ...l, format: 'other/1' }))).toEqual(['format']);
  });
  it('rejects two parts in one place, naming the second', () => {
    const l = start('wheat');
    expect(paths(layoutSchema.safeParse({ ...l, elements: [...l.elements, l.elements[0]!] }))).toEqual([`elements.${l.elements.length}`]);
  });
  it('rejects a malformed part number', () => {
    expect(paths(layoutSchema.safeParse({ ...start('wheat'), rotorBars: [{ row: 1, position: 1, partNumber: 'cw fw' }] }))).toEqual([
      'rotorBars.0.partNumber',
    ]);
  });
});

describe('family and catalog schemas', () => {
  it('accept the demo data', () => {
    for (const f of demoFamilies) expect(() => machineFamilySchema.parse(f)).not.toThrow();
    for (const p of demoCatalog) expect(() => catalogPartSchema.parse(p)).not.toThrow();
  });
  it('insist positions count from 1 and the rear position is the last', () => {
    const f = demoFamilies[0]!;
    expect(paths(machineFamilySchema.safeParse({ ...f, rearPosition: 3 }))).toEqual(['rearPosition']);
    const swapped = { ...f, positions: [f.positions[1]!, f.positions[0]!, ...f.positions.slice(2)] };
    expect(paths(machineFamilySchema.safeParse(swapped))).toContain('positions.0.index');
  });
  it('insist threshing positions come before separating ones', () => {
    const f = demoFamilies[0]!;
    const positions = f.positions.map((p) => ({ ...p, zone: p.index === 1 ? ('separating' as const) : p.zone }));
    expect(paths(machineFamilySchema.safeParse({ ...f, positions }))).toEqual(['positions.1.zone']);
  });
  it('reject rotor bar places on rows the rotor does not have', () => {
    const f = demoFamilies[0]!;
    const r = machineFamilySchema.safeParse({ ...f, rotorBarPlaces: [...f.rotorBarPlaces, { row: 9, position: 1, inLine: false }] });
    expect(paths(r)).toEqual([`rotorBarPlaces.${f.rotorBarPlaces.length}.row`]);
  });
  it('the base schema supports pick() for forms', () => {
    expect(machineFamilyBaseSchema.pick({ id: true, name: true }).parse({ id: 'a-b', name: 'A' })).toEqual({ id: 'a-b', name: 'A' });
  });
});
