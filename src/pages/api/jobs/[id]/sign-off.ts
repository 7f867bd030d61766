import { parseId, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { jobRowForActor, signOffJob, signOffSchema } from '~/lib/server/services/jobs';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: signOffSchema } });

/** { checklist: { concaveZeroed: true, …, lossCheck: 'done' | 'booked' } }: signs a done job card off. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'jobs.manage');
  const id = parseId(ctx.params.id);
  await jobRowForActor(actor, id);
  const { checklist } = await readJson(ctx.request, inputs.POST.body);
  return signOffJob(actor, id, checklist, ctx.url.origin);
});
