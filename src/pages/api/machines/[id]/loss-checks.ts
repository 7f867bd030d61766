import { json, parseId, parseParams, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { recordLossCheck, recordLossCheckSchema, seasonCsv, seasonLog, seasonQuerySchema } from '~/lib/server/services/field-checks';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: recordLossCheckSchema } });

/** The machine's loss checks of one season (`?season=2026`, latest by default); `?format=csv` downloads them. */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  const id = parseId(ctx.params.id);
  const q = parseParams(Object.fromEntries(ctx.url.searchParams), seasonQuerySchema);
  const log = await seasonLog(actor, id, q.season);
  if (q.format === 'csv') {
    const name = `loss-checks-${log.machine.nickname.toLowerCase().replace(/[^a-z0-9]+/g, '-')}-${log.season}.csv`;
    return new Response(seasonCsv(log.checks, q.units ?? actor.unitSystem), {
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="${name}"`,
        'cache-control': 'no-store',
      },
    });
  }
  return log;
});

/** Records a loss check with the settings of the moment (absent settings come from what is installed). */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'lossChecks.write');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.POST.body);
  return json(await recordLossCheck(actor, id, input), 201);
});
