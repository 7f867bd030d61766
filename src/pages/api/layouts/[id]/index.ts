import { readJson, requireActor, route, parseId, json, routeInputs } from '~/lib/server/http';
import { layoutWithCurrent, saveVersion, saveVersionSchema } from '~/lib/server/services/layouts';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ PUT: { body: saveVersionSchema } });

/** The layout with its current version. */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  return layoutWithCurrent(actor, parseId(ctx.params.id));
});

/** Save: a new immutable version, guarded by the version the client started from. */
export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx, 'layouts.write');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.PUT.body);
  const version = await saveVersion(actor, id, input);
  return json({ version }, 201);
});
