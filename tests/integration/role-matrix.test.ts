import { beforeAll, describe, expect, it } from 'vitest';
import type { Client } from './client';
import { apiRoutes, fill } from './routes';
import { clientsByRole, loadFixtures, ROLES, type Fixtures, type Role } from './matrix-fixtures';

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
type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
const ALL: Role[] = ['operator', 'technician', 'trainer', 'admin'];
const WRITERS: Role[] = ['operator', 'technician', 'admin'];
const DESK: Role[] = ['technician', 'admin'];
const DECK: Role[] = ['trainer', 'technician'];
const ADMIN: Role[] = ['admin'];

interface Row {
  allowed: Role[] | 'public';
  /** Params of the route filled from the fixtures. */
  params?: (f: Fixtures) => Record<string, string>;
  query?: (f: Fixtures) => string;
  /** A body valid for our resource: sent only by strangers, who must get 404. */
  body?: (f: Fixtures) => unknown;
  /** Upload routes send multipart. */
  multipart?: boolean;
  /** How strangers are kept out: 404 on our resource, or (collections) our ids never listed. */
  other: 'not-found' | 'not-listed' | 'none';
  /** Why there is no other-organisation check. */
  why?: string;
}

const machine = (f: Fixtures) => ({ id: f.machineId });
const layout = (f: Fixtures) => ({ id: f.layoutId });
const deck = (f: Fixtures) => ({ id: f.deckId });
const request = (f: Fixtures) => ({ id: f.partsRequestId });

