import { json, parseId, readJson, requireActor, route } from '../../../../lib/server/http';
import { restoreSchema, restoreVersion } from '../../../../lib/server/services/layouts';

/** Restore an old version: its content becomes a new version on top; nothing is rewritten. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'layouts.write');
  const id = parseId(ctx.params.id);
  const input = await readJson(ctx.request, restoreSchema);
  return json({ version: await restoreVersion(actor, id, input) }, 201);
});
