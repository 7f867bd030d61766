import { readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { flatRateTable, flatRatesInputSchema, setFlatRates } from '~/lib/server/services/jobs';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ PUT: { body: flatRatesInputSchema } });

/** The caller's dealer's flat-rate minutes per kind of job-card step (defaults where none is set). */
export const GET = route(async (ctx) => flatRateTable(requireActor(ctx, 'flatRates.write')));

/** { rates: { kind: minutes, … } }: sets those kinds for the caller's dealer. */
export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx, 'flatRates.write');
  const { rates } = await readJson(ctx.request, inputs.PUT.body);
  return setFlatRates(actor, rates);
});
