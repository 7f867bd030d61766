import { beforeAll, describe, expect, it } from 'vitest';
import { fill, pageRoutes } from './routes';
import { clientsByRole, loadFixtures, ROLES, type Fixtures, type Role } from './matrix-fixtures';

/**
 * Every Astro page under src/pages × (signed out, each role, another dealer's people), as the API
 * role matrix does for routes. Expectations are written out here by hand; the page list is read
 * from the folder, so a new page without a row fails the suite.
 *
 * - signed out: a redirect to /signin (except the public pages)
 * - a role not allowed: 403
 * - an allowed role: 200
 * - another organisation's people: 404 on our resource (pages about the shared catalog or
 *   the caller's own lists answer 200 with their own data)
 */
type Other = 'not-found' | 'own-data';
interface PageRow {
  allowed: Role[] | 'public';
  params?: (f: Fixtures) => Record<string, string>;
  other: Other;
  /** Status every caller gets on a public page filled with the given params. */
  publicStatus?: number;
}

const ALL: Role[] = ['operator', 'technician', 'trainer', 'dealer_admin', 'instance_admin'];
const WRITERS: Role[] = ['operator', 'technician', 'dealer_admin'];
const CATALOG_READERS: Role[] = ['technician', 'dealer_admin', 'instance_admin'];
const INSTANCE: Role[] = ['instance_admin'];
const ADMINS: Role[] = ['dealer_admin', 'instance_admin'];
const PRICE_READERS: Role[] = ['technician', 'dealer_admin'];
const DECK: Role[] = ['trainer', 'technician'];
/** The dealer's before-the-season list (access.ts `season.list`). */
const SEASON: Role[] = ['technician', 'dealer_admin'];
/** Runs the installation, belongs to no tenant: a farm's or dealer's resource is a 404 to them. */
const STRANGERS_TO_TENANTS: Role[] = ['instance_admin'];

/** Shop work: who sees job cards (shop.view) and who manages them (jobs.manage). */
const SHOP: Role[] = ['operator', 'technician', 'dealer_admin'];
const JOBS: Role[] = ['technician', 'dealer_admin'];
const machine = (f: Fixtures) => ({ id: f.machineId });
const layoutOf = (f: Fixtures) => ({ id: f.machineId, layoutId: f.layoutId });
const deck = (f: Fixtures) => ({ deckId: f.deckId });

const PAGES: Record<string, PageRow> = {
  '/': { allowed: ALL, other: 'own-data' },
  '/account/password': { allowed: ALL, other: 'own-data' },
  '/admin/backup': { allowed: INSTANCE, other: 'own-data' },
  '/admin/catalog': { allowed: CATALOG_READERS, other: 'own-data' },
  '/admin/catalog/families/[id]': { allowed: CATALOG_READERS, params: (f) => ({ id: f.familyId }), other: 'own-data' },
  '/admin/catalog/families/new': { allowed: INSTANCE, other: 'own-data' },
  '/admin/catalog/parts/[partNumber]': { allowed: CATALOG_READERS, params: (f) => ({ partNumber: f.partNumber }), other: 'own-data' },
  '/admin/catalog/parts/new': { allowed: INSTANCE, other: 'own-data' },
  '/admin/mailbox': { allowed: ADMINS, other: 'own-data' },
  '/admin/prices': { allowed: PRICE_READERS, other: 'own-data' },
  '/admin/stock': { allowed: ['dealer_admin'], other: 'own-data' },
  '/admin/flat-rates': { allowed: ['dealer_admin'], other: 'own-data' },
  '/admin/starting-values': { allowed: ALL, other: 'own-data' },
  '/before-season': { allowed: SEASON, other: 'own-data' },
  '/classroom': { allowed: DECK, other: 'own-data' },
  '/classroom/[deckId]': { allowed: DECK, params: deck, other: 'not-found' },
  '/classroom/[deckId]/present': { allowed: DECK, params: deck, other: 'not-found' },
  '/classroom/[deckId]/presenter': { allowed: DECK, params: deck, other: 'not-found' },
  '/classroom/compare': { allowed: DECK, other: 'own-data' },
  '/field-check': { allowed: ALL, other: 'own-data' },
  '/inspections': { allowed: ALL, other: 'own-data' },
  '/inspections/[id]': { allowed: ALL, params: (f) => ({ id: f.inspectionId }), other: 'not-found' },
  '/inspections/[id]/report': { allowed: ALL, params: (f) => ({ id: f.inspectionId }), other: 'not-found' },
  '/inspections/history/[machineId]': { allowed: ALL, params: (f) => ({ machineId: f.machineId }), other: 'not-found' },
  '/jobs': { allowed: SHOP, other: 'own-data' },
  '/jobs/new': { allowed: JOBS, other: 'own-data' },
  '/jobs/[id]': { allowed: SHOP, params: (f) => ({ id: f.jobId }), other: 'not-found' },
  '/jobs/[id]/sheet': { allowed: SHOP, params: (f) => ({ id: f.jobId }), other: 'not-found' },
  '/machines': { allowed: ALL, other: 'own-data' },
  '/machines/new': { allowed: WRITERS, other: 'own-data' },
  '/machines/[id]': { allowed: ALL, params: machine, other: 'not-found' },
  '/machines/[id]/card': { allowed: ALL, params: machine, other: 'not-found' },
  '/machines/[id]/loss-check': { allowed: ALL, params: machine, other: 'not-found' },
  '/machines/[id]/season': { allowed: ALL, params: machine, other: 'not-found' },
  '/machines/[id]/hours': { allowed: WRITERS, params: machine, other: 'not-found' },
  '/machines/[id]/parts/[recordId]': {
    allowed: WRITERS,
    params: (f) => ({ id: f.machineId, recordId: f.partRecordId }),
    other: 'not-found',
  },
  '/machines/[id]/layouts/[layoutId]': { allowed: ALL, params: layoutOf, other: 'not-found' },
  '/machines/[id]/layouts/[layoutId]/compare': { allowed: ALL, params: layoutOf, other: 'not-found' },
  '/machines/[id]/layouts/[layoutId]/history': { allowed: ALL, params: layoutOf, other: 'not-found' },
  '/machines/[id]/layouts/[layoutId]/share': { allowed: ALL, params: layoutOf, other: 'not-found' },
  '/orgs': { allowed: ALL, other: 'own-data' },
  '/parts-requests': { allowed: WRITERS, other: 'own-data' },
  '/parts-requests/[id]': { allowed: WRITERS, params: (f) => ({ id: f.partsRequestId }), other: 'not-found' },
  '/planner': { allowed: WRITERS, other: 'own-data' },
  '/share/[token]': { allowed: 'public', params: () => ({ token: 'not-a-real-token' }), other: 'own-data', publicStatus: 404 },
  '/share/deck/[token]': { allowed: 'public', params: () => ({ token: 'not-a-real-token' }), other: 'own-data', publicStatus: 404 },
  '/signin': { allowed: 'public', other: 'own-data', publicStatus: 200 },
  '/signout': { allowed: ALL, other: 'own-data' },
};

