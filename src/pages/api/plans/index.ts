import { readJson, requireActor, route } from '../../../lib/server/http';
import { planRequestSchema, proposePlan } from '../../../lib/server/services/planner';

/** A crop-change proposal for a machine: { machineId, crop, mode? } → the plan (never saved). */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'plans.make');
  const input = await readJson(ctx.request, planRequestSchema);
  const { family: _family, catalog: _catalog, ...proposal } = await proposePlan(actor, input);
  return proposal;
});
