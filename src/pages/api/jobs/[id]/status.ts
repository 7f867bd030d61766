import { parseId, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { jobRowForActor, moveJob, moveJobSchema } from '~/lib/server/services/jobs';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: moveJobSchema } });

/** { status: 'in_progress' } or { status: 'done', hours: { engineHours, separatorHours, correctionReason? } }. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'jobs.manage');
  const id = parseId(ctx.params.id);
  await jobRowForActor(actor, id);
  const input = await readJson(ctx.request, inputs.POST.body);
  return moveJob(actor, id, input);
});
