import { requireActor, route } from '~/lib/server/http';
import { seasonList } from '~/lib/server/services/part-history';

/** The dealer's before-the-season list: customer machines with parts due within the coming season, and the parts to stock. */
export const GET = route(async (ctx) => seasonList(requireActor(ctx, 'season.list')));
