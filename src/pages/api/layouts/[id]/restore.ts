import { json, parseId, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { restoreSchema, restoreVersion } from '~/lib/server/services/layouts';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: restoreSchema } });

/** Restore an old version: its content becomes a new version on top; nothing is rewritten. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'layouts.write');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.POST.body);
  return json({ version: await restoreVersion(actor, id, input) }, 201);
});
