import { describe, expect, it } from 'vitest';
import { placeFromSlotId, slotCoordinateGetter, slotId, slotsFor, stepPlace } from '../../../src/components/editor/keyboard';
import { demoCatalog, sedgeS6, tamarackM4 } from '../../../src/lib/domain/demo-catalog';
import { allPlaces, placeKey } from '../../../src/lib/domain/places';
import type { CatalogPart, Place } from '../../../src/lib/domain/schemas';

const part = (pn: string) => demoCatalog.find((p) => p.partNumber === pn)!;
const keys = (ps: (Place | null)[]) => ps.map((p) => (p ? placeKey(p) : null));

describe('stepping between slots in the drawing’s order', () => {
  const all = allPlaces(tamarackM4);
  const elements = slotsFor(tamarackM4, part('CW-WW-L-04'));

  it('a part only visits the slots that take its kind', () => {
    expect(keys(elements)).toEqual([
      'element:1:left', 'element:2:left', 'element:3:left', 'element:4:left',
      'element:1:right', 'element:2:right', 'element:3:right', 'element:4:right',
    ]);
    expect(keys(slotsFor(tamarackM4, part('CW-CP-R-04')))).toEqual(['cover:1:left', 'cover:2:left', 'cover:3:left', 'cover:1:right', 'cover:2:right', 'cover:3:right']);
    expect(slotsFor(tamarackM4, part('CW-BR-RS-04'))).toHaveLength(16);
    expect(slotsFor(tamarackM4, null)).toEqual(all);
  });

  it('right and left follow the rotor, then go on to the next band; the ends stay put', () => {
    const walk: (Place | null)[] = [];
    let at: Place | null = null;
    for (let i = 0; i < 9; i++) walk.push((at = stepPlace(tamarackM4, elements, at, 'right')));
    expect(keys(walk)).toEqual([...keys(elements), 'element:4:right']);
    expect(placeKey(stepPlace(tamarackM4, elements, elements[0]!, 'left')!)).toBe('element:1:left');
  });

  it('down and up jump to the same position in the band below or above', () => {
    const p3l: Place = { kind: 'element', position: 3, side: 'left' };
    expect(placeKey(stepPlace(tamarackM4, elements, p3l, 'down')!)).toBe('element:3:right');
    expect(placeKey(stepPlace(tamarackM4, elements, { kind: 'element', position: 3, side: 'right' }, 'up')!)).toBe('element:3:left');
    // no band below the right half among element slots: stay
    expect(placeKey(stepPlace(tamarackM4, elements, { kind: 'element', position: 3, side: 'right' }, 'down')!)).toBe('element:3:right');
  });

  it('walking every slot: from the right half down to the cage-top section over it, then the rotor rows', () => {
    const p2r: Place = { kind: 'element', position: 2, side: 'right' };
    const cover = stepPlace(tamarackM4, all, p2r, 'down')!;
    expect(placeKey(cover)).toBe('cover:2:right'); // section 2 lies over positions 2 and 3
    expect(placeKey(stepPlace(tamarackM4, all, cover, 'down')!)).toMatch(/^bar:1:[23]$/);
    expect(placeKey(stepPlace(tamarackM4, all, { kind: 'bar', row: 1, position: 4 }, 'down')!)).toBe('bar:2:4');
    expect(placeKey(stepPlace(tamarackM4, all, { kind: 'cover', section: 1, side: 'left' }, 'up')!)).toBe('cover:1:left');
  });

  it('with nothing to start from, the first slot', () => {
    expect(placeKey(stepPlace(sedgeS6, slotsFor(sedgeS6, part('CW-FW-R-06C')), null, 'down')!)).toBe('element:1:left');
    expect(stepPlace(sedgeS6, [], null, 'right')).toBeNull();
  });

  it('slot ids round-trip', () => {
    for (const p of allPlaces(sedgeS6)) expect(placeFromSlotId(slotId(p))).toEqual(p);
    expect(placeFromSlotId('palette')).toBeNull();
    expect(placeFromSlotId(7)).toBeNull();
  });
});

