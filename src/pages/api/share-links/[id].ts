import { parseId, requireActor, route } from '../../../lib/server/http';
import { revokeShareLink, SHARE_WRITERS } from '../../../lib/server/services/sharing';

/** Revoke: the link answers 404 from now on. */
export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, SHARE_WRITERS);
  return revokeShareLink(actor, parseId(ctx.params.id));
});
