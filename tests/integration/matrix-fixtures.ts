import { expect } from 'vitest';
import { Client, DEMO, DEMO_PASSWORD, machineWithLayout } from './client';

/**
 * Strangers to the demo's data: the second dealer's people (see src/lib/server/test-fixtures.ts),
 * and the instance administrator, who runs the installation but is no member of any tenant.
 */
export const OTHER = {
  operator: 'op@fenwick.example',
  technician: 'tech@brackenridge.example',
  trainer: 'trainer@brackenridge.example',
  dealer_admin: 'admin@brackenridge.example',
  instance_admin: DEMO.instanceAdmin,
} as const;

export type Role = 'operator' | 'technician' | 'trainer' | 'dealer_admin' | 'instance_admin';
export const ROLES: Role[] = ['operator', 'technician', 'trainer', 'dealer_admin', 'instance_admin'];

/** The demo's own people by role key. */
const OWN: Record<Role, string> = {
  operator: DEMO.operator,
  technician: DEMO.technician,
  trainer: DEMO.trainer,
  dealer_admin: DEMO.dealerAdmin,
  instance_admin: DEMO.instanceAdmin,
};

export interface Fixtures {
  machineId: string;
  familyId: string;
  family: Record<string, unknown>;
  part: Record<string, unknown>;
  layoutId: string;
  layoutBody: Record<string, unknown>;
  partNumber: string;
  shareLinkId: string;
  deckId: string;
  slideId: string;
  inspectionId: string;
  itemId: string;
  photoId: string;
  partsRequestId: string;
  /** A member of the demo dealer (the trainer): their id, that dealer's id and their role there. */
  member: { userId: string; orgId: string; role: string };
  lossCheckId: string;
  /** A job card by hand on the demo machine (made by the demo technician). */
  jobId: string;
  /** A part record (part history) of the machine. */
  partRecordId: string;
  /** A tiny valid PNG for upload routes. */
  png: Uint8Array;
}

const PNG_1PX = Uint8Array.from(
  Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==', 'base64'),
);

async function as(email: string): Promise<Client> {
  const c = new Client();
  await c.signIn(email, DEMO_PASSWORD);
  if (!c.hasSession()) throw new Error(`sign-in failed for ${email}`);
  return c;
}

/** A loss check body with only the fields that must be there (the hostile-input properties drop each). */
export const LOSS_CHECK_BODY = {
  fieldName: 'Matrix field',
  crop: 'wheat',
  frame: { by: 'area', area: 1, unit: 'ft2' },
  counts: { preHarvest: [1], header: [3], behindMachine: [20] },
  cutWidth: 30,
  spreadWidth: 10,
  widthUnit: 'ft',
  expectedYield: { value: 60, unit: 'bu/ac' },
};

export async function clientsByRole() {
  const own = {} as Record<Role, Client>;
  const other = {} as Record<Role, Client>;
  for (const r of ROLES) {
    own[r] = await as(OWN[r]);
    other[r] = r === 'instance_admin' ? own[r] : await as(OTHER[r]);
  }
  return { own, other, signedOut: new Client() };
}

/**
 * Resources of the demo world (Larkspur Farms' machine, the dealer's deck, the demo inspection),
 * found or made through the API itself.
 */
export async function loadFixtures(own: Record<Role, Client>): Promise<Fixtures> {
  const olive = own.operator;
  const { machineId } = await machineWithLayout(olive);
  const machine = (await olive.get(`/api/machines/${machineId}`)).body;
  const familyId: string = machine.familyId ?? machine.machine?.familyId;
  const layouts = (await olive.get(`/api/machines/${machineId}/layouts`)).body.layouts;
  const layoutId: string = layouts[0].id;
  const layoutBody = (await olive.get(`/api/layouts/${layoutId}`)).body.current.body;
  const partNumber: string = (layoutBody.elements as { partNumber: string }[])[0]!.partNumber;

  const family = (await own.instance_admin.get(`/api/catalog/families/${familyId}`)).body;
  const part = (await own.instance_admin.get(`/api/catalog/parts/${partNumber}`)).body;

  const share = await own.technician.post('/api/share-links', { layoutId, version: 1, label: 'matrix' });
  expect(share.status).toBe(201);
  const shareLinkId: string = share.body.link?.id ?? share.body.id;

  // Other suites share this store and add decks and inspections of their own: pick the demo's
  // (a deck with slides, an inspection with photos) rather than the first listed.
  const decks = (await own.trainer.get('/api/decks')).body.decks as { id: string; slideCount: number }[];
  const deckId = decks.find((d) => d.slideCount > 0)!.id;
  const deck = (await own.trainer.get(`/api/decks/${deckId}`)).body;
  const slideId: string = deck.slides[0].id;

  const inspections = (await own.technician.get('/api/inspections?pageSize=100')).body.items as { id: string; photoCount: number }[];
  const inspectionId = inspections.find((i) => i.photoCount > 0)!.id;
  const inspection = (await own.technician.get(`/api/inspections/${inspectionId}`)).body;
  const withPhoto = inspection.items.find((i: { photos?: unknown[] }) => (i.photos ?? []).length > 0);
  const itemId: string = inspection.items[0].id;
  const photoId: string = withPhoto.photos[0].id;

  const pr = await olive.post('/api/parts-requests', { from: 'manual', machineId, lines: [{ partNumber, quantity: 1 }] });
  expect(pr.status, JSON.stringify(pr.body)).toBe(201);
  const partsRequestId: string = pr.body.id ?? pr.body.request?.id;

  // A loss check of the machine: the demo's, or one made here when another suite removed them.
  let lossCheckId: string | undefined = (await olive.get(`/api/machines/${machineId}/loss-checks`)).body.checks?.[0]?.id;
  if (!lossCheckId) {
    const made = await olive.post(`/api/machines/${machineId}/loss-checks`, LOSS_CHECK_BODY);
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    lossCheckId = made.body.id as string;
  }

  // A job card of the machine, planned, made here (job cards are shop work, not demo data).
  const job = await own.technician.post('/api/jobs', {
    origin: 'hand',
    machineId,
    title: 'Matrix job',
    steps: [{ kind: 'check', text: 'Look the cage over.' }],
  });
  expect(job.status, JSON.stringify(job.body)).toBe(201);
  const jobId: string = job.body.id;
  // A part of the machine's history (the seed starts every demo machine's history).
  const parts = (await olive.get(`/api/machines/${machineId}/parts`)).body as { current: { record: { id: string } }[] };
  const partRecordId = parts.current[0]?.record.id;
  if (!partRecordId) throw new Error('the fixture machine has no part history');

  const people = (await own.dealer_admin.get('/api/admin/users')).body.users as {
    id: string;
    email: string;
    orgId: string;
    role: string;
  }[];
  const trainer = people.find((p) => p.email === DEMO.trainer)!;
  const member = { userId: trainer.id, orgId: trainer.orgId, role: trainer.role };

  return {
    member,
    lossCheckId,
    jobId,
    partRecordId,
    machineId,
    familyId,
    family: family.family?.spec ?? family.family ?? family,
    part: part.part?.spec ?? part.part ?? part,
    layoutId,
    layoutBody,
    partNumber,
    shareLinkId,
    deckId,
    slideId,
    inspectionId,
    itemId,
    photoId,
    partsRequestId,
    png: PNG_1PX,
  };
}
