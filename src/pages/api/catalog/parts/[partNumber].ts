import { partNumberSchema } from '~/lib/domain/schemas';
import { notFound, readJson, requireActor, route, routeInputs, refuseBody } from '~/lib/server/http';
import { getPart, partInputSchema, retirePart, updatePart } from '~/lib/server/services/catalog';

function partNumber(raw: string | undefined): string {
  const parsed = partNumberSchema.safeParse(raw);
  if (!parsed.success) throw notFound('Part not found', 'partNumber');
  return parsed.data;
}

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ PUT: { body: partInputSchema }, DELETE: {} });

export const GET = route(async (ctx) => {
  requireActor(ctx);
  return { part: await getPart(partNumber(ctx.params.partNumber)) };
});

export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx, 'catalog.write');
  const pn = partNumber(ctx.params.partNumber);
  const input = await readJson(ctx.request, inputs.PUT.body);
  return { part: await updatePart(actor, pn, input) };
});

/** Retire the part (saved layouts still name it, so it is kept, marked inactive). */
export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, 'catalog.write');
  await refuseBody(ctx.request);
  return { part: await retirePart(actor, partNumber(ctx.params.partNumber)) };
});
