/**
 * Effort of the work on the cage: the mass lifted and the time it takes.
 *
 * Every part handled is lifted once to take it off and once to fit it: a part that stays is not
 * lifted, one taken off is lifted once, one moved twice (off, then on at its new place), a spare
 * or a bought part once. The time of one lift is a fixed handling time per kind of part (undo and
 * do up the bolts, line the part up) plus a time per kilogram (heavier parts go slower, with a
 * helper or a lifting aid). Rotor bars sit on the rotor: reaching them (open the access, turn the
 * rotor to each row) costs a fixed time once, whatever the number of bars touched.
 *
 * The minutes are invented planning figures for the demo (common practice, no published source):
 * a crew should replace them with their own.
 */
import type { CatalogPart } from '~/lib/domain/schemas';
import type { SlotGroup } from './targets';

/** Seconds per lift by kind of part (invented planning figures, common practice, no published source). */
export const HANDLING_SECONDS: Readonly<Record<SlotGroup, number>> = {
  element: 15 * 60,
  cover: 5 * 60,
  bar: 6 * 60,
};

/** Seconds per kilogram lifted (invented planning figure, common practice, no published source). */
export const SECONDS_PER_KG = 6;

/** Reaching the rotor bars, once if any bar is touched (invented planning figure, common practice, no published source). */
export const ROTOR_ACCESS_SECONDS = 30 * 60;

export function groupOfKind(kind: CatalogPart['kind']): SlotGroup {
  return kind === 'element' ? 'element' : kind === 'cover-plate' ? 'cover' : 'bar';
}

/** Seconds of one lift of this part (a whole number). A part the catalog does not know counts its kind's time only. */
export function liftSeconds(group: SlotGroup, massKg: number | undefined): number {
  return HANDLING_SECONDS[group] + Math.round((massKg ?? 0) * SECONDS_PER_KG);
}

export interface Effort {
  /** Mass lifted, kg (a part moved counts twice: off and on). */
  massKg: number;
  /** Working time, seconds, rotor access included. */
  seconds: number;
  /** Number of lifts. */
  lifts: number;
  /** Whether the rotor bars have to be reached. */
  rotorAccess: boolean;
}

/** Adds up lifts: each entry is one part taken off or fitted. */
export function effortOf(lifts: readonly { group: SlotGroup; massKg: number | undefined }[]): Effort {
  let massKg = 0;
  let seconds = 0;
  let rotorAccess = false;
  for (const l of lifts) {
    massKg += l.massKg ?? 0;
    seconds += liftSeconds(l.group, l.massKg);
    if (l.group === 'bar') rotorAccess = true;
  }
  if (rotorAccess) seconds += ROTOR_ACCESS_SECONDS;
  return { massKg: Math.round(massKg * 10) / 10, seconds, lifts: lifts.length, rotorAccess };
}
