import { describe, expect, it } from 'vitest';
import { hoursInService, installChanges, partPlaces, type OpenPart } from '~/lib/domain/part-history';

const open = (id: string, placeKey: string, partNumber: string): OpenPart => ({ id, placeKey, partNumber });

describe('part places of a layout', () => {
  it('keys elements, cover plates and rotor bars by place', () => {
    const places = partPlaces({
      elements: [{ position: 1, side: 'left', partNumber: 'A-L' }],
      coverPlates: [{ section: 2, side: 'right', partNumber: 'C-R' }],
      rotorBars: [{ row: 1, position: 3, partNumber: 'B' }],
    } as never);
    expect([...places]).toEqual([
      ['element:1:left', 'A-L'],
      ['cover:2:right', 'C-R'],
      ['bar:1:3', 'B'],
    ]);
  });
});

describe('what an install changes', () => {
  it('keeps a place whose part number stays', () => {
    const c = installChanges([open('r1', 'element:1:left', 'A')], new Map([['element:1:left', 'A']]));
    expect(c).toEqual({ close: [], open: [] });
  });

  it('a swap between two places is two moves, not two new parts', () => {
    const c = installChanges(
      [open('r1', 'element:1:left', 'A'), open('r3', 'element:3:left', 'B')],
      new Map([
        ['element:1:left', 'B'],
        ['element:3:left', 'A'],
      ]),
    );
    expect(c.close).toEqual([
      { record: open('r1', 'element:1:left', 'A'), movedTo: 'element:3:left' },
      { record: open('r3', 'element:3:left', 'B'), movedTo: 'element:1:left' },
    ]);
    expect(c.open).toEqual([
      { placeKey: 'element:1:left', partNumber: 'B', movedFrom: open('r3', 'element:3:left', 'B') },
      { placeKey: 'element:3:left', partNumber: 'A', movedFrom: open('r1', 'element:1:left', 'A') },
    ]);
  });

  it('a part taken out with nothing taking it goes to the shelf; a new part number comes from elsewhere', () => {
    const c = installChanges([open('r2', 'element:2:right', 'F')], new Map([['element:2:right', 'W']]));
    expect(c.close).toEqual([{ record: open('r2', 'element:2:right', 'F'), movedTo: null }]);
    expect(c.open).toEqual([{ placeKey: 'element:2:right', partNumber: 'W', movedFrom: null }]);
  });

  it('an emptied place closes its record; a newly filled place opens one', () => {
    const c = installChanges([open('r9', 'cover:2:right', 'P')], new Map([['element:4:left', 'Q']]));
    expect(c.close.map((x) => x.movedTo)).toEqual([null]);
    expect(c.open).toEqual([{ placeKey: 'element:4:left', partNumber: 'Q', movedFrom: null }]);
  });

  it('one part leaving can move to only one place', () => {
    const c = installChanges(
      [open('r1', 'bar:1:1', 'S')],
      new Map([
        ['bar:1:1', 'R'],
        ['bar:1:2', 'S'],
        ['bar:1:3', 'S'],
      ]),
    );
    expect(c.open.filter((o) => o.movedFrom).map((o) => o.placeKey)).toEqual(['bar:1:2']);
    expect(c.open.filter((o) => !o.movedFrom).map((o) => o.placeKey)).toEqual(['bar:1:1', 'bar:1:3']);
  });
});

describe('hours in service', () => {
  it('adds the machine’s hours between install and removal to what the part carried (hand-computed)', () => {
    // 80 carried + (170 − 130) = 120
    expect(hoursInService({ carriedHours: 80, installedSeparatorHours: 130, removedSeparatorHours: 170 }, null)).toBe(120);
    // still in: up to today's reading, 80 + (200 − 130) = 150
    expect(hoursInService({ carriedHours: 80, installedSeparatorHours: 130, removedSeparatorHours: null }, 200)).toBe(150);
    // install hours unknown: counted from the first known reading, 0 + (200 − 160) = 40
    expect(hoursInService({ carriedHours: 0, installedSeparatorHours: null, removedSeparatorHours: null }, 200, 160)).toBe(40);
    // nothing known: only what it carried
    expect(hoursInService({ carriedHours: 12, installedSeparatorHours: null, removedSeparatorHours: null }, null)).toBe(12);
  });
});
