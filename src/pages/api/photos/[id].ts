import { parseId, requireActor, route, routeInputs, refuseBody } from '~/lib/server/http';
import { deletePhoto, photoResponse } from '~/lib/server/services/photos';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ DELETE: {} });

/** The photo itself (`?thumb=1` for the thumbnail), only to those who may see its inspection. */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  const id = parseId(ctx.params.id);
  return photoResponse(actor, id, ctx.url.searchParams.get('thumb') === '1');
});

/** Removes a photo from an open inspection. */
export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, 'inspections.write');
  await refuseBody(ctx.request);
  return deletePhoto(actor, parseId(ctx.params.id));
});
