import { parseId, requireActor, route, routeInputs, refuseBody } from '~/lib/server/http';
import { revokeShareLink } from '~/lib/server/services/sharing';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ DELETE: {} });

/** Revoke: the link answers 404 from now on. */
export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, 'shares.write');
  await refuseBody(ctx.request);
  return revokeShareLink(actor, parseId(ctx.params.id));
});
