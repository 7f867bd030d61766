import { parseParams, requireActor, route } from '../../../lib/server/http';
import { z } from 'zod';
import { readMailbox } from '../../../lib/server/services/mail';

const querySchema = z.object({ limit: z.coerce.number().int().min(1).max(500).default(100) });

/** The fake mailbox (development and tests): the newest messages the app has sent. */
export const GET = route(async (ctx) => {
  requireActor(ctx, ['admin']);
  const { limit } = parseParams(Object.fromEntries(ctx.url.searchParams), querySchema);
  return readMailbox(limit);
});
