/**
 * Machine hours: the engine and separator hour meters, read at inspections, job cards and loss
 * checks. A meter only counts up, so a reading lower than the last one is refused unless it is
 * marked as a correction with a reason (a meter replaced, a figure mistyped earlier).
 */
import { z } from 'zod';

/** Upper bound for an hour meter (a combine's meter reads far below this). */
export const MAX_HOURS = 100_000;

// zod 4 numbers are finite: Infinity and NaN are refused.
const hours = z.number().min(0, 'hours cannot be negative').max(MAX_HOURS, `at most ${MAX_HOURS} hours`);

/** A reading as a form or an API body gives it. */
export const hoursReadingSchema = z.object({
  engineHours: hours,
  separatorHours: hours,
  /** Why a reading lower than the last one is right (required only then). */
  correctionReason: z.string().trim().min(3, 'give the reason in a few words').max(500).optional(),
});
export type HoursReading = z.infer<typeof hoursReadingSchema>;

export interface LastHours {
  engineHours: number;
  separatorHours: number;
}

export interface HoursProblem {
  field: 'engineHours' | 'separatorHours';
  message: string;
}

/**
 * What is wrong with `next` given the machine's last reading (null: none yet). A meter lower than
 * the last reading is a problem unless the reading carries a correction reason; the separator
 * never runs more hours than the engine.
 */
export function checkHoursReading(last: LastHours | null, next: HoursReading): HoursProblem[] {
  const problems: HoursProblem[] = [];
  if (next.separatorHours > next.engineHours)
    problems.push({
      field: 'separatorHours',
      message: `separator hours (${next.separatorHours}) cannot exceed engine hours (${next.engineHours})`,
    });
  if (last && !next.correctionReason) {
    for (const field of ['engineHours', 'separatorHours'] as const) {
      if (next[field] < last[field])
        problems.push({
          field,
          message: `${field === 'engineHours' ? 'engine' : 'separator'} hours ${next[field]} are lower than the last reading (${last[field]}); give a correction reason if the last reading was wrong`,
        });
    }
  }
  return problems;
}
