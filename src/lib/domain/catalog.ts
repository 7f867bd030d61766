/**
 * Look-up helpers over a catalog and a family, built once and reused by the rules and the
 * computations. `indexCatalog` is what a caller checking many layouts against one catalog
 * should build and pass in; the rules accept a plain array too and index it themselves.
 */
import type { CatalogPart, CageTopSection, MachineFamily, RotorBarPlace, Zone } from './schemas';

export interface CatalogIndex {
  readonly parts: readonly CatalogPart[];
  readonly byPartNumber: ReadonlyMap<string, CatalogPart>;
}

export function indexCatalog(catalog: readonly CatalogPart[]): CatalogIndex {
  const byPartNumber = new Map<string, CatalogPart>();
  for (const p of catalog) byPartNumber.set(p.partNumber, p);
  return { parts: catalog, byPartNumber };
}

export function isCatalogIndex(c: readonly CatalogPart[] | CatalogIndex): c is CatalogIndex {
  return !Array.isArray(c);
}

export function asCatalogIndex(c: readonly CatalogPart[] | CatalogIndex): CatalogIndex {
  return isCatalogIndex(c) ? c : indexCatalog(c);
}

/** The parts of a catalog that belong to a family's fit group. */
export function partsForFamily(catalog: readonly CatalogPart[], family: MachineFamily): CatalogPart[] {
  return catalog.filter((p) => p.fitGroup === family.fitGroup);
}

export interface FamilyIndex {
  readonly family: MachineFamily;
  /** zoneByPosition[i] is the zone of position i (index 0 unused). */
  readonly zoneByPosition: readonly (Zone | undefined)[];
  readonly sectionByIndex: ReadonlyMap<number, CageTopSection>;
  /** 'row:position' → place. */
  readonly barPlaceByKey: ReadonlyMap<string, RotorBarPlace>;
  readonly rowAngle: ReadonlyMap<number, number>;
}

// Families are static reference data, so indexing one once per object is safe and saves the
// rules a few allocations on every keystroke in the editor.
const familyIndexCache = new WeakMap<MachineFamily, FamilyIndex>();

export function indexFamily(family: MachineFamily): FamilyIndex {
  const cached = familyIndexCache.get(family);
  if (cached) return cached;
  const zoneByPosition: (Zone | undefined)[] = [];
  for (const p of family.positions) zoneByPosition[p.index] = p.zone;
  const sectionByIndex = new Map(family.cageTopSections.map((s) => [s.index, s] as const));
  const barPlaceByKey = new Map(family.rotorBarPlaces.map((b) => [`${b.row}:${b.position}`, b] as const));
  const rowAngle = new Map(family.rotorBarRows.map((r) => [r.index, r.angleDeg] as const));
  const index: FamilyIndex = { family, zoneByPosition, sectionByIndex, barPlaceByKey, rowAngle };
  familyIndexCache.set(family, index);
  return index;
}

/**
 * The same part for the other hand (or side): same kind, type or bar kind, role and fit group.
 * What the editor's "mirror" uses; undefined when the catalog lacks it. Rotor bars have no hand
 * and come back as they are.
 */
export function handedCounterpart(catalog: CatalogIndex, part: CatalogPart, side: 'left' | 'right'): CatalogPart | undefined {
  switch (part.kind) {
    case 'element':
      if (part.hand === side) return part;
      return catalog.parts.find(
        (p) =>
          p.kind === 'element' &&
          p.hand === side &&
          p.elementType === part.elementType &&
          p.role === part.role &&
          p.fitGroup === part.fitGroup,
      );
    case 'cover-plate':
      if (part.side === side) return part;
      return catalog.parts.find((p) => p.kind === 'cover-plate' && p.side === side && p.fitGroup === part.fitGroup);
    case 'rotor-bar':
      return part;
  }
}
