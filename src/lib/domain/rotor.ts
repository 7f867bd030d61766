/**
 * The rotor's bar mountings as a technician sees them, shared by the rules, the starter layout,
 * the planner and the inspection checklist:
 *
 * - Opposite rows: a row's partner 180° around the rotor. Bars on opposite places (opposite row,
 *   same position along the rotor) are a matched set: same kind, same mass.
 * - Straight-bar spans: two in-line rasp-bar places of one row next to each other. A straight
 *   bar is ONE part bolted across both mounts; in a layout it is listed once, at the front place
 *   of its span (the anchor), and the rear place of the span then carries nothing else. When it
 *   comes off, spike rasp bars go on those two mounts (common practice, no published source).
 * - Discharge mountings: the rear position, and one position ahead of it for an extra pair.
 *
 * Out-of-balance force (physics): a mass m at radius r turning at ω rad/s pulls on its bearings
 * with F = m·r·ω² (centripetal force; any standard mechanics text, e.g. Meriam & Kraige,
 * Engineering Mechanics: Dynamics, ch. 3). The permissible residual unbalance of a rigid rotor
 * is e·ω ≤ G (ISO 21940-11, balance quality grade G in mm/s), so a rotor of mass M may carry an
 * out-of-balance force of at most M·G·ω at speed ω.
 */
import { indexFamily, type CatalogIndex } from './catalog';
import type { BarKind, Layout, MachineFamily, RotorBarPart } from './schemas';

/**
 * Balance quality grade for the threshing rotor, mm/s: G 16, the grade ISO 21940-11 lists for
 * parts of agricultural machinery (from memory of the standard's table of grades).
 */
export const ROTOR_BALANCE_GRADE_MM_S = 16;

/**
 * The threshing rotor's own mass when a family does not state it, kg (invented for the demo; a
 * family's `rotorMassKg` overrides it).
 */
export const DEFAULT_ROTOR_MASS_KG = 450;

/**
 * Two bars of one kind on opposite places are a matched set when their catalog masses differ by
 * at most this, kg: about the mass of one mounting bolt with its nut. Cagewright's tolerance;
 * bars are replaced as matched sets (common practice, no published source for a figure).
 */
export const BALANCE_MASS_TOLERANCE_KG = 0.05;

export const NEWTONS_PER_LBF = 4.4482216152605; // NIST SP 811, Appendix B (exact by definition of lbf)

/** Angular speed, rad/s, of `rpm` revolutions per minute. */
export const radPerSecond = (rpm: number): number => (2 * Math.PI * rpm) / 60;

/** F = m·r·ω², newtons, for `massKg` at `radiusM` turning at `rpm`. */
export function outOfBalanceForceN(massKg: number, radiusM: number, rpm: number): number {
  const w = radPerSecond(rpm);
  return massKg * radiusM * w * w;
}

/** ISO 21940-11: the largest residual out-of-balance force for a rotor of `rotorMassKg` at grade G. */
export function permissibleForceN(rotorMassKg: number, rpm: number, gradeMmS = ROTOR_BALANCE_GRADE_MM_S): number {
  return rotorMassKg * (gradeMmS / 1000) * radPerSecond(rpm);
}

export interface StraightSpan {
  row: number;
  /** The front place (where the layout lists the bar) and the rear place it also covers. */
  front: number;
  rear: number;
}

export interface RotorModel {
  /** row → its opposite row (180° around), for rows that have one. */
  readonly oppositeRow: ReadonlyMap<number, number>;
  /** 'row:position' of a span's front place → the span. */
  readonly spanByFront: ReadonlyMap<string, StraightSpan>;
  /** 'row:position' of a span's rear place → the span. */
  readonly spanByRear: ReadonlyMap<string, StraightSpan>;
  readonly spans: readonly StraightSpan[];
  /** Rows of the rear discharge pair and of the extra pair one position ahead (may be empty). */
  readonly dischargeRearRows: readonly number[];
  readonly dischargeExtraRows: readonly number[];
}

const cache = new WeakMap<MachineFamily, RotorModel>();

