import { machineFamilySchema, slugSchema } from '../../../../lib/domain/schemas';
import { notFound, readJson, requireActor, route } from '../../../../lib/server/http';
import { getFamily, updateFamily } from '../../../../lib/server/services/catalog';

function familyId(raw: string | undefined): string {
  const parsed = slugSchema.safeParse(raw);
  if (!parsed.success) throw notFound('Machine family not found', 'id');
  return parsed.data;
}

export const GET = route(async (ctx) => {
  requireActor(ctx);
  return { family: await getFamily(familyId(ctx.params.id)) };
});

/** Replace the family document (its id stays). */
export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx, 'catalog.write');
  const id = familyId(ctx.params.id);
  const spec = await readJson(ctx.request, machineFamilySchema);
  return { family: await updateFamily(actor, id, spec) };
});
