import { parseId, requireActor, route } from '~/lib/server/http';
import { partHistory } from '~/lib/server/services/part-history';

/** The machine's part history: the parts in it now with each one's wear forecast, and the records closed before. */
export const GET = route(async (ctx) => partHistory(requireActor(ctx, 'shop.view'), parseId(ctx.params.id)));
