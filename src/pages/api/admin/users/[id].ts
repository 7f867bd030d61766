import { parseId, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { changeRole, roleChangeSchema } from '~/lib/server/services/account';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ PUT: { body: roleChangeSchema } });

/** A dealer administrator changes a person's role in their own dealer; their sessions end. */
export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx, 'users.edit');
  const userId = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.PUT.body);
  return changeRole(actor, userId, input);
});
