import { parseParams, requireActor, route } from '~/lib/server/http';
import { listInspections, listInspectionsQuerySchema } from '~/lib/server/services/inspections';

/** Inspections across the machines the user may see, newest first; filter by machine or status. */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  const query = parseParams(Object.fromEntries(ctx.url.searchParams), listInspectionsQuerySchema);
  return listInspections(actor, query);
});
