/**
 * What each place of the cage should hold for the target crop: for every half-position, cover-
 * plate slot and rotor bar place, the catalog parts that may go there (ranked: 0 is the crop
 * program's own choice, higher is a further departure from it) and whether it may stay empty.
 *
 * Only parts that raise no 'blocks-fit' finding at the place are ever candidates, and elements
 * must also raise no crop finding there (opening too small, too aggressive for a crop that
 * cracks, too open for a crop that is hard to thresh) — the same tests as the rules module.
 *
 * Modes:
 *   program  — the crop program's element per zone (crops.ts `suggested`); another element only
 *              when the catalog lacks that one, closest first in how hard it rubs the crop.
 *   on-hand  — any element that suits the crop at that place, the program's own first; cover
 *              plates only when on hand. Fewer purchases, at the cost of departing from the program.
 */
import type { CatalogIndex } from '~/lib/domain/catalog';
import { isDischargeMount, rotorModel } from '~/lib/domain/rotor';
import { ELEMENT_AGGRESSIVENESS, kernelPassage } from '~/lib/domain/cage-metrics';
import { SMALL_GRAINS, SMALL_SEEDED } from '~/lib/domain/rules/elements';
import { AGGRESSIVE_ELEMENT_TYPES, OPEN_ELEMENT_TYPES, type CropProgram } from '~/lib/domain/crops';
import { barPlace, coverPlace, elementPlace, placeKey, type BarPlace, type CoverPlace, type ElementPlace } from '~/lib/domain/places';
import type {
  BarKind,
  CatalogPart,
  CoverPlatePart,
  ElementPart,
  MachineFamily,
  RotorBarPart,
  Side,
  VaneControl,
  Zone,
} from '~/lib/domain/schemas';
import { cropAdjective, cropNoun, cropVerb, elementPlaceWords, elementTypeName as elementWord, kernelsOf } from '~/lib/domain/vocabulary';
import { listWords } from '~/lib/domain/words';

export type PlanMode = 'program' | 'on-hand';
export type SlotPlace = ElementPlace | CoverPlace | BarPlace;
export type SlotGroup = SlotPlace['kind'];

export interface Candidate {
  part: CatalogPart;
  /** 0: the crop program's choice; higher: further from it. */
  rank: number;
  /** Why this part suits the place, completing "…: <why>". */
  why: string;
}

export interface SlotTarget {
  place: SlotPlace;
  key: string;
  /** Best first: by rank, then price. */
  candidates: Candidate[];
  /** The place may stay empty: at what rank and why. */
  empty: { rank: number; why: string } | null;
}

export interface Impossible {
  place: SlotPlace | null;
  message: string;
}

export interface Targets {
  slots: SlotTarget[];
  /** Places nothing in the catalog can fill: no plan is possible. */
  impossible: Impossible[];
  /** Things worth telling the user about the target itself. */
  notes: string[];
  /** Why an installed part at a place that is not a target slot comes off, by place key. */
  offReasons: Map<string, string>;
}

const SIDES: readonly Side[] = ['left', 'right'];
const RASP_KINDS: readonly BarKind[] = ['rasp', 'spike-rasp', 'smooth-rasp'];

/** Whether an element part bolts into a half-position of `zone` on `side` (the rules' fit tests). */
export function elementFits(family: MachineFamily, part: CatalogPart, zone: Zone, side: Side): boolean {
  if (part.kind !== 'element' || part.fitGroup !== family.fitGroup || part.hand !== side || !part.zones.includes(zone)) return false;
  if (family.cageKind === 'split') {
    if (part.role === 'concave' && zone === 'separating') return false;
    if (part.role === 'grate' && zone === 'threshing') return false;
  }
  return true;
}

