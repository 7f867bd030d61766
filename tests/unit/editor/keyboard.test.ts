import { describe, expect, it } from 'vitest';
import { slotCoordinateGetter, slotsFor, stepPlace } from '~/components/editor/keyboard';
import { demoCatalog, sedgeS6, tamarackM4 } from '~/lib/domain/demo-catalog';
import { allPlaces, placeKey } from '~/lib/domain/places';
import type { CatalogPart, Place } from '~/lib/domain/schemas';

const part = (pn: string) => demoCatalog.find((p) => p.partNumber === pn)!;
const keys = (ps: (Place | null)[]) => ps.map((p) => (p ? placeKey(p) : null));

describe('stepping between slots in the drawing’s order', () => {
  const all = allPlaces(tamarackM4);
  const elements = slotsFor(tamarackM4, part('CW-WW-L-04'));

  it('a part only visits the slots that take its kind', () => {
    expect(keys(elements)).toEqual([
      'element:1:left',
      'element:2:left',
      'element:3:left',
      'element:4:left',
      'element:1:right',
      'element:2:right',
      'element:3:right',
      'element:4:right',
    ]);
    expect(keys(slotsFor(tamarackM4, part('CW-CP-R-04')))).toEqual([
      'cover:1:left',
      'cover:2:left',
      'cover:3:left',
      'cover:1:right',
      'cover:2:right',
      'cover:3:right',
    ]);
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
});

describe('the dnd-kit keyboard coordinate getter', () => {
  // Slots laid out like the drawing: a column per position, bands 100 px apart.
  const rects = new Map<string, { left: number; top: number; width: number; height: number }>();
  for (const p of allPlaces(tamarackM4)) {
    const col = p.kind === 'cover' ? p.section : p.kind === 'setting' ? 0 : p.position;
    const band =
      p.kind === 'cover'
        ? p.side === 'left'
          ? 0
          : 3
        : p.kind === 'element'
          ? p.side === 'left'
            ? 1
            : 2
          : p.kind === 'bar'
            ? 3 + p.row
            : 0;
    rects.set(placeKey(p), { left: col * 150, top: band * 100, width: 140, height: 90 });
  }
  const carried = { left: 0, top: 0, width: 40, height: 30, right: 40, bottom: 30 };
  const centred = (key: string) => {
    const r = rects.get(key)!;
    return { x: r.left + r.width / 2 - 20, y: r.top + r.height / 2 - 15 };
  };
  function setup(carry: { part: CatalogPart; from?: Place }) {
    const targets: string[] = [];
    const getter = slotCoordinateGetter({
      family: () => tamarackM4,
      rectOf: (p) => rects.get(placeKey(p)) ?? null,
      onTarget: (p) => targets.push(placeKey(p)),
    });
    const ctx = { active: { id: 'carry', data: { current: carry } }, over: null, collisionRect: carried };
    const press = (code: string) => {
      let prevented = false;
      const event = { code, key: code, preventDefault: () => (prevented = true) } as unknown as KeyboardEvent;
      const out = getter(event, { active: 'carry', currentCoordinates: { x: 1, y: 2 }, context: ctx as never });
      return { out, prevented };
    };
    return { getter, press, targets };
  }

  it('from the palette, the first arrow goes to the centre of the first slot that takes the part', () => {
    const { press, targets } = setup({ part: part('CW-WW-L-04') });
    const { out, prevented } = press('ArrowRight');
    expect(prevented).toBe(true);
    expect(out).toEqual(centred('element:1:left'));
    expect(targets).toEqual(['element:1:left']);
  });

  it('then steps on from the slot it went to, however quick the presses', () => {
    const { press, targets } = setup({ part: part('CW-WW-L-04') });
    for (const k of ['ArrowRight', 'ArrowRight', 'ArrowRight']) press(k);
    expect(press('ArrowDown').out).toEqual(centred('element:3:right'));
    expect(targets).toEqual(['element:1:left', 'element:2:left', 'element:3:left', 'element:3:right']);
  });

  it('a placed part starts from where it was picked up; reset forgets the last slot', () => {
    const { press, getter } = setup({ part: part('CW-BR-RS-04'), from: { kind: 'bar', row: 2, position: 1 } });
    expect(press('ArrowRight').out).toEqual(centred('bar:2:2'));
    expect(press('ArrowDown').out).toEqual(centred('bar:3:2'));
    getter.reset();
    expect(press('ArrowUp').out).toEqual(centred('bar:1:1'));
  });

  it('other keys are left to the sensor', () => {
    const { press, targets } = setup({ part: part('CW-WW-L-04') });
    const { out, prevented } = press('KeyA');
    expect(out).toBeUndefined();
    expect(prevented).toBe(false);
    expect(targets).toEqual([]);
  });
});
