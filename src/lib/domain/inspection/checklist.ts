/**
 * Inspection checklist: the lines generated from what is installed, the conditions a person ticks,
 * the measurements each line accepts, a suggested severity, the counts, and the replacement parts
 * flagged lines turn into.
 */
import { z } from 'zod';
import type { CatalogPart, Layout, MachineFamily, Side } from '~/lib/domain/schemas';
import { coverPlace, elementPlace } from '~/lib/domain/places';
import { barKindName, barRowWords, placeLabel } from '~/lib/domain/vocabulary';
import { capitalise, countOf } from '~/lib/domain/words';
import { clearanceTolerance, parseClearanceReadingKey, surveyFromMeasurements } from './survey';
import { assessWear } from './wear';
import { rotorModel } from '~/lib/domain/rotor';

// ---------------------------------------------------------------------------------------------
// Checklist lines

/** element: a concave, grate or modular element; cover: a cage-top cover plate; row: a rotor bar row. */
export type ChecklistKind = 'element' | 'cover' | 'row' | 'survey';

export const inspectionSeveritySchema = z.enum(['ok', 'watch', 'replace']);
export type InspectionSeverity = z.infer<typeof inspectionSeveritySchema>;

export const SEVERITY_TEXT: Readonly<Record<InspectionSeverity, { label: string; hint: string }>> = {
  ok: { label: 'Serviceable', hint: 'Fit for the season as it is' },
  watch: { label: 'Keep an eye on', hint: 'Usable now; check again after the next hard field' },
  replace: { label: 'Replace', hint: 'Order a replacement before the season' },
};

export const conditionIdSchema = z.enum(['bent-bars', 'wires-missing', 'edge-wear', 'weld-cracked', 'bolts-loose', 'plate-warped']);
export type ConditionId = z.infer<typeof conditionIdSchema>;

export interface ConditionText {
  id: ConditionId;
  label: string;
  /** What to look for, in a few words. */
  hint: string;
  appliesTo: readonly ChecklistKind[];
}

/** What a person may find, in our own words, and on which kind of line it can be ticked. */
export const CONDITIONS: readonly ConditionText[] = [
  {
    id: 'bent-bars',
    label: 'Bent bars',
    hint: 'Bars pushed out of line, most often by a stone or other hard object taken in',
    appliesTo: ['element', 'row'],
  },
  {
    id: 'wires-missing',
    label: 'Missing or broken wires',
    hint: 'Gaps in the wire rows, or wires snapped or pulled out of their holes',
    appliesTo: ['element'],
  },
  {
    id: 'edge-wear',
    label: 'Worn leading edge',
    hint: 'The edge the crop meets first is rounded off or thinned',
    appliesTo: ['element', 'row'],
  },
  {
    id: 'weld-cracked',
    label: 'Cracked weld',
    hint: 'A hairline or open crack along a weld or a frame corner',
    appliesTo: ['element', 'cover', 'row'],
  },
  {
    id: 'bolts-loose',
    label: 'Loose or missing bolts',
    hint: 'Bolts that turn by hand, lost nuts, or empty holes',
    appliesTo: ['element', 'cover', 'row'],
  },
  {
    id: 'plate-warped',
    label: 'Dented or warped plate',
    hint: 'The plate no longer lies flat against the cage top',
    appliesTo: ['cover'],
  },
];

const conditionById = new Map(CONDITIONS.map((c) => [c.id, c] as const));

export function conditionText(id: ConditionId): ConditionText {
  return conditionById.get(id)!;
}

export function conditionsFor(kind: ChecklistKind): ConditionText[] {
  return CONDITIONS.filter((c) => c.appliesTo.includes(kind));
}

/** A line of the checklist before it is stored: where, what part, and what it is called. */
export interface ChecklistLine {
  placeKey: string;
  kind: ChecklistKind;
  partNumber: string | null;
  label: string;
  /** Measurements to start from (the survey starts with the set clearance and its tolerance). */
  measurements: Record<string, number>;
}

export const SURVEY_KEY = 'survey';
export const rowKey = (row: number) => `row:${row}`;

