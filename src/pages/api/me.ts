import { readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { me, preferencesSchema, updatePreferences } from '~/lib/server/services/users';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ PUT: { body: preferencesSchema } });

/** The signed-in user and their preferences (units follow this choice everywhere). */
export const GET = route(async (ctx) => me(requireActor(ctx)));

export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx);
  const prefs = await readJson(ctx.request, inputs.PUT.body);
  return updatePreferences(actor, prefs);
});
