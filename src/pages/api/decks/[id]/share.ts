import { z } from 'zod';
import { idParam, json, parseId, readIdQuery, readJson, refuseBody, requireActor, route, routeInputs } from '~/lib/server/http';
import { createDeckShare, createDeckShareSchema, listDeckShares, revokeDeckShare } from '~/lib/server/services/decks';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({
  POST: { body: createDeckShareSchema },
  /** `?link=<id>` names one link; without it every active link of the deck goes. */
  DELETE: { query: z.object({ link: idParam.optional() }) },
});

/** The deck's read-only links (never their tokens: only hashes are kept). */
export const GET = route(async (ctx) => listDeckShares(requireActor(ctx, 'decks.use'), parseId(ctx.params.id)));

/** A new read-only link; the response carries the token once. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.POST.body);
  return json(await createDeckShare(actor, id, input), 201);
});

/** Revokes the link named by `?link=<id>`, or every active link of the deck. */
export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  const id = parseId(ctx.params.id);
  await refuseBody(ctx.request);
  const { link } = readIdQuery(ctx.url, inputs.DELETE.query);
  return revokeDeckShare(actor, id, link ?? null);
});
