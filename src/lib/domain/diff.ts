/**
 * What changed between two layouts, place by place: the half-positions whose element differs,
 * the cover-plate slots, the rotor bar places and the settings beside the diagram. Pure; the
 * history page, the compare view and the classroom's side-by-side all read the same list.
 *
 * The list comes in a fixed order — settings first (in the editor's order), then elements
 * along the rotor (left before right), cover plates by section, rotor bars by row and place —
 * so two calls on the same pair always read alike.
 */
import { barPlace, coverPlace, elementPlace, placeKey, settingPlace, type Place } from './places';
import type { Layout, SettingField, Side } from './schemas';
import { SETTING_FIELD_VALUES } from './values';
import { placeLabel } from './vocabulary';

/** added: empty in `a`, filled in `b`; removed: the reverse; changed: a different part or value. */
export type ChangeKind = 'added' | 'removed' | 'changed';

export interface PartDifference {
  kind: 'element' | 'cover' | 'bar';
  place: Place;
  change: ChangeKind;
  /** Part number in `a` (null when the place was empty). */
  before: string | null;
  /** Part number in `b` (null when the place is empty). */
  after: string | null;
}

export interface SettingDifference {
  kind: 'setting';
  place: Place;
  field: SettingField;
  change: 'changed';
  before: string | number;
  after: string | number;
}

export type LayoutDifference = PartDifference | SettingDifference;

export interface LayoutDiff {
  differences: LayoutDifference[];
  /** The two layouts are for different machine families (their places may not line up). */
  familyChanged: boolean;
  /** Counts by what changed, for a one-line summary. */
  counts: { elements: number; coverPlates: number; rotorBars: number; settings: number };
}

const SIDE_ORDER: Record<Side, number> = { left: 0, right: 1 };

function diffPlaced<T>(
  kind: PartDifference['kind'],
  a: readonly T[],
  b: readonly T[],
  key: (t: T) => string,
  place: (t: T) => Place,
  order: (x: T, y: T) => number,
  partNumber: (t: T) => string,
): PartDifference[] {
  const before = new Map(a.map((t) => [key(t), t] as const));
  const after = new Map(b.map((t) => [key(t), t] as const));
  const keys = new Map<string, T>();
  for (const t of [...a, ...b]) if (!keys.has(key(t))) keys.set(key(t), t);
  const out: { sortBy: T; d: PartDifference }[] = [];
  for (const [k, sample] of keys) {
    const x = before.get(k);
    const y = after.get(k);
    const pa = x === undefined ? null : partNumber(x);
    const pb = y === undefined ? null : partNumber(y);
    if (pa === pb) continue;
    const change: ChangeKind = pa === null ? 'added' : pb === null ? 'removed' : 'changed';
    out.push({ sortBy: sample, d: { kind, place: place(sample), change, before: pa, after: pb } });
  }
  return out.sort((p, q) => order(p.sortBy, q.sortBy)).map((o) => o.d);
}

/** The differences that turn layout `a` into layout `b`. */
export function diffLayouts(a: Layout, b: Layout): LayoutDiff {
  const settings: SettingDifference[] = [];
  for (const field of SETTING_FIELD_VALUES) {
    const x = a[field];
    const y = b[field];
    if (x !== y) settings.push({ kind: 'setting', place: settingPlace(field), field, change: 'changed', before: x, after: y });
  }
  const elements = diffPlaced(
    'element',
    a.elements,
    b.elements,
    (e) => `${e.position}:${e.side}`,
    (e) => elementPlace(e.position, e.side),
    (x, y) => x.position - y.position || SIDE_ORDER[x.side] - SIDE_ORDER[y.side],
    (e) => e.partNumber,
  );
  const coverPlates = diffPlaced(
    'cover',
    a.coverPlates,
    b.coverPlates,
    (c) => `${c.section}:${c.side}`,
    (c) => coverPlace(c.section, c.side),
    (x, y) => x.section - y.section || SIDE_ORDER[x.side] - SIDE_ORDER[y.side],
    (c) => c.partNumber,
  );
  const rotorBars = diffPlaced(
    'bar',
    a.rotorBars,
    b.rotorBars,
    (r) => `${r.row}:${r.position}`,
    (r) => barPlace(r.row, r.position),
    (x, y) => x.row - y.row || x.position - y.position,
    (r) => r.partNumber,
  );
  return {
    differences: [...settings, ...elements, ...coverPlates, ...rotorBars],
    familyChanged: a.familyId !== b.familyId,
    counts: { elements: elements.length, coverPlates: coverPlates.length, rotorBars: rotorBars.length, settings: settings.length },
  };
}

/** The places that differ, for a diagram's highlight. */
export function diffPlaces(diff: LayoutDiff | readonly LayoutDifference[]): Place[] {
  const list = Array.isArray(diff) ? diff : (diff as LayoutDiff).differences;
  return list.map((d) => d.place);
}

/** The same places as keys ('element:2:left'), handy for a Set look-up. */
export function diffPlaceKeys(diff: LayoutDiff | readonly LayoutDifference[]): Set<string> {
  return new Set(diffPlaces(diff).map(placeKey));
}

export function isSameLayout(a: Layout, b: Layout): boolean {
  const d = diffLayouts(a, b);
  return !d.familyChanged && d.differences.length === 0;
}

const SETTING_WORDS: Record<SettingField, string> = {
  crop: 'Crop',
  drum: 'Rotor drum',
  rotorRpm: 'Rotor speed (rpm)',
  clearanceMm: 'Concave clearance (mm)',
  vaneControl: 'Vane control',
  vaneSetting: 'Vane setting',
};

/** A plain name for a place: "Position 2, left", "Cage-top section 2, right", "Rotor row 1, position 4" (vocabulary.ts); a setting with its unit. */
export function describePlace(place: Place): string {
  return place.kind === 'setting' ? SETTING_WORDS[place.field] : placeLabel(place);
}

/** One sentence per difference: "Position 2, left: CW-FW-L-04 → CW-WW-L-04". */
export function describeDifference(d: LayoutDifference): string {
  const where = describePlace(d.place);
  if (d.kind === 'setting') return `${where}: ${d.before} → ${d.after}`;
  if (d.change === 'added') return `${where}: ${d.after} added`;
  if (d.change === 'removed') return `${where}: ${d.before} removed`;
  return `${where}: ${d.before} → ${d.after}`;
}
