import { parseId, readJson, requireActor, route, routeInputs, refuseBody } from '~/lib/server/http';
import { deleteDeck, getDeck, updateDeck, updateDeckSchema } from '~/lib/server/services/decks';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ PATCH: { body: updateDeckSchema }, DELETE: {} });

/** The deck with its slides in order (talking points as markdown and as safe HTML). */
export const GET = route(async (ctx) => getDeck(requireActor(ctx, 'decks.use'), parseId(ctx.params.id)));

export const PATCH = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.PATCH.body);
  return { deck: await updateDeck(actor, id, input) };
});

export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  await refuseBody(ctx.request);
  return deleteDeck(actor, parseId(ctx.params.id));
});
