/**
 * A job card's steps and parts from a plan: the work from what is installed now to a saved layout
 * version, worked out with the planner's own parts (the same assignment of parts to places, the
 * same steps in their working order, the same set-and-verify steps), only with the target fixed:
 * every place holds exactly what the accepted version puts there.
 */
import { asCatalogIndex, type CatalogIndex } from '~/lib/domain/catalog';
import { placeKey } from '~/lib/domain/places';
import type { CatalogPart, Layout, MachineFamily, VaneControl } from '~/lib/domain/schemas';
import type { UnitSystem } from '~/lib/domain/units';
import { installedUnits } from '~/lib/domain/planner';
import { finishSteps } from '~/lib/domain/planner/finish';
import { groupOf, solveGroup, type SlotOutcome, type Unit } from '~/lib/domain/planner/solve';
import { number, workSteps, type PlanStep, type PurchaseAvailability, type Removal } from '~/lib/domain/planner/steps';
import type { SlotGroup, SlotPlace, SlotTarget } from '~/lib/domain/planner/targets';
import { partNameWithHand } from '~/lib/domain/vocabulary';
import type { JobStepKind } from './kinds';

export interface LayoutJobInput {
  family: MachineFamily;
  catalog: readonly CatalogPart[] | CatalogIndex;
  installed: Layout | null;
  target: Layout;
  /** The farm's spares: part number → quantity. */
  shelf: Readonly<Record<string, number>>;
  /** Where each purchase comes from (the dealer's shelf, or to order), by part number. */
  availability?: Readonly<Record<string, PurchaseAvailability | undefined>>;
  vaneControl: VaneControl;
  units: UnitSystem;
}

export type JobPartSource = 'dealer_stock' | 'farm_shelf' | 'on_order';

export interface DraftStep {
  kind: JobStepKind;
  text: string;
  heavy: boolean;
  partNumbers: string[];
}

export interface DraftPart {
  partNumber: string;
  quantity: number;
  source: JobPartSource;
}

export interface LayoutJob {
  steps: DraftStep[];
  parts: DraftPart[];
  /** Parts fitted or moved (their bolts are checked at sign-off). */
  fitted: CatalogPart[];
  /** Part numbers of the target the catalog does not know (no step can fit them). */
  unknown: string[];
}

function placesOf(layout: Layout | null): { place: SlotPlace; partNumber: string }[] {
  if (!layout) return [];
  return [
    ...layout.elements.map((e) => ({
      place: { kind: 'element', position: e.position, side: e.side } as SlotPlace,
      partNumber: e.partNumber,
    })),
    ...layout.coverPlates.map((c) => ({
      place: { kind: 'cover', section: c.section, side: c.side } as SlotPlace,
      partNumber: c.partNumber,
    })),
    ...layout.rotorBars.map((b) => ({ place: { kind: 'bar', row: b.row, position: b.position } as SlotPlace, partNumber: b.partNumber })),
  ];
}

const GROUPS: readonly SlotGroup[] = ['element', 'cover', 'bar'];

export function jobFromLayout(input: LayoutJobInput): LayoutJob {
  const catalog = asCatalogIndex(input.catalog);
  const unknown: string[] = [];
  // One slot per place either layout uses: the target's part, or empty where the target has none.
  const slots = new Map<string, SlotTarget>();
  for (const { place } of placesOf(input.installed)) {
    const key = placeKey(place);
    slots.set(key, { place, key, candidates: [], empty: { rank: 0, why: 'the accepted layout leaves this place empty' } });
  }
  for (const { place, partNumber } of placesOf(input.target)) {
    const key = placeKey(place);
    const part = catalog.byPartNumber.get(partNumber);
    if (!part) {
      unknown.push(partNumber);
      continue;
    }
    slots.set(key, { place, key, candidates: [{ part, rank: 0, why: 'the accepted layout puts it here' }], empty: null });
  }
  const { units, unknown: unknownInstalled } = installedUnits(input.installed, catalog);
  const shelf = new Map<string, number>();
  for (const [pn, q] of Object.entries(input.shelf)) if (Number.isFinite(q) && q >= 1) shelf.set(pn, Math.floor(q));

  const outcomes: SlotOutcome[] = [];
  const removed: Unit[] = [];
  for (const group of GROUPS) {
    const r = solveGroup(
      [...slots.values()].filter((s) => s.place.kind === group),
      units.filter((u) => groupOf(u.part) === group),
      shelf,
      catalog,
    );
    outcomes.push(...r.outcomes);
    removed.push(...r.removed);
  }
  // Why a part comes off: the planner's words are about a crop program; here the version decides.
  const targetAt = new Map(placesOf(input.target).map((p) => [placeKey(p.place), catalog.byPartNumber.get(p.partNumber)] as const));
  const removals: Removal[] = [
    ...unknownInstalled,
    ...removed.map((unit) => {
      const there = unit.atKey ? targetAt.get(unit.atKey) : undefined;
      return {
        unit,
        why: there ? `the accepted layout puts the ${partNameWithHand(there)} here instead` : 'the accepted layout leaves this place empty',
      };
    }),
  ];
  const fitted = outcomes.flatMap((o) => (o.source === 'moved' || o.source === 'shelf' || o.source === 'buy' ? [o.candidate!.part] : []));
  const planSteps: PlanStep[] = number([
    ...workSteps(outcomes, removals, { availability: input.availability }),
    ...finishSteps({ layout: input.target, installed: input.installed, vaneControl: input.vaneControl, fitted, units: input.units }),
  ]);

  const parts = new Map<string, DraftPart>();
  for (const o of outcomes) {
    if (o.source !== 'shelf' && o.source !== 'buy') continue;
    const pn = o.candidate!.part.partNumber;
    const source: JobPartSource =
      o.source === 'shelf' ? 'farm_shelf' : input.availability?.[pn]?.at === 'dealer-shelf' ? 'dealer_stock' : 'on_order';
    const key = `${pn}|${source}`;
    const line = parts.get(key) ?? { partNumber: pn, quantity: 0, source };
    line.quantity += 1;
    parts.set(key, line);
  }
  return {
    steps: planSteps.map((s) => ({ kind: s.kind, text: s.text, heavy: s.heavy, partNumbers: s.partNumbers })),
    parts: [...parts.values()],
    fitted,
    unknown,
  };
}
