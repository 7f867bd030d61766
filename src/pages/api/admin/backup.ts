import { timingSafeEqual } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { APIContext } from 'astro';
import { dataDir, store } from '../../../lib/server/db';
import { errorResponse, HttpError, requireActor, route } from '../../../lib/server/http';

/**
 * A consistent snapshot of the embedded store while the server runs. Admins may call it; so may
 * `npm run backup` on the same machine, which proves itself with the token the start script
 * wrote into the data directory (readable only by the server's user).
 */
function localTokenMatches(ctx: APIContext): boolean {
  const sent = ctx.request.headers.get('x-cagewright-backup-token');
  if (!sent) return false;
  let expected: string;
  try {
    expected = readFileSync(join(dataDir(), 'backup-token'), 'utf8').trim();
  } catch {
    return false;
  }
  const a = Buffer.from(sent);
  const b = Buffer.from(expected);
  return a.length === b.length && timingSafeEqual(a, b);
}

export const POST = route(async (ctx) => {
  if (!localTokenMatches(ctx)) requireActor(ctx, ['admin']);
  const s = await store();
  if (!s.dump) throw new HttpError(501, 'The server uses a PostgreSQL server: back it up with pg_dump (npm run backup does).');
  const blob = await s.dump();
  const stamp = new Date().toISOString().replace(/[:.]/g, '-');
  return new Response(blob, {
    status: 200,
    headers: {
      'content-type': 'application/gzip',
      'content-disposition': `attachment; filename="cagewright-${stamp}.tar.gz"`,
      'cache-control': 'no-store',
    },
  });
});

export const GET = () => errorResponse(405, 'Use POST to take a backup.');
