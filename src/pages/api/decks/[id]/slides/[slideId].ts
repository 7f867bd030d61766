import { parseId, readJson, requireActor, route } from '../../../../../lib/server/http';
import { deleteSlide, getSlide, updateSlide, updateSlideSchema } from '../../../../../lib/server/services/decks';

export const GET = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  return { slide: await getSlide(actor, parseId(ctx.params.id), parseId(ctx.params.slideId, 'slideId')) };
});

/** Changes the title, the talking points or the layout a slide shows. */
export const PATCH = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  const id = parseId(ctx.params.id);
  const slideId = parseId(ctx.params.slideId, 'slideId');
  const input = await readJson(ctx.request, updateSlideSchema);
  return { slide: await updateSlide(actor, id, slideId, input) };
});

export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  return deleteSlide(actor, parseId(ctx.params.id), parseId(ctx.params.slideId, 'slideId'));
});
