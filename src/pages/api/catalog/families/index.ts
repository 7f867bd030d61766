import { machineFamilySchema } from '~/lib/domain/schemas';
import { json, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { createFamily, listFamilies } from '~/lib/server/services/catalog';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: machineFamilySchema } });

export const GET = route(async (ctx) => {
  requireActor(ctx);
  return { families: await listFamilies() };
});

/** A new machine family; the body is the family document itself. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'catalog.write');
  const spec = await readJson(ctx.request, inputs.POST.body);
  return json({ family: await createFamily(actor, spec) }, 201);
});
