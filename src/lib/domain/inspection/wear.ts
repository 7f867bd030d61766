/** Inspection measurement one: bar wear depth under a straight edge. */
import type { InspectionSeverity } from './checklist';
import { round2 } from './numbers';

// ---------------------------------------------------------------------------------------------
// Measurement one: bar wear depth under a straight edge

/**
 * Replace a bar whose wear, measured as the gap under a straight edge laid across it, is past
 * about 6 mm (a quarter inch). Common practice, no published source.
 */
export const WEAR_REPLACE_MM = 6;
/** Our own early warning: two thirds of the way to the limit, say so before it is reached. */
export const WEAR_WATCH_MM = 4;

export interface WearVerdict {
  verdict: InspectionSeverity;
  depthMm: number;
  limitMm: number;
  /** Wear left before the limit; negative once past it. */
  remainingMm: number;
}

export function assessWear(depthMm: number, limitMm = WEAR_REPLACE_MM): WearVerdict {
  if (!Number.isFinite(depthMm) || depthMm < 0) throw new RangeError('wear depth must be a number of millimetres, zero or more');
  const watchAt = (limitMm * WEAR_WATCH_MM) / WEAR_REPLACE_MM;
  const verdict: InspectionSeverity = depthMm > limitMm ? 'replace' : depthMm >= watchAt ? 'watch' : 'ok';
  return { verdict, depthMm, limitMm, remainingMm: round2(limitMm - depthMm) };
}
