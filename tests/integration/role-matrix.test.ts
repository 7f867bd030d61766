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
 * - another organisation (the second dealer's people, who share nothing with the demo, and the
 *   instance administrator, who runs the installation but belongs to no tenant): 404 for our
 *   resource, with a body that would be valid; collections never list our ids.
 * - tenancy of the administrators' routes: the second dealer's administrator against every admin,
 *   catalog and price-list route never reaches or sees the demo dealer's data; mailbox and
 *   statistics are scoped to the dealer for a dealer administrator and whole for the instance's.
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
      const probe =
        fill(
          route,
          Object.fromEntries(
            Object.keys(row.params?.(f) ?? {}).map((k) => [k, k === 'version' ? '999' : k === 'partNumber' ? 'CW-NONE-X-00' : UNKNOWN_ID]),
          ),
        ) + (row.query?.(f) ?? '');
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
          // The instance administrator passes the role check of a tenant's resource but is no member: 404.
          const expected = role === 'instance_admin' && row.other === 'not-found' ? 404 : 200;
          if (res.status !== expected) problems.push(`${key} as ${role}: ${res.status}, expected ${expected}`);
        } else {
          // Junk body to an unknown id: gets past the role check, changes nothing.
          const res = await send(
            c,
            method,
            probe,
            row.multipart ? undefined : { matrixProbe: [1, 'x'] },
            row.multipart,
            new Uint8Array([1, 2, 3]),
          );
          // 501: a backup in server mode is pg_dump's job, and the route says so.
          if ([401, 403].includes(res.status) || (res.status >= 500 && res.status !== 501))
            problems.push(`${key} as ${role} (probe ${probe}): ${res.status}`);
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

  describe('tenancy of the administrators’ routes', () => {
    const OUR_ADDRESSES = /@(kestrel|larkspur|haldane)\.example/;
    const PATHS = /\/(tmp|home|var|srv|work|root|Users)\/|[A-Z]:\\|"pid"/;
    let requestNumber: string;

    beforeAll(async () => {
      // A message that concerns the demo dealer: a parts request sent to its desk.
      const olive = clients.own.operator;
      const pr = await olive.post('/api/parts-requests', {
        from: 'manual',
        machineId: f.machineId,
        lines: [{ partNumber: f.partNumber, quantity: 2 }],
      });
      expect(pr.status, JSON.stringify(pr.body)).toBe(201);
      const sent = await olive.post(`/api/parts-requests/${pr.body.id}/submit`);
      expect(sent.status, JSON.stringify(sent.body)).toBe(200);
      requestNumber = sent.body.number;
    }, 60_000);

    it('the second dealer’s administrator never reaches or sees the demo dealer’s data on any admin, catalog or price-list route', async () => {
      const stranger = clients.other.dealer_admin;
      const problems: string[] = [];
      const ourIds = [f.machineId, f.layoutId, f.deckId, f.inspectionId, f.partsRequestId, f.shareLinkId];
      const adminRoutes = routes.filter((k) => /^\w+ \/api\/(admin|catalog|price-list)\b/.test(k));
      expect(adminRoutes.length).toBeGreaterThan(10);
      for (const key of adminRoutes) {
        const row = MATRIX[key]!;
        const [method, route] = key.split(' ') as [Method, string];
        const path = fill(route, row.params?.(f)) + (row.query?.(f) ?? '');
        const res = await send(stranger, method, path, row.body?.(f));
        const text = await res.text();
        const allowed = row.allowed === 'public' || row.allowed.includes('dealer_admin');
        if (!allowed && res.status !== 403 && !(row.allowed === 'public' && res.status === 405))
          problems.push(`${key}: ${res.status}, expected 403`);
        if (res.status >= 500) problems.push(`${key}: ${res.status}`);
        for (const id of ourIds) if (text.includes(id)) problems.push(`${key} shows ${id}`);
        if (OUR_ADDRESSES.test(text)) problems.push(`${key} shows an address of the demo dealer or its farms`);
        if (PATHS.test(text)) problems.push(`${key} shows a server path or process id`);
      }
      expect(problems).toEqual([]);
      // The price the stranger just set (PUT above) is theirs: the demo dealer's list is unchanged.
      const ours = (await clients.own.dealer_admin.get('/api/price-list')).body.items.find(
        (i: { partNumber: string }) => i.partNumber === f.partNumber,
      );
      expect(ours.priceCents).not.toBe(100);
      const theirs = (await stranger.get('/api/price-list')).body;
      expect(theirs.dealer.name).toBe('Brackenridge Ag Supply');
      expect((await stranger.delete(`/api/price-list/${f.partNumber}`)).status).toBe(200);
    }, 120_000);

    it('backups: only the instance administrator; a dealer’s administrator gets 403', async () => {
      expect((await clients.own.dealer_admin.post('/api/admin/backup')).status).toBe(403);
      expect((await clients.other.dealer_admin.post('/api/admin/backup')).status).toBe(403);
      expect((await clients.own.technician.post('/api/admin/backup')).status).toBe(403);
      expect((await clients.signedOut.post('/api/admin/backup')).status).toBe(401);
      // A token sent without sign-in opens nothing either (the real one never leaves the host).
      const forged = await clients.signedOut.fetch('/api/admin/backup', {
        method: 'POST',
        headers: { 'x-cagewright-backup-token': 'x'.repeat(43) },
      });
      expect(forged.status).toBe(401);
    });

    it('the mailbox: a dealer’s administrator sees their dealer’s messages only, the instance administrator all; no path', async () => {
      type Box = { scope: string; total: number; messages: { subject: string; to: string[]; cc: string[]; envelope: { to: string[] } }[] };
      const get = async (c: Client) => {
        const res = await c.get('/api/admin/mailbox?limit=500');
        expect(res.status).toBe(200);
        expect(res.body).not.toHaveProperty('dir');
        expect(JSON.stringify(res.body)).not.toMatch(PATHS);
        return res.body as Box;
      };
      const [instance, ours, theirs] = await Promise.all([
        get(clients.own.instance_admin),
        get(clients.own.dealer_admin),
        get(clients.other.dealer_admin),
      ]);
      expect(instance.scope).toBe('instance');
      expect(ours.scope).toBe('dealer');
      const concerning = (b: Box) => b.messages.filter((m) => m.subject.includes(requestNumber));
      expect(concerning(instance)).toHaveLength(1);
      expect(concerning(ours)).toHaveLength(1);
      expect(concerning(theirs)).toHaveLength(0);
      const addresses = (b: Box) => b.messages.flatMap((m) => [...m.to, ...m.cc, ...m.envelope.to]).join(' ');
      expect(addresses(theirs)).not.toMatch(OUR_ADDRESSES);
      expect(instance.total).toBeGreaterThanOrEqual(ours.total + theirs.total);
      // The page shows the same scope.
      const page = await (await clients.other.dealer_admin.fetch('/admin/mailbox')).text();
      expect(page).not.toContain(requestNumber);
      expect(page).not.toMatch(PATHS);
      expect(await (await clients.own.dealer_admin.fetch('/admin/mailbox')).text()).toContain(requestNumber);
    });

    it('statistics: a dealer’s administrator counts their dealer’s rows only, the instance administrator every row', async () => {
      const counts = async (c: Client) => {
        const res = await c.get('/api/admin/stats');
        expect(res.status).toBe(200);
        return res.body as { scope: string; counts: Record<string, number> };
      };
      const [instance, ours, theirs] = await Promise.all([
        counts(clients.own.instance_admin),
        counts(clients.own.dealer_admin),
        counts(clients.other.dealer_admin),
      ]);
      expect([instance.scope, ours.scope, theirs.scope]).toEqual(['instance', 'dealer', 'dealer']);
      const machinesOf = async (c: Client) => (await c.get('/api/machines?pageSize=100')).body.total as number;
      expect(theirs.counts.machines).toBe(await machinesOf(clients.other.dealer_admin));
      expect(ours.counts.machines).toBe(await machinesOf(clients.own.dealer_admin));
      expect(instance.counts.machines).toBeGreaterThanOrEqual(ours.counts.machines + theirs.counts.machines);
      expect(theirs.counts.organisations).toBe(2); // Brackenridge and its one farm
      expect(instance.counts.organisations).toBeGreaterThanOrEqual(ours.counts.organisations + theirs.counts.organisations + 1); // + the installation
      expect(theirs.counts.partsRequests).toBeLessThan(ours.counts.partsRequests);
      // The shared catalog is the same for everyone.
      expect(theirs.counts.catalogParts).toBe(instance.counts.catalogParts);
    });
  });
});
