import { ADMIN_ROLES } from '../../../lib/server/access';
import { HttpError, requireActor, route } from '../../../lib/server/http';
import { tableCounts, tableDigests } from '../../../lib/server/services/stats';

/**
 * Row counts: every row for the instance administrator, a dealer's own rows for its administrator.
 * `?digest=1` (instance administrator only) adds a digest of every table's contents.
 */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx, ADMIN_ROLES);
  const instance = actor.role === 'instance_admin';
  const digest = ctx.url.searchParams.get('digest');
  if (digest !== null && digest !== '1') throw new HttpError(400, 'digest: give 1 or leave it out', 'digest');
  if (digest && !instance) throw new HttpError(403, 'digest: table digests are for the instance administrator', 'digest');
  return {
    scope: instance ? 'instance' : 'dealer',
    counts: await tableCounts(actor),
    ...(digest ? { digests: await tableDigests() } : {}),
  };
});
