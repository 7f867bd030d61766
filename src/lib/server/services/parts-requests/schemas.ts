/** Parts requests: what the API and the pages accept. */
import { z } from 'zod';
import { partsRequestStatuses } from '~/db/schema';
import { cropIdSchema, partNumberSchema } from '~/lib/domain/schemas';
import { planModeSchema } from '~/lib/domain/planner';

export const MAX_QTY = 999;
export const note = z.string().trim().max(2000).default('');

export const lineInputSchema = z.object({
  partNumber: partNumberSchema,
  quantity: z.int({ error: 'give a whole number' }).min(1, { error: 'must be at least 1' }).max(MAX_QTY),
});
export type LineInput = z.infer<typeof lineInputSchema>;

/**
 * Why parts are ordered for a layout that does not fit (blocks-fit findings): technicians and
 * administrators only (`parts.overrideFit`), 10 to 500 characters once trimmed.
 */
export const overrideReasonSchema = z
  .string()
  .trim()
  .min(10, { error: 'give a reason of at least 10 characters' })
  .max(500, { error: 'at most 500 characters' })
  .optional();

export const createPartsRequestSchema = z.discriminatedUnion('from', [
  z.object({
    from: z.literal('plan'),
    machineId: z.uuid(),
    crop: cropIdSchema,
    mode: planModeSchema.default('program'),
    note,
    overrideReason: overrideReasonSchema,
  }),
  z.object({
    from: z.literal('layout'),
    layoutId: z.uuid(),
    version: z.int32().min(1).optional(),
    note,
    overrideReason: overrideReasonSchema,
  }),
  z.object({ from: z.literal('manual'), machineId: z.uuid(), lines: z.array(lineInputSchema).min(1).max(100), note }),
]);
export type CreatePartsRequest = z.infer<typeof createPartsRequestSchema>;

/** Editing a draft: the full list of lines (quantity 0 drops a line) and the note. */
export const updatePartsRequestSchema = z
  .object({
    lines: z
      .array(
        z.object({
          partNumber: partNumberSchema,
          quantity: z.int({ error: 'give a whole number' }).min(0, { error: 'cannot be negative' }).max(MAX_QTY),
        }),
      )
      .max(100)
      .optional(),
    note: z.string().trim().max(2000).optional(),
  })
  .refine((v) => v.lines !== undefined || v.note !== undefined, { message: 'give lines or a note to change', path: ['lines'] });

export const statusChangeSchema = z.object({ status: z.enum(partsRequestStatuses) });

export const listQuerySchema = z.object({
  status: z.enum(partsRequestStatuses).optional(),
  /** 'incoming': requests sent to the actor's dealer; 'own': the actor's organisations' requests. */
  scope: z.enum(['all', 'incoming', 'own']).default('all'),
});
