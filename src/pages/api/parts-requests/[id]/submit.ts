import { requireActor, route, parseId } from '../../../../lib/server/http';
import { PARTS_WRITERS, submitPartsRequest } from '../../../../lib/server/services/parts-requests';

/** Send a draft to the dealer's parts desk (e-mail to the desk, copy to the owner). */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, PARTS_WRITERS);
  return submitPartsRequest(actor, parseId(ctx.params.id), ctx.url.origin);
});