/** The kind of line a stored place key names. */
export function checklistKind(placeKey: string): ChecklistKind | null {
  if (placeKey === SURVEY_KEY) return 'survey';
  if (/^element:\d+:(left|right)$/.test(placeKey)) return 'element';
  if (/^cover:\d+:(left|right)$/.test(placeKey)) return 'cover';
  if (/^row:\d+$/.test(placeKey)) return 'row';
  return null;
}

/**
 * The checklist for what is installed: every element (front to rear, left then right), every
 * cover plate, every rotor bar row that carries bars, and the clearance survey last.
 */
export function buildChecklist(family: MachineFamily, layout: Layout, catalog: readonly CatalogPart[]): ChecklistLine[] {
  const byNumber = new Map(catalog.map((p) => [p.partNumber, p] as const));
  const name = (pn: string) => byNumber.get(pn)?.name ?? pn;
  const lines: ChecklistLine[] = [];

  const elements = [...layout.elements].sort((a, b) => a.position - b.position || (a.side === b.side ? 0 : a.side === 'left' ? -1 : 1));
  for (const e of elements) {
    lines.push({
      placeKey: `element:${e.position}:${e.side}`,
      kind: 'element',
      partNumber: e.partNumber,
      label: `${placeLabel(elementPlace(e.position, e.side))}: ${name(e.partNumber)}`,
      measurements: {},
    });
  }

  const plates = [...layout.coverPlates].sort((a, b) => a.section - b.section || a.side.localeCompare(b.side));
  for (const c of plates) {
    lines.push({
      placeKey: `cover:${c.section}:${c.side}`,
      kind: 'cover',
      partNumber: c.partNumber,
      label: `${placeLabel(coverPlace(c.section, c.side))}: ${name(c.partNumber)}`,
      measurements: {},
    });
  }

  for (const row of family.rotorBarRows) {
    const bars = layout.rotorBars.filter((b) => b.row === row.index);
    if (bars.length === 0) continue;
    lines.push({
      placeKey: rowKey(row.index),
      kind: 'row',
      partNumber: null,
      label: `${capitalise(barRowWords(row.index))}: ${describeRowBars(
        bars.map((b) => b.partNumber),
        byNumber,
      )}`,
      measurements: {},
    });
  }

  lines.push({
    placeKey: SURVEY_KEY,
    kind: 'survey',
    partNumber: null,
    label: 'Clearance survey, rotor to elements',
    measurements: { setClearanceMm: layout.clearanceMm, toleranceMm: clearanceTolerance(layout.clearanceMm) },
  });
  return lines;
}

function describeRowBars(partNumbers: string[], byNumber: ReadonlyMap<string, CatalogPart>): string {
  const counts = new Map<string, number>();
  for (const pn of partNumbers) {
    const p = byNumber.get(pn);
    const what =
      p?.kind === 'rotor-bar'
        ? barKindName(p.barKind).replace(/ bar$/, '') + (p.barKind === 'straight' ? ' (one across two in-line mounts)' : '')
        : pn;
    counts.set(what, (counts.get(what) ?? 0) + 1);
  }
  const total = partNumbers.length;
  const parts = [...counts].map(([what, n]) => `${n} ${what}`);
  return `${countOf(total, 'bar')} (${parts.join(', ')})`;
}

// ---------------------------------------------------------------------------------------------
// Measurements a line accepts, and the severity the findings suggest

export const MAX_WEAR_MM = 50;
export const MAX_CLEARANCE_READING_MM = 100;

/** Which measurement keys a line of this kind accepts, with their range in mm. */
export function measurementAllowed(kind: ChecklistKind, family: MachineFamily, key: string): { max: number } | null {
  if (kind === 'element' || kind === 'row') return key === 'wearMm' ? { max: MAX_WEAR_MM } : null;
  if (kind !== 'survey') return null;
  if (key === 'setClearanceMm') return { max: MAX_CLEARANCE_READING_MM };
  if (key === 'toleranceMm') return { max: 20 };
  const at = parseClearanceReadingKey(key);
  if (at && family.positions.some((p) => p.index === at.position)) return { max: MAX_CLEARANCE_READING_MM };
  return null;
}

