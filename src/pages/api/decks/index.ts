import { json, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { createDeck, createDeckSchema, listDecks } from '~/lib/server/services/decks';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: createDeckSchema } });

/** The decks of the user's organisation, newest change first. */
export const GET = route(async (ctx) => listDecks(requireActor(ctx, 'decks.use')));

export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  const input = await readJson(ctx.request, inputs.POST.body);
  return json({ deck: await createDeck(actor, input) }, 201);
});
