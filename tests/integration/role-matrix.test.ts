import { beforeAll, describe, expect, it } from 'vitest';
import type { Client } from './client';
import { apiRoutes, fill } from './routes';
import { clientsByRole, loadFixtures, ROLES, type Fixtures } from './matrix-fixtures';
import { MATRIX, type Method } from './api-matrix';

/**
 * Every API route × method × (signed out, each role, another organisation). Expectations are
 * written out here by hand; the route list is read from src/pages/api itself, so a new route or
 * method without a row here fails the suite.
 *
 * - signed out: 401 (except the public ones)
 * - a role not allowed: 403
 * - an allowed role: gets past the role check (GET of our own resource: 200; writes are probed
 *   with a junk body or an unknown id, so nothing changes: any status but 401/403/5xx)
 * - another organisation (the second dealer's people, who share nothing with the demo): 404 for
 *   our resource, with a body that would be valid; collections never list our ids.
 */
const UNKNOWN_ID = '00000000-0000-4000-8000-00000000beef';

function send(c: Client, method: Method, path: string, body: unknown, multipart = false, png?: Uint8Array) {
  if (multipart) {
    const form = new FormData();
    form.append('file', new Blob([(png ?? new Uint8Array()) as BlobPart], { type: 'image/png' }), 'x.png');
    return c.fetch(path, { method, body: form });
  }
  if (method === 'GET' || body === undefined) return c.fetch(path, { method });
  return c.fetch(path, { method, headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
}

describe('role matrix', () => {
  const routes = apiRoutes().flatMap((r) => r.methods.map((m) => `${m} ${r.route}`));
  let clients: Awaited<ReturnType<typeof clientsByRole>>;
  let f: Fixtures;

  beforeAll(async () => {
    clients = await clientsByRole();
    f = await loadFixtures(clients.own);
  }, 60_000);

  it('has a row for every route and method in src/pages/api, and no stale rows', () => {
    const missing = routes.filter((r) => !(r in MATRIX));
    const stale = Object.keys(MATRIX).filter((k) => !routes.includes(k));
    expect(missing, 'routes without a row in the matrix').toEqual([]);
    expect(stale, 'rows for routes that no longer exist').toEqual([]);
  });

  it('refuses the signed-out with 401 and wrong roles with 403; lets allowed roles through', async () => {
    const problems: string[] = [];
    for (const key of routes) {
      const row = MATRIX[key];
      if (!row) continue;
      const [method, route] = key.split(' ') as [Method, string];
      const path = fill(route, row.params?.(f)) + (row.query?.(f) ?? '');
      const probe = fill(route, Object.fromEntries(Object.keys(row.params?.(f) ?? {}).map((k) => [k, k === 'version' ? '999' : k === 'partNumber' ? 'CW-NONE-X-00' : UNKNOWN_ID]))) + (row.query?.(f) ?? '');
      if (row.allowed === 'public') continue;
      const anon = await send(clients.signedOut, method, path, row.body?.(f), row.multipart, f.png);
      if (anon.status !== 401) problems.push(`${key} signed out: ${anon.status}, expected 401`);
      for (const role of ROLES) {
        const c = clients.own[role];
        if (!row.allowed.includes(role)) {
          const res = await send(c, method, path, row.body?.(f), row.multipart, f.png);
          if (res.status !== 403) problems.push(`${key} as ${role}: ${res.status}, expected 403`);
          continue;
        }
        if (method === 'GET') {
          const res = await c.fetch(path);
          if (res.status !== 200) problems.push(`${key} as ${role}: ${res.status}, expected 200`);
        } else {
          // Junk body to an unknown id: gets past the role check, changes nothing.
          const res = await send(c, method, probe, row.multipart ? undefined : { matrixProbe: [1, 'x'] }, row.multipart, new Uint8Array([1, 2, 3]));
          // 501: a backup in server mode is pg_dump's job, and the route says so.
          if ([401, 403].includes(res.status) || (res.status >= 500 && res.status !== 501)) problems.push(`${key} as ${role} (probe ${probe}): ${res.status}`);
        }
      }
    }
    expect(problems).toEqual([]);
  }, 180_000);

  it('keeps other organisations out: 404 for our resources, and our ids never listed', async () => {
    const problems: string[] = [];
    const ourIds = [f.machineId, f.layoutId, f.deckId, f.inspectionId, f.partsRequestId, f.shareLinkId];
    for (const key of routes) {
      const row = MATRIX[key];
      if (!row || row.allowed === 'public' || row.other === 'none') continue;
      const [method, route] = key.split(' ') as [Method, string];
      const path = fill(route, row.params?.(f)) + (row.query?.(f) ?? '');
      for (const role of row.allowed) {
        const c = clients.other[role];
        const res = await send(c, method, path, row.body?.(f), row.multipart, f.png);
        if (row.other === 'not-found') {
          if (res.status !== 404) problems.push(`${key} as another organisation's ${role}: ${res.status}, expected 404`);
        } else {
          const text = await res.text();
          if (res.status !== 200) problems.push(`${key} as another organisation's ${role}: ${res.status}`);
          for (const id of ourIds) if (text.includes(id)) problems.push(`${key} as another organisation's ${role} lists ${id}`);
        }
      }
    }
    expect(problems).toEqual([]);
  }, 180_000);
});
