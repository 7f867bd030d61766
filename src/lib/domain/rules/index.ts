/**
 * checkLayout: everything that will not bolt on, will work badly for the crop, or deserves
 * advice, for a layout on its machine family. Pure, never throws on a schema-valid layout,
 * and cheap enough to run on every edit (index the catalog once with `indexCatalog` when
 * checking many layouts).
 */
import { asCatalogIndex, indexFamily, type CatalogIndex } from '~/lib/domain/catalog';
import { cropPrograms } from '~/lib/domain/crops';
import type { CatalogPart, Finding, Layout, MachineFamily, Severity } from '~/lib/domain/schemas';
import type { RuleContext } from './context';
import { checkCoverPlates } from './cover-plates';
import { checkElements } from './elements';
import { checkRotorBars } from './rotor-bars';
import { checkSettings } from './settings';

const SEVERITY_RANK: Record<Severity, number> = { 'blocks-fit': 0, 'hurts-crop': 1, advice: 2 };

/** Findings, most serious first; within a severity in the order the checks met them. */
export function checkLayout(family: MachineFamily, catalog: readonly CatalogPart[] | CatalogIndex, layout: Layout): Finding[] {
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
