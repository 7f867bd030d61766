import { hoursReadingSchema } from '~/lib/domain/machine-hours';
import { json, parseId, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { listHours, recordHoursByHand } from '~/lib/server/services/machine-hours';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: hoursReadingSchema } });

/** The machine's engine and separator hour readings, newest first. */
export const GET = route(async (ctx) => listHours(requireActor(ctx, 'shop.view'), parseId(ctx.params.id)));

/** Records a reading by hand; lower than the last one only with `correctionReason` (else 400 naming the field). */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'hours.record');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.POST.body);
  return json(await recordHoursByHand(actor, id, input), 201);
});