/** Why an element would work badly for the crop in this zone (the rules' crop tests), or null. */
export function elementTrouble(part: ElementPart, zone: Zone, crop: CropProgram): string | null {
  const cropWord = cropNoun(crop.id);
  const passage = kernelPassage(part.openingMm, crop.kernel);
  if (passage.verdict === 'blocked') return `its opening is too small for ${kernelsOf(crop.id)}`;
  if (passage.verdict === 'tight') return `its opening is tight for the larger ${kernelsOf(crop.id)}`;
  if (crop.fragile && AGGRESSIVE_ELEMENT_TYPES.has(part.elementType)) return `it rubs hard and cracks ${cropWord}`;
  if (crop.threshability === 'hard' && zone === 'threshing' && OPEN_ELEMENT_TYPES.has(part.elementType))
    return `it lets ${cropAdjective(crop.id)} heads through unthreshed`;
  if (SMALL_GRAINS.has(crop.id) && zone === 'threshing' && part.elementType === 'skip-wire')
    return `it lets ${cropAdjective(crop.id)} heads through unthreshed`;
  if (SMALL_SEEDED.has(crop.id) && part.elementType === 'close-bar')
    return `it grinds ${cropAdjective(crop.id)} straw to chaff that loads the sieves`;
  return null;
}

const byRankThenPrice = (a: Candidate, b: Candidate) =>
  a.rank - b.rank || a.part.priceCents - b.part.priceCents || a.part.partNumber.localeCompare(b.part.partNumber);

function roleWord(family: MachineFamily, zone: Zone): string {
  return family.cageKind === 'split' ? (zone === 'threshing' ? 'concave' : 'grate') : 'element';
}

function elementSlot(
  family: MachineFamily,
  parts: readonly CatalogPart[],
  crop: CropProgram,
  mode: PlanMode,
  position: number,
  zone: Zone,
  side: Side,
): SlotTarget | Impossible {
  const place = elementPlace(position, side);
  const want = zone === 'threshing' ? crop.suggested.threshing : crop.suggested.separating;
  const cropWord = cropNoun(crop.id);
  const role = roleWord(family, zone);
  const fits = parts.filter((p): p is ElementPart => p.kind === 'element' && elementFits(family, p, zone, side));
  const suited = fits.filter((p) => elementTrouble(p, zone, crop) === null);
  const own = suited.filter((p) => p.elementType === want);
  const programWhy = `the ${cropAdjective(crop.id)} program asks for a ${elementWord(want)} ${role} in the ${zone} zone`;
  const distance = (p: ElementPart) => 1 + Math.round(Math.abs(ELEMENT_AGGRESSIVENESS[p.elementType] - ELEMENT_AGGRESSIVENESS[want]) * 20);

  const candidates: Candidate[] = own.map((part) => ({ part, rank: 0, why: programWhy }));
  if (mode === 'on-hand' || own.length === 0) {
    for (const part of suited) {
      // A blank plate has no opening at all: it is a crop program's deliberate choice, never a
      // stand-in for another element.
      if (part.elementType === want || part.elementType === 'blank') continue;
      const why =
        own.length === 0
          ? `${elementWord(part.elementType)} suits ${cropWord} in the ${zone} zone; the catalog has no ${side}-hand ${elementWord(want)} ${role}, which the program would use`
          : `${elementWord(part.elementType)} suits ${cropWord} in the ${zone} zone too (the program's choice is ${elementWord(want)})`;
      candidates.push({ part, rank: distance(part), why });
    }
  }
  if (candidates.length === 0) {
    const what = `${side}-hand ${role}`;
    if (fits.length === 0)
      return {
        place,
        message: `The catalog has no ${what} for the ${family.name} that fits ${elementPlaceWords(position, side)} (${zone} zone), so that half-position cannot be filled.`,
      };
    const troubles = fits.map((p) => `${elementWord(p.elementType)}: ${elementTrouble(p, zone, crop)}`);
    return {
      place,
      message: `None of the ${what}s in the catalog suits ${cropWord} at ${elementPlaceWords(position, side)} (${zone} zone): ${listWords(troubles)}. Add a ${elementWord(want)} ${role} to the catalog.`,
    };
  }
  return { place, key: placeKey(place), candidates: candidates.sort(byRankThenPrice), empty: null };
}

