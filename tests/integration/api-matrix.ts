import { LOSS_CHECK_BODY, type Fixtures, type Role } from './matrix-fixtures';

/**
 * Every API route and method with the roles allowed, how to fill its params from the fixtures,
 * and a body that would be valid for our resource. Used by the role matrix and the hostile-input
 * properties.
 */
export type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
const ALL: Role[] = ['operator', 'technician', 'trainer', 'dealer_admin', 'instance_admin'];
const WRITERS: Role[] = ['operator', 'technician', 'dealer_admin'];
const DESK: Role[] = ['technician', 'dealer_admin'];
const DECK: Role[] = ['trainer', 'technician'];
/** Both administrators; what each sees is scoped (tenancy tests in role-matrix.test.ts). */
const ADMINS: Role[] = ['dealer_admin', 'instance_admin'];
const INSTANCE: Role[] = ['instance_admin'];
const DEALER_ADMIN: Role[] = ['dealer_admin'];
const PRICE_READERS: Role[] = ['technician', 'dealer_admin'];
/** Who sees shop work (access.ts shop.view) and who manages job cards (jobs.manage). */
const SHOP: Role[] = ['operator', 'technician', 'dealer_admin'];
const JOBS: Role[] = ['technician', 'dealer_admin'];
/** Who records loss checks (services/field-checks.ts LOSS_CHECK_WRITERS). */
const FIELD: Role[] = ['operator', 'technician'];

