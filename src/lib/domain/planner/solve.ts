/**
 * The exact choice of which physical part goes to which place, one kind of part at a time
 * (elements, cover plates, rotor bars never trade places with one another, so the three
 * problems are independent and their optima add up).
 *
 * Rows are the target places; columns are the parts that could fill them — each part now on
 * the machine, each spare on the shelf (no more copies of a part number than places that take
 * it) — plus, per place, a private "buy the best part for it" column and, where the place may
 * stay empty, a private "leave empty" column. The cost of a pair is lexicographic:
 *
 *   1. purchases          (buying: 1)
 *   2. parts handled      (a part that stays: −1 against the baseline that every part on the
 *                          machine comes off once; moving one: 0; fitting a spare or a bought
 *                          part: 1) — so the total is "parts taken off, moved or fitted"
 *   3. departure from the crop program (the candidate's rank)
 *   4. price of what is bought
 *
 * packed into one integer with weights large enough that no total of a lower tier reaches one
 * unit of a higher one. The Hungarian method then gives the exact optimum.
 */
import type { CatalogIndex } from '~/lib/domain/catalog';
import type { CatalogPart } from '~/lib/domain/schemas';
import { solveAssignment } from './assignment';
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
  return part.kind === 'element' ? 'element' : part.kind === 'cover-plate' ? 'cover' : 'bar';
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
  slots.forEach((s, row) => {
    const best = s.candidates[0];
    if (best) {
      columns.push({ type: 'buy', row, candidate: best });
      maxPrice = Math.max(maxPrice, best.part.priceCents);
    }
    if (s.empty) columns.push({ type: 'empty', row, rank: s.empty.rank });
    for (const c of s.candidates) maxRank = Math.max(maxRank, c.rank);
    if (s.empty) maxRank = Math.max(maxRank, s.empty.rank);
  });

  // Weights: each tier's whole range stays below one unit of the tier above.
  let wPrice = 1;
  let wRank = n * maxPrice + 1;
  let wMove = (n * maxRank + 1) * wRank;
  let wBuy = (2 * n + 1) * wMove;
  if (wBuy * (n + 1) > SAFE) {
    // Too large to stay exact: drop the price tier (a tie-break only).
    wPrice = 0;
    wRank = 1;
    wMove = n * maxRank + 1;
    wBuy = (2 * n + 1) * wMove;
    if (wBuy * (n + 1) > SAFE) throw new RangeError(`planner: ${n} places are too many to solve exactly`);
  }

  const cost = (row: number, col: number): number => {
    const c = columns[col]!;
    switch (c.type) {
      case 'unit': {
        const cand = accepts.get(c.unit.partNumber)?.get(row);
        if (!cand) return Infinity;
        if (c.unit.source === 'shelf') return wMove + cand.rank * wRank;
        return (c.unit.atKey === slots[row]!.key ? -wMove : 0) + cand.rank * wRank;
      }
      case 'buy':
        return c.row === row ? wBuy + wMove + c.candidate.rank * wRank + c.candidate.part.priceCents * wPrice : Infinity;
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
  columns.forEach((c, i) => {
    if (c.type === 'unit' && c.unit.source === 'installed' && !used.has(i)) removed.push(c.unit);
  });
  return { outcomes, removed };
}
