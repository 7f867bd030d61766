import { json, readJson, requireActor, route, parseId, parseParams, routeInputs } from '~/lib/server/http';
import { createLayout, createLayoutSchema, layoutListQuerySchema, listLayoutsForMachine } from '~/lib/server/services/layouts';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: createLayoutSchema } });

/** A machine's layouts a page at a time (?page=1&pageSize=50, at most 200), most recently changed first, with the total. */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  const paging = parseParams(Object.fromEntries(ctx.url.searchParams), layoutListQuerySchema);
  return listLayoutsForMachine(actor, parseId(ctx.params.id), paging);
});

export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'layouts.write');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.POST.body);
  return json(await createLayout(actor, id, input), 201);
});
