import { z } from 'zod';
import { json, parseId, parseParams, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { listInspectionsForMachine, startInspection, startInspectionSchema } from '~/lib/server/services/inspections';

const pageQuery = z.object({
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(50),
});

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: startInspectionSchema } });

/** The machine's inspection history, newest first. */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  const id = parseId(ctx.params.id);
  const q = parseParams(Object.fromEntries(ctx.url.searchParams), pageQuery);
  return listInspectionsForMachine(actor, id, q.page, q.pageSize);
});

/** Starts an inspection with a checklist built from what is installed on the machine. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'inspections.write');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.POST.body);
  return json(await startInspection(actor, id, input), 201);
});