describe('the dnd-kit keyboard coordinate getter', () => {
  // Slots laid out like the drawing: a column per position, bands 100 px apart.
  const rects = new Map<string, { left: number; top: number; width: number; height: number; right: number; bottom: number }>();
  for (const p of allPlaces(tamarackM4)) {
    const col = p.kind === 'cover' ? p.section : p.kind === 'setting' ? 0 : p.position;
    const band = p.kind === 'cover' ? (p.side === 'left' ? 0 : 3) : p.kind === 'element' ? (p.side === 'left' ? 1 : 2) : p.kind === 'bar' ? 3 + p.row : 0;
    rects.set(slotId(p), { left: col * 150, top: band * 100, width: 140, height: 90, right: col * 150 + 140, bottom: band * 100 + 90 });
  }
  const carried = { left: 0, top: 0, width: 40, height: 30, right: 40, bottom: 30 };
  const run = (code: string, carry: { part: CatalogPart; from?: Place }, overId: string | null) => {
    let prevented = false;
    const event = { code, key: code, preventDefault: () => (prevented = true) } as unknown as KeyboardEvent;
    const ctx = {
      active: { id: 'x', data: { current: carry } },
      over: overId ? { id: overId } : null,
      droppableRects: rects,
      collisionRect: carried,
    };
    const getter = slotCoordinateGetter(() => tamarackM4);
    const out = getter(event, { active: 'x', currentCoordinates: { x: 1, y: 2 }, context: ctx as never });
    return { out, prevented };
  };

  it('from the palette, the first arrow goes to the centre of the first slot that takes the part', () => {
    const { out, prevented } = run('ArrowRight', { part: part('CW-WW-L-04') }, null);
    expect(prevented).toBe(true);
    const r = rects.get('slot:element:1:left')!;
    expect(out).toEqual({ x: r.left + r.width / 2 - 20, y: r.top + r.height / 2 - 15 });
  });

  it('then steps from the slot it is over', () => {
    const { out } = run('ArrowDown', { part: part('CW-WW-L-04') }, 'slot:element:3:left');
    const r = rects.get('slot:element:3:right')!;
    expect(out).toEqual({ x: r.left + r.width / 2 - 20, y: r.top + r.height / 2 - 15 });
  });

  it('a placed part starts from where it was picked up', () => {
    const { out } = run('ArrowRight', { part: part('CW-BR-RS-04'), from: { kind: 'bar', row: 2, position: 1 } }, null);
    const r = rects.get('slot:bar:2:2')!;
    expect(out).toEqual({ x: r.left + r.width / 2 - 20, y: r.top + r.height / 2 - 15 });
  });

  it('quick presses step on from the last slot even when the drop target lags behind', () => {
    const getter = slotCoordinateGetter(() => tamarackM4);
    const carry = { part: part('CW-WW-L-04') };
    const ctx = { active: { id: 'x', data: { current: carry } }, over: null, droppableRects: rects, collisionRect: carried };
    const press = (code: string) => getter({ code, key: code, preventDefault() {} } as unknown as KeyboardEvent, { active: 'x', currentCoordinates: { x: 0, y: 0 }, context: ctx as never });
    for (const k of ['ArrowRight', 'ArrowRight', 'ArrowRight']) press(k);
    const r = rects.get('slot:element:3:right')!;
    expect(press('ArrowDown')).toEqual({ x: r.left + r.width / 2 - 20, y: r.top + r.height / 2 - 15 });
    getter.reset();
    const first = rects.get('slot:element:1:left')!;
    expect(press('ArrowDown')).toEqual({ x: first.left + first.width / 2 - 20, y: first.top + first.height / 2 - 15 });
  });

  it('other keys are left to the sensor', () => {
    const { out, prevented } = run('KeyA', { part: part('CW-WW-L-04') }, null);
    expect(out).toBeUndefined();
    expect(prevented).toBe(false);
  });
});
