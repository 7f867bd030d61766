/**
 * Rotor tip speed and the rpm window of a crop.
 * v = π·D·n / 60 (D in m, n in rpm, v in m/s) — USDA Yearbook of Agriculture 1961 "Seeds".
 */
import type { CropProgram } from './crops';
import { cropPrograms } from './crops';
import type { CropId, DrumId } from './schemas';
import { metresPerSecond, mm, rpm, type MetresPerSecond, type Mm, type Rpm } from './units';

/** Rim speed of a rotor of diameter `diameter` turning at `speed`. */
export function tipSpeed(diameter: Mm, speed: Rpm): MetresPerSecond {
  return metresPerSecond((Math.PI * (diameter / 1000) * speed) / 60);
}

/** The rpm that gives tip speed `v` on a rotor of diameter `diameter`. */
export function rpmForTipSpeed(v: MetresPerSecond, diameter: Mm): Rpm {
  return rpm((v * 60) / (Math.PI * (diameter / 1000)));
}

/** The slim drum runs about 100 rpm faster than the full drum in the same crop (common practice). */
export const SLIM_DRUM_RPM_SHIFT = 100;

export interface RpmWindow {
  readonly minRpm: Rpm;
  readonly maxRpm: Rpm;
  /** The crop's tip-speed window the rpm came from (before the slim-drum shift). */
  readonly tipMinMs: MetresPerSecond;
  readonly tipMaxMs: MetresPerSecond;
  /** rpm added for the drum option (0 for the full drum). */
  readonly shiftRpm: number;
  readonly diameterMm: Mm;
  readonly source: string;
}

/**
 * The rotor speed window for a crop on a drum: the crop's tip-speed window turned into rpm on
 * the drum's diameter, then shifted +100 rpm for the slim drum (common practice).
 */
export function rpmWindow(crop: CropProgram | CropId, drum: { id: DrumId; diameterMm: number }): RpmWindow {
  const c = typeof crop === 'string' ? cropPrograms[crop] : crop;
  const d = mm(drum.diameterMm);
  const shiftRpm = drum.id === 'slim' ? SLIM_DRUM_RPM_SHIFT : 0;
  const tipMinMs = metresPerSecond(c.tipSpeedMs.min);
  const tipMaxMs = metresPerSecond(c.tipSpeedMs.max);
  return {
    minRpm: rpm(rpmForTipSpeed(tipMinMs, d) + shiftRpm),
    maxRpm: rpm(rpmForTipSpeed(tipMaxMs, d) + shiftRpm),
    tipMinMs,
    tipMaxMs,
    shiftRpm,
    diameterMm: d,
    source: c.tipSpeedMs.source,
  };
}

/** Whether `speed` lies in the window, rounding the window outward to whole rpm. */
/**
 * The window in whole rpm, as every screen shows it and as inRpmWindow judges: the lower end
 * rounded down, the upper end rounded up. One place, so no two screens disagree by one rpm.
 */
export function rpmWindowWhole(w: RpmWindow): { lo: number; hi: number } {
  return { lo: Math.floor(w.minRpm), hi: Math.ceil(w.maxRpm) };
}

/** "727–977 rpm". */
export function rpmWindowWords(w: RpmWindow): string {
  const { lo, hi } = rpmWindowWhole(w);
  return `${lo}–${hi} rpm`;
}

export function inRpmWindow(speed: number, w: RpmWindow): boolean {
  const { lo, hi } = rpmWindowWhole(w);
  return speed >= lo && speed <= hi;
}

/** A whole-rpm speed in the middle of the window (what a starter layout uses). */
export function middleRpm(w: RpmWindow): number {
  return Math.round((w.minRpm + w.maxRpm) / 2);
}
