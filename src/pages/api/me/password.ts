import { readJson, requireActor, route } from '../../../lib/server/http';
import { changePassword, passwordChangeSchema } from '../../../lib/server/services/account';

/** Changes the signed-in user's password; every session of theirs ends (sign in again). */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx);
  const input = await readJson(ctx.request, passwordChangeSchema);
  return changePassword(actor, input);
});
