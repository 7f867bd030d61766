import {
  barPlace,
  checkLayout,
  demoCatalog,
  elementPlace,
  indexCatalog,
  placePart,
  sedgeS6,
  starterLayout,
  tamarackM4,
  type CropId,
  type Finding,
  type FindingCode,
  type Layout,
  type MachineFamily,
  type Side,
  withPartAt,
} from '~/lib/domain';

export const catalog = indexCatalog(demoCatalog);
export const modular = tamarackM4;
export const split = sedgeS6;

export function start(crop: CropId, family: MachineFamily = modular, opts: Parameters<typeof starterLayout>[3] = {}): Layout {
  return starterLayout(family, crop, demoCatalog, opts);
}

export function check(layout: Layout, family: MachineFamily = modular): Finding[] {
  return checkLayout(family, catalog, layout);
}

export function codes(findings: readonly Finding[]): FindingCode[] {
  return findings.map((f) => f.code);
}

// Layouts are edited through the domain's own layout edits (src/lib/domain/layout-edits.ts).

/** The layout with the element at (position, side) replaced (or added). */
export function setElement(layout: Layout, position: number, side: Side, partNumber: string): Layout {
  return placePart(layout, elementPlace(position, side), partNumber);
}

export function removeElement(layout: Layout, position: number, side: Side): Layout {
  return withPartAt(layout, elementPlace(position, side), null);
}

export function setBar(layout: Layout, row: number, position: number, partNumber: string): Layout {
  return placePart(layout, barPlace(row, position), partNumber);
}
