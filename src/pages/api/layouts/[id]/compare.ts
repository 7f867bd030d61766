import { z } from 'zod';
import { parseId, parseParams, requireActor, route } from '~/lib/server/http';
import { compareVersions } from '~/lib/server/services/layouts';

const compareQuery = z.object({
  a: z.coerce.number({ error: 'give version numbers ?a=1&b=2' }).int().min(1),
  b: z.coerce.number({ error: 'give version numbers ?a=1&b=2' }).int().min(1),
});

/** Two versions of a layout, their findings and the differences between them (?a=1&b=3). */
export const GET = route(async (ctx) => {
  const actor = requireActor(ctx);
  const id = parseId(ctx.params.id);
  const { a, b } = parseParams(Object.fromEntries(ctx.url.searchParams), compareQuery);
  const r = await compareVersions(actor, id, a, b);
  return { layout: r.layout, a: r.a, b: r.b, diff: r.diff };
});
