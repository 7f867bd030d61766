import { json, parseId, readJson, requireActor, route } from '../../../../lib/server/http';
import { createDeckShare, createDeckShareSchema, listDeckShares, revokeDeckShare } from '../../../../lib/server/services/decks';

/** The deck's read-only links (never their tokens: only hashes are kept). */
export const GET = route(async (ctx) => listDeckShares(requireActor(ctx, 'decks.use'), parseId(ctx.params.id)));

/** A new read-only link; the response carries the token once. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, createDeckShareSchema);
  return json(await createDeckShare(actor, id, input), 201);
});

/** Revokes the link named by `?link=<id>`, or every active link of the deck. */
export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, 'decks.use');
  const id = parseId(ctx.params.id);
  const link = ctx.url.searchParams.get('link');
  return revokeDeckShare(actor, id, link === null ? null : parseId(link, 'link'));
});
