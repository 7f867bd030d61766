import { json, parseParams, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { createPartsRequest, createPartsRequestSchema, listPartsRequests, listQuerySchema } from '~/lib/server/services/parts-requests';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: createPartsRequestSchema } });

/** The requests the user may see: their organisations' and, for dealer staff, those sent to the dealer. */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  const query = parseParams(Object.fromEntries(ctx.url.searchParams), listQuerySchema);
  return listPartsRequests(actor, query);
});

/** A draft from a plan ({ from: 'plan', machineId, crop }), a layout ({ from: 'layout', layoutId }) or lines ({ from: 'manual', machineId, lines }). */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'parts.request');
  const input = await readJson(ctx.request, inputs.POST.body);
  return json(await createPartsRequest(actor, input), 201);
});
