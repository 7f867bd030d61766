import { z } from 'zod';
import { hoursReadingSchema } from '~/lib/domain/machine-hours';
import { parseId, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { finishInspection, getInspection, updateInspection, updateInspectionSchema } from '~/lib/server/services/inspections';

const actionSchema = z.object({
  action: z.literal('finish', { error: 'the only action is "finish"' }),
  /** Finish although the clearance survey is uneven and marked serviceable (a conscious choice). */
  acceptUnevenSurvey: z.boolean({ error: 'acceptUnevenSurvey is true or false' }).optional(),
  /** The engine and separator hours read at the inspection (optional; lower than the last only with a reason). */
  hours: hoursReadingSchema.optional(),
});

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: actionSchema }, PATCH: { body: updateInspectionSchema } });

export const GET = route(async (ctx) => getInspection(requireActor(ctx), parseId(ctx.params.id)));

/** Records findings, severities, measurements and notes on some lines (and the title). */
export const PATCH = route(async (ctx) => {
  const actor = requireActor(ctx, 'inspections.write');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.PATCH.body);
  return updateInspection(actor, id, input);
});

/** { "action": "finish" }: closes the inspection; lines marked replace go to a draft parts request. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'inspections.write');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.POST.body);
  return finishInspection(actor, id, { acceptUnevenSurvey: input.acceptUnevenSurvey, hours: input.hours });
});
