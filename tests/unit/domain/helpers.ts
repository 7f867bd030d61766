import {
  checkLayout,
  demoCatalog,
  indexCatalog,
  sedgeS6,
  starterLayout,
  tamarackM4,
  type CropId,
  type Finding,
  type FindingCode,
  type Layout,
  type MachineFamily,
  type Side,
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

/** The layout with the element at (position, side) replaced (or added). */
export function setElement(layout: Layout, position: number, side: Side, partNumber: string): Layout {
  const elements = layout.elements.filter((e) => !(e.position === position && e.side === side));
  elements.push({ position, side, partNumber });
  return { ...layout, elements };
}

export function removeElement(layout: Layout, position: number, side: Side): Layout {
  return { ...layout, elements: layout.elements.filter((e) => !(e.position === position && e.side === side)) };
}

export function setBar(layout: Layout, row: number, position: number, partNumber: string): Layout {
  const rotorBars = layout.rotorBars.filter((b) => !(b.row === row && b.position === position));
  rotorBars.push({ row, position, partNumber });
  return { ...layout, rotorBars };
}
