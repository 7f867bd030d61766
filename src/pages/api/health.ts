import type { APIRoute } from 'astro';
import { sql } from 'drizzle-orm';
import { store } from '~/lib/server/db';
import { DataDirInUseError } from '~/lib/server/data-dir-lock';
import { errorResponse, json } from '~/lib/server/http';

/**
 * Liveness and store readiness; the start script calls it to open and migrate the store at boot.
 * Why the store is unavailable goes to the server's console: the details name files and
 * processes, which no response carries.
 */
export const GET: APIRoute = async () => {
  try {
    const s = await store();
    await s.db.execute(sql`select 1`);
    return json({ ok: true, store: s.mode });
  } catch (err) {
    console.error(`cagewright: the store is not available: ${err instanceof Error ? err.message : String(err)}`);
    const message = err instanceof DataDirInUseError ? err.publicMessage : 'The store is not available.';
    return errorResponse(503, message, undefined, { code: err instanceof DataDirInUseError ? 'data-dir-in-use' : 'store-unavailable' });
  }
};
