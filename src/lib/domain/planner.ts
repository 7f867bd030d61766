/**
 * The crop-change planner: from what is bolted in the machine now, the spares on the shelf and
 * a target crop, the layout for that crop that spends least on purchases first, then takes the
 * least effort (mass lifted and handling time, planner/effort.ts), then departs least from the crop
 * program — solved exactly (an assignment problem per kind of part, see planner/solve.ts) — with
 * every choice explained and the work listed in the order a crew can follow: parts first, one work
 * session, then set and verify, safety first.
 *
 * Pure: the same call runs on the server, in a browser island and in tests.
 */
import { z } from 'zod';
import { asCatalogIndex, type CatalogIndex } from './catalog';
import { cropPrograms, type CropProgram } from './crops';
import { starterLayout } from './starter';
import { placeKey } from './places';
import { placePart } from './layout-edits';
import { checkLayout } from './rules';
import type { CatalogPart, CropId, DrumId, Finding, Layout, MachineFamily, VaneControl } from './schemas';
import { bomLine, fingerprint, type BomLine } from './planner/bom';
import { WORK_CAUTIONS } from './planner/cautions';
import { groupOf, solveGroup, type SlotOutcome, type SlotSource, type Unit } from './planner/solve';
import { number, placeOrder, workSteps, type PlanStep, type PurchaseAvailability, type Removal } from './planner/steps';
import { effortOf, type Effort } from './planner/effort';
import { finishSteps } from './planner/finish';
import { buildTargets, elementFits, elementTrouble, type PlanMode, type SlotGroup, type SlotPlace, type Targets } from './planner/targets';
import { cropAdjective, cropNoun, cropVerb, elementTypeName as elementWord, partNameWithHand as partWords, placeWords } from './vocabulary';
import { capitalise, countOf, plural } from './words';
import { formatLength, formatMass, kg, mm, type UnitSystem } from './units';

export { WORK_CAUTIONS, ONE_PERSON_LIFT_KG } from './planner/cautions';
export { billOfMaterials, bomLine, bomTotal, handOf, partCounts, fingerprint, type Bom, type BomLine } from './planner/bom';
export { solveAssignment } from './planner/assignment';
export type { PlanStep, StepKind, StepPhase, StepOp, PurchaseAvailability } from './planner/steps';
export { availabilityWords } from './planner/steps';
export { HANDLING_SECONDS, SECONDS_PER_KG, ROTOR_ACCESS_SECONDS, type Effort } from './planner/effort';
export { FIELD_CHECK_PATH } from './planner/finish';
export type { PlanMode, SlotPlace } from './planner/targets';

export const planModeSchema = z.enum(['program', 'on-hand']);

export interface PlanInput {
  family: MachineFamily;
  catalog: readonly CatalogPart[] | CatalogIndex;
  /** What is bolted in the machine now; null when nothing is recorded (an empty cage). */
  installed: Layout | null;
  /** Spares on the shelf: part number → quantity. */
  shelf: Readonly<Record<string, number>>;
  crop: CropId;
  mode?: PlanMode;
  /** The machine's drum and vane control (default: as installed, else the family's first). */
  drum?: DrumId;
  vaneControl?: VaneControl;
  /** The reader's unit system for the words of the setting changes (default metric). */
  units?: UnitSystem;
  /**
   * Where each purchase comes from, by part number, when known (dealer stock and lead time);
   * without it a purchase is "to order" and the work waits for it.
   */
  availability?: Readonly<Record<string, PurchaseAvailability | undefined>>;
}

export interface PlanChoice {
  place: SlotPlace;
  key: string;
  /** Part number at this place now (null: empty). */
  before: string | null;
  /** Part number in the proposal (null: left empty). */
  after: string | null;
  source: SlotSource;
  /** Where a moved part comes from. */
  from: SlotPlace | null;
  /** 0: the crop program's own choice; higher: a further departure from it. */
  rank: number;
  why: string;
}

export interface PlanRemoval {
  place: SlotPlace;
  key: string;
  partNumber: string;
  why: string;
}

