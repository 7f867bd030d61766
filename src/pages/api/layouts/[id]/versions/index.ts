import { parseId, parseParams, requireActor, route } from '~/lib/server/http';
import { listVersions, versionListQuerySchema } from '~/lib/server/services/layouts';

/** A layout's versions, newest first, a page at a time: ?page=1&pageSize=50 (at most 200). */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  const paging = parseParams(Object.fromEntries(ctx.url.searchParams), versionListQuerySchema);
  return listVersions(actor, parseId(ctx.params.id), paging);
});
