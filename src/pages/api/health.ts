import type { APIRoute } from 'astro';
import { sql } from 'drizzle-orm';
import { store } from '../../lib/server/db';
import { errorResponse, json } from '../../lib/server/http';

/** Liveness and store readiness; the start script calls it to open and migrate the store at boot. */
export const GET: APIRoute = async () => {
  try {
    const s = await store();
    await s.db.execute(sql`select 1`);
    return json({ ok: true, store: s.mode });
  } catch (err) {
    return errorResponse(503, err instanceof Error ? err.message : 'The store is not available.');
  }
};
