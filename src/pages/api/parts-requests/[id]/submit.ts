import { requireActor, route, parseId } from '../../../../lib/server/http';
import { submitPartsRequest } from '../../../../lib/server/services/parts-requests';

/** Send a draft to the dealer's parts desk (e-mail to the desk, copy to the owner). */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'parts.request');
  return submitPartsRequest(actor, parseId(ctx.params.id), ctx.url.origin);
});
