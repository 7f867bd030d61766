/**
 * The estimated time of a job card: each step takes the minutes typed for it, else the flat rate
 * of its kind — the dealer's own where it has set one, else the default (kinds.ts) — and the
 * estimate is their sum.
 */
import { DEFAULT_FLAT_RATES, JOB_STEP_KINDS, type JobStepKind } from './kinds';

export type FlatRates = Readonly<Record<JobStepKind, number>>;

/** The dealer's table over the defaults (a kind the dealer has not set keeps its default). */
export function flatRatesWith(dealer: Readonly<Partial<Record<string, number>>>): FlatRates {
  const out = { ...DEFAULT_FLAT_RATES };
  for (const kind of JOB_STEP_KINDS) {
    const v = Object.hasOwn(dealer, kind) ? dealer[kind] : undefined;
    if (typeof v === 'number' && Number.isFinite(v) && v >= 0) out[kind] = v;
  }
  return out;
}

export interface EstimatedStep {
  kind: JobStepKind;
  /** Minutes typed for this step; null or absent: the flat rate of its kind. */
  minutes?: number | null;
}

export interface Estimate {
  /** Minutes of each step, in order. */
  perStep: number[];
  totalMinutes: number;
  /** Minutes of the steps not yet done (null when no step says whether it is done). */
  remainingMinutes: number;
}

export function stepMinutes(step: EstimatedStep, rates: FlatRates): number {
  return step.minutes ?? rates[step.kind];
}

export function estimateJob(steps: readonly (EstimatedStep & { done?: boolean })[], rates: FlatRates): Estimate {
  const perStep = steps.map((s) => stepMinutes(s, rates));
  return {
    perStep,
    totalMinutes: perStep.reduce((a, b) => a + b, 0),
    remainingMinutes: steps.reduce((sum, s, i) => sum + (s.done ? 0 : perStep[i]!), 0),
  };
}

/** "2 h 35 min", "45 min", "0 min": a flat-rate time in words. */
export function minutesWords(minutes: number): string {
  const m = Math.max(0, Math.round(minutes));
  if (m < 60) return `${m} min`;
  const h = Math.floor(m / 60);
  return m % 60 ? `${h} h ${m % 60} min` : `${h} h`;
}