export interface PlanPurchase extends BomLine {
  places: SlotPlace[];
}

export interface SettingChange {
  field: 'vaneSetting' | 'rotorRpm' | 'clearanceMm' | 'drum' | 'vaneControl';
  before: string | number | null;
  after: string | number;
  text: string;
}

export interface PlanCounts {
  /** Parts bought. */
  purchases: number;
  /** Parts handled: taken off, moved, or fitted from the shelf or new. */
  moves: number;
  /** The effort of the work: mass lifted and minutes (planner/effort.ts). */
  effort: Effort;
  kept: number;
  moved: number;
  removed: number;
  fromShelf: number;
  purchaseCents: number;
}

export interface PlanOk {
  ok: true;
  crop: CropId;
  mode: PlanMode;
  layout: Layout;
  choices: PlanChoice[];
  removals: PlanRemoval[];
  purchases: PlanPurchase[];
  /** Safety cautions: shown at the head of the steps. */
  cautions: readonly string[];
  steps: PlanStep[];
  settings: SettingChange[];
  counts: PlanCounts;
  /** checkLayout of the proposal: never 'blocks-fit'. */
  findings: Finding[];
  notes: string[];
  /** Changes whenever the proposal would change (installed parts, shelf, catalog, crop). */
  fingerprint: string;
  /** The reader's unit system the words were made in. */
  units: UnitSystem;
}

export interface PlanImpossible {
  ok: false;
  crop: CropId;
  mode: PlanMode;
  reasons: { place: SlotPlace | null; message: string }[];
  cautions: readonly string[];
}

export type Plan = PlanOk | PlanImpossible;

const GROUPS: readonly SlotGroup[] = ['element', 'cover', 'bar'];

export function installedUnits(installed: Layout | null, catalog: CatalogIndex): { units: Unit[]; unknown: Removal[] } {
  const units: Unit[] = [];
  const unknown: Removal[] = [];
  if (!installed) return { units, unknown };
  const add = (partNumber: string, at: SlotPlace) => {
    const part = catalog.byPartNumber.get(partNumber);
    const unit = { source: 'installed' as const, partNumber, part: part!, at, atKey: placeKey(at) };
    if (part) units.push(unit);
    else unknown.push({ unit, why: 'the catalog does not know this part number, so it cannot stay on' });
  };
  for (const e of installed.elements) add(e.partNumber, { kind: 'element', position: e.position, side: e.side });
  for (const c of installed.coverPlates) add(c.partNumber, { kind: 'cover', section: c.section, side: c.side });
  for (const b of installed.rotorBars) add(b.partNumber, { kind: 'bar', row: b.row, position: b.position });
  return { units, unknown };
}

/** Why a part now on the machine comes off in the proposal. */
function removalWhy(
  unit: Unit,
  family: MachineFamily,
  crop: CropProgram,
  targets: Targets,
  finalAt: Map<string, CatalogPart | null>,
): string {
  const { part, at, atKey } = unit;
  const cropWord = cropNoun(crop.id);
  if (part.fitGroup !== family.fitGroup) return `it belongs to another machine family (fit group "${part.fitGroup}")`;
  const off = targets.offReasons.get(atKey!);
  if (off && part.kind === 'cover-plate') return off;
  if (part.kind === 'rotor-bar') {
    if (part.barKind === 'straight' && crop.rotorBars.straight === 'not-needed')
      return `straight bars are not needed in ${cropWord} and cost power`;
    if (part.barKind === 'straight') return 'a straight bar bolts only across two rasp bars in line';
    if (part.barKind === 'discharge' && crop.rotorBars.discharge === 'not-needed')
      return `discharge bars are for stringy crops; ${cropWord} ${cropVerb(crop.id, 'does', 'do')} not rope`;
  }
  if (part.kind === 'element' && at?.kind === 'element') {
    const zone = family.positions.find((p) => p.index === at.position)?.zone;
    if (!zone) return `the ${family.name} has no position ${at.position}`;
    if (!elementFits(family, part, zone, at.side))
      return part.hand !== at.side
        ? `a ${part.hand}-hand element never fits the ${at.side} half`
        : `it does not belong in the ${zone} zone`;
    const trouble = elementTrouble(part, zone, crop);
    if (trouble) return trouble;
  }
  const there = finalAt.get(atKey!);
  if (there) return `the ${cropAdjective(crop.id)} plan puts the ${partWords(there)} here instead`;
  // A mount the plan leaves bare on purpose (the straight bar in front takes it) says so.
  const slot = at?.kind === 'bar' ? targets.slots.find((s) => s.key === atKey) : undefined;
  if (slot && slot.candidates.length === 0 && slot.empty) return slot.empty.why;
  return `no place in the ${cropAdjective(crop.id)} plan needs it`;
}

