import { requireActor, route } from '../../../lib/server/http';
import { tableCounts } from '../../../lib/server/services/stats';

export const GET = route(async (ctx) => {
  requireActor(ctx, ['admin']);
  return { counts: await tableCounts() };
});
