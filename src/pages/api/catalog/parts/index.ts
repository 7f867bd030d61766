import { json, parseParams, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { createPart, listParts, partInputSchema, partListQuerySchema } from '~/lib/server/services/catalog';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: partInputSchema } });

/** Catalog parts (?familyId=&kind=&q=&status=active|retired|all). */
export const GET = route(async (ctx) => {
  requireActor(ctx);
  const query = parseParams(Object.fromEntries(ctx.url.searchParams), partListQuerySchema);
  return { parts: await listParts(query) };
});

/** A new part: { familyId, active, part } where part is the catalog part document. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'catalog.write');
  const input = await readJson(ctx.request, inputs.POST.body);
  return json({ part: await createPart(actor, input) }, 201);
});