const isOpposite = (a: number, b: number) => Math.abs(((((a - b) % 360) + 360) % 360) - 180) < 1;

export function rotorModel(family: MachineFamily): RotorModel {
  const hit = cache.get(family);
  if (hit) return hit;
  const oppositeRow = new Map<number, number>();
  for (const r of family.rotorBarRows) {
    const o = family.rotorBarRows.find((x) => x.index !== r.index && isOpposite(x.angleDeg, r.angleDeg));
    if (o) oppositeRow.set(r.index, o.index);
  }
  const spans: StraightSpan[] = [];
  const rows = new Map<number, number[]>();
  for (const p of family.rotorBarPlaces) if (p.inLine) rows.set(p.row, [...(rows.get(p.row) ?? []), p.position]);
  for (const [row, positions] of rows) {
    positions.sort((a, b) => a - b);
    for (let i = 0; i + 1 < positions.length; i++) {
      if (positions[i + 1] === positions[i]! + 1) {
        spans.push({ row, front: positions[i]!, rear: positions[i + 1]! });
        i++;
      }
    }
  }
  const spanByFront = new Map(spans.map((s) => [`${s.row}:${s.front}`, s] as const));
  const spanByRear = new Map(spans.map((s) => [`${s.row}:${s.rear}`, s] as const));
  // The rear pair on the first row and its opposite; the extra pair on the next row that has an
  // opposite and is not already used (so the four discharge bars point four ways).
  const pairs: number[][] = [];
  const used = new Set<number>();
  for (const r of family.rotorBarRows) {
    const o = oppositeRow.get(r.index);
    if (o === undefined || used.has(r.index) || used.has(o)) continue;
    pairs.push([r.index, o]);
    used.add(r.index).add(o);
  }
  const model: RotorModel = {
    oppositeRow,
    spanByFront,
    spanByRear,
    spans,
    dischargeRearRows: pairs[0] ?? [],
    dischargeExtraRows: pairs[1] ?? [],
  };
  cache.set(family, model);
  return model;
}

/** Whether a discharge bar belongs at (row, position) in the starter layout and the planner. */
export function isDischargeMount(family: MachineFamily, row: number, position: number): boolean {
  const m = rotorModel(family);
  return (
    (position === family.rearPosition && m.dischargeRearRows.includes(row)) ||
    (position === family.rearPosition - 1 && m.dischargeExtraRows.includes(row))
  );
}

/** One bar mounting as the balance sees it: what kind sits there and how much mass. */
export interface MountLoad {
  kind: BarKind | null;
  massKg: number;
  /** The part bolted there (a straight bar shows on both places of its span). */
  part: RotorBarPart | null;
}

/**
 * The load on every bar mounting of the family ('row:position' → load); a mounting with nothing
 * (or an unknown / foreign part) carries nothing. A straight bar's mass is shared by the two
 * mounts it spans.
 */
export function mountLoads(family: MachineFamily, catalog: CatalogIndex, layout: Layout): Map<string, MountLoad> {
  const fam = indexFamily(family);
  const m = rotorModel(family);
  const out = new Map<string, MountLoad>();
  for (const key of fam.barPlaceByKey.keys()) out.set(key, { kind: null, massKg: 0, part: null });
  for (const b of layout.rotorBars) {
    const key = `${b.row}:${b.position}`;
    const slot = out.get(key);
    if (!slot || slot.part) continue;
    const part = catalog.byPartNumber.get(b.partNumber);
    if (!part || part.kind !== 'rotor-bar' || part.fitGroup !== family.fitGroup) continue;
    const span = part.barKind === 'straight' ? m.spanByFront.get(key) : undefined;
    if (span) {
      const rearKey = `${span.row}:${span.rear}`;
      const rear = out.get(rearKey);
      out.set(key, { kind: 'straight', massKg: part.massKg / 2, part });
      if (rear && !rear.part) out.set(rearKey, { kind: 'straight', massKg: part.massKg / 2, part });
    } else {
      out.set(key, { kind: part.barKind, massKg: part.massKg, part });
    }
  }
  return out;
}
