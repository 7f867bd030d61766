import { HttpError, requireActor, route } from '~/lib/server/http';
import { tableCounts, tableDigests } from '~/lib/server/services/stats';
import { isInstanceAdmin } from '~/lib/server/access';

/**
 * Row counts: every row for the instance administrator, a dealer's own rows for its administrator.
 * `?digest=1` (instance administrator only) adds a digest of every table's contents.
 */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx, 'stats.read');
  const instance = isInstanceAdmin(actor);
  const digest = ctx.url.searchParams.get('digest');
  if (digest !== null && digest !== '1') throw new HttpError(400, 'digest: give 1 or leave it out', 'digest');
  if (digest && !instance) throw new HttpError(403, 'digest: table digests are for the instance administrator', 'digest');
  return {
    scope: instance ? 'instance' : 'dealer',
    counts: await tableCounts(actor),
    ...(digest ? { digests: await tableDigests() } : {}),
  };
});
