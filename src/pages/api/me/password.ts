import { readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { changePassword, passwordChangeSchema } from '~/lib/server/services/account';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: passwordChangeSchema } });

/** Changes the signed-in user's password; every session of theirs ends (sign in again). */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx);
  const input = await readJson(ctx.request, inputs.POST.body);
  return changePassword(actor, input);
});
