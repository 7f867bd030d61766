import { parseId, requireActor, route, routeInputs, refuseBody } from '~/lib/server/http';
import { deleteLossCheck, getLossCheck } from '~/lib/server/services/field-checks';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ DELETE: {} });

/** One loss check: what was counted, what it came to, and the settings of the moment. */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  return getLossCheck(actor, parseId(ctx.params.id));
});

/** Removes a check recorded by mistake (audited). */
export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, 'lossChecks.write');
  await refuseBody(ctx.request);
  return deleteLossCheck(actor, parseId(ctx.params.id));
});
