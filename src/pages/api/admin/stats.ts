import { ADMIN_ROLES } from '../../../lib/server/access';
import { requireActor, route } from '../../../lib/server/http';
import { tableCounts } from '../../../lib/server/services/stats';

/** Row counts: every row for the instance administrator, a dealer's own rows for its administrator. */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx, ADMIN_ROLES);
  return { scope: actor.role === 'instance_admin' ? 'instance' : 'dealer', counts: await tableCounts(actor) };
});