function explain(o: SlotOutcome, cropWord: string): string {
  const c = o.candidate;
  switch (o.source) {
    case 'kept':
      return `Keep the ${partWords(c!.part)} already here: ${c!.why}.`;
    case 'moved':
      return `Move the ${partWords(c!.part)} here from ${placeWords(o.unit!.at!)}: ${c!.why}; it is already on the machine, so nothing is bought.`;
    case 'shelf':
      return `Fit ${c!.part.partNumber} from the shelf: ${c!.why}.`;
    case 'buy':
      return `Buy ${c!.part.partNumber}: ${c!.why}; none is on the machine or on the shelf to spare.`;
    case 'empty':
      return `Leave empty: ${o.slot.empty?.why ?? `nothing is needed here in ${cropWord}`}.`;
  }
}

function settingChanges(installed: Layout | null, layout: Layout, units: UnitSystem): SettingChange[] {
  const out: SettingChange[] = [];
  const length = (v: unknown) => formatLength(mm(Number(v)), units);
  const words = {
    drum: (v: unknown) => `${v} drum`,
    vaneControl: (v: unknown) => `${v} vanes`,
    vaneSetting: (v: unknown) => `vanes to ${String(v).replace('-', ' ')}`,
    rotorRpm: (v: unknown) => `rotor speed to ${v} rpm`,
    clearanceMm: (v: unknown) => `concave clearance to ${length(v)}`,
  } as const;
  for (const field of ['drum', 'vaneControl', 'vaneSetting', 'rotorRpm', 'clearanceMm'] as const) {
    const before = installed ? installed[field] : null;
    const after = layout[field];
    if (before === after) continue;
    const now =
      before === null
        ? ''
        : ` (now ${field === 'rotorRpm' ? `${before} rpm` : field === 'clearanceMm' ? length(before) : String(before).replace('-', ' ')})`;
    const text =
      field === 'drum' || field === 'vaneControl'
        ? `Record the machine's ${words[field](after)}${now}.`
        : `Set the ${words[field](after)}${now}.`;
    out.push({ field, before, after, text });
  }
  return out;
}

