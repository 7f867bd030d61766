import { parseId, requireActor, route } from '../../../lib/server/http';
import { revokeShareLink } from '../../../lib/server/services/sharing';

/** Revoke: the link answers 404 from now on. */
export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, 'shares.write');
  return revokeShareLink(actor, parseId(ctx.params.id));
});