/** What the findings on a line suggest; the person decides. */
export function suggestSeverity(
  kind: ChecklistKind,
  conditions: readonly ConditionId[],
  measurements: Readonly<Record<string, number>>,
  family?: MachineFamily,
): InspectionSeverity {
  let worst: InspectionSeverity = conditions.length > 0 ? 'watch' : 'ok';
  const raise = (s: InspectionSeverity) => {
    if (SEVERITY_RANK[s] > SEVERITY_RANK[worst]) worst = s;
  };
  const wear = measurements.wearMm;
  if ((kind === 'element' || kind === 'row') && wear !== undefined) raise(assessWear(wear).verdict);
  if (kind === 'survey' && family && surveyFromMeasurements(family, measurements).uneven) raise('watch');
  return worst;
}

export const SEVERITY_RANK: Readonly<Record<InspectionSeverity, number>> = { ok: 0, watch: 1, replace: 2 };

// ---------------------------------------------------------------------------------------------
// Flagged lines become a parts request

export interface InspectedLine {
  placeKey: string;
  partNumber: string | null;
  severity: InspectionSeverity;
}

export interface ReplacementLine {
  partNumber: string;
  description: string;
  hand: Side | null;
  quantity: number;
  unitPriceCents: number;
}

/**
 * The parts that lines marked "replace" call for: an element or cover plate is replaced by the
 * same part number (so the same hand); a rotor bar row by the bars bolted in it now (from
 * `layout`) AND by the bars of its opposite row (180° around, from `family`): bars are replaced as
 * matched sets so the rotor stays in balance (common practice; see rotor.ts). A row is counted
 * once even when it and its opposite are both marked. Equal part numbers are added up; the order follows the checklist. Lines whose part
 * is not in the catalog are left out and returned in `unknown`.
 */
export function replacementLines(
  lines: readonly InspectedLine[],
  layout: Layout | null,
  catalog: readonly CatalogPart[],
  family: MachineFamily | null,
): { lines: ReplacementLine[]; unknown: string[] } {
  const byNumber = new Map(catalog.map((p) => [p.partNumber, p] as const));
  const out = new Map<string, ReplacementLine>();
  const unknown: string[] = [];
  const add = (pn: string, quantity: number) => {
    const part = byNumber.get(pn);
    if (!part) {
      if (!unknown.includes(pn)) unknown.push(pn);
      return;
    }
    const have = out.get(pn);
    if (have) {
      have.quantity += quantity;
      return;
    }
    out.set(pn, {
      partNumber: pn,
      description: part.name,
      hand: part.kind === 'element' ? part.hand : part.kind === 'cover-plate' ? part.side : null,
      quantity,
      unitPriceCents: part.priceCents,
    });
  };
  const rows = new Set<number>();
  const opposite = family ? rotorModel(family).oppositeRow : new Map<number, number>();
  for (const line of lines) {
    if (line.severity !== 'replace') continue;
    const kind = checklistKind(line.placeKey);
    if ((kind === 'element' || kind === 'cover') && line.partNumber) add(line.partNumber, 1);
    if (kind === 'row' && layout) {
      const row = Number(line.placeKey.slice(4));
      for (const r of [row, opposite.get(row)]) {
        if (r === undefined || rows.has(r)) continue;
        rows.add(r);
        for (const b of layout.rotorBars.filter((x) => x.row === r)) add(b.partNumber, 1);
      }
    }
  }
  return { lines: [...out.values()], unknown };
}

// ---------------------------------------------------------------------------------------------

export interface ChecklistCounts {
  ok: number;
  watch: number;
  replace: number;
  total: number;
}

export function countSeverities(lines: readonly { severity: InspectionSeverity }[]): ChecklistCounts {
  const c: ChecklistCounts = { ok: 0, watch: 0, replace: 0, total: lines.length };
  for (const l of lines) c[l.severity] += 1;
  return c;
}
