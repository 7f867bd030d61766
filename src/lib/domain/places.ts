/**
 * Places on the cage: a half-position, a cover-plate slot, a rotor bar place, or a setting.
 * Findings are pinned to places; the diagram and the editor's keyboard walk them.
 * A place key is a short stable string ('element:2:left', 'cover:2:right', 'bar:1:4',
 * 'setting:rotorRpm') usable as a map key, a DOM id fragment or a URL fragment.
 */
import { placeSchema, settingFieldSchema, type MachineFamily, type Place, type SettingField } from './schemas';

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

/** The place a key names, or null when the key is malformed. */
export function parsePlaceKey(key: string): Place | null {
  const parts = key.split(':');
  let candidate: unknown = null;
  const int = (s: string | undefined) => (s !== undefined && /^\d+$/.test(s) ? Number(s) : NaN);
  switch (parts[0]) {
    case 'element':
      if (parts.length === 3) candidate = { kind: 'element', position: int(parts[1]), side: parts[2] };
      break;
    case 'cover':
      if (parts.length === 3) candidate = { kind: 'cover', section: int(parts[1]), side: parts[2] };
      break;
    case 'bar':
      if (parts.length === 3) candidate = { kind: 'bar', row: int(parts[1]), position: int(parts[2]) };
      break;
    case 'setting':
      if (parts.length === 2) candidate = { kind: 'setting', field: parts[1] };
      break;
  }
  const parsed = placeSchema.safeParse(candidate);
  return parsed.success ? parsed.data : null;
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
export const settingPlaces: readonly SettingPlace[] = settingFieldSchema.options.map(settingPlace);
