import { json, parseId, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { addSlide, addSlideSchema, getDeck, reorderSlides, reorderSlidesSchema } from '~/lib/server/services/decks';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: addSlideSchema }, PUT: { body: reorderSlidesSchema } });

export const GET = route(async (ctx) => {
  const { slides } = await getDeck(requireActor(ctx, 'decks.use'), parseId(ctx.params.id));
  return { slides };
});

/** Adds a slide at the end: a layout version, a sample layout, or a starter for a crop. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.POST.body);
  return json({ slide: await addSlide(actor, id, input) }, 201);
});

/** Reorders the slides: `order` lists every slide id of the deck once. */
export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.PUT.body);
  return reorderSlides(actor, id, input);
});
