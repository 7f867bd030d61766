import { parseId, requireActor, route } from '../../../lib/server/http';
import { deleteLossCheck, getLossCheck } from '../../../lib/server/services/field-checks';

/** One loss check: what was counted, what it came to, and the settings of the moment. */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  return getLossCheck(actor, parseId(ctx.params.id));
});

/** Removes a check recorded by mistake (audited). */
export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, 'lossChecks.write');
  return deleteLossCheck(actor, parseId(ctx.params.id));
});
