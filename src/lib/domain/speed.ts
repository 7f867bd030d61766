/**
 * Rotor tip speed and the rpm window of a crop.
 * v = π·D·n / 60 (D in m, n in rpm, v in m/s) — USDA Yearbook of Agriculture 1961 "Seeds".
 */
import type { CropProgram, SpeedRange } from './crops';
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

/** One cited range on a drum: whole rpm as every screen shows it, with its source. */
export interface RpmRange {
  /** Lower end rounded down, upper end rounded up (a figure given in rpm comes back exact). */
  readonly lo: number;
  readonly hi: number;
  /** The ends before rounding. */
  readonly minRpm: number;
  readonly maxRpm: number;
  readonly tipMinMs: MetresPerSecond;
  readonly tipMaxMs: MetresPerSecond;
  readonly source: string;
}

export interface RpmWindow {
  /** The span from the slowest to the fastest cited range, rpm (after the slim-drum shift). */
  readonly minRpm: Rpm;
  readonly maxRpm: Rpm;
  /** The same span as tip speed, before the slim-drum shift. */
  readonly tipMinMs: MetresPerSecond;
  readonly tipMaxMs: MetresPerSecond;
  /** rpm added for the drum option (0 for the full drum). */
  readonly shiftRpm: number;
  readonly diameterMm: Mm;
  /** Every cited range on this drum: inside any of them never hurts the crop. */
  readonly ranges: readonly RpmRange[];
  /** The narrower "start here" band, if the program has one (outside it is advice only). */
  readonly start: RpmRange | null;
  /** The sources of the ranges, joined. */
  readonly source: string;
}

// Tolerance for rpm that went through tip speed and back (floating point), far below one rpm.
const EPS = 1e-6;

function onDrum(r: SpeedRange, d: Mm, shiftRpm: number): RpmRange {
  const minRpm = rpmForTipSpeed(metresPerSecond(r.minMs), d) + shiftRpm;
  const maxRpm = rpmForTipSpeed(metresPerSecond(r.maxMs), d) + shiftRpm;
  return {
    lo: Math.floor(minRpm + EPS),
    hi: Math.ceil(maxRpm - EPS),
    minRpm,
    maxRpm,
    tipMinMs: metresPerSecond(r.minMs),
    tipMaxMs: metresPerSecond(r.maxMs),
    source: r.source,
  };
}

/**
 * The rotor speed window for a crop on a drum: each cited tip-speed range turned into rpm on the
 * drum's diameter, then shifted +100 rpm for the slim drum (common practice). The published
 * figures are for the usual (full) drum; the slim drum takes the same windows 100 rpm higher.
 */
export function rpmWindow(crop: CropProgram | CropId, drum: { id: DrumId; diameterMm: number }): RpmWindow {
  const c = typeof crop === 'string' ? cropPrograms[crop] : crop;
  // The built-in programs are frozen: their windows are worked out once per drum (checkLayout runs on every edit).
  const builtIn = cropPrograms[c.id] === c;
  const key = `${c.id}|${drum.id}|${drum.diameterMm}`;
  if (builtIn) {
    const hit = WINDOWS.get(key);
    if (hit) return hit;
  }
  const w = computeWindow(c, drum);
  if (builtIn) WINDOWS.set(key, w);
  return w;
}

const WINDOWS = new Map<string, RpmWindow>();

function computeWindow(c: CropProgram, drum: { id: DrumId; diameterMm: number }): RpmWindow {
  const d = mm(drum.diameterMm);
  const shiftRpm = drum.id === 'slim' ? SLIM_DRUM_RPM_SHIFT : 0;
  const ranges = c.speed.ranges.map((r) => onDrum(r, d, shiftRpm));
  const tipMin = Math.min(...c.speed.ranges.map((r) => r.minMs));
  const tipMax = Math.max(...c.speed.ranges.map((r) => r.maxMs));
  return Object.freeze({
    minRpm: rpm(rpmForTipSpeed(metresPerSecond(tipMin), d) + shiftRpm),
    maxRpm: rpm(rpmForTipSpeed(metresPerSecond(tipMax), d) + shiftRpm),
    tipMinMs: metresPerSecond(tipMin),
    tipMaxMs: metresPerSecond(tipMax),
    shiftRpm,
    diameterMm: d,
    ranges,
    start: c.speed.start ? onDrum(c.speed.start, d, shiftRpm) : null,
    source: [...new Set(c.speed.ranges.map((r) => r.source))].join('; '),
  });
}

/**
 * The span of the window in whole rpm, as every screen shows it: the slowest range's lower end
 * and the fastest range's upper end. One place, so no two screens disagree by one rpm.
 */
export function rpmWindowWhole(w: RpmWindow): { lo: number; hi: number } {
  return { lo: Math.min(...w.ranges.map((r) => r.lo)), hi: Math.max(...w.ranges.map((r) => r.hi)) };
}

/** The cited ranges merged where they touch or overlap, slowest first. */
export function rpmWindowSpans(w: RpmWindow): { lo: number; hi: number }[] {
  const sorted = [...w.ranges].sort((a, b) => a.lo - b.lo);
  const out: { lo: number; hi: number }[] = [];
  for (const r of sorted) {
    const last = out[out.length - 1];
    if (last && r.lo <= last.hi + 1) last.hi = Math.max(last.hi, r.hi);
    else out.push({ lo: r.lo, hi: r.hi });
  }
  return out;
}

/** "727–977 rpm" (or "200–250 or 300–400 rpm" where the cited ranges leave a gap). */
export function rpmWindowWords(w: RpmWindow): string {
  return `${rpmWindowSpans(w)
    .map((s) => `${s.lo}–${s.hi}`)
    .join(' or ')} rpm`;
}

/** Whether `speed` lies inside any cited range (whole-rpm ends, rounded outward). */
export function inRpmWindow(speed: number, w: RpmWindow): boolean {
  return w.ranges.some((r) => speed >= r.lo && speed <= r.hi);
}

/** Whether `speed` lies in the "start here" band (true when the program has none). */
export function inStartBand(speed: number, w: RpmWindow): boolean {
  return !w.start || (speed >= w.start.lo && speed <= w.start.hi);
}

/**
 * Where a new layout starts: the slow end of the start band, or of the window when the program
 * has no band (start slow, go up only as losses call for it: Iowa State University Extension, Hanna).
 */
export function startRpm(w: RpmWindow): number {
  const slowest = w.start ?? [...w.ranges].sort((a, b) => a.minRpm - b.minRpm)[0]!;
  // The first whole rpm at or above the source's own lower end, so the start is inside it exactly.
  return Math.ceil(slowest.minRpm - EPS);
}

/** A whole-rpm speed in the middle of the window. */
export function middleRpm(w: RpmWindow): number {
  return Math.round((w.minRpm + w.maxRpm) / 2);
}
