/** What the job-card routes and pages read (zod), shared by the API and the page forms. */
import { z } from 'zod';
import { partNumberSchema } from '~/lib/domain/schemas';
import { storableString } from '~/lib/domain/text';
import { checklistAnswersSchema, flatRateMinutesSchema, jobStepKindSchema, JOB_STEP_KINDS } from '~/lib/domain/jobs';
import { hoursReadingSchema } from '~/lib/domain/machine-hours';
import { jobPartSources, jobStatuses } from '~/db/schema';

const title = storableString().trim().min(1, { error: 'give the job a title' }).max(120, { error: 'at most 120 characters' });
const assignedTo = z.uuid({ error: 'the id of a technician' }).nullable().optional();

export const jobStepInputSchema = z
  .object({
    kind: jobStepKindSchema,
    text: storableString().trim().min(1, { error: 'say what the step is' }).max(1000, { error: 'at most 1000 characters' }),
    /** Minutes for this step; absent or null: the flat rate of its kind. */
    minutes: flatRateMinutesSchema.nullable().optional(),
  })
  .strict();

export const jobPartInputSchema = z
  .object({
    partNumber: partNumberSchema,
    quantity: z.int({ error: 'a whole number' }).min(1, { error: 'at least 1' }).max(999, { error: 'at most 999' }),
    source: z.enum(jobPartSources, { error: `where it comes from: ${jobPartSources.join(', ')}` }),
  })
  .strict();

export const createJobSchema = z.discriminatedUnion('origin', [
  z.object({ origin: z.literal('plan'), layoutId: z.uuid(), version: z.int32().min(1), title: title.optional(), assignedTo }).strict(),
  z.object({ origin: z.literal('inspection'), inspectionId: z.uuid(), title: title.optional(), assignedTo }).strict(),
  z
    .object({
      origin: z.literal('hand'),
      machineId: z.uuid(),
      title,
      steps: z.array(jobStepInputSchema).min(1, { error: 'give at least one step' }).max(200),
      parts: z.array(jobPartInputSchema).max(100).default([]),
      assignedTo,
    })
    .strict(),
]);
export type CreateJob = z.infer<typeof createJobSchema>;

/**
 * Changes to a job card. `steps` and `parts` replace the whole list (while planned or in
 * progress); `done` ticks steps off or on by id (in progress only).
 */
export const updateJobSchema = z
  .object({
    title: title.optional(),
    assignedTo,
    steps: z.array(jobStepInputSchema).min(1, { error: 'keep at least one step' }).max(200).optional(),
    parts: z.array(jobPartInputSchema).max(100).optional(),
    done: z
      .array(z.object({ id: z.uuid(), done: z.boolean() }).strict())
      .max(200)
      .optional(),
  })
  .strict()
  .refine((v) => Object.values(v).some((x) => x !== undefined), {
    error: 'give at least one of title, assignedTo, steps, parts or done',
    path: ['title'],
  });
export type UpdateJob = z.infer<typeof updateJobSchema>;

/** Moving a job card on: to in progress, or to done with the hours read then. */
export const moveJobSchema = z
  .object({
    status: z.enum(jobStatuses.filter((s) => s !== 'planned' && s !== 'signed_off') as ['in_progress', 'done'], {
      error: 'status is "in_progress" or "done" (sign off through /sign-off)',
    }),
    hours: hoursReadingSchema.optional(),
  })
  .strict();
export type MoveJob = z.infer<typeof moveJobSchema>;

export const signOffSchema = z.object({ checklist: checklistAnswersSchema }).strict();

export const listJobsQuerySchema = z.object({
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
  status: z.enum(jobStatuses).optional(),
  machineId: z.uuid().optional(),
});
export type ListJobsQuery = z.infer<typeof listJobsQuerySchema>;

export const flatRatesInputSchema = z
  .object({
    rates: z.partialRecord(jobStepKindSchema, flatRateMinutesSchema).refine((r) => Object.keys(r).length > 0, {
      error: `give the minutes of at least one kind: ${JOB_STEP_KINDS.join(', ')}`,
    }),
  })
  .strict();
