import { requireActor, route, parseId, routeInputs, refuseBody } from '~/lib/server/http';
import { submitPartsRequest } from '~/lib/server/services/parts-requests';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: {} });

/** Send a draft to the dealer's parts desk (e-mail to the desk, copy to the owner). */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'parts.request');
  await refuseBody(ctx.request);
  return submitPartsRequest(actor, parseId(ctx.params.id), ctx.url.origin);
});
