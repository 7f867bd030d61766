/**
 * Moving between slots with the keyboard, in the drawing's own order (allPlaces): Right and
 * Left step to the next and previous slot that takes the part in hand (along the rotor, then on
 * to the next band around it); Down and Up jump to the nearest such slot in the band below or
 * above. Used by the dnd-kit keyboard sensor while a part is carried, and by the diagram's own
 * arrow-key navigation when nothing is.
 */
import type { KeyboardCoordinateGetter } from '@dnd-kit/core';
import { allPlaces, placeKey } from '~/lib/domain/places';
import type { CarryData } from './carry';
import type { CatalogPart, MachineFamily, Place } from '~/lib/domain/schemas';
import { accepts } from '~/lib/domain/layout-edits';

export type Direction = 'left' | 'right' | 'up' | 'down';

export const ARROW_DIRECTION: Record<string, Direction> = {
  ArrowLeft: 'left',
  ArrowRight: 'right',
  ArrowUp: 'up',
  ArrowDown: 'down',
};

/** The band a place is drawn in, counted from the top of the drawing. */
function bandOf(family: MachineFamily, place: Place): number {
  switch (place.kind) {
    case 'cover':
      return place.side === 'left' ? 0 : 3;
    case 'element':
      return place.side === 'left' ? 1 : 2;
    case 'bar':
      return (
        4 +
        Math.max(
          0,
          family.rotorBarRows.findIndex((r) => r.index === place.row),
        )
      );
    default:
      return -1;
  }
}

/** Where a place sits along the rotor, in positions (a cage-top section: its middle). */
function columnOf(family: MachineFamily, place: Place): number {
  switch (place.kind) {
    case 'element':
    case 'bar':
      return place.position;
    case 'cover': {
      const s = family.cageTopSections.find((x) => x.index === place.section);
      if (!s || s.positions.length === 0) return place.section;
      return (Math.min(...s.positions) + Math.max(...s.positions)) / 2;
    }
    default:
      return 0;
  }
}

/**
 * The slot to go to from `current` in direction `dir`, among `places` (already in drawing
 * order). With no current slot, the first one. Stays put at the ends.
 */
export function stepPlace(family: MachineFamily, places: readonly Place[], current: Place | null, dir: Direction): Place | null {
  if (places.length === 0) return null;
  const keys = places.map(placeKey);
  const i = current ? keys.indexOf(placeKey(current)) : -1;
  if (i < 0) return places[0]!;
  if (dir === 'right') return places[Math.min(places.length - 1, i + 1)]!;
  if (dir === 'left') return places[Math.max(0, i - 1)]!;
  const band = bandOf(family, current!);
  const col = columnOf(family, current!);
  const bands = [...new Set(places.map((p) => bandOf(family, p)))].sort((a, b) => a - b);
  const bi = bands.indexOf(band);
  const target = dir === 'down' ? bands[bi + 1] : bands[bi - 1];
  if (target === undefined) return current;
  let best: Place | null = null;
  let bestDist = Infinity;
  for (const p of places) {
    if (bandOf(family, p) !== target) continue;
    const d = Math.abs(columnOf(family, p) - col);
    if (d < bestDist) {
      best = p;
      bestDist = d;
    }
  }
  return best ?? current;
}

/** The slots of a family that take a part of this kind, in drawing order (all slots when no part). */
export function slotsFor(family: MachineFamily, part: Pick<CatalogPart, 'kind'> | null): Place[] {
  const all = allPlaces(family);
  return part ? all.filter((p) => accepts(part, p)) : all;
}

export type SlotCoordinateGetter = KeyboardCoordinateGetter & {
  /** Forget the last slot stepped to; call when a drag starts. */
  reset: () => void;
};

export interface SlotStepping {
  family: () => MachineFamily;
  /** Where a slot is on screen now (null when it is not drawn). */
  rectOf: (place: Place) => { left: number; top: number; width: number; height: number } | null;
  /** Told the slot the carried part now sits over. */
  onTarget?: (place: Place) => void;
}

/**
 * dnd-kit keyboard coordinate getter: arrow keys carry the part to the centre of the next slot
 * (in the drawing's order) that takes it, instead of moving by pixels. It remembers the slot it
 * last stepped to, so quick key presses step on from there.
 */
export function slotCoordinateGetter(opts: SlotStepping): SlotCoordinateGetter {
  let last: Place | null = null;
  const getter: KeyboardCoordinateGetter = (event, { context, currentCoordinates }) => {
    const dir = ARROW_DIRECTION[event.code] ?? ARROW_DIRECTION[event.key];
    if (!dir) return undefined;
    event.preventDefault();
    const family = opts.family();
    const carry = context.active?.data.current as Partial<CarryData> | undefined;
    const places = slotsFor(family, carry?.part ?? null);
    // From the slot last stepped to, or the one it was picked up from; fresh from the palette,
    // the first slot that takes it.
    const fromPlace = last ?? carry?.from ?? null;
    const next = fromPlace ? stepPlace(family, places, fromPlace, dir) : (places[0] ?? null);
    if (!next) return currentCoordinates;
    const rect = opts.rectOf(next);
    const carried = context.collisionRect;
    if (!rect || !carried) return currentCoordinates;
    last = next;
    opts.onTarget?.(next);
    return {
      x: rect.left + rect.width / 2 - carried.width / 2,
      y: rect.top + rect.height / 2 - carried.height / 2,
    };
  };
  return Object.assign(getter, {
    reset: () => {
      last = null;
    },
  });
}
