/**
 * The work in the order it is done on the machine: take off what goes, move parts into places
 * that are free (a chain of moves starts at its free end), swap or rotate parts that stand in
 * each other's way, fit spares from the shelf, and last the parts to order, to be fitted when
 * they arrive.
 */
import type { CatalogPart } from '~/lib/domain/schemas';
import { placeKey } from '~/lib/domain/places';
import { ONE_PERSON_LIFT_KG } from './cautions';
import type { SlotOutcome, Unit } from './solve';
import type { SlotPlace } from './targets';
import { partNameWithHand as partWords, partWithNumber, placeWords } from '~/lib/domain/vocabulary';
import { capitalise, listWords, plural } from '~/lib/domain/words';

export type StepKind = 'remove' | 'move' | 'swap' | 'install' | 'buy';

export interface PlanStep {
  /** 1-based, in working order. */
  n: number;
  kind: StepKind;
  text: string;
  partNumbers: string[];
  places: SlotPlace[];
  /** The heaviest part handled in the step, kg. */
  massKg: number | null;
  /** Heavier than one person should lift alone. */
  heavy: boolean;
}

export interface Removal {
  unit: Unit;
  why: string;
}

/** Sort key of a place: elements (left then right, front to rear), cover plates, rotor bars. */
export function placeOrder(p: SlotPlace): number {
  switch (p.kind) {
    case 'element':
      return (p.side === 'left' ? 0 : 1) * 100 + p.position;
    case 'cover':
      return 1_000 + p.section * 10 + (p.side === 'left' ? 0 : 1);
    case 'bar':
      return 2_000 + p.row * 100 + p.position;
  }
}

const byPlace = (a: SlotPlace, b: SlotPlace) => placeOrder(a) - placeOrder(b);

function liftWords(parts: readonly (CatalogPart | undefined)[]): { massKg: number | null; heavy: boolean; words: string } {
  const masses = parts.map((p) => p?.massKg ?? 0).filter((m) => m > 0);
  if (!masses.length) return { massKg: null, heavy: false, words: '' };
  const massKg = Math.max(...masses);
  const heavy = massKg > ONE_PERSON_LIFT_KG;
  const words = heavy
    ? ` About ${Math.round(massKg)} kg (${Math.round(massKg * 2.20462)} lb)${parts.length > 1 ? ' each' : ''}: lift with a helper or a lifting aid.`
    : '';
  return { massKg, heavy, words };
}

interface Move {
  from: SlotPlace;
  to: SlotPlace;
  unit: Unit;
}

