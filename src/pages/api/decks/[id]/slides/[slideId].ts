import { parseId, readJson, requireActor, route, routeInputs, refuseBody } from '~/lib/server/http';
import { deleteSlide, getSlide, updateSlide, updateSlideSchema } from '~/lib/server/services/decks';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ PATCH: { body: updateSlideSchema }, DELETE: {} });

export const GET = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  return { slide: await getSlide(actor, parseId(ctx.params.id), parseId(ctx.params.slideId, 'slideId')) };
});

/** Changes the title, the talking points or the layout a slide shows. */
export const PATCH = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  const id = parseId(ctx.params.id);
  const slideId = parseId(ctx.params.slideId, 'slideId');
  const input = await readJson(ctx.request, inputs.PATCH.body);
  return { slide: await updateSlide(actor, id, slideId, input) };
});

export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  await refuseBody(ctx.request);
  return deleteSlide(actor, parseId(ctx.params.id), parseId(ctx.params.slideId, 'slideId'));
});
