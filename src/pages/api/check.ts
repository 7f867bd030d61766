import { z } from 'zod';
import { readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { checkStateless } from '~/lib/server/services/check';

// The layout itself is checked by the domain's input checker, which names every bad field.
const checkRequestSchema = z.object({ layout: z.unknown().refine((v) => v !== undefined, 'required field is missing') });

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: checkRequestSchema } });

/** Stateless: the findings and computed settings for a layout; nothing is written. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx);
  const { layout } = await readJson(ctx.request, inputs.POST.body);
  return checkStateless(layout, actor.homeOrgId);
});
