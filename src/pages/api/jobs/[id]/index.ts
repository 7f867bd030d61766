import { parseId, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { getJob, jobRowForActor, updateJob, updateJobSchema } from '~/lib/server/services/jobs';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ PATCH: { body: updateJobSchema } });

export const GET = route(async (ctx) => getJob(requireActor(ctx, 'shop.view'), parseId(ctx.params.id)));

/** Title, assignee, the steps (while planned), the parts (until done), and steps ticked off (in progress). */
export const PATCH = route(async (ctx) => {
  const actor = requireActor(ctx, 'jobs.manage');
  const id = parseId(ctx.params.id);
  // Another organisation's job card is not found whatever was sent.
  await jobRowForActor(actor, id);
  const input = await readJson(ctx.request, inputs.PATCH.body);
  return updateJob(actor, id, input);
});
