import { json, parseParams, readJson, requireActor, route } from '../../../lib/server/http';
import {
  createMachine,
  createMachineSchema,
  listMachines,
  machineListQuerySchema,
} from '../../../lib/server/services/machines';

/** One page of machines: ?page=1&pageSize=20&sort=-updatedAt&q=creek&orgId=&familyId= */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  const query = parseParams(Object.fromEntries(ctx.url.searchParams), machineListQuerySchema);
  return listMachines(actor, query);
});

export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'machines.write');
  const input = await readJson(ctx.request, createMachineSchema);
  return json({ machine: await createMachine(actor, input) }, 201);
});