const MATRIX: Record<string, Row> = {
  'POST /api/admin/backup': { allowed: ADMIN, other: 'none', why: 'not an organisation resource' },
  'GET /api/admin/backup': { allowed: 'public', other: 'none', why: 'answers 405 to everyone' },
  'GET /api/admin/mailbox': { allowed: ADMIN, other: 'none', why: 'the development mailbox' },
  'GET /api/admin/stats': { allowed: ADMIN, other: 'none', why: 'table counts only' },
  'GET /api/admin/users': { allowed: ADMIN, other: 'not-listed' },
  'GET /api/catalog/families': { allowed: ALL, other: 'none', why: 'the catalog is shared' },
  'POST /api/catalog/families': { allowed: ADMIN, other: 'none', why: 'the catalog is shared' },
  'GET /api/catalog/families/[id]': { allowed: ALL, params: (f) => ({ id: f.familyId }), other: 'none', why: 'the catalog is shared' },
  'PUT /api/catalog/families/[id]': { allowed: ADMIN, params: (f) => ({ id: f.familyId }), other: 'none', why: 'the catalog is shared' },
  'GET /api/catalog/parts': { allowed: ALL, other: 'none', why: 'the catalog is shared' },
  'POST /api/catalog/parts': { allowed: ADMIN, other: 'none', why: 'the catalog is shared' },
  'GET /api/catalog/parts/[partNumber]': { allowed: ALL, params: (f) => ({ partNumber: f.partNumber }), other: 'none', why: 'the catalog is shared' },
  'PUT /api/catalog/parts/[partNumber]': { allowed: ADMIN, params: (f) => ({ partNumber: f.partNumber }), other: 'none', why: 'the catalog is shared' },
  'DELETE /api/catalog/parts/[partNumber]': { allowed: ADMIN, params: (f) => ({ partNumber: f.partNumber }), other: 'none', why: 'the catalog is shared' },
  'POST /api/check': { allowed: ALL, other: 'none', why: 'stateless' },
  'GET /api/decks': { allowed: DECK, other: 'not-listed' },
  'POST /api/decks': { allowed: DECK, other: 'none', why: 'creates in the caller’s own organisation' },
  'GET /api/decks/[id]': { allowed: DECK, params: deck, other: 'not-found' },
  'PATCH /api/decks/[id]': { allowed: DECK, params: deck, body: () => ({ title: 'taken over' }), other: 'not-found' },
  'DELETE /api/decks/[id]': { allowed: DECK, params: deck, other: 'not-found' },
  'GET /api/decks/[id]/share': { allowed: DECK, params: deck, other: 'not-found' },
  'POST /api/decks/[id]/share': { allowed: DECK, params: deck, body: () => ({ label: 'x' }), other: 'not-found' },
  'DELETE /api/decks/[id]/share': { allowed: DECK, params: deck, query: (f) => `?link=${f.shareLinkId}`, other: 'not-found' },
  'GET /api/decks/[id]/slides': { allowed: DECK, params: deck, other: 'not-found' },
  'POST /api/decks/[id]/slides': { allowed: DECK, params: deck, body: (f) => ({ title: 'x', starter: { familyId: f.familyId, crop: 'wheat' } }), other: 'not-found' },
  'PUT /api/decks/[id]/slides': { allowed: DECK, params: deck, body: (f) => ({ order: [f.slideId] }), other: 'not-found' },
  'GET /api/decks/[id]/slides/[slideId]': { allowed: DECK, params: (f) => ({ id: f.deckId, slideId: f.slideId }), other: 'not-found' },
  'PATCH /api/decks/[id]/slides/[slideId]': { allowed: DECK, params: (f) => ({ id: f.deckId, slideId: f.slideId }), body: () => ({ title: 'taken over' }), other: 'not-found' },
  'DELETE /api/decks/[id]/slides/[slideId]': { allowed: DECK, params: (f) => ({ id: f.deckId, slideId: f.slideId }), other: 'not-found' },
  'GET /api/health': { allowed: 'public', other: 'none', why: 'liveness' },
  'GET /api/inspections': { allowed: ALL, other: 'not-listed' },
  'GET /api/inspections/[id]': { allowed: ALL, params: (f) => ({ id: f.inspectionId }), other: 'not-found' },
  'PATCH /api/inspections/[id]': { allowed: WRITERS, params: (f) => ({ id: f.inspectionId }), body: () => ({ title: 'taken over' }), other: 'not-found' },
  'POST /api/inspections/[id]': { allowed: WRITERS, params: (f) => ({ id: f.inspectionId }), body: () => ({ action: 'finish' }), other: 'not-found' },
  'POST /api/inspections/[id]/items/[itemId]/photos': { allowed: WRITERS, params: (f) => ({ id: f.inspectionId, itemId: f.itemId }), multipart: true, other: 'not-found' },
  'GET /api/layouts/[id]': { allowed: ALL, params: layout, other: 'not-found' },
  'PUT /api/layouts/[id]': { allowed: WRITERS, params: layout, body: (f) => ({ baseVersion: 1, body: f.layoutBody, note: 'taken over' }), other: 'not-found' },
  'GET /api/layouts/[id]/compare': { allowed: ALL, params: layout, query: () => '?a=1&b=1', other: 'not-found' },
  'POST /api/layouts/[id]/copy': { allowed: WRITERS, params: layout, body: (f) => ({ machineId: f.machineId }), other: 'not-found' },
  'POST /api/layouts/[id]/restore': { allowed: WRITERS, params: layout, body: () => ({ version: 1 }), other: 'not-found' },
  'GET /api/layouts/[id]/versions': { allowed: ALL, params: layout, other: 'not-found' },
  'GET /api/layouts/[id]/versions/[version]': { allowed: ALL, params: (f) => ({ id: f.layoutId, version: '1' }), other: 'not-found' },
  'GET /api/machines': { allowed: ALL, other: 'not-listed' },
  'POST /api/machines': { allowed: WRITERS, other: 'none', why: 'creates in the caller’s own organisation (orgId of another is refused: fleet tests)' },
  'GET /api/machines/[id]': { allowed: ALL, params: machine, other: 'not-found' },
  'PUT /api/machines/[id]': { allowed: WRITERS, params: machine, body: () => ({ nickname: 'taken over' }), other: 'not-found' },
  'DELETE /api/machines/[id]': { allowed: WRITERS, params: machine, other: 'not-found' },
  'GET /api/machines/[id]/inspections': { allowed: ALL, params: machine, other: 'not-found' },
  'POST /api/machines/[id]/inspections': { allowed: WRITERS, params: machine, body: () => ({ title: 'x' }), other: 'not-found' },
  'GET /api/machines/[id]/installed': { allowed: ALL, params: machine, other: 'not-found' },
  'PUT /api/machines/[id]/installed': { allowed: WRITERS, params: machine, body: (f) => ({ layout: f.layoutBody }), other: 'not-found' },
  'GET /api/machines/[id]/layouts': { allowed: ALL, params: machine, other: 'not-found' },
  'POST /api/machines/[id]/layouts': { allowed: WRITERS, params: machine, body: (f) => ({ name: 'x', body: f.layoutBody }), other: 'not-found' },
  'GET /api/me': { allowed: ALL, other: 'none', why: 'the caller themself' },
  'PUT /api/me': { allowed: ALL, other: 'none', why: 'the caller themself' },
  'GET /api/orgs': { allowed: ALL, other: 'not-listed' },
  'POST /api/orgs': { allowed: ADMIN, other: 'none', why: 'creates a farm for the admin’s own dealer' },
  'GET /api/parts-requests': { allowed: ALL, other: 'not-listed' },
  'POST /api/parts-requests': { allowed: WRITERS, body: (f) => ({ from: 'manual', machineId: f.machineId, lines: [{ partNumber: f.partNumber, quantity: 1 }] }), other: 'not-found' },
  'GET /api/parts-requests/[id]': { allowed: ALL, params: request, other: 'not-found' },
  'PUT /api/parts-requests/[id]': { allowed: WRITERS, params: request, body: (f) => ({ lines: [{ partNumber: f.partNumber, quantity: 9 }] }), other: 'not-found' },
  'DELETE /api/parts-requests/[id]': { allowed: WRITERS, params: request, other: 'not-found' },
  'POST /api/parts-requests/[id]/status': { allowed: DESK, params: request, body: () => ({ status: 'acknowledged' }), other: 'not-found' },
  'POST /api/parts-requests/[id]/submit': { allowed: WRITERS, params: request, other: 'not-found' },
  'GET /api/photos/[id]': { allowed: ALL, params: (f) => ({ id: f.photoId }), other: 'not-found' },
  'DELETE /api/photos/[id]': { allowed: WRITERS, params: (f) => ({ id: f.photoId }), other: 'not-found' },
  'POST /api/plans': { allowed: WRITERS, body: (f) => ({ machineId: f.machineId, crop: 'field-peas' }), other: 'not-found' },
  'POST /api/plans/accept': { allowed: WRITERS, body: (f) => ({ machineId: f.machineId, crop: 'field-peas' }), other: 'not-found' },
  'GET /api/share-links': { allowed: ALL, other: 'not-listed' },
  'POST /api/share-links': { allowed: WRITERS, body: (f) => ({ layoutId: f.layoutId, version: 1 }), other: 'not-found' },
  'DELETE /api/share-links/[id]': { allowed: WRITERS, params: (f) => ({ id: f.shareLinkId }), other: 'not-found' },
};

const UNKNOWN_ID = '00000000-0000-4000-8000-00000000beef';

function send(c: Client, method: Method, path: string, body: unknown, multipart = false, png?: Uint8Array) {
  if (multipart) {
    const form = new FormData();
    form.append('file', new Blob([png ?? new Uint8Array()], { type: 'image/png' }), 'x.png');
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
          if ([401, 403].includes(res.status) || res.status >= 500) problems.push(`${key} as ${role} (probe ${probe}): ${res.status}`);
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
