import { timingSafeEqual } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { APIContext } from 'astro';
import { dataDir, store } from '~/lib/server/db';
import { errorResponse, HttpError, requireActor, route, routeInputs, refuseBody } from '~/lib/server/http';
import { withoutSecrets } from '../../../../scripts/lib/backup-archive.mjs';

/**
 * A consistent snapshot of the embedded store while the server runs, for an instance
 * administrator, or for `npm run backup` on the same host. The script proves it runs here with
 * the token the start script writes into the data directory at every start (readable only by
 * the server's user, never archived, so an old archive's token opens nothing), and only over
 * the loopback interface. The archive never carries the session secret, the token or the owner
 * file (scripts/lib/backup-archive.mjs).
 */
function isLoopback(ctx: APIContext): boolean {
  let address = '';
  try {
    address = ctx.clientAddress;
  } catch {
    return false;
  }
  return address === '127.0.0.1' || address === '::1' || address === '::ffff:127.0.0.1';
}

function localTokenMatches(ctx: APIContext): boolean {
  const sent = ctx.request.headers.get('x-cagewright-backup-token');
  if (!sent || !isLoopback(ctx)) return false;
  let expected: string;
  try {
    expected = readFileSync(join(dataDir(), 'backup-token'), 'utf8').trim();
  } catch {
    return false;
  }
  const a = Buffer.from(sent);
  const b = Buffer.from(expected);
  return expected.length >= 32 && a.length === b.length && timingSafeEqual(a, b);
}

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: {} });

export const POST = route(async (ctx) => {
  if (!localTokenMatches(ctx)) requireActor(ctx, 'backup.run');
  await refuseBody(ctx.request);
  const s = await store();
  if (!s.dump) throw new HttpError(501, 'The server uses a PostgreSQL server: back it up with pg_dump (npm run backup does).');
  const blob = await s.dump();
  const archive = await withoutSecrets(new Uint8Array(await blob.arrayBuffer()));
  const stamp = new Date().toISOString().replace(/[:.]/g, '-');
  return new Response(new Uint8Array(archive), {
    status: 200,
    headers: {
      'content-type': 'application/gzip',
      'content-disposition': `attachment; filename="cagewright-${stamp}.tar.gz"`,
      'cache-control': 'no-store',
    },
  });
});

export const GET = () => errorResponse(405, 'Use POST to take a backup.');
