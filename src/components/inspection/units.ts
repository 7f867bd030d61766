/** Lengths in the person's own units for the checklist's inputs; stored in millimetres. */
import { formatLength, mm, MM_PER_INCH, type UnitSystem } from '~/lib/domain/units';

export const unitLabel = (u: UnitSystem) => (u === 'imperial' ? 'in' : 'mm');

/** A stored millimetre value as the text an input shows. */
export function toInput(mm: number | undefined, u: UnitSystem): string {
  if (mm === undefined) return '';
  const v = u === 'imperial' ? mm / MM_PER_INCH : mm;
  return String(Math.round(v * (u === 'imperial' ? 1000 : 10)) / (u === 'imperial' ? 1000 : 10));
}

/** What a person typed, in millimetres: null when cleared, NaN when it is not a number. */
export function fromInput(text: string, u: UnitSystem): number | null {
  const t = text.trim().replace(',', '.');
  if (t === '') return null;
  if (!/^\d*\.?\d+$|^\d+\.$/.test(t)) return Number.NaN;
  const v = Number(t);
  return Math.round((u === 'imperial' ? v * MM_PER_INCH : v) * 100) / 100;
}

/** A length for reading: the one length formatter, two decimals of an inch or one of a millimetre. */
export function showLength(value: number, u: UnitSystem): string {
  return formatLength(mm(value), u, u === 'imperial' ? 2 : 1);
}

/** A survey finding in the person's units (the domain's own message is in millimetres). */
export function describeSurveyFinding(
  f: { kind: 'side-to-side' | 'front-to-rear' | 'off-setting'; position: number; where: string; differenceMm: number },
  u: UnitSystem,
): string {
  const d = showLength(f.differenceMm, u);
  if (f.kind === 'side-to-side') return `Position ${f.position}, ${f.where} end: left and right differ by ${d}`;
  if (f.kind === 'front-to-rear') return `Position ${f.position}, ${f.where} side: front and rear differ by ${d}`;
  return `Position ${f.position}, ${f.where} side: ${d} off the set clearance`;
}
