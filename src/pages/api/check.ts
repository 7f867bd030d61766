import { z } from 'zod';
import { layoutSchema } from '../../lib/domain/schemas';
import { readJson, requireActor, route } from '../../lib/server/http';
import { checkStateless } from '../../lib/server/services/check';

const checkRequestSchema = z.object({ layout: layoutSchema });

/** Stateless: the findings and computed settings for a layout; nothing is written. */
export const POST = route(async (ctx) => {
  requireActor(ctx);
  const { layout } = await readJson(ctx.request, checkRequestSchema);
  return checkStateless(layout);
});
