/**
 * Pre-season inspection: the checklist generated from what is installed, the findings a person
 * ticks, the two measurements a technician takes (bar wear under a straight edge, and a
 * clearance survey around the cage), a suggested severity, and the replacement parts that
 * flagged lines turn into. Pure: the server, the checklist island and the tests share it.
 *
 * Lengths are millimetres throughout; the pages convert for people who work in inches.
 */
import { z } from 'zod';
import { rotorModel } from './rotor';
import type { CatalogPart, Layout, MachineFamily, Side } from './schemas';

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

export const conditionIdSchema = z.enum([
  'bent-bars',
  'wires-missing',
  'edge-wear',
  'weld-cracked',
  'bolts-loose',
  'plate-warped',
]);
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

const sideWord = (s: Side) => (s === 'left' ? 'left' : 'right');

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
      label: `Position ${e.position}, ${sideWord(e.side)}: ${name(e.partNumber)}`,
      measurements: {},
    });
  }

  const plates = [...layout.coverPlates].sort((a, b) => a.section - b.section || a.side.localeCompare(b.side));
  for (const c of plates) {
    lines.push({
      placeKey: `cover:${c.section}:${c.side}`,
      kind: 'cover',
      partNumber: c.partNumber,
      label: `Cage-top section ${c.section}, ${sideWord(c.side)}: ${name(c.partNumber)}`,
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
      label: `Rotor bar row ${row.index}: ${describeRowBars(bars.map((b) => b.partNumber), byNumber)}`,
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
    const what = p?.kind === 'rotor-bar' ? BAR_WORD[p.barKind] : pn;
    counts.set(what, (counts.get(what) ?? 0) + 1);
  }
  const total = partNumbers.length;
  const parts = [...counts].map(([what, n]) => `${n} ${what}`);
  return `${total} ${total === 1 ? 'bar' : 'bars'} (${parts.join(', ')})`;
}

const BAR_WORD: Record<string, string> = {
  rasp: 'rasp',
  'smooth-rasp': 'smooth-top rasp',
  'spike-rasp': 'spike rasp',
  straight: 'straight (one across two in-line mounts)',
  discharge: 'discharge',
};

// ---------------------------------------------------------------------------------------------
// Measurement one: bar wear depth under a straight edge

/**
 * Replace a bar whose wear, measured as the gap under a straight edge laid across it, is past
 * about 6 mm (a quarter inch). Common practice, no published source.
 */
export const WEAR_REPLACE_MM = 6;
/** Our own early warning: two thirds of the way to the limit, say so before it is reached. */
export const WEAR_WATCH_MM = 4;

export interface WearVerdict {
  verdict: InspectionSeverity;
  depthMm: number;
  limitMm: number;
  /** Wear left before the limit; negative once past it. */
  remainingMm: number;
}

export function assessWear(depthMm: number, limitMm = WEAR_REPLACE_MM): WearVerdict {
  if (!Number.isFinite(depthMm) || depthMm < 0) throw new RangeError('wear depth must be a number of millimetres, zero or more');
  const watchAt = (limitMm * WEAR_WATCH_MM) / WEAR_REPLACE_MM;
  const verdict: InspectionSeverity = depthMm > limitMm ? 'replace' : depthMm >= watchAt ? 'watch' : 'ok';
  return { verdict, depthMm, limitMm, remainingMm: round2(limitMm - depthMm) };
}

// ---------------------------------------------------------------------------------------------
// Measurement two: the clearance survey

export const clearanceEndSchema = z.enum(['front', 'rear']);
export type ClearanceEnd = z.infer<typeof clearanceEndSchema>;

export const clearanceReadingKey = (position: number, side: Side, end: ClearanceEnd) => `clearance:${position}:${side}:${end}`;

/** The reading a survey measurement key names, or null. */
export function parseClearanceReadingKey(key: string): { position: number; side: Side; end: ClearanceEnd } | null {
  const m = /^clearance:(\d+):(left|right):(front|rear)$/.exec(key);
  if (!m) return null;
  return { position: Number(m[1]), side: m[2] as Side, end: m[3] as ClearanceEnd };
}

/**
 * How uneven the rotor-to-element clearance may be before it is flagged: a fifth of the set
 * clearance, never below 1.5 mm. A few millimetres of unevenness lets small-grain heads slip
 * through unthreshed while corn, run wide, hardly notices (common practice, no published
 * source); scaling with the set clearance is our own working figure.
 */
export function clearanceTolerance(setClearanceMm: number): number {
  return Math.max(1.5, round1(setClearanceMm * 0.2));
}

export interface ClearanceReading {
  position: number;
  side: Side;
  end: ClearanceEnd;
  mm: number;
}

export type SurveyFindingKind = 'side-to-side' | 'front-to-rear' | 'off-setting';

export interface SurveyFinding {
  kind: SurveyFindingKind;
  position: number;
  /** The side (front-to-rear) or the end (side-to-side) the finding concerns. */
  where: Side | ClearanceEnd;
  /** How far apart the two readings are, or how far off the set clearance, mm. */
  differenceMm: number;
  message: string;
}

export interface PositionSurvey {
  position: number;
  readings: Partial<Record<`${Side}-${ClearanceEnd}`, number>>;
  minMm: number | null;
  maxMm: number | null;
  /** Widest minus narrowest reading in the position. */
  spreadMm: number | null;
  uneven: boolean;
}

export interface ClearanceSurvey {
  toleranceMm: number;
  positions: PositionSurvey[];
  findings: SurveyFinding[];
  readingCount: number;
  uneven: boolean;
}

/**
 * Compare the readings taken front and rear of each position on both sides. A pair of readings
 * further apart than the tolerance is a finding: left against right at one end of a position
 * (the cage sits crooked across the rotor), or front against rear on one side (it is tilted
 * along the rotor). With the set clearance given, threshing-zone readings further from it than
 * the tolerance are findings too (the indicator no longer tells the truth).
 */
export function surveyClearance(
  family: MachineFamily,
  readings: readonly ClearanceReading[],
  toleranceMm: number,
  setClearanceMm?: number,
): ClearanceSurvey {
  if (!(toleranceMm > 0)) throw new RangeError('tolerance must be more than zero');
  const findings: SurveyFinding[] = [];
  const positions: PositionSurvey[] = [];
  let readingCount = 0;
  const over = (d: number) => d > toleranceMm + 1e-9;
  for (const pos of family.positions) {
    const mine = readings.filter((r) => r.position === pos.index);
    const at = (side: Side, end: ClearanceEnd) => mine.find((r) => r.side === side && r.end === end)?.mm;
    const table: PositionSurvey['readings'] = {};
    for (const r of mine) table[`${r.side}-${r.end}`] = r.mm;
    readingCount += mine.length;
    const values = mine.map((r) => r.mm);
    const min = values.length ? Math.min(...values) : null;
    const max = values.length ? Math.max(...values) : null;
    let uneven = false;
    for (const end of ['front', 'rear'] as const) {
      const l = at('left', end);
      const r = at('right', end);
      if (l === undefined || r === undefined) continue;
      const d = round2(Math.abs(l - r));
      if (over(d)) {
        uneven = true;
        const wider = l > r ? 'left' : 'right';
        findings.push({
          kind: 'side-to-side',
          position: pos.index,
          where: end,
          differenceMm: d,
          message: `Position ${pos.index}, ${end}: the ${wider} side is ${fmt(d)} mm wider than the other (left ${fmt(l)}, right ${fmt(r)} mm)`,
        });
      }
    }
    for (const side of ['left', 'right'] as const) {
      const f = at(side, 'front');
      const r = at(side, 'rear');
      if (f === undefined || r === undefined) continue;
      const d = round2(Math.abs(f - r));
      if (over(d)) {
        uneven = true;
        const wider = f > r ? 'front' : 'rear';
        findings.push({
          kind: 'front-to-rear',
          position: pos.index,
          where: side,
          differenceMm: d,
          message: `Position ${pos.index}, ${side}: the ${wider} end is ${fmt(d)} mm wider than the other (front ${fmt(f)}, rear ${fmt(r)} mm)`,
        });
      }
    }
    if (setClearanceMm !== undefined && pos.zone === 'threshing') {
      for (const r of mine) {
        const d = round2(Math.abs(r.mm - setClearanceMm));
        if (over(d)) {
          uneven = true;
          findings.push({
            kind: 'off-setting',
            position: pos.index,
            where: r.side,
            differenceMm: d,
            message: `Position ${pos.index}, ${r.side}, ${r.end}: ${fmt(r.mm)} mm measured against ${fmt(setClearanceMm)} mm set`,
          });
        }
      }
    }
    positions.push({ position: pos.index, readings: table, minMm: min, maxMm: max, spreadMm: min === null || max === null ? null : round2(max - min), uneven });
  }
  return { toleranceMm, positions, findings, readingCount, uneven: findings.length > 0 };
}

/** The readings stored in a survey line's measurements. */
export function readingsFromMeasurements(measurements: Readonly<Record<string, number>>): ClearanceReading[] {
  const out: ClearanceReading[] = [];
  for (const [key, mm] of Object.entries(measurements)) {
    const at = parseClearanceReadingKey(key);
    if (at && Number.isFinite(mm)) out.push({ ...at, mm });
  }
  return out;
}

/** The survey a stored survey line describes (its own tolerance and set clearance). */
export function surveyFromMeasurements(family: MachineFamily, measurements: Readonly<Record<string, number>>): ClearanceSurvey {
  const set = measurements.setClearanceMm;
  const tolerance = measurements.toleranceMm ?? (set !== undefined ? clearanceTolerance(set) : 2);
  return surveyClearance(family, readingsFromMeasurements(measurements), tolerance, set);
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

function round1(n: number) {
  return Math.round(n * 10) / 10;
}
function round2(n: number) {
  return Math.round(n * 100) / 100;
}
function fmt(n: number) {
  return (Math.round(n * 10) / 10).toFixed(1);
}
