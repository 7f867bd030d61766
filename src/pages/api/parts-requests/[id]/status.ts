import { readJson, requireActor, route, parseId, routeInputs } from '~/lib/server/http';
import { advancePartsRequest, statusChangeSchema } from '~/lib/server/services/parts-requests';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: statusChangeSchema } });

/** The dealer's parts desk moves a request on: { status: 'acknowledged' | 'ready' | 'picked-up' }. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'parts.desk');
  const id = parseId(ctx.params.id);
  const { status } = await readJson(ctx.request, inputs.POST.body);
  return advancePartsRequest(actor, id, status, ctx.url.origin);
});