export function planCropChange(input: PlanInput): Plan {
  const { family, installed, crop: cropId } = input;
  const mode: PlanMode = input.mode ?? 'program';
  const catalog = asCatalogIndex(input.catalog);
  const crop = cropPrograms[cropId];
  const cropWord = cropNoun(cropId);
  const wantedDrum = input.drum ?? installed?.drum;
  const drum = wantedDrum && family.drumOptions.some((d) => d.id === wantedDrum) ? wantedDrum : undefined;
  const wantedVanes = input.vaneControl ?? installed?.vaneControl;
  const vaneControl = wantedVanes && family.vaneControls.includes(wantedVanes) ? wantedVanes : family.vaneControls[0]!;

  const targets = buildTargets(family, catalog, crop, mode, vaneControl);
  if (targets.impossible.length) {
    return { ok: false, crop: cropId, mode, reasons: targets.impossible, cautions: WORK_CAUTIONS };
  }

  const shelf = new Map<string, number>();
  for (const [pn, q] of Object.entries(input.shelf)) if (Number.isFinite(q) && q >= 1) shelf.set(pn, Math.floor(q));
  const { units, unknown } = installedUnits(installed, catalog);

  const outcomes: SlotOutcome[] = [];
  const removedUnits: Unit[] = [];
  for (const group of GROUPS) {
    const slots = targets.slots.filter((s) => s.place.kind === group);
    const mine = units.filter((u) => groupOf(u.part) === group);
    const r = solveGroup(slots, mine, shelf, catalog);
    outcomes.push(...r.outcomes);
    removedUnits.push(...r.removed);
  }

  const finalAt = new Map<string, CatalogPart | null>(outcomes.map((o) => [o.slot.key, o.candidate?.part ?? null]));
  const removals: Removal[] = [
    ...unknown,
    ...removedUnits.map((unit) => ({ unit, why: removalWhy(unit, family, crop, targets, finalAt) })),
  ];

  // The proposal: settings from the crop program on this machine, parts from the assignment.
  const settings = starterLayout(family, cropId, catalog.parts, { drum, vaneControl });
  // Parts go in through the domain's layout edits, which keep the starter layout's order
  // (along the rotor, left before right).
  let layout: Layout = { ...settings, elements: [], coverPlates: [], rotorBars: [] };
  for (const o of outcomes) {
    const pn = o.candidate?.part.partNumber;
    if (pn) layout = placePart(layout, o.slot.place, pn);
  }

  const beforeAt = new Map(units.map((u) => [u.atKey!, u.partNumber] as const));
  for (const r of unknown) beforeAt.set(r.unit.atKey!, r.unit.partNumber);
  const choices: PlanChoice[] = outcomes
    .map((o) => ({
      place: o.slot.place,
      key: o.slot.key,
      before: beforeAt.get(o.slot.key) ?? null,
      after: o.candidate?.part.partNumber ?? null,
      source: o.source,
      from: o.source === 'moved' ? o.unit!.at : null,
      rank: o.candidate ? o.candidate.rank : (o.slot.empty?.rank ?? 0),
      why: explain(o, cropWord),
    }))
    .sort((a, b) => placeOrder(a.place) - placeOrder(b.place));

  const purchaseMap = new Map<string, PlanPurchase>();
  for (const o of outcomes) {
    if (o.source !== 'buy') continue;
    const part = o.candidate!.part;
    const line = purchaseMap.get(part.partNumber) ?? { ...bomLine(part, 0), places: [] };
    line.quantity += 1;
    line.lineTotalCents = line.quantity * line.unitPriceCents;
    line.places.push(o.slot.place);
    purchaseMap.set(part.partNumber, line);
  }
  const order = new Map(catalog.parts.map((p, i) => [p.partNumber, i] as const));
  const purchases = [...purchaseMap.values()].sort((a, b) => (order.get(a.partNumber) ?? 0) - (order.get(b.partNumber) ?? 0));

  const count = (s: SlotSource) => outcomes.filter((o) => o.source === s).length;
  const counts: PlanCounts = {
    purchases: count('buy'),
    kept: count('kept'),
    moved: count('moved'),
    fromShelf: count('shelf'),
    removed: removals.length,
    moves: removals.length + count('moved') + count('shelf') + count('buy'),
    effort: effortOf([
      ...removals.map((r) => ({ group: r.unit.at!.kind, massKg: r.unit.part?.massKg })),
      ...outcomes.flatMap((o) => {
        if (o.source !== 'moved' && o.source !== 'shelf' && o.source !== 'buy') return [];
        const lift = { group: groupOf(o.candidate!.part), massKg: o.candidate!.part.massKg };
        return o.source === 'moved' ? [lift, lift] : [lift];
      }),
    ]),
    purchaseCents: purchases.reduce((s, p) => s + p.lineTotalCents, 0),
  };

  const findings = checkLayout(family, catalog, layout);
  const blocking = findings.filter((f) => f.severity === 'blocks-fit');
  if (blocking.length) {
    // The targets only offer parts that fit, so this means a family the planner does not yet
    // understand; never hand out a plan that will not bolt on.
    return {
      ok: false,
      crop: cropId,
      mode,
      cautions: WORK_CAUTIONS,
      reasons: blocking.map((f) => ({
        place: (f.places.find((p) => p.kind !== 'setting') as SlotPlace | undefined) ?? null,
        message: `${f.title}: ${f.explanation}`,
      })),
    };
  }

  const notes = [...targets.notes];
  const departures = choices.filter((c) => c.rank > 0 && c.after);
  if (departures.length)
    notes.push(
      `${countOf(departures.length, 'place')} ${plural(departures.length, 'holds', 'hold')} a part other than the ${cropAdjective(cropId)} program's own choice; see the reasons beside ${plural(departures.length, 'it', 'them')}.`,
    );
  if (!installed) notes.push('Nothing is recorded as installed in this machine, so every part is fitted from the shelf or bought.');

  const settingList = settingChanges(installed, layout, input.units ?? 'metric');
  const removalList: PlanRemoval[] = removals
    .map((r) => ({ place: r.unit.at!, key: r.unit.atKey!, partNumber: r.unit.partNumber, why: capitalise(r.why) + '.' }))
    .sort((a, b) => placeOrder(a.place) - placeOrder(b.place));

  return {
    ok: true,
    crop: cropId,
    mode,
    layout,
    choices,
    removals: removalList,
    purchases,
    cautions: WORK_CAUTIONS,
    steps: steps(workSteps(outcomes, removals, { availability: input.availability }), settingList, () =>
      finishSteps({
        layout,
        installed,
        vaneControl,
        fitted: outcomes.flatMap((o) => (o.source === 'moved' || o.source === 'shelf' || o.source === 'buy' ? [o.candidate!.part] : [])),
        units: input.units ?? 'metric',
      }),
    ),
    settings: settingList,
    units: input.units ?? 'metric',
    counts,
    findings,
    notes,
    fingerprint: fingerprint(JSON.stringify([layout, purchases.map((p) => [p.partNumber, p.quantity]), mode])),
  };
}

