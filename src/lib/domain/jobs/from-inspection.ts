/**
 * A job card's steps from a finished inspection: one step per line marked replace or watch, in
 * the inspection's order, with what was found on it. Lines marked replace bring their part.
 */
import type { JobStepKind } from './kinds';
import { listWords } from '~/lib/domain/words';

export interface InspectionLine {
  label: string;
  partNumber: string | null;
  severity: 'ok' | 'watch' | 'replace';
  /** What was found, in words ("bent bars"). */
  findings: readonly string[];
  note: string;
}

export function jobFromInspection(lines: readonly InspectionLine[]): {
  steps: { kind: JobStepKind; text: string; heavy: boolean; partNumbers: string[] }[];
  parts: { partNumber: string; quantity: number; source: 'on_order' }[];
} {
  const steps: { kind: JobStepKind; text: string; heavy: boolean; partNumbers: string[] }[] = [];
  const parts = new Map<string, number>();
  for (const l of lines) {
    if (l.severity === 'ok') continue;
    const found = l.findings.length ? ` (found: ${listWords(l.findings.map((f) => f.toLowerCase()))})` : '';
    const note = l.note.trim() ? ` Note: ${l.note.trim()}` : '';
    if (l.severity === 'replace') {
      steps.push({
        kind: 'replace',
        text: `Replace ${l.partNumber ?? 'the part'} at ${l.label}${found}.${note}`,
        heavy: false,
        partNumbers: l.partNumber ? [l.partNumber] : [],
      });
      if (l.partNumber) parts.set(l.partNumber, (parts.get(l.partNumber) ?? 0) + 1);
    } else {
      steps.push({
        kind: 'look',
        text: `Look again at ${l.partNumber ? `${l.partNumber} at ` : ''}${l.label}${found}: usable now, check its wear.${note}`,
        heavy: false,
        partNumbers: [],
      });
    }
  }
  return { steps, parts: [...parts].map(([partNumber, quantity]) => ({ partNumber, quantity, source: 'on_order' as const })) };
}
