import { json, parseId, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { copyLayout, copySchema } from '~/lib/server/services/layouts';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: copySchema } });

/** Copy a layout version to another machine of the same family; the findings there come back. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'layouts.write');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.POST.body);
  return json(await copyLayout(actor, id, input), 201);
});
