import { parseId, parseParams, readJson, requireActor, route, routeInputs, refuseBody } from '~/lib/server/http';
import { z } from 'zod';
import {
  csvFileName,
  deletePartsRequest,
  getPartsRequest,
  partsRequestCsv,
  updatePartsRequest,
  updatePartsRequestSchema,
} from '~/lib/server/services/parts-requests';

const formatSchema = z.object({ format: z.enum(['json', 'csv']).default('json') });

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ PUT: { body: updatePartsRequestSchema }, DELETE: {} });

/** The request with its lines and totals; `?format=csv` downloads it as a CSV file. */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  const id = parseId(ctx.params.id);
  const { format } = parseParams({ format: ctx.url.searchParams.get('format') ?? undefined }, formatSchema);
  const view = await getPartsRequest(actor, id);
  if (format === 'csv') {
    return new Response(partsRequestCsv(view), {
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="${csvFileName(view)}"`,
        'cache-control': 'no-store',
      },
    });
  }
  return view;
});

/** Edit a draft: the full list of lines (quantity 0 drops a line) and/or the note. */
export const PUT = route(async (ctx) => {
  const actor = requireActor(ctx, 'parts.request');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, inputs.PUT.body);
  return updatePartsRequest(actor, id, input);
});

export const DELETE = route(async (ctx) => {
  const actor = requireActor(ctx, 'parts.request');
  await refuseBody(ctx.request);
  return deletePartsRequest(actor, parseId(ctx.params.id));
});
