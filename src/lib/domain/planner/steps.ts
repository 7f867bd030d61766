/**
 * The work in the order a crew can follow it:
 *
 * 1. Get the parts: spares from the farm's shelf, purchases from the dealer's shelf or on order
 *    (with the expected wait when the plan knows the lead time). When something is on order the
 *    work waits for it.
 * 2. One work session, started when every part is at hand, walking along the machine: a place
 *    that is emptied is filled straight away (a spare or a new part into the place it leaves, a
 *    part moved in from along the chain), parts that stand in each other's way swap or rotate.
 *    No step leaves a half-position empty while its part is not at hand.
 * 3. Set and verify (planner/finish.ts).
 */
import type { CatalogPart } from '~/lib/domain/schemas';
import { placeKey } from '~/lib/domain/places';
import { ONE_PERSON_LIFT_KG } from './cautions';
import type { SlotOutcome, Unit } from './solve';
import type { SlotPlace } from './targets';
import { partNameWithHand as partWords, partWithNumber, placeWords } from '~/lib/domain/vocabulary';
import { capitalise, countOf, listWords } from '~/lib/domain/words';
import { formatDate } from '~/lib/domain/format';

export type StepKind = 'fetch' | 'buy' | 'wait' | 'remove' | 'move' | 'swap' | 'install' | 'set' | 'check';
export type StepPhase = 'parts' | 'work' | 'verify';

/** One part taken off or fitted at a place, for anyone who follows the work part by part. */
export interface StepOp {
  op: 'off' | 'on';
  place: SlotPlace;
  partNumber: string;
}

export interface PlanStep {
  /** 1-based, in working order. */
  n: number;
  kind: StepKind;
  phase: StepPhase;
  text: string;
  partNumbers: string[];
  places: SlotPlace[];
  /** What the step takes off and fits, in order (work steps only). */
  ops: StepOp[];
  /** The heaviest part handled in the step, kg. */
  massKg: number | null;
  /** Heavier than one person should lift alone. */
  heavy: boolean;
  /** A page of this product that the step uses (the field check). */
  link?: string;
}

/**
 * Where a purchase comes from, when the plan knows: on the dealer's shelf, or to order with the
 * dealer's lead time in days (and the expected day, ISO yyyy-mm-dd, when known).
 */
export type PurchaseAvailability = { at: 'dealer-shelf' } | { at: 'to-order'; leadDays: number; expectedOn?: string };

export interface Removal {
  unit: Unit;
  why: string;
}