describe('page role matrix', () => {
  const pages = pageRoutes();
  let clients: Awaited<ReturnType<typeof clientsByRole>>;
  let f: Fixtures;

  beforeAll(async () => {
    clients = await clientsByRole();
    f = await loadFixtures(clients.own);
  }, 60_000);

  it('has a row for every page in src/pages, and no stale rows', () => {
    expect(
      pages.filter((p) => !(p in PAGES)),
      'pages without a row',
    ).toEqual([]);
    expect(
      Object.keys(PAGES).filter((p) => !pages.includes(p)),
      'rows for pages that no longer exist',
    ).toEqual([]);
  });

  it('sends the signed-out to sign in, refuses wrong roles with 403, shows allowed roles the page', async () => {
    const problems: string[] = [];
    for (const page of pages) {
      const row = PAGES[page];
      if (!row) continue;
      const path = fill(page, row.params?.(f));
      const anon = await clients.signedOut.fetch(path);
      if (row.allowed === 'public') {
        if (anon.status !== row.publicStatus) problems.push(`${path} signed out: ${anon.status}, expected ${row.publicStatus}`);
        continue;
      }
      if (anon.status !== 303 || !(anon.headers.get('location') ?? '').startsWith('/signin')) {
        problems.push(`${path} signed out: ${anon.status} → ${anon.headers.get('location')}, expected 303 to /signin`);
      }
      for (const role of ROLES) {
        const res = await clients.own[role].fetch(path);
        const stranger = row.other === 'not-found' && STRANGERS_TO_TENANTS.includes(role);
        const want = !row.allowed.includes(role) ? 403 : stranger ? 404 : 200;
        if (res.status !== want) problems.push(`${path} as ${role}: ${res.status}, expected ${want}`);
      }
    }
    expect(problems).toEqual([]);
  }, 120_000);

  it("shows another dealer's people a 404 for our resources, and only their own data elsewhere", async () => {
    const problems: string[] = [];
    const ourIds = [f.machineId, f.layoutId, f.deckId, f.inspectionId, f.partsRequestId];
    for (const page of pages) {
      const row = PAGES[page];
      if (!row || row.allowed === 'public') continue;
      const path = fill(page, row.params?.(f));
      for (const role of ROLES) {
        const res = await clients.other[role].fetch(path);
        const html = await res.text();
        if (!row.allowed.includes(role)) {
          if (res.status !== 403 && res.status !== 404) problems.push(`${path} as the other ${role}: ${res.status}, expected 403 or 404`);
        } else if (row.other === 'not-found') {
          if (res.status !== 404) problems.push(`${path} as the other ${role}: ${res.status}, expected 404`);
        } else if (res.status !== 200) {
          problems.push(`${path} as the other ${role}: ${res.status}, expected 200 with their own data`);
        }
        // An id the caller put in the address may come back (a link to the page itself); any other is a leak.
        const leaked = ourIds.filter((id) => !path.includes(id) && html.includes(id));
        if (leaked.length) problems.push(`${path} as the other ${role} shows our ids ${leaked.join(', ')}`);
      }
    }
    expect(problems).toEqual([]);
  }, 120_000);

  it('never answers a POST that is not a form with a 5xx, on any page, for any role', async () => {
    const problems: string[] = [];
    for (const page of pages) {
      const row = PAGES[page];
      if (!row) continue;
      const path = fill(page, row.params?.(f));
      for (const role of ROLES) {
        for (const [type, body] of [
          ['application/json', '{"action":"save"}'],
          ['text/plain', 'action=save'],
        ] as const) {
          const res = await clients.own[role].fetch(path, { method: 'POST', headers: { 'content-type': type }, body });
          if (res.status >= 500) problems.push(`${path} as ${role}, ${type}: ${res.status}`);
        }
      }
    }
    expect(problems).toEqual([]);
  }, 120_000);
});
