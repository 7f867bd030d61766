import { json, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { acceptPlan, acceptPlanSchema, editorUrl } from '~/lib/server/services/planner';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: acceptPlanSchema } });

/**
 * Accept a proposal: its layout becomes a new layout of the machine, or a new version of one
 * (layoutId + baseVersion). 409 when the plan changed since the fingerprint the user saw.
 */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'layouts.write');
  const input = await readJson(ctx.request, inputs.POST.body);
  const r = await acceptPlan(actor, input);
  return json(
    {
      layoutId: r.layoutId,
      version: r.version,
      machineId: r.machineId,
      created: r.created,
      editorUrl: editorUrl(r.machineId, r.layoutId),
      fingerprint: r.plan.fingerprint,
      counts: r.plan.counts,
    },
    201,
  );
});
