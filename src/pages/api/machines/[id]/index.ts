import { parseId, readJson, requireActor, route } from '../../../../lib/server/http';
import { deleteMachine, updateMachine, updateMachineSchema } from '../../../../lib/server/services/machines';
import { machineOverview } from '../../../../lib/server/services/installed';

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
  const input = await readJson(ctx.request, updateMachineSchema);
  return { machine: await updateMachine(actor, id, input) };
});

export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, 'machines.write');
  return deleteMachine(actor, parseId(ctx.params.id));
});