/** Parts and work steps, then set and verify; nothing at all when nothing changes. */
function steps(work: PlanStep[], settings: readonly SettingChange[], finish: () => Omit<PlanStep, 'n'>[]): PlanStep[] {
  if (work.length === 0 && settings.length === 0) return [];
  return number([...work, ...finish()]);
}

/** "3 h 20 min", "45 min": a working time in words, rounded to the minute (5 minutes above an hour). */
export function durationWords(seconds: number): string {
  const minutes = Math.round(seconds / 60);
  if (minutes < 60) return `${minutes} min`;
  const rounded = Math.round(minutes / 5) * 5;
  const h = Math.floor(rounded / 60);
  const m = rounded % 60;
  return m ? `${h} h ${m} min` : `${h} h`;
}

/** The effort in words: "about 3 h 20 min of work, 412.5 kg lifted". */
export function effortWords(effort: Effort, units: UnitSystem = 'metric'): string {
  if (effort.lifts === 0) return 'no part to take off, move or fit';
  return `about ${durationWords(effort.seconds)} of work, ${formatMass(kg(effort.massKg), units)} lifted${effort.rotorAccess ? ' (rotor access included)' : ''}`;
}

/** Words for the plan's headline: "2 parts to buy, about 3 h 20 min of work, 412.5 kg lifted". */
export function planSummaryWords(plan: PlanOk): string {
  const { purchases, moves } = plan.counts;
  const settings = plan.settings.length;
  const buy = purchases === 0 ? 'nothing to buy' : `${countOf(purchases, 'part')} to buy`;
  const handle = effortWords(plan.counts.effort, plan.units);
  const set = settings === 0 ? '' : `, ${countOf(settings, 'setting')} to change`;
  // "Nothing to change" only when the plan really changes nothing (no part and no setting).
  if (purchases === 0 && moves === 0 && settings === 0) return 'Nothing to buy, nothing to change.';
  return `${capitalise(buy)}, ${handle}${set}.`;
}

/** The element type the crop program wants in a zone, in words ("round-bar"). */
export function programElementWords(cropId: CropId): { threshing: string; separating: string } {
  const c = cropPrograms[cropId];
  return { threshing: elementWord(c.suggested.threshing), separating: elementWord(c.suggested.separating) };
}
