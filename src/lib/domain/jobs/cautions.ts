/**
 * The cautions at the head of a job card and its printed sheet: the planner's cautions for work
 * on the cage, with the rotor locked against turning. The operator's manual of the machine, local
 * regulations and licensed practice come first.
 */
import { WORK_CAUTIONS } from '~/lib/domain/planner/cautions';

export const JOB_CAUTIONS: readonly string[] = [
  ...WORK_CAUTIONS.slice(0, 3),
  'Lock the rotor against turning (with the machine’s rotor lock where it has one) before anyone reaches into the cage.',
  ...WORK_CAUTIONS.slice(3),
];
