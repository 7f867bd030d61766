import { json, parseParams, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { createShareLink, createShareSchema, listShareLinks, shareListQuerySchema } from '~/lib/server/services/sharing';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: createShareSchema } });

/** Share links of the layouts the user may see (?layoutId=&status=active|all). Tokens are never listed. */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  const query = parseParams(Object.fromEntries(ctx.url.searchParams), shareListQuerySchema);
  return { links: await listShareLinks(actor, query) };
});

/** A new read-only link to a saved version. The token is in this response only; the store keeps its hash. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'shares.write');
  const input = await readJson(ctx.request, inputs.POST.body);
  const created = await createShareLink(actor, input);
  return json({ ...created, url: new URL(created.path, ctx.url.origin).toString() }, 201);
});
