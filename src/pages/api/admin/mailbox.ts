import { parseParams, requireActor, route } from '~/lib/server/http';
import { z } from 'zod';
import { mailboxFor } from '~/lib/server/services/mailbox';

const querySchema = z.object({ limit: z.coerce.number().int().min(1).max(500).default(100) });

/**
 * The fake mailbox (development and tests): the newest messages the app has sent. A dealer
 * administrator sees those concerning their dealer and its customer farms; the instance
 * administrator sees all.
 */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx, 'mailbox.read');
  const { limit } = parseParams(Object.fromEntries(ctx.url.searchParams), querySchema);
  return mailboxFor(actor, limit);
});
