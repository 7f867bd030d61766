import { json, readJson, requireActor, route, parseId } from '../../../../lib/server/http';
import { createLayout, createLayoutSchema, LAYOUT_WRITERS, listLayoutsForMachine } from '../../../../lib/server/services/layouts';

export const GET = route(async (ctx) => listLayoutsForMachine(requireActor(ctx), parseId(ctx.params.id)));

export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, LAYOUT_WRITERS);
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, createLayoutSchema);
  return json(await createLayout(actor, id, input), 201);
});
