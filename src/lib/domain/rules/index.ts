/**
 * checkLayout: everything that will not bolt on, will work badly for the crop, or deserves
 * advice, for a layout on its machine family. Pure, never throws on a schema-valid layout,
 * and cheap enough to run on every edit (index the catalog once with `indexCatalog` when
 * checking many layouts).
 */
import { asCatalogIndex, indexFamily, type CatalogIndex } from '../catalog';
import { cropPrograms } from '../crops';
import { placeKey } from '../places';
import type { CatalogPart, Finding, Layout, MachineFamily, Place, Severity } from '../schemas';
import type { RuleContext } from './context';
import { checkCoverPlates } from './cover-plates';
import { checkElements } from './elements';
import { checkRotorBars } from './rotor-bars';
import { checkSettings } from './settings';

const SEVERITY_RANK: Record<Severity, number> = { 'blocks-fit': 0, 'hurts-crop': 1, advice: 2 };

/** Findings, most serious first; within a severity in the order the checks met them. */
export function checkLayout(
  family: MachineFamily,
  catalog: readonly CatalogPart[] | CatalogIndex,
  layout: Layout,
): Finding[] {
  const ctx: RuleContext = {
    family,
    fam: indexFamily(family),
    catalog: asCatalogIndex(catalog),
    layout,
    crop: cropPrograms[layout.crop],
    findings: [],
  };
  checkSettings(ctx);
  checkElements(ctx);
  checkCoverPlates(ctx);
  checkRotorBars(ctx);
  // Array.prototype.sort is stable, so order within a severity is kept.
  return ctx.findings.sort((a, b) => SEVERITY_RANK[a.severity] - SEVERITY_RANK[b.severity]);
}

export function hasBlockingFindings(findings: readonly Finding[]): boolean {
  return findings.some((f) => f.severity === 'blocks-fit');
}

export function countBySeverity(findings: readonly Finding[]): Record<Severity, number> {
  const out: Record<Severity, number> = { 'blocks-fit': 0, 'hurts-crop': 0, advice: 0 };
  for (const f of findings) out[f.severity]++;
  return out;
}

/**
 * The findings a part would raise where it is dropped: the layout with `partNumber` put at
 * `place` (replacing what is there) is checked, and the findings pinned to that place are
 * returned. The editor uses it to preview a drop; an empty result (or advice only) means the
 * rules allow the part there.
 */
export function checkPlacement(
  family: MachineFamily,
  catalog: readonly CatalogPart[] | CatalogIndex,
  layout: Layout,
  place: Place,
  partNumber: string,
): Finding[] {
  const next = placePart(layout, place, partNumber);
  const key = placeKey(place);
  return checkLayout(family, catalog, next).filter((f) => f.places.some((p) => placeKey(p) === key));
}

/** The layout with `partNumber` at `place` (a setting place leaves the layout as it is). */
export function placePart(layout: Layout, place: Place, partNumber: string): Layout {
  switch (place.kind) {
    case 'element':
      return {
        ...layout,
        elements: [
          ...layout.elements.filter((e) => !(e.position === place.position && e.side === place.side)),
          { position: place.position, side: place.side, partNumber },
        ],
      };
    case 'cover':
      return {
        ...layout,
        coverPlates: [
          ...layout.coverPlates.filter((c) => !(c.section === place.section && c.side === place.side)),
          { section: place.section, side: place.side, partNumber },
        ],
      };
    case 'bar':
      return {
        ...layout,
        rotorBars: [
          ...layout.rotorBars.filter((b) => !(b.row === place.row && b.position === place.position)),
          { row: place.row, position: place.position, partNumber },
        ],
      };
    case 'setting':
      return layout;
  }
}
