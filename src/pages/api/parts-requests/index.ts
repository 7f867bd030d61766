import { json, parseParams, readJson, requireActor, route } from '../../../lib/server/http';
import {
  createPartsRequest,
  createPartsRequestSchema,
  listPartsRequests,
  listQuerySchema,
  } from '../../../lib/server/services/parts-requests';

/** The requests the user may see: their organisations' and, for dealer staff, those sent to the dealer. */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  const query = parseParams(Object.fromEntries(ctx.url.searchParams), listQuerySchema);
  return listPartsRequests(actor, query);
});

/** A draft from a plan ({ from: 'plan', machineId, crop }), a layout ({ from: 'layout', layoutId }) or lines ({ from: 'manual', machineId, lines }). */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'parts.request');
  const input = await readJson(ctx.request, createPartsRequestSchema);
  return json(await createPartsRequest(actor, input), 201);
});
