import { json, readJson, requireActor, route, routeInputs } from '../../../lib/server/http';
import { createDeck, createDeckSchema, DECK_ROLES, listDecks } from '../../../lib/server/services/decks';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: createDeckSchema } });

/** The decks of the user's organisation, newest change first. */
export const GET = route(async (ctx) => listDecks(requireActor(ctx, DECK_ROLES)));

export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, DECK_ROLES);
  const input = await readJson(ctx.request, inputs.POST.body);
  return json({ deck: await createDeck(actor, input) }, 201);
});
