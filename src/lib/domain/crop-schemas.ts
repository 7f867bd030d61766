/**
 * The shape of a crop program (crops.ts) as zod schemas: the tests hold every program to it.
 * Kept apart from the programs so the islands that read the programs are not sent zod.
 */
import { z } from 'zod';
import { cropIdSchema, elementTypeSchema, vaneSettingSchema } from './schemas';

const sourced = z.object({ value: z.number().positive(), source: z.string().min(1) });
export type Sourced = z.infer<typeof sourced>;

export const kernelSizeSchema = z.object({
  lengthMm: z.number().positive(),
  widthMm: z.number().positive(),
  thicknessMm: z.number().positive(),
  source: z.string().min(1),
});
export type KernelSize = z.infer<typeof kernelSizeSchema>;

/** A tip-speed range, m/s, with its citation (and the figure as the source gave it, if not m/s). */
export const speedRangeSchema = z.object({
  minMs: z.number().positive(),
  maxMs: z.number().positive(),
  source: z.string().min(1),
});
export type SpeedRange = z.infer<typeof speedRangeSchema>;

export const clearanceWindowSchema = z.object({
  minMm: z.number().positive(),
  maxMm: z.number().positive(),
  source: z.string().min(1),
});
export type ClearanceWindow = z.infer<typeof clearanceWindowSchema>;

export const cropProgramSchema = z.object({
  id: cropIdSchema,
  name: z.string(),
  kernel: kernelSizeSchema,
  /** min(width, thickness): the size that must get through an opening. */
  passingSizeMm: z.number().positive(),
  /** Thousand-kernel weight, grams. */
  tkwG: sourced,
  /** Cracks or splits easily: keep aggressive elements away (common practice). */
  fragile: z.boolean(),
  /** 'hard': heads or pods hold their grain; open threshing elements leave whitecaps. */
  threshability: z.enum(['easy', 'normal', 'hard']),
  /** Heavy, tough straw where the slim drum's extra capacity shows (common practice). */
  heavyStraw: z.boolean(),
  /** Long fibres that rope around the rotor. */
  stringy: z.boolean(),
  suggested: z.object({ threshing: elementTypeSchema, separating: elementTypeSchema }),
  /** Blank plates (no openings) have a place in this crop's cage (common practice: sunflower). */
  blankPlatesUsed: z.boolean().optional(),
  rotorBars: z.object({
    /** Straight interrupter bars across in-line rasp bars: wanted only where grain hides in husks. */
    straight: z.enum(['wanted', 'not-needed']),
    /** Discharge bars at the rear against roping. */
    discharge: z.enum(['wanted', 'not-needed']),
    advice: z.string(),
  }),
  /**
   * Rotor speed, stored as tip speed (m/s) so rpm follows from the rotor diameter. `ranges` are
   * the windows the program cites (a speed inside any of them never hurts the crop; outside all of
   * them it does); `start` is a narrower "start here" band inside them (outside it is advice).
   */
  speed: z.object({
    ranges: z.array(speedRangeSchema).min(1),
    start: speedRangeSchema.nullable(),
  }),
  bushel: z.object({
    /** US bushel weight, lb/bu. */
    usLb: sourced,
    /** Canadian bushels per metric tonne, where published. */
    canadaPerTonne: sourced.nullable(),
  }),
  /** A published kernels-per-area rule of thumb: kernels per ft² ≈ 1 bu/ac loss. */
  publishedLossCount: sourced.nullable(),
  /**
   * Concave clearance window, mm: tighter than `minMm` cracks kernels or crushes the crop; wider
   * than `maxMm` lets heads or pods through unthreshed. A new layout starts at `maxMm`.
   */
  clearanceMm: clearanceWindowSchema,
  /** Vane settings that suit the crop, and those that work against it (common practice). */
  vanes: z.object({ suits: z.array(vaneSettingSchema).min(1), against: z.array(vaneSettingSchema), source: z.string().min(1) }),
  clearanceAdvice: z.string(),
  notes: z.string().optional(),
});
export type CropProgram = z.infer<typeof cropProgramSchema>;