function coverSlots(
  family: MachineFamily,
  parts: readonly CatalogPart[],
  crop: CropProgram,
  mode: PlanMode,
  vaneControl: VaneControl,
  notes: string[],
  offReasons: Map<string, string>,
): SlotTarget[] {
  const cropWord = cropNoun(crop.id);
  const slots: SlotTarget[] = [];
  const plates = (side: Side) =>
    parts.filter((p): p is CoverPlatePart => p.kind === 'cover-plate' && p.fitGroup === family.fitGroup && p.side === side);
  let rightWanted = crop.threshability === 'hard';
  for (const section of family.cageTopSections) {
    for (const side of SIDES) {
      const place = coverPlace(section.index, side);
      const key = placeKey(place);
      if (!section.coverPlateSides.includes(side)) {
        offReasons.set(key, `cage-top section ${section.index} has no mounting for a ${side} cover plate`);
        continue;
      }
      if (crop.threshability !== 'hard') {
        offReasons.set(
          key,
          `${cropWord} ${cropVerb(crop.id, 'threshes', 'thresh')} without cover plates; they only cost separating area and capacity`,
        );
        continue;
      }
      if (side === 'left' && vaneControl !== 'fixed') {
        offReasons.set(key, `the ${vaneControl} vane linkage runs over the left side of the cage top, so the left plate cannot stay on`);
        continue;
      }
      // With vanes set by bolts, a slotted plate lets them be moved with the plate on.
      const candidates = plates(side).map((part) => ({
        part,
        rank: (side === 'right' ? 0 : 1) + (vaneControl === 'fixed' && !part.slotted ? 1 : 0),
        why:
          side === 'right'
            ? `${cropWord} ${cropVerb(crop.id, 'is', 'are')} hard to thresh; the right cover plate keeps heads in the threshing zone longer`
            : `with fixed vanes the left plate may stay on in ${cropWord}, which ${cropVerb(crop.id, 'is', 'are')} hard to thresh`,
      }));
      if (side === 'right' && rightWanted) {
        rightWanted = false;
        if (candidates.length === 0) {
          notes.push(
            `The ${cropAdjective(crop.id)} program would fit a right cover plate, but the catalog has none for the ${family.name}.`,
          );
          slots.push({ place, key, candidates, empty: { rank: 0, why: 'the catalog has no right cover plate for this family' } });
        } else if (mode === 'on-hand') {
          slots.push({
            place,
            key,
            candidates,
            empty: { rank: 1, why: `no right cover plate is on hand; fit one if ${cropAdjective(crop.id)} heads go through unthreshed` },
          });
        } else {
          slots.push({ place, key, candidates, empty: null });
        }
      } else {
        const why =
          side === 'left'
            ? 'the left plate is optional; the right one does most of the work'
            : 'one right cover plate is enough; more closes separating area';
        slots.push({ place, key, candidates, empty: { rank: candidates.length ? 1 : 0, why } });
      }
    }
  }
  return slots;
}

