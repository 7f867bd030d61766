import { z } from 'zod';
import { readJson, requireActor, route } from '../../lib/server/http';
import { checkStateless } from '../../lib/server/services/check';

// The layout itself is checked by the domain's input checker, which names every bad field.
const checkRequestSchema = z.object({ layout: z.unknown().refine((v) => v !== undefined, 'required field is missing') });

/** Stateless: the findings and computed settings for a layout; nothing is written. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx);
  const { layout } = await readJson(ctx.request, checkRequestSchema);
  return checkStateless(layout, actor.homeOrgId);
});
