/**
 * Places on the cage: a half-position, a cover-plate slot, a rotor bar place, or a setting.
 * Findings are pinned to places; the diagram and the editor's keyboard walk them.
 * A place key is a short stable string ('element:2:left', 'cover:2:right', 'bar:1:4',
 * 'setting:rotorRpm') usable as a map key, a DOM id fragment or a URL fragment.
 */
import type { MachineFamily, Place, SettingField } from './schemas';
import { INDEX_MAX, SETTING_FIELD_VALUES, SIDE_VALUES } from './values';

export type { Place, SettingField };
export type ElementPlace = Extract<Place, { kind: 'element' }>;
export type CoverPlace = Extract<Place, { kind: 'cover' }>;
export type BarPlace = Extract<Place, { kind: 'bar' }>;
export type SettingPlace = Extract<Place, { kind: 'setting' }>;

export const elementPlace = (position: number, side: ElementPlace['side']): ElementPlace => ({ kind: 'element', position, side });
export const coverPlace = (section: number, side: CoverPlace['side']): CoverPlace => ({ kind: 'cover', section, side });
export const barPlace = (row: number, position: number): BarPlace => ({ kind: 'bar', row, position });
export const settingPlace = (field: SettingField): SettingPlace => ({ kind: 'setting', field });

export function placeKey(place: Place): string {
  switch (place.kind) {
    case 'element':
      return `element:${place.position}:${place.side}`;
    case 'cover':
      return `cover:${place.section}:${place.side}`;
    case 'bar':
      return `bar:${place.row}:${place.position}`;
    case 'setting':
      return `setting:${place.field}`;
  }
}

/**
 * The place a key names, or null when the key is malformed: the rule of `placeSchema` (whole
 * numbers from 1 to INDEX_MAX, a known side or setting), checked without zod so the islands
 * that read keys from the drawing need not load it (tests/unit/domain/places.test.ts holds the
 * two to the same answers).
 */
export function parsePlaceKey(key: string): Place | null {
  const parts = key.split(':');
  const index = (s: string | undefined): number | null => {
    if (s === undefined || !/^\d+$/.test(s)) return null;
    const n = Number(s);
    return n >= 1 && n <= INDEX_MAX ? n : null;
  };
  const side = (s: string | undefined) => SIDE_VALUES.find((x) => x === s) ?? null;
  switch (parts.length === 3 || parts.length === 2 ? parts[0] : undefined) {
    case 'element': {
      const position = index(parts[1]);
      const s = side(parts[2]);
      return parts.length === 3 && position !== null && s ? { kind: 'element', position, side: s } : null;
    }
    case 'cover': {
      const section = index(parts[1]);
      const s = side(parts[2]);
      return parts.length === 3 && section !== null && s ? { kind: 'cover', section, side: s } : null;
    }
    case 'bar': {
      const row = index(parts[1]);
      const position = index(parts[2]);
      return parts.length === 3 && row !== null && position !== null ? { kind: 'bar', row, position } : null;
    }
    case 'setting': {
      const field = SETTING_FIELD_VALUES.find((f) => f === parts[1]);
      return parts.length === 2 && field ? { kind: 'setting', field } : null;
    }
    default:
      return null;
  }
}

export function samePlace(a: Place, b: Place): boolean {
  return placeKey(a) === placeKey(b);
}

/**
 * Every slot of the diagram in the drawing's own order: each band is read along the rotor
 * (front to rear), and the bands follow one another around the rotor from the top — cage top
 * left (cover-plate slots per section), left half of the element ring, right half, cage top
 * right — then the rotor strip, row by row, along the rotor.
 * Cover-plate slots are listed for every section so a misplaced plate still has a place.
 */
export function allPlaces(family: MachineFamily): Place[] {
  const out: Place[] = [];
  for (const s of family.cageTopSections) out.push(coverPlace(s.index, 'left'));
  for (const p of family.positions) out.push(elementPlace(p.index, 'left'));
  for (const p of family.positions) out.push(elementPlace(p.index, 'right'));
  for (const s of family.cageTopSections) out.push(coverPlace(s.index, 'right'));
  const byRow = [...family.rotorBarPlaces].sort((a, b) => a.row - b.row || a.position - b.position);
  for (const b of byRow) out.push(barPlace(b.row, b.position));
  return out;
}

/** The settings beside the diagram, in the order the editor shows them. */
export const settingPlaces: readonly SettingPlace[] = SETTING_FIELD_VALUES.map(settingPlace);
