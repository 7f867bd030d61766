import { requireActor, route } from '~/lib/server/http';
import { listPriceList } from '~/lib/server/services/prices';

/** The caller's dealer's price list: every catalog part, the list price and the dealer's own. */
export const GET = route(async (ctx) => listPriceList(requireActor(ctx, 'prices.read')));
