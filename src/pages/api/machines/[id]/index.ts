import { parseId, readJson, requireActor, route, routeInputs, refuseBody } from '~/lib/server/http';
import { deleteMachine, updateMachine, updateMachineSchema } from '~/lib/server/services/machines';
import { machineOverview } from '~/lib/server/services/installed';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ PUT: { body: updateMachineSchema }, DELETE: {} });

/** The machine with its family, what is installed now (with findings) and its layouts. */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  const o = await machineOverview(actor, parseId(ctx.params.id));
  return {
    machine: o.machine,
    orgName: o.orgName,
    family: o.family,
    installed: o.installed,
    installedFindings: o.installedFindings,
    layouts: o.layouts,
    layoutTotal: o.layoutTotal,
    activity: o.activity,
  };
});

export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx, 'machines.write');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.PUT.body);
  return { machine: await updateMachine(actor, id, input) };
});

export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, 'machines.write');
  await refuseBody(ctx.request);
  return deleteMachine(actor, parseId(ctx.params.id));
});
