/**
 * The sign-off checklist of a job card: what a technician confirms on the machine before the job
 * is signed off. Every item must be answered; the loss check counts when it is done or booked.
 * The bolt item names the torque the catalog gives for the parts the job fits, if it has one.
 * Common practice, no published source; the operator's manual of the machine comes first.
 */
import { z } from 'zod';
import { torqueWords } from '~/lib/domain/planner/finish';
import type { UnitSystem } from '~/lib/domain/units';
import { listWords, plural } from '~/lib/domain/words';

export const CHECKLIST_IDS = ['concaveZeroed', 'clearanceSet', 'boltsTorqued', 'rotorTurned', 'guardsOn', 'testRun', 'lossCheck'] as const;
export type ChecklistId = (typeof CHECKLIST_IDS)[number];

const yes = z.boolean({ error: 'true when done, false when not' }).optional();

/** The answers as a form or an API body gives them. */
export const checklistAnswersSchema = z
  .object({
    concaveZeroed: yes,
    clearanceSet: yes,
    boltsTorqued: yes,
    rotorTurned: yes,
    guardsOn: yes,
    testRun: yes,
    /** The first loss check behind the machine: done, or booked with the operator. */
    lossCheck: z.enum(['done', 'booked', 'no'], { error: 'the loss check is "done", "booked" or "no"' }).optional(),
  })
  .strict();
export type ChecklistAnswers = z.infer<typeof checklistAnswersSchema>;

export interface ChecklistItem {
  id: ChecklistId;
  label: string;
  /** What it asks, in a sentence. */
  hint: string;
}

/** A part the job fits, as the bolt item reads it. */
export interface FittedPart {
  /** "fine-wire element", "rasp bar" (vocabulary.ts partName). */
  name: string;
  boltTorqueNm?: number;
}

function boltHint(fitted: readonly FittedPart[], units: UnitSystem): string {
  const byTorque = new Map<number, Set<string>>();
  let unknown = false;
  for (const p of fitted) {
    if (p.boltTorqueNm === undefined) unknown = true;
    else byTorque.set(p.boltTorqueNm, (byTorque.get(p.boltTorqueNm) ?? new Set()).add(plural(2, p.name)));
  }
  const manual = 'the torque in the operator’s manual';
  if (byTorque.size === 0) return `Every bolt of the parts fitted or moved is tightened with a torque wrench to ${manual}.`;
  const known = [...byTorque].sort((a, b) => a[0] - b[0]).map(([nm, names]) => `${listWords([...names])} to ${torqueWords(nm, units)}`);
  return `Torqued with a torque wrench to the catalog’s values: ${known.join('; ')}${unknown ? `; the others to ${manual}` : ''}.`;
}

/** The checklist for a job that fits these parts, in the reader's units. */
export function signOffChecklist(fitted: readonly FittedPart[], units: UnitSystem): ChecklistItem[] {
  return [
    {
      id: 'concaveZeroed',
      label: 'Concave zeroed and levelled',
      hint: 'Closed to the rotor, touching evenly front and rear, left and right, and the indicator set to zero there.',
    },
    { id: 'clearanceSet', label: 'Clearance set', hint: 'The concave opened from that zero to the clearance the layout gives.' },
    { id: 'boltsTorqued', label: 'Bolts torqued to the catalog’s values', hint: boltHint(fitted, units) },
    {
      id: 'rotorTurned',
      label: 'Rotor turned by hand',
      hint: 'At least one full turn, engine off and key out: nothing rubs, knocks or catches, no tool left in the cage.',
    },
    { id: 'guardsOn', label: 'Guards back on', hint: 'Every guard and shield back, every access cover closed.' },
    {
      id: 'testRun',
      label: 'Test run',
      hint: 'Everyone clear; threshing drive engaged at low idle, then up to speed, without rubbing, knocking or vibration.',
    },
    {
      id: 'lossCheck',
      label: 'Loss check done or booked',
      hint: 'Kernels counted behind the machine in the first field, or a day agreed with the operator.',
    },
  ];
}

/** The items not yet answered yes (the loss check: done or booked), in checklist order. */
export function missingItems(answers: Readonly<ChecklistAnswers>, items: readonly ChecklistItem[]): ChecklistItem[] {
  return items.filter((item) =>
    item.id === 'lossCheck' ? answers.lossCheck !== 'done' && answers.lossCheck !== 'booked' : answers[item.id] !== true,
  );
}
