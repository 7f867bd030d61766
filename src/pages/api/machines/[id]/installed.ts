import { parseId, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { getInstalled, putInstalled, putInstalledSchema } from '~/lib/server/services/installed';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ PUT: { body: putInstalledSchema } });

/** What is bolted in the machine now, with the rules' findings on it. */
export const GET = route(async (ctx) => getInstalled(requireActor(ctx), parseId(ctx.params.id)));

/** Record what is installed: a layout document, or `fromLayout` (a saved version of this machine). */
export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx, 'machines.write');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.PUT.body);
  return putInstalled(actor, id, input);
});
