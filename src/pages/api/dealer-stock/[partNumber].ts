import { partNumberSchema } from '~/lib/domain/schemas';
import { notFound, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { setDealerStock, setDealerStockSchema } from '~/lib/server/services/stock';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ PUT: { body: setDealerStockSchema } });

/** `{ quantity, leadDays }`: the caller's dealer's shelf quantity and order lead time for this part. */
export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx, 'stock.write');
  const parsed = partNumberSchema.safeParse(ctx.params.partNumber);
  if (!parsed.success) throw notFound('Part not found', 'partNumber');
  const body = await readJson(ctx.request, inputs.PUT.body);
  return setDealerStock(actor, parsed.data, body);
});
