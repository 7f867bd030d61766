/**
 * The exact choice of which physical part goes to which place, one kind of part at a time
 * (elements, cover plates, rotor bars never trade places with one another, so the three
 * problems are independent and their optima add up).
 *
 * Rows are the target places; columns are the parts that could fill them — each part now on
 * the machine, each spare on the shelf (no more copies of a part number than places that take
 * it) — plus, per place, a private "buy" column for each part that may go there and, where the
 * place may stay empty, a private "leave empty" column. The cost of a pair is lexicographic:
 *
 *   1. money spent on purchases (the price of what is bought)
 *   2. number of parts bought (so a part priced at nothing still counts as a purchase)
 *   3. effort, seconds (planner/effort.ts): against the baseline that every part on the machine
 *      comes off once, a part that stays saves its lift; moving one, fitting a spare or a bought
 *      part costs the lift at the new place
 *   4. departure from the crop program (the candidate's rank)
 *
 * packed into one integer with weights large enough that no total of a lower tier reaches one
 * unit of a higher one. The Hungarian method then gives the exact optimum.
 *
 * The rotor access (a fixed time once any bar is touched, planner/effort.ts) is no sum over pairs,
 * yet it needs no place here: leaving every bar as it is costs no money and no effort, so when
 * that is allowed it is already the optimum of the bar group, and when it is not, every plan
 * touches a bar and pays the same access. Adding it to the effort afterwards keeps the optimum
 * exact.
 */
import type { CatalogIndex } from '~/lib/domain/catalog';
import type { CatalogPart } from '~/lib/domain/schemas';
import { solveAssignment } from './assignment';
import { groupOfKind, liftSeconds } from './effort';
import type { Candidate, SlotGroup, SlotPlace, SlotTarget } from './targets';

export interface Unit {
  source: 'installed' | 'shelf';
  partNumber: string;
  part: CatalogPart;
  /** Where an installed part sits now (null for a spare on the shelf). */
  at: SlotPlace | null;
  atKey: string | null;
}

export type SlotSource = 'kept' | 'moved' | 'shelf' | 'buy' | 'empty';

export interface SlotOutcome {
  slot: SlotTarget;
  source: SlotSource;
  /** The part that ends up here (null when left empty). */
  candidate: Candidate | null;
  /** The physical part used (installed or shelf); null for a purchase or an empty place. */
  unit: Unit | null;
}

export interface GroupOutcome {
  outcomes: SlotOutcome[];
  /** Parts on the machine that no place keeps: they come off and go on the shelf. */
  removed: Unit[];
}

export function groupOf(part: CatalogPart): SlotGroup {
  return groupOfKind(part.kind);
}

type Column =
  { type: 'unit'; unit: Unit } | { type: 'buy'; row: number; candidate: Candidate } | { type: 'empty'; row: number; rank: number };

const SAFE = 2 ** 52;

export function solveGroup(
  slots: readonly SlotTarget[],
  installed: readonly Unit[],
  shelf: ReadonlyMap<string, number>,
  catalog: CatalogIndex,
): GroupOutcome {
  const n = slots.length;
  // part number → row → candidate
  const accepts = new Map<string, Map<number, Candidate>>();
  slots.forEach((s, row) => {
    for (const c of s.candidates) {
      let m = accepts.get(c.part.partNumber);
      if (!m) accepts.set(c.part.partNumber, (m = new Map()));
      m.set(row, c);
    }
  });

  const columns: Column[] = [];
  const removed: Unit[] = [];
  for (const u of installed) {
    if (accepts.has(u.partNumber)) columns.push({ type: 'unit', unit: u });
    else removed.push(u);
  }
  for (const [partNumber, qty] of [...shelf].sort(([a], [b]) => a.localeCompare(b))) {
    const rows = accepts.get(partNumber);
    const part = catalog.byPartNumber.get(partNumber);
    if (!rows || !part || qty <= 0) continue;
    const copies = Math.min(qty, rows.size);
    for (let k = 0; k < copies; k++) columns.push({ type: 'unit', unit: { source: 'shelf', partNumber, part, at: null, atKey: null } });
  }
  let maxRank = 0;
  let maxPrice = 0;
  let maxLift = 0;
  const lift = (part: CatalogPart) => liftSeconds(groupOf(part), part.massKg);
  for (const c of columns) if (c.type === 'unit') maxLift = Math.max(maxLift, lift(c.unit.part));
  slots.forEach((s, row) => {
    for (const candidate of s.candidates) {
      columns.push({ type: 'buy', row, candidate });
      maxPrice = Math.max(maxPrice, candidate.part.priceCents);
      maxLift = Math.max(maxLift, lift(candidate.part));
      maxRank = Math.max(maxRank, candidate.rank);
    }
    if (s.empty) {
      columns.push({ type: 'empty', row, rank: s.empty.rank });
      maxRank = Math.max(maxRank, s.empty.rank);
    }
  });

  // Weights: each tier's whole range stays below one unit of the tier above. Effort per row lies
  // in [−maxLift, maxLift].
  const wRank = 1;
  const wEffort = n * maxRank + 1;
  const wCount = (2 * n * maxLift + 1) * wEffort;
  const wMoney = (n + 1) * wCount;
  if (wMoney * (n * maxPrice + 1) > SAFE) throw new RangeError(`planner: ${n} places are too many to solve exactly`);

  const cost = (row: number, col: number): number => {
    const c = columns[col]!;
    switch (c.type) {
      case 'unit': {
        const cand = accepts.get(c.unit.partNumber)?.get(row);
        if (!cand) return Infinity;
        if (c.unit.source === 'shelf') return lift(c.unit.part) * wEffort + cand.rank * wRank;
        return (c.unit.atKey === slots[row]!.key ? -1 : 1) * lift(c.unit.part) * wEffort + cand.rank * wRank;
      }
      case 'buy':
        return c.row === row
          ? c.candidate.part.priceCents * wMoney + wCount + lift(c.candidate.part) * wEffort + c.candidate.rank * wRank
          : Infinity;
      case 'empty':
        return c.row === row ? c.rank * wRank : Infinity;
    }
  };

  const { colOfRow } = solveAssignment(n, columns.length, cost);
  const used = new Set<number>();
  const outcomes: SlotOutcome[] = slots.map((slot, row) => {
    const colIndex = colOfRow[row]!;
    used.add(colIndex);
    const c = columns[colIndex]!;
    switch (c.type) {
      case 'unit': {
        const candidate = accepts.get(c.unit.partNumber)!.get(row)!;
        const source: SlotSource = c.unit.source === 'shelf' ? 'shelf' : c.unit.atKey === slot.key ? 'kept' : 'moved';
        return { slot, source, candidate, unit: c.unit };
      }
      case 'buy':
        return { slot, source: 'buy', candidate: c.candidate, unit: null };
      case 'empty':
        return { slot, source: 'empty', candidate: null, unit: null };
    }
  });
  const leftOver = columns.flatMap((c, i) => (c.type === 'unit' && c.unit.source === 'installed' && !used.has(i) ? [c.unit] : []));

  removed.push(...leftOver);
  return { outcomes, removed };
}
