import { parseId, readJson, requireActor, route } from '../../../../lib/server/http';
import { deleteDeck, getDeck, updateDeck, updateDeckSchema } from '../../../../lib/server/services/decks';

/** The deck with its slides in order (talking points as markdown and as safe HTML). */
export const GET = route(async (ctx) => getDeck(requireActor(ctx, 'decks.use'), parseId(ctx.params.id)));

export const PATCH = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, updateDeckSchema);
  return { deck: await updateDeck(actor, id, input) };
});

export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  return deleteDeck(actor, parseId(ctx.params.id));
});
