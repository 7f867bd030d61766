import { parseId, readJson, requireActor, route } from '../../../../lib/server/http';
import { changeRole, roleChangeSchema } from '../../../../lib/server/services/account';

/** A dealer administrator changes a person's role in their own dealer; their sessions end. */
export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx, 'users.edit');
  const userId = parseId(ctx.params.id);
  const input = await readJson(ctx.request, roleChangeSchema);
  return changeRole(actor, userId, input);
});