export function workSteps(outcomes: readonly SlotOutcome[], removals: readonly Removal[]): PlanStep[] {
  const steps: Omit<PlanStep, 'n'>[] = [];
  const push = (kind: StepKind, text: string, units: { partNumber: string; part?: CatalogPart }[], places: SlotPlace[]) => {
    const lift = liftWords(units.map((u) => u.part));
    steps.push({
      kind,
      text: text + lift.words,
      partNumbers: [...new Set(units.map((u) => u.partNumber))],
      places,
      massKg: lift.massKg,
      heavy: lift.heavy,
    });
  };

  // 1. Take off what goes.
  const vacated = new Set<string>();
  const occupied = new Set<string>();
  for (const o of outcomes) if (o.unit?.atKey) occupied.add(o.unit.atKey);
  for (const r of removals) if (r.unit.atKey) occupied.add(r.unit.atKey);
  for (const r of [...removals].sort((a, b) => byPlace(a.unit.at!, b.unit.at!))) {
    vacated.add(r.unit.atKey!);
    push(
      'remove',
      `Take off ${partWithNumber(r.unit.part, r.unit.partNumber)} at ${placeWords(r.unit.at!)} and put it on the shelf: ${r.why}.`,
      [r.unit],
      [r.unit.at!],
    );
  }
  const free = (key: string) => !occupied.has(key) || vacated.has(key);

  // 2. Moves whose destination is free, repeatedly; each frees its source for the next.
  let pending: Move[] = outcomes
    .filter((o) => o.source === 'moved')
    .map((o) => ({ from: o.unit!.at!, to: o.slot.place, unit: o.unit! }))
    .sort((a, b) => byPlace(a.to, b.to));
  for (;;) {
    const ready = pending.filter((m) => free(placeKey(m.to)));
    if (!ready.length) break;
    for (const m of ready) {
      vacated.add(placeKey(m.from));
      push(
        'move',
        `Move ${partWithNumber(m.unit.part, m.unit.partNumber)} from ${placeWords(m.from)} to ${placeWords(m.to)}.`,
        [m.unit],
        [m.from, m.to],
      );
    }
    pending = pending.filter((m) => !ready.includes(m));
  }

  // 3. What is left are cycles: every destination holds a part that moves on. Two parts swap;
  //    longer cycles rotate through one part set aside.
  const byFrom = new Map(pending.map((m) => [placeKey(m.from), m] as const));
  const done = new Set<Move>();
  for (const start of pending) {
    if (done.has(start)) continue;
    const cycle: Move[] = [];
    for (let m: Move | undefined = start; m && !done.has(m); m = byFrom.get(placeKey(m.to))) {
      done.add(m);
      cycle.push(m);
    }
    if (cycle.length === 2) {
      const [a, b] = [...cycle].sort((x, y) => byPlace(x.from, y.from)) as [Move, Move];
      push(
        'swap',
        `Swap ${partWithNumber(a.unit.part, a.unit.partNumber)} at ${placeWords(a.from)} with ${partWithNumber(b.unit.part, b.unit.partNumber)} at ${placeWords(b.from)}: take both off, then fit each in the other's place.`,
        cycle.map((m) => m.unit),
        [a.from, b.from],
      );
    } else {
      // Set the first aside, then fill each free place from the part that belongs there.
      const first = cycle[0]!;
      const lines = [`take off ${partWithNumber(first.unit.part, first.unit.partNumber)} at ${placeWords(first.from)} and set it aside`];
      for (let i = cycle.length - 1; i >= 1; i--) {
        const m = cycle[i]!;
        lines.push(`move ${partWithNumber(m.unit.part, m.unit.partNumber)} from ${placeWords(m.from)} to ${placeWords(m.to)}`);
      }
      lines.push(`fit the part set aside at ${placeWords(first.to)}`);
      push(
        'swap',
        `Rotate ${cycle.length} parts: ${lines.join('; ')}.`,
        cycle.map((m) => m.unit),
        cycle.map((m) => m.from),
      );
    }
  }

  // 4. Spares from the shelf.
  for (const o of outcomes.filter((x) => x.source === 'shelf').sort((a, b) => byPlace(a.slot.place, b.slot.place))) {
    push(
      'install',
      `Fit ${partWithNumber(o.unit!.part, o.unit!.partNumber)} from the shelf at ${placeWords(o.slot.place)}.`,
      [o.unit!],
      [o.slot.place],
    );
  }

  // 5. What has to be bought, one step per part number.
  const buys = new Map<string, SlotOutcome[]>();
  for (const o of outcomes.filter((x) => x.source === 'buy').sort((a, b) => byPlace(a.slot.place, b.slot.place))) {
    const pn = o.candidate!.part.partNumber;
    buys.set(pn, [...(buys.get(pn) ?? []), o]);
  }
  for (const [pn, os] of buys) {
    const part = os[0]!.candidate!.part;
    const where = listWords(os.map((o) => placeWords(o.slot.place)));
    // A straight bar is one part across two in-line mounts; it is listed at the front one.
    const span =
      part.kind === 'rotor-bar' && part.barKind === 'straight'
        ? `, ${os.length === 1 ? 'it spans' : 'each spanning'} that mount and the in-line mount behind it`
        : '';
    push(
      'buy',
      `Order ${os.length} × ${pn} (${partWords(part)}) and fit ${plural(os.length, 'it', 'them')} at ${where} when ${plural(os.length, 'it arrives', 'they arrive')}${span}.`,
      os.map(() => ({ partNumber: pn, part })),
      os.map((o) => o.slot.place),
    );
  }

  return steps.map((s, i) => ({ ...s, n: i + 1, text: capitalise(s.text) }));
}