export interface WorkStepOptions {
  /** Per part number bought; without it a purchase is simply "order". */
  availability?: Readonly<Record<string, PurchaseAvailability | undefined>>;
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

/** "about 12 days, expected 14 Dec 2026" for a part on order. */
export function availabilityWords(a: PurchaseAvailability | undefined): string {
  if (!a) return 'to order';
  if (a.at === 'dealer-shelf') return "on the dealer's shelf";
  const days = `to order, about ${countOf(a.leadDays, 'day')}`;
  return a.expectedOn ? `${days} (expected ${formatDate(new Date(`${a.expectedOn}T12:00:00Z`))})` : days;
}

interface Move {
  from: SlotPlace;
  to: SlotPlace;
  unit: Unit;
}

type StepDraft = Omit<PlanStep, 'n'>;

/** The parts and work steps (set and verify come after, from planner/finish.ts). */
export function workSteps(outcomes: readonly SlotOutcome[], removals: readonly Removal[], options: WorkStepOptions = {}): PlanStep[] {
  const steps: StepDraft[] = [];
  const push = (
    kind: StepKind,
    phase: StepPhase,
    text: string,
    units: { partNumber: string; part?: CatalogPart }[],
    places: SlotPlace[],
    ops: StepOp[],
  ) => {
    const lift = phase === 'work' ? liftWords(units.map((u) => u.part)) : { massKg: null, heavy: false, words: '' };
    steps.push({
      kind,
      phase,
      text: text + lift.words,
      partNumbers: [...new Set(units.map((u) => u.partNumber))],
      places,
      ops,
      massKg: lift.massKg,
      heavy: lift.heavy,
    });
  };

  // ---- 1. Get the parts.
  const gather = (source: 'shelf' | 'buy') => {
    const m = new Map<string, SlotOutcome[]>();
    for (const o of outcomes.filter((x) => x.source === source).sort((a, b) => byPlace(a.slot.place, b.slot.place))) {
      const pn = o.candidate!.part.partNumber;
      m.set(pn, [...(m.get(pn) ?? []), o]);
    }
    return m;
  };
  for (const [pn, os] of gather('shelf')) {
    const part = os[0]!.candidate!.part;
    push(
      'fetch',
      'parts',
      `Take ${os.length} × ${pn} (${partWords(part)}) from the farm's shelf, for ${listWords(os.map((o) => placeWords(o.slot.place)))}.`,
      os.map(() => ({ partNumber: pn, part })),
      os.map((o) => o.slot.place),
      [],
    );
  }
  const waits: PurchaseAvailability[] = [];
  let unknownWait = false;
  for (const [pn, os] of gather('buy')) {
    const part = os[0]!.candidate!.part;
    const a = options.availability?.[pn];
    // A straight bar is one part across two in-line mounts; it is listed at the front one.
    const span =
      part.kind === 'rotor-bar' && part.barKind === 'straight'
        ? ` (${os.length === 1 ? 'it spans' : 'each spans'} that mount and the in-line mount behind it)`
        : '';
    const what = `${os.length} × ${pn} (${partWords(part)})`;
    const forWhere = `for ${listWords(os.map((o) => placeWords(o.slot.place)))}${span}`;
    const text =
      a?.at === 'dealer-shelf'
        ? `Collect ${what} from the dealer, ${availabilityWords(a)}, ${forWhere}.`
        : a
          ? `Order ${what} from the dealer, ${availabilityWords(a)}, ${forWhere}.`
          : `Order ${what} ${forWhere}.`;
    if (a?.at === 'to-order') waits.push(a);
    else if (!a) unknownWait = true;
    push(
      'buy',
      'parts',
      text,
      os.map(() => ({ partNumber: pn, part })),
      os.map((o) => o.slot.place),
      [],
    );
  }
  if (waits.length || unknownWait) {
    const longest = waits.reduce<PurchaseAvailability | null>(
      (m, a) => (a.at === 'to-order' && (!m || (m.at === 'to-order' && a.leadDays > m.leadDays)) ? a : m),
      null,
    );
    const when = longest && longest.at === 'to-order' && !unknownWait ? ` (${availabilityWords(longest).replace(/^to order, /, '')})` : '';
    push(
      'wait',
      'parts',
      `Wait until every part on order has arrived${when}: the work below starts only when all its parts are at hand, so no place on the machine stands empty waiting for a delivery.`,
      [],
      [],
      [],
    );
  }

  // ---- 2. One work session, along the machine.
  const finalAt = new Map(outcomes.map((o) => [o.slot.key, o] as const));
  const removalAt = new Map(removals.filter((r) => r.unit.atKey).map((r) => [r.unit.atKey!, r] as const));
  const moveInto = new Map<string, Move>();
  for (const o of outcomes) if (o.source === 'moved') moveInto.set(o.slot.key, { from: o.unit!.at!, to: o.slot.place, unit: o.unit! });
  const doneMoves = new Set<Move>();
  const filled = new Set<string>();

  /** Fill a place that has just become free (or was empty), and follow the chain it frees. */
  const fill = (key: string) => {
    if (filled.has(key)) return;
    const o = finalAt.get(key);
    if (!o) return;
    if (o.source === 'shelf' || o.source === 'buy') {
      filled.add(key);
      const part = o.candidate!.part;
      const from = o.source === 'shelf' ? 'from the shelf' : 'new';
      push(
        'install',
        'work',
        `Fit ${partWithNumber(part, part.partNumber)} (${from}) at ${placeWords(o.slot.place)}.`,
        [{ partNumber: part.partNumber, part }],
        [o.slot.place],
        [{ op: 'on', place: o.slot.place, partNumber: part.partNumber }],
      );
    } else if (o.source === 'moved') {
      const m = moveInto.get(key)!;
      if (doneMoves.has(m)) return;
      filled.add(key);
      doneMoves.add(m);
      push(
        'move',
        'work',
        `Move ${partWithNumber(m.unit.part, m.unit.partNumber)} from ${placeWords(m.from)} to ${placeWords(m.to)}.`,
        [m.unit],
        [m.from, m.to],
        [
          { op: 'off', place: m.from, partNumber: m.unit.partNumber },
          { op: 'on', place: m.to, partNumber: m.unit.partNumber },
        ],
      );
      fill(placeKey(m.from));
    }
  };

  // Every place that is free now or is freed by taking a part off to the shelf, in order along
  // the machine.
  const occupied = new Set<string>();
  for (const o of outcomes) if (o.unit?.atKey) occupied.add(o.unit.atKey);
  for (const r of removals) if (r.unit.atKey) occupied.add(r.unit.atKey);
  const starts = new Map<string, SlotPlace>();
  for (const o of outcomes) if (!occupied.has(o.slot.key)) starts.set(o.slot.key, o.slot.place);
  for (const r of removals) if (r.unit.atKey) starts.set(r.unit.atKey, r.unit.at!);
  for (const [key, place] of [...starts].sort((a, b) => byPlace(a[1], b[1]))) {
    const r = removalAt.get(key);
    if (r)
      push(
        'remove',
        'work',
        `Take off ${partWithNumber(r.unit.part, r.unit.partNumber)} at ${placeWords(place)} and put it on the shelf: ${r.why}.`,
        [r.unit],
        [place],
        [{ op: 'off', place, partNumber: r.unit.partNumber }],
      );
    fill(key);
  }

  // What is left are cycles: every destination holds a part that moves on. Two parts swap;
  // longer cycles rotate through one part set aside.
  const pending = [...moveInto.values()].filter((m) => !doneMoves.has(m)).sort((a, b) => byPlace(a.to, b.to));
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
        'work',
        `Swap ${partWithNumber(a.unit.part, a.unit.partNumber)} at ${placeWords(a.from)} with ${partWithNumber(b.unit.part, b.unit.partNumber)} at ${placeWords(b.from)}: take both off, then fit each in the other's place.`,
        cycle.map((m) => m.unit),
        [a.from, b.from],
        [
          { op: 'off', place: a.from, partNumber: a.unit.partNumber },
          { op: 'off', place: b.from, partNumber: b.unit.partNumber },
          { op: 'on', place: a.to, partNumber: a.unit.partNumber },
          { op: 'on', place: b.to, partNumber: b.unit.partNumber },
        ],
      );
    } else {
      // Set the first aside, then fill each free place from the part that belongs there.
      const first = cycle[0]!;
      const lines = [`take off ${partWithNumber(first.unit.part, first.unit.partNumber)} at ${placeWords(first.from)} and set it aside`];
      const ops: StepOp[] = [{ op: 'off', place: first.from, partNumber: first.unit.partNumber }];
      for (let i = cycle.length - 1; i >= 1; i--) {
        const m = cycle[i]!;
        lines.push(`move ${partWithNumber(m.unit.part, m.unit.partNumber)} from ${placeWords(m.from)} to ${placeWords(m.to)}`);
        ops.push({ op: 'off', place: m.from, partNumber: m.unit.partNumber }, { op: 'on', place: m.to, partNumber: m.unit.partNumber });
      }
      lines.push(`fit the part set aside at ${placeWords(first.to)}`);
      ops.push({ op: 'on', place: first.to, partNumber: first.unit.partNumber });
      push(
        'swap',
        'work',
        `Rotate ${cycle.length} parts: ${lines.join('; ')}.`,
        cycle.map((m) => m.unit),
        cycle.map((m) => m.from),
        ops,
      );
    }
  }

  return number(steps);
}

export function number(steps: readonly StepDraft[]): PlanStep[] {
  return steps.map((s, i) => ({ ...s, n: i + 1, text: capitalise(s.text) }));
}
