/** What every rule sees: the indexed family and catalog, the layout, the crop, and the sink. */
import type { CatalogIndex, FamilyIndex } from '~/lib/domain/catalog';
import type { CropProgram } from '~/lib/domain/crops';
import type { Finding, FindingCode, Layout, MachineFamily, Place, Severity } from '~/lib/domain/schemas';

export interface RuleContext {
  readonly family: MachineFamily;
  readonly fam: FamilyIndex;
  readonly catalog: CatalogIndex;
  readonly layout: Layout;
  readonly crop: CropProgram;
  readonly findings: Finding[];
}

export function emit(
  ctx: RuleContext,
  code: FindingCode,
  severity: Severity,
  places: Place[],
  title: string,
  explanation: string,
  fix: string,
): void {
  ctx.findings.push({ code, severity, places, title, explanation, fix });
}
