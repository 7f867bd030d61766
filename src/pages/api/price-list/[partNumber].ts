import { partNumberSchema } from '~/lib/domain/schemas';
import { notFound, readJson, requireActor, route, routeInputs, refuseBody } from '~/lib/server/http';
import { clearDealerPrice, setDealerPrice, setPriceSchema } from '~/lib/server/services/prices';

function partNumber(raw: string | undefined): string {
  const parsed = partNumberSchema.safeParse(raw);
  if (!parsed.success) throw notFound('Part not found', 'partNumber');
  return parsed.data;
}

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ PUT: { body: setPriceSchema }, DELETE: {} });

/** `{ priceCents }`: the caller's dealer's price for this part. */
export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx, 'prices.write');
  const pn = partNumber(ctx.params.partNumber);
  const { priceCents } = await readJson(ctx.request, inputs.PUT.body);
  return setDealerPrice(actor, pn, priceCents);
});

/** Drops the dealer's own price: the catalog's list price applies again. */
export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, 'prices.write');
  await refuseBody(ctx.request);
  return clearDealerPrice(actor, partNumber(ctx.params.partNumber));
});