function barSlots(family: MachineFamily, parts: readonly CatalogPart[], crop: CropProgram, mode: PlanMode, notes: string[]): SlotTarget[] {
  const cropWord = cropNoun(crop.id);
  const bars = parts.filter((p): p is RotorBarPart => p.kind === 'rotor-bar' && p.fitGroup === family.fitGroup);
  const ofKind = (k: BarKind) => bars.filter((b) => b.barKind === k);
  const straightWanted = crop.rotorBars.straight === 'wanted';
  const dischargeWanted = crop.rotorBars.discharge === 'wanted';
  const straight = ofKind('straight');
  const discharge = ofKind('discharge');
  if (straightWanted && straight.length === 0 && family.rotorBarPlaces.some((p) => p.inLine))
    notes.push(
      `The ${cropAdjective(crop.id)} program would bolt straight bars across the in-line rasp bars, but the catalog has none for the ${family.name}.`,
    );
  if (dischargeWanted && discharge.length === 0)
    notes.push(
      `The ${cropAdjective(crop.id)} program would fit discharge bars at the rear, but the catalog has none for the ${family.name}.`,
    );

  // Discharge and straight-bar mounts as the starter layout sets them (rotor.ts): an opposite
  // pair of discharge bars at the rear and one ahead of it; one straight bar across each in-line
  // pair, which takes both mounts; spike rasp bars on in-line mounts without one (common practice).
  const model = rotorModel(family);
  const useStraight = straightWanted && straight.length > 0;

  // One kind per mount: the wanted kind, else the first rasp kind the catalog has. Offering a
  // choice of kinds would let the solver put different kinds on opposite places (unbalanced).
  const raspCandidates = (rank0Why: string, first: BarKind = 'rasp'): Candidate[] => {
    const kinds = [first, ...RASP_KINDS.filter((k) => k !== first)];
    const i = kinds.findIndex((k) => ofKind(k).length > 0);
    if (i < 0) return [];
    const k = kinds[i]!;
    return ofKind(k).map((part) => ({
      part,
      rank: i === 0 ? 0 : 1,
      why: i === 0 ? rank0Why : `a ${k.replace('-', ' ')} bar does the ${first.replace('-', ' ')} bar's job here`,
    }));
  };

  const slots: SlotTarget[] = [];
  for (const p of [...family.rotorBarPlaces].sort((a, b) => a.row - b.row || a.position - b.position)) {
    const place = barPlace(p.row, p.position);
    const key = placeKey(place);
    const spanKey = `${p.row}:${p.position}`;
    if (useStraight && model.spanByRear.has(spanKey)) {
      const span = model.spanByRear.get(spanKey)!;
      slots.push({
        place,
        key,
        candidates: [],
        empty: { rank: 0, why: `the straight bar from position ${span.front} takes this mount too` },
      });
      continue;
    }
    let candidates: Candidate[];
    if (useStraight && model.spanByFront.has(spanKey)) {
      candidates = straight.map((part) => ({ part, rank: 0, why: crop.rotorBars.advice.replace(/\s*\(common practice\)/, '') }));
    } else if (dischargeWanted && isDischargeMount(family, p.row, p.position) && discharge.length) {
      candidates = discharge.map((part) => ({
        part,
        rank: 0,
        why: `discharge bars move stringy ${cropWord} out at the rear before ${cropVerb(crop.id, 'it ropes', 'they rope')}`,
      }));
    } else if (p.inLine) {
      candidates = raspCandidates(`spike rasp bars go on the in-line mounts when no straight bar is fitted`, 'spike-rasp');
    } else {
      candidates = raspCandidates(`rasp bars keep ${cropWord} moving along the rotor`);
    }
    candidates.sort(byRankThenPrice);
    slots.push({
      place,
      key,
      candidates,
      empty: candidates.length ? null : { rank: 0, why: 'no rotor bar in the catalog suits this place' },
    });
  }
  return slots;
}

/** The target of every place for `crop` on `family` with the machine's vane control. */
export function buildTargets(
  family: MachineFamily,
  catalog: CatalogIndex,
  crop: CropProgram,
  mode: PlanMode,
  vaneControl: VaneControl,
): Targets {
  const parts = catalog.parts;
  const slots: SlotTarget[] = [];
  const impossible: Impossible[] = [];
  const notes: string[] = [];
  const offReasons = new Map<string, string>();
  for (const side of SIDES)
    for (const pos of family.positions) {
      const t = elementSlot(family, parts, crop, mode, pos.index, pos.zone, side);
      if ('candidates' in t) slots.push(t);
      else impossible.push(t);
    }
  slots.push(...coverSlots(family, parts, crop, mode, vaneControl, notes, offReasons));
  slots.push(...barSlots(family, parts, crop, mode, notes));
  return { slots, impossible, notes, offReasons };
}
