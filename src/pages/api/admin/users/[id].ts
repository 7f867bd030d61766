import { parseId, readJson, requireActor, route } from '../../../../lib/server/http';
import { changeRole, roleChangeSchema } from '../../../../lib/server/services/account';

/** Changes a person's role in one of the administrator's organisations; their sessions end. */
export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx, ['admin']);
  const userId = parseId(ctx.params.id);
  const input = await readJson(ctx.request, roleChangeSchema);
  return changeRole(actor, userId, input);
});
