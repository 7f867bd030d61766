import { readJson, requireActor, route, parseId } from '../../../../lib/server/http';
import { advancePartsRequest, statusChangeSchema } from '../../../../lib/server/services/parts-requests';

/** The dealer's parts desk moves a request on: { status: 'acknowledged' | 'ready' | 'picked-up' }. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'parts.desk');
  const id = parseId(ctx.params.id);
  const { status } = await readJson(ctx.request, statusChangeSchema);
  return advancePartsRequest(actor, id, status, ctx.url.origin);
});
