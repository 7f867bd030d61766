import { parseParams, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import {
  listStartingValues,
  putStartingValues,
  startingValuesQuerySchema,
  startingValuesSchema,
} from '~/lib/server/services/starting-values';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ PUT: { body: startingValuesSchema } });

/** The starting values for the rest of the machine of the dealer that serves the caller. */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  const q = parseParams(Object.fromEntries(ctx.url.searchParams), startingValuesQuerySchema);
  return listStartingValues(actor, q);
});

/** Sets the caller's dealer's starting values for one machine family and crop (mm and rpm). */
export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx, 'startingValues.write');
  const input = await readJson(ctx.request, inputs.PUT.body);
  return putStartingValues(actor, input);
});
