import { readJson, requireActor, route } from '../../lib/server/http';
import { me, preferencesSchema, updatePreferences } from '../../lib/server/services/users';

/** The signed-in user and their preferences (units follow this choice everywhere). */
export const GET = route(async (ctx) => me(requireActor(ctx)));

export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx);
  const prefs = await readJson(ctx.request, preferencesSchema);
  return updatePreferences(actor, prefs);
});