export interface Row {
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

export const MATRIX: Record<string, Row> = {
  'POST /api/admin/backup': { allowed: INSTANCE, other: 'none', why: 'the whole installation: instance administrator only' },
  'GET /api/admin/backup': { allowed: 'public', other: 'none', why: 'answers 405 to everyone' },
  'GET /api/admin/mailbox': { allowed: ADMINS, other: 'none', why: 'scoped to the dealer: tenancy tests below' },
  'GET /api/admin/stats': { allowed: ADMINS, other: 'none', why: 'scoped to the dealer: tenancy tests below' },
  'GET /api/admin/users': { allowed: ADMINS, other: 'not-listed' },
  'PUT /api/admin/users/[id]': {
    allowed: DEALER_ADMIN,
    params: (f) => ({ id: f.member.userId }),
    body: (f) => ({ orgId: f.member.orgId, role: f.member.role }),
    other: 'not-found',
  },
  'GET /api/catalog/families': { allowed: ALL, other: 'none', why: 'the catalog is shared' },
  'POST /api/catalog/families': {
    allowed: INSTANCE,
    body: (f) => ({ ...f.family, id: 'matrix-family', name: 'Matrix family' }),
    other: 'none',
    why: 'the catalog is shared',
  },
  'GET /api/catalog/families/[id]': { allowed: ALL, params: (f) => ({ id: f.familyId }), other: 'none', why: 'the catalog is shared' },
  'PUT /api/catalog/families/[id]': {
    allowed: INSTANCE,
    params: (f) => ({ id: f.familyId }),
    body: (f) => f.family,
    other: 'none',
    why: 'the catalog is shared',
  },
  'GET /api/catalog/parts': { allowed: ALL, other: 'none', why: 'the catalog is shared' },
  'POST /api/catalog/parts': {
    allowed: INSTANCE,
    body: (f) => ({ familyId: f.familyId, part: { ...f.part, partNumber: 'CW-MX-L-99' } }),
    other: 'none',
    why: 'the catalog is shared',
  },
  'GET /api/catalog/parts/[partNumber]': {
    allowed: ALL,
    params: (f) => ({ partNumber: f.partNumber }),
    other: 'none',
    why: 'the catalog is shared',
  },
  'PUT /api/catalog/parts/[partNumber]': {
    allowed: INSTANCE,
    params: (f) => ({ partNumber: f.partNumber }),
    body: (f) => ({ familyId: f.familyId, part: f.part }),
    other: 'none',
    why: 'the catalog is shared',
  },
  'DELETE /api/catalog/parts/[partNumber]': {
    allowed: INSTANCE,
    params: (f) => ({ partNumber: f.partNumber }),
    other: 'none',
    why: 'the catalog is shared',
  },
  'POST /api/check': { allowed: ALL, body: (f) => ({ layout: f.layoutBody }), other: 'none', why: 'stateless' },
  'GET /api/decks': { allowed: DECK, other: 'not-listed' },
  'POST /api/decks': { allowed: DECK, body: () => ({ title: 'A deck' }), other: 'none', why: 'creates in the caller’s own organisation' },
  'GET /api/decks/[id]': { allowed: DECK, params: deck, other: 'not-found' },
  'PATCH /api/decks/[id]': { allowed: DECK, params: deck, body: () => ({ title: 'taken over' }), other: 'not-found' },
  'DELETE /api/decks/[id]': { allowed: DECK, params: deck, other: 'not-found' },
  'GET /api/decks/[id]/share': { allowed: DECK, params: deck, other: 'not-found' },
  'POST /api/decks/[id]/share': { allowed: DECK, params: deck, body: () => ({ label: 'x' }), other: 'not-found' },
  'DELETE /api/decks/[id]/share': { allowed: DECK, params: deck, query: (f) => `?link=${f.shareLinkId}`, other: 'not-found' },
  'GET /api/decks/[id]/slides': { allowed: DECK, params: deck, other: 'not-found' },
  'POST /api/decks/[id]/slides': {
    allowed: DECK,
    params: deck,
    body: (f) => ({ title: 'x', starter: { familyId: f.familyId, crop: 'wheat' } }),
    other: 'not-found',
  },
  'PUT /api/decks/[id]/slides': { allowed: DECK, params: deck, body: (f) => ({ order: [f.slideId] }), other: 'not-found' },
  'GET /api/decks/[id]/slides/[slideId]': { allowed: DECK, params: (f) => ({ id: f.deckId, slideId: f.slideId }), other: 'not-found' },
  'PATCH /api/decks/[id]/slides/[slideId]': {
    allowed: DECK,
    params: (f) => ({ id: f.deckId, slideId: f.slideId }),
    body: () => ({ title: 'taken over' }),
    other: 'not-found',
  },
  'DELETE /api/decks/[id]/slides/[slideId]': { allowed: DECK, params: (f) => ({ id: f.deckId, slideId: f.slideId }), other: 'not-found' },
  'GET /api/health': { allowed: 'public', other: 'none', why: 'liveness' },
  'GET /api/inspections': { allowed: ALL, other: 'not-listed' },
  'GET /api/inspections/[id]': { allowed: ALL, params: (f) => ({ id: f.inspectionId }), other: 'not-found' },
  'PATCH /api/inspections/[id]': {
    allowed: WRITERS,
    params: (f) => ({ id: f.inspectionId }),
    body: () => ({ title: 'taken over' }),
    other: 'not-found',
  },
  'POST /api/inspections/[id]': {
    allowed: WRITERS,
    params: (f) => ({ id: f.inspectionId }),
    body: () => ({ action: 'finish' }),
    other: 'not-found',
  },
  'POST /api/inspections/[id]/items/[itemId]/photos': {
    allowed: WRITERS,
    params: (f) => ({ id: f.inspectionId, itemId: f.itemId }),
    multipart: true,
    other: 'not-found',
  },
  'GET /api/layouts/[id]': { allowed: ALL, params: layout, other: 'not-found' },
  'PUT /api/layouts/[id]': {
    allowed: WRITERS,
    params: layout,
    body: (f) => ({ baseVersion: 1, body: f.layoutBody, note: 'taken over' }),
    other: 'not-found',
  },
  'GET /api/layouts/[id]/compare': { allowed: ALL, params: layout, query: () => '?a=1&b=1', other: 'not-found' },
  'POST /api/layouts/[id]/copy': { allowed: WRITERS, params: layout, body: (f) => ({ machineId: f.machineId }), other: 'not-found' },
  'POST /api/layouts/[id]/restore': { allowed: WRITERS, params: layout, body: () => ({ version: 1 }), other: 'not-found' },
  'GET /api/layouts/[id]/versions': { allowed: ALL, params: layout, other: 'not-found' },
  'GET /api/layouts/[id]/versions/[version]': { allowed: ALL, params: (f) => ({ id: f.layoutId, version: '1' }), other: 'not-found' },
  'GET /api/machines': { allowed: ALL, other: 'not-listed' },
  'POST /api/machines': {
    allowed: WRITERS,
    body: (f) => ({ familyId: f.familyId, drum: 'full', vaneControl: 'fixed', serial: 'MX-1', nickname: 'Matrix' }),
    other: 'none',
    why: 'creates in the caller’s own organisation (orgId of another is refused: fleet tests)',
  },
  'GET /api/machines/[id]': { allowed: ALL, params: machine, other: 'not-found' },
  'PUT /api/machines/[id]': { allowed: WRITERS, params: machine, body: () => ({ nickname: 'taken over' }), other: 'not-found' },
  'DELETE /api/machines/[id]': { allowed: WRITERS, params: machine, other: 'not-found' },
  'GET /api/machines/[id]/inspections': { allowed: ALL, params: machine, other: 'not-found' },
  'POST /api/machines/[id]/inspections': { allowed: WRITERS, params: machine, body: () => ({ title: 'x' }), other: 'not-found' },
  'GET /api/machines/[id]/loss-checks': { allowed: ALL, params: machine, other: 'not-found' },
  'POST /api/machines/[id]/loss-checks': { allowed: FIELD, params: machine, body: () => LOSS_CHECK_BODY, other: 'not-found' },
  'GET /api/machines/[id]/hours': { allowed: WRITERS, params: machine, other: 'not-found' },
  'POST /api/machines/[id]/hours': {
    allowed: WRITERS,
    params: machine,
    body: () => ({ engineHours: 99_000, separatorHours: 1 }),
    other: 'not-found',
  },
  'GET /api/machines/[id]/parts': { allowed: WRITERS, params: machine, other: 'not-found' },
  'GET /api/machines/[id]/parts/[recordId]': {
    allowed: WRITERS,
    params: (f) => ({ id: f.machineId, recordId: f.partRecordId }),
    other: 'not-found',
  },
  'GET /api/season-list': { allowed: DESK, other: 'not-listed' },
  'GET /api/loss-checks/[id]': { allowed: ALL, params: (f) => ({ id: f.lossCheckId }), other: 'not-found' },
  'DELETE /api/loss-checks/[id]': { allowed: FIELD, params: (f) => ({ id: f.lossCheckId }), other: 'not-found' },
  'GET /api/starting-values': { allowed: ALL, other: 'none', why: 'answers the caller’s own dealer’s values, keyed by family and crop' },
  'PUT /api/starting-values': {
    allowed: DEALER_ADMIN,
    body: (f) => ({ familyId: f.familyId, crop: 'wheat' }),
    other: 'none',
    why: 'writes the caller’s own dealer’s values (another dealer’s stay untouched: field-check tests)',
  },
  'GET /api/machines/[id]/installed': { allowed: ALL, params: machine, other: 'not-found' },
  'PUT /api/machines/[id]/installed': { allowed: WRITERS, params: machine, body: (f) => ({ layout: f.layoutBody }), other: 'not-found' },
  'GET /api/machines/[id]/layouts': { allowed: ALL, params: machine, other: 'not-found' },
  'POST /api/machines/[id]/layouts': {
    allowed: WRITERS,
    params: machine,
    body: (f) => ({ name: 'x', body: f.layoutBody }),
    other: 'not-found',
  },
  'GET /api/me': { allowed: ALL, other: 'none', why: 'the caller themself' },
  'PUT /api/me': { allowed: ALL, body: () => ({ unitSystem: 'metric' }), other: 'none', why: 'the caller themself' },
  'POST /api/me/password': {
    allowed: ALL,
    body: () => ({ currentPassword: 'not-the-password', newPassword: 'a-new-password-2026' }),
    other: 'none',
    why: 'the caller themself',
  },
  'GET /api/orgs': { allowed: ALL, other: 'not-listed' },
  'POST /api/orgs': {
    allowed: DEALER_ADMIN,
    body: () => ({ name: 'Matrix Farm' }),
    other: 'none',
    why: 'creates a farm for the admin’s own dealer',
  },
  'GET /api/parts-requests': { allowed: ALL, other: 'not-listed' },
  'POST /api/parts-requests': {
    allowed: WRITERS,
    body: (f) => ({ from: 'manual', machineId: f.machineId, lines: [{ partNumber: f.partNumber, quantity: 1 }] }),
    other: 'not-found',
  },
  'GET /api/parts-requests/[id]': { allowed: ALL, params: request, other: 'not-found' },
  'PUT /api/parts-requests/[id]': {
    allowed: WRITERS,
    params: request,
    body: (f) => ({ lines: [{ partNumber: f.partNumber, quantity: 9 }] }),
    other: 'not-found',
  },
  'DELETE /api/parts-requests/[id]': { allowed: WRITERS, params: request, other: 'not-found' },
  'POST /api/parts-requests/[id]/status': { allowed: DESK, params: request, body: () => ({ status: 'acknowledged' }), other: 'not-found' },
  'POST /api/parts-requests/[id]/submit': { allowed: WRITERS, params: request, other: 'not-found' },
  'GET /api/photos/[id]': { allowed: ALL, params: (f) => ({ id: f.photoId }), other: 'not-found' },
  'DELETE /api/photos/[id]': { allowed: WRITERS, params: (f) => ({ id: f.photoId }), other: 'not-found' },
  'POST /api/plans': { allowed: WRITERS, body: (f) => ({ machineId: f.machineId, crop: 'field-peas' }), other: 'not-found' },
  'POST /api/plans/accept': { allowed: WRITERS, body: (f) => ({ machineId: f.machineId, crop: 'field-peas' }), other: 'not-found' },
  'GET /api/price-list': { allowed: PRICE_READERS, other: 'none', why: 'always the caller’s own dealer: tenancy tests below' },
  'POST /api/price-list/import': {
    allowed: DEALER_ADMIN,
    body: (f) => ({ csv: `part number,price\n${f.partNumber},1.00` }),
    other: 'none',
    why: 'always the caller’s own dealer',
  },
  'PUT /api/price-list/[partNumber]': {
    allowed: DEALER_ADMIN,
    params: (f) => ({ partNumber: f.partNumber }),
    body: () => ({ priceCents: 100 }),
    other: 'none',
    why: 'always the caller’s own dealer',
  },
  'DELETE /api/price-list/[partNumber]': {
    allowed: DEALER_ADMIN,
    params: (f) => ({ partNumber: f.partNumber }),
    other: 'none',
    why: 'always the caller’s own dealer',
  },
  'PUT /api/dealer-stock/[partNumber]': {
    allowed: DEALER_ADMIN,
    params: (f) => ({ partNumber: f.partNumber }),
    body: () => ({ quantity: 3, leadDays: 5 }),
    other: 'none',
    why: 'always the caller’s own dealer: tenancy tests in planner-stock.test.ts',
  },
  // Job cards and flat rates (shop work).
  'GET /api/jobs': { allowed: SHOP, other: 'not-listed' },
  'POST /api/jobs': {
    allowed: JOBS,
    body: (f) => ({ origin: 'hand', machineId: f.machineId, title: 'taken over', steps: [{ kind: 'other', text: 'x' }] }),
    other: 'not-found',
  },
  'GET /api/jobs/[id]': { allowed: SHOP, params: (f) => ({ id: f.jobId }), other: 'not-found' },
  'PATCH /api/jobs/[id]': { allowed: JOBS, params: (f) => ({ id: f.jobId }), body: () => ({ title: 'taken over' }), other: 'not-found' },
  'POST /api/jobs/[id]/status': {
    allowed: JOBS,
    params: (f) => ({ id: f.jobId }),
    body: () => ({ status: 'in_progress' }),
    other: 'not-found',
  },
  'POST /api/jobs/[id]/sign-off': {
    allowed: JOBS,
    params: (f) => ({ id: f.jobId }),
    body: () => ({ checklist: { concaveZeroed: true } }),
    other: 'not-found',
  },
  'GET /api/flat-rates': { allowed: DEALER_ADMIN, other: 'none', why: 'always the caller’s own dealer: jobs tests' },
  'PUT /api/flat-rates': {
    allowed: DEALER_ADMIN,
    body: () => ({ rates: { other: 15 } }),
    other: 'none',
    why: 'always the caller’s own dealer (another dealer’s rates stay apart: jobs tests)',
  },
  'GET /api/share-links': { allowed: ALL, other: 'not-listed' },
  'POST /api/share-links': { allowed: WRITERS, body: (f) => ({ layoutId: f.layoutId, version: 1 }), other: 'not-found' },
  'DELETE /api/share-links/[id]': { allowed: WRITERS, params: (f) => ({ id: f.shareLinkId }), other: 'not-found' },
};
