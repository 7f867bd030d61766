/**
 * Part history: which part sits in which place of a layout, and what an install changes. A place
 * whose part number changes closes the old part's record and opens a new one; a part taken out
 * in the same install and bolted into another place of the machine is a move, not a new part.
 * Pure: the server records what this works out (services/part-history.ts).
 */
import type { Layout } from './schemas';

/** Every place of a layout that carries a part, with the part number there. */
export function partPlaces(layout: Pick<Layout, 'elements' | 'coverPlates' | 'rotorBars'>): Map<string, string> {
  const out = new Map<string, string>();
  for (const e of layout.elements) out.set(`element:${e.position}:${e.side}`, e.partNumber);
  for (const c of layout.coverPlates) out.set(`cover:${c.section}:${c.side}`, c.partNumber);
  for (const b of layout.rotorBars) out.set(`bar:${b.row}:${b.position}`, b.partNumber);
  return out;
}

export interface OpenPart {
  id: string;
  placeKey: string;
  partNumber: string;
}

export interface InstallChanges {
  /** Records to close: the part left its place. `movedTo` names the place it went to, in this install. */
  close: { record: OpenPart; movedTo: string | null }[];
  /** Places that get a part: `movedFrom` is the record of the part that moved there, null when it comes from elsewhere. */
  open: { placeKey: string; partNumber: string; movedFrom: OpenPart | null }[];
}

/**
 * What an install changes, from the open records of the machine and the new layout's places.
 * A place keeping its part number keeps its record. Parts leaving a place are matched, in place
 * order, to places gaining the same part number in this install (a move); the rest go to the shelf.
 */
export function installChanges(open: readonly OpenPart[], next: ReadonlyMap<string, string>): InstallChanges {
  const leaving = open.filter((r) => next.get(r.placeKey) !== r.partNumber).sort((a, b) => a.placeKey.localeCompare(b.placeKey));
  const kept = new Set(open.filter((r) => next.get(r.placeKey) === r.partNumber).map((r) => r.placeKey));
  const gaining = [...next].filter(([key]) => !kept.has(key)).sort(([a], [b]) => a.localeCompare(b));
  const free = [...leaving];
  const movedTo = new Map<string, string>();
  const opens: InstallChanges['open'] = gaining.map(([placeKey, partNumber]) => {
    const i = free.findIndex((r) => r.partNumber === partNumber);
    const from = i >= 0 ? free.splice(i, 1)[0]! : null;
    if (from) movedTo.set(from.id, placeKey);
    return { placeKey, partNumber, movedFrom: from };
  });
  return { close: leaving.map((record) => ({ record, movedTo: movedTo.get(record.id) ?? null })), open: opens };
}

/**
 * The separator hours a part has run by the end of a record: what it carried in, plus the
 * machine's hours between install and removal (or `nowHours` while it is still in). Unknown
 * hours at install count from the first known reading (`fallbackStart`).
 */
export function hoursInService(
  record: { carriedHours: number; installedSeparatorHours: number | null; removedSeparatorHours: number | null },
  nowHours: number | null,
  fallbackStart: number | null = null,
): number {
  const start = record.installedSeparatorHours ?? fallbackStart;
  const end = record.removedSeparatorHours ?? nowHours;
  if (start === null || end === null) return record.carriedHours;
  return record.carriedHours + Math.max(0, end - start);
}
