import { readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { planRequestSchema, proposePlan } from '~/lib/server/services/planner';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: planRequestSchema } });

/** A crop-change proposal for a machine: { machineId, crop, mode? } → the plan (never saved). */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'plans.make');
  const input = await readJson(ctx.request, inputs.POST.body);
  const { family: _family, catalog: _catalog, ...proposal } = await proposePlan(actor, input);
  return proposal;
});
