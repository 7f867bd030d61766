import { json, parseParams, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { createJob, createJobSchema, listJobs, listJobsQuerySchema } from '~/lib/server/services/jobs';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: createJobSchema } });

/** The job cards of the machines the user may see, newest first; filter by status or machine. */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx, 'shop.view');
  const query = parseParams(Object.fromEntries(ctx.url.searchParams), listJobsQuerySchema);
  return listJobs(actor, query);
});

/** A job card from a plan ({ origin: 'plan', layoutId, version }), an inspection ({ origin: 'inspection', inspectionId }) or by hand. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'jobs.manage');
  const input = await readJson(ctx.request, inputs.POST.body);
  return json(await createJob(actor, input), 201);
});
