import { machineFamilySchema, slugSchema } from '~/lib/domain/schemas';
import { notFound, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { getFamily, updateFamily } from '~/lib/server/services/catalog';

function familyId(raw: string | undefined): string {
  const parsed = slugSchema.safeParse(raw);
  if (!parsed.success) throw notFound('Machine family not found', 'id');
  return parsed.data;
}

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ PUT: { body: machineFamilySchema } });

export const GET = route(async (ctx) => {
  requireActor(ctx);
  return { family: await getFamily(familyId(ctx.params.id)) };
});

/** Replace the family document (its id stays). */
export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx, 'catalog.write');
  const id = familyId(ctx.params.id);
  const spec = await readJson(ctx.request, inputs.PUT.body);
  return { family: await updateFamily(actor, id, spec) };
});
