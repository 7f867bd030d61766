import { readJson, requireActor, route } from '../../../lib/server/http';
import { importPricesSchema, importPriceList } from '../../../lib/server/services/prices';

/** `{ csv }`: prices for the caller's dealer; any problem (named by row and column) writes nothing. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'prices.write');
  const { csv } = await readJson(ctx.request, importPricesSchema);
  return importPriceList(actor, csv);
});
