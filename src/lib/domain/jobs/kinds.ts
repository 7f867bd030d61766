/**
 * The kinds of job-card step, with the flat-rate minutes a dealer starts from. The planner's own
 * step kinds come first (a job from a plan keeps them); `replace` and `look` come from an
 * inspection's lines, `other` from steps typed by hand.
 */
import { z } from 'zod';

export const JOB_STEP_KINDS = [
  'fetch',
  'buy',
  'wait',
  'remove',
  'move',
  'swap',
  'install',
  'set',
  'check',
  'replace',
  'look',
  'other',
] as const;
export const jobStepKindSchema = z.enum(JOB_STEP_KINDS, { error: `the kind of step is one of ${JOB_STEP_KINDS.join(', ')}` });
export type JobStepKind = z.infer<typeof jobStepKindSchema>;

/** Each kind as a person reads it (a column heading, a form label). */
export const STEP_KIND_WORDS: Readonly<Record<JobStepKind, string>> = {
  fetch: 'Take from the farm’s shelf',
  buy: 'Collect or order a part',
  wait: 'Wait for parts',
  remove: 'Take a part off',
  move: 'Move a part',
  swap: 'Swap or rotate parts',
  install: 'Fit a part',
  set: 'Set a setting',
  check: 'Check',
  replace: 'Replace a worn or damaged part',
  look: 'Look at a part again',
  other: 'Other work',
};

/**
 * Flat-rate minutes per kind when the dealer has not set its own. Invented for the demo (no
 * published source): a dealer replaces them with its own on /admin/flat-rates.
 */
export const DEFAULT_FLAT_RATES: Readonly<Record<JobStepKind, number>> = {
  fetch: 10,
  buy: 5,
  wait: 0,
  remove: 20,
  move: 30,
  swap: 45,
  install: 25,
  set: 10,
  check: 10,
  replace: 40,
  look: 10,
  other: 15,
};

/** The most minutes a flat rate or a typed estimate may give one step (a long working day). */
export const MAX_STEP_MINUTES = 24 * 60;

export const flatRateMinutesSchema = z
  .int({ error: 'minutes are a whole number' })
  .min(0, { error: 'minutes cannot be negative' })
  .max(MAX_STEP_MINUTES, { error: `at most ${MAX_STEP_MINUTES} minutes` });
