/** Inspection measurement two: the clearance survey around the cage. */
import { z } from 'zod';
import type { MachineFamily, Side } from '~/lib/domain/schemas';
import { fmt, round1, round2 } from './numbers';

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
    positions.push({
      position: pos.index,
      readings: table,
      minMm: min,
      maxMm: max,
      spreadMm: min === null || max === null ? null : round2(max - min),
      uneven,
    });
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
