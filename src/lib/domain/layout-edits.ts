/**
 * Pure edits of a layout: what sits at a place, put, take away, move or swap, and what the rules
 * say about a part dropped at a place. Each edit returns a new layout object (or the same one
 * when nothing changes), so the editor's undo can keep references. The editor store, the planner
 * and the tests all edit layouts through this module.
 */
import type { CatalogIndex } from './catalog';
import { placeKey } from './places';
import { checkLayout } from './rules';
import type { CatalogPart, Finding, Layout, MachineFamily, Place, Side } from './schemas';

// Left before right. A plain comparison: String#localeCompare builds a collator, which costs
// more than the rest of an edit.
const sideOrder = (a: Side, b: Side) => (a === b ? 0 : a === 'left' ? -1 : 1);

/** Whether a part of this kind goes into a slot of this kind at all (fit is the rules' job). */
export function accepts(part: Pick<CatalogPart, 'kind'>, place: Place): boolean {
  return (
    (part.kind === 'element' && place.kind === 'element') ||
    (part.kind === 'cover-plate' && place.kind === 'cover') ||
    (part.kind === 'rotor-bar' && place.kind === 'bar')
  );
}

export function partNumberAt(layout: Layout, place: Place): string | undefined {
  switch (place.kind) {
    case 'element':
      return layout.elements.find((e) => e.position === place.position && e.side === place.side)?.partNumber;
    case 'cover':
      return layout.coverPlates.find((c) => c.section === place.section && c.side === place.side)?.partNumber;
    case 'bar':
      return layout.rotorBars.find((b) => b.row === place.row && b.position === place.position)?.partNumber;
    default:
      return undefined;
  }
}

/** The layout with `partNumber` at `place` (or the place emptied when partNumber is null). */
export function withPartAt(layout: Layout, place: Place, partNumber: string | null): Layout {
  switch (place.kind) {
    case 'element': {
      const rest = layout.elements.filter((e) => !(e.position === place.position && e.side === place.side));
      const elements = partNumber ? [...rest, { position: place.position, side: place.side, partNumber }] : rest;
      elements.sort((a, b) => a.position - b.position || sideOrder(a.side, b.side));
      return { ...layout, elements };
    }
    case 'cover': {
      const rest = layout.coverPlates.filter((c) => !(c.section === place.section && c.side === place.side));
      const coverPlates = partNumber ? [...rest, { section: place.section, side: place.side, partNumber }] : rest;
      coverPlates.sort((a, b) => a.section - b.section || sideOrder(a.side, b.side));
      return { ...layout, coverPlates };
    }
    case 'bar': {
      const rest = layout.rotorBars.filter((b) => !(b.row === place.row && b.position === place.position));
      const rotorBars = partNumber ? [...rest, { row: place.row, position: place.position, partNumber }] : rest;
      rotorBars.sort((a, b) => a.row - b.row || a.position - b.position);
      return { ...layout, rotorBars };
    }
    default:
      return layout;
  }
}

/** Move the part at `from` to `to`, swapping with what is there. Null when `from` is empty or kinds differ. */
export function movedLayout(layout: Layout, from: Place, to: Place): Layout | null {
  if (from.kind !== to.kind || from.kind === 'setting') return null;
  const moving = partNumberAt(layout, from);
  if (!moving) return null;
  const there = partNumberAt(layout, to) ?? null;
  return withPartAt(withPartAt(layout, from, there), to, moving);
}

/** The layout with `partNumber` at `place`, replacing what is there (a setting place leaves it as it is). */
export function placePart(layout: Layout, place: Place, partNumber: string): Layout {
  return withPartAt(layout, place, partNumber);
}

/**
 * The findings a part would raise where it is dropped: the layout with `partNumber` put at
 * `place` (replacing what is there) is checked, and the findings pinned to that place are
 * returned. The editor uses it to preview a drop, the planner to offer parts; an empty result
 * (or advice only) means the rules allow the part there.
 */
export function checkPlacement(
  family: MachineFamily,
  catalog: readonly CatalogPart[] | CatalogIndex,
  layout: Layout,
  place: Place,
  partNumber: string,
): Finding[] {
  const key = placeKey(place);
  return checkLayout(family, catalog, placePart(layout, place, partNumber)).filter((f) => f.places.some((p) => placeKey(p) === key));
}
