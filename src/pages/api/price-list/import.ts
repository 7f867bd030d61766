import { readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { importPricesSchema, importPriceList } from '~/lib/server/services/prices';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: importPricesSchema } });

/** `{ csv }`: prices for the caller's dealer; any problem (named by row and column) writes nothing. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'prices.write');
  const { csv } = await readJson(ctx.request, inputs.POST.body);
  return importPriceList(actor, csv);
});
