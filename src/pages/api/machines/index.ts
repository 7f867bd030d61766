import { json, parseParams, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { createMachine, createMachineSchema, listMachines, machineListQuerySchema } from '~/lib/server/services/machines';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: createMachineSchema } });

/** One page of machines: ?page=1&pageSize=20&sort=-updatedAt&q=creek&orgId=&familyId= */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  const query = parseParams(Object.fromEntries(ctx.url.searchParams), machineListQuerySchema);
  return listMachines(actor, query);
});

export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'machines.write');
  const input = await readJson(ctx.request, inputs.POST.body);
  return json({ machine: await createMachine(actor, input) }, 201);
});
