import { z } from 'zod';
import { requireActor, route, parseId, parseParams } from '~/lib/server/http';
import { getVersion } from '~/lib/server/services/layouts';

export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  const version = parseParams(ctx.params.version, z.coerce.number().int().min(1).max(2_147_483_647), 'version');
  return getVersion(actor, parseId(ctx.params.id), version);
});
