/**
 * Parts requests: a bill of materials a farm (or its dealer's technician on its behalf) sends to
 * the dealer's parts desk. Made from a crop-change plan, from a saved layout (what it needs
 * beyond what is installed and on the shelf), from inspection findings, or by hand. A draft can
 * be edited and deleted; submitting is an outbox: the request is `sending` while the mail server
 * is asked, `sent` once it accepted (only then may the desk act), and back to `draft` with the
 * reason if it failed; the dealer's technicians then move it through acknowledged → ready →
 * picked up. A request left `sending` by a crash is returned to draft (`recoverStuckSends`).
 *
 * Lines keep the description and unit price the catalog had when they were added, so a sent
 * request reads the same later; part numbers are always checked against the machine's catalog.
 */
import { and, desc, eq, inArray, or, sql } from 'drizzle-orm';
import { toCsv } from '../csv';
import { withArticle } from '../../domain/words';
import { z } from 'zod';
import { getDb, type Db } from '../db';
import {
  families,
  layouts,
  machines,
  organisations,
  partsRequests,
  partsRequestStatuses,
  users,
  type PartsRequestLine,
  type PartsRequestSettings,
} from '../../../db/schema';
import { indexCatalog } from '../../domain/catalog';
import { cropIdSchema, partNumberSchema, type CatalogPart, type Layout } from '../../domain/schemas';
import { DEFAULT_CURRENCY, formatMoney, formatNumber, moneyAmount } from '../../domain/format';
import { formatLength, mm, type UnitSystem } from '../../domain/units';
import { billOfMaterials, bomLine, planModeSchema } from '../../domain/planner';
import type { Actor } from '../access';
import { audit } from '../audit';
import { HttpError, notFound, whenNotFound } from '../http';
import { getVersion, getLayout } from './layouts';
import { catalogForFamily, installedLayout, machineForActor } from './machines';
import { mailDeadlineMs, sendMail } from './mail';
import { proposePlan, requirePlan, shelfOf } from './planner';

export type PartsRequestStatus = (typeof partsRequestStatuses)[number];
export type PartsRequestSource = 'plan' | 'layout' | 'inspection' | 'manual';

/** Who may make, edit, delete and submit requests. */
export const PARTS_WRITERS = ['operator', 'technician', 'dealer_admin'] as const;
/** Who moves a sent request through the parts desk's statuses (staff of the dealer it went to). */
export const DESK_ROLES = ['technician', 'dealer_admin'] as const;

export const NEXT_STATUS: Partial<Record<PartsRequestStatus, PartsRequestStatus>> = {
  sent: 'acknowledged',
  acknowledged: 'ready',
  ready: 'picked-up',
};

export const STATUS_WORDS: Record<PartsRequestStatus, string> = {
  draft: 'Draft',
  sending: 'Being sent',
  sent: 'Sent to the parts desk',
  acknowledged: 'Acknowledged',
  ready: 'Ready for pick-up',
  'picked-up': 'Picked up',
};

export const SOURCE_WORDS: Record<PartsRequestSource, string> = {
  plan: 'crop-change plan',
  layout: 'saved layout',
  inspection: 'inspection',
  manual: 'entered by hand',
};

/** Where a request came from, as a phrase: "from an inspection", "entered by hand". */
export const sourceOrigin = (source: PartsRequestSource): string => (source === 'manual' ? SOURCE_WORDS.manual : `from ${withArticle(SOURCE_WORDS[source])}`);

const MAX_QTY = 999;
const note = z.string().trim().max(2000).default('');

export const lineInputSchema = z.object({
  partNumber: partNumberSchema,
  quantity: z.int({ error: 'give a whole number' }).min(1, { error: 'must be at least 1' }).max(MAX_QTY),
});
export type LineInput = z.infer<typeof lineInputSchema>;

export const createPartsRequestSchema = z.discriminatedUnion('from', [
  z.object({ from: z.literal('plan'), machineId: z.uuid(), crop: cropIdSchema, mode: planModeSchema.default('program'), note }),
  z.object({ from: z.literal('layout'), layoutId: z.uuid(), version: z.int32().min(1).optional(), note }),
  z.object({ from: z.literal('manual'), machineId: z.uuid(), lines: z.array(lineInputSchema).min(1).max(100), note }),
]);
export type CreatePartsRequest = z.infer<typeof createPartsRequestSchema>;

/** Editing a draft: the full list of lines (quantity 0 drops a line) and the note. */
export const updatePartsRequestSchema = z
  .object({
    lines: z
      .array(
        z.object({
          partNumber: partNumberSchema,
          quantity: z.int({ error: 'give a whole number' }).min(0, { error: 'cannot be negative' }).max(MAX_QTY),
        }),
      )
      .max(100)
      .optional(),
    note: z.string().trim().max(2000).optional(),
  })
  .refine((v) => v.lines !== undefined || v.note !== undefined, { message: 'give lines or a note to change', path: ['lines'] });

export const statusChangeSchema = z.object({ status: z.enum(partsRequestStatuses) });

export const listQuerySchema = z.object({
  status: z.enum(partsRequestStatuses).optional(),
  /** 'incoming': requests sent to the actor's dealer; 'own': the actor's organisations' requests. */
  scope: z.enum(['all', 'incoming', 'own']).default('all'),
});

export const requestNumber = (id: string) => `PR-${id.slice(0, 8).toUpperCase()}`;

// ---------------------------------------------------------------------------------------------
// Reading

const visibleTo = (actor: Actor) =>
  or(inArray(partsRequests.orgId, actor.visibleOrgIds), inArray(partsRequests.dealerOrgId, actor.memberOrgIds))!;

type Row = typeof partsRequests.$inferSelect;

export interface PartsRequestView {
  id: string;
  number: string;
  status: PartsRequestStatus;
  statusWords: string;
  source: PartsRequestSource;
  org: { id: string; name: string; ownerEmail: string | null };
  dealer: { id: string; name: string; partsDeskEmail: string | null } | null;
  machine: { id: string; nickname: string; serial: string; familyId: string; familyName: string } | null;
  lines: (PartsRequestLine & { lineTotalCents: number })[];
  totalCents: number;
  /** ISO 4217 code of the prices: the dealer's currency. */
  currency: string;
  /** What the layout it was made for asks of the machine (plan and layout requests). */
  settings: PartsRequestSettings | null;
  totalQuantity: number;
  note: string;
  createdAt: Date;
  updatedAt: Date;
  sentAt: Date | null;
  /** Why the last send failed (the request is a draft again), until it is sent. */
  sendError: string | null;
  createdByName: string | null;
  /** What this actor may do with it now. */
  can: { edit: boolean; submit: boolean; delete: boolean; advance: boolean };
  nextStatus: PartsRequestStatus | null;
}

async function rowForActor(actor: Actor, id: string, db?: Db): Promise<Row> {
  const d = db ?? (await getDb());
  const [row] = await d
    .select()
    .from(partsRequests)
    .where(and(eq(partsRequests.id, id), visibleTo(actor)))
    .limit(1);
  if (!row) throw notFound('Parts request not found', 'id');
  return row;
}

function permissions(actor: Actor, row: Pick<Row, 'status' | 'orgId' | 'dealerOrgId'>) {
  const writer = (PARTS_WRITERS as readonly string[]).includes(actor.role) && actor.visibleOrgIds.includes(row.orgId);
  const draft = row.status === 'draft';
  const desk = (DESK_ROLES as readonly string[]).includes(actor.role) && !!row.dealerOrgId && actor.memberOrgIds.includes(row.dealerOrgId);
  return {
    edit: writer && draft,
    submit: writer && draft,
    delete: writer && draft,
    advance: desk && NEXT_STATUS[row.status] !== undefined,
  };
}

async function viewOf(actor: Actor, row: Row, db: Db): Promise<PartsRequestView> {
  const ids = [row.orgId, ...(row.dealerOrgId ? [row.dealerOrgId] : [])];
  const [orgRows, machineRows, creator] = await Promise.all([
    db
      .select({ id: organisations.id, name: organisations.name, ownerEmail: organisations.ownerEmail, partsDeskEmail: organisations.partsDeskEmail, currency: organisations.currency })
      .from(organisations)
      .where(inArray(organisations.id, ids)),
    row.machineId
      ? db
          .select({ id: machines.id, nickname: machines.nickname, serial: machines.serial, familyId: machines.familyId, familyName: families.name })
          .from(machines)
          .innerJoin(families, eq(families.id, machines.familyId))
          .where(eq(machines.id, row.machineId))
          .limit(1)
      : Promise.resolve([]),
    row.createdBy ? db.select({ name: users.name }).from(users).where(eq(users.id, row.createdBy)).limit(1) : Promise.resolve([]),
  ]);
  const org = orgRows.find((o) => o.id === row.orgId)!;
  const dealer = row.dealerOrgId ? orgRows.find((o) => o.id === row.dealerOrgId) : undefined;
  const lines = row.lines.map((l) => ({ ...l, lineTotalCents: l.quantity * l.unitPriceCents }));
  return {
    id: row.id,
    number: requestNumber(row.id),
    status: row.status,
    statusWords: STATUS_WORDS[row.status],
    source: row.source,
    org: { id: org.id, name: org.name, ownerEmail: org.ownerEmail },
    dealer: dealer ? { id: dealer.id, name: dealer.name, partsDeskEmail: dealer.partsDeskEmail } : null,
    machine: machineRows[0] ?? null,
    lines,
    totalCents: lines.reduce((s, l) => s + l.lineTotalCents, 0),
    currency: dealer?.currency ?? DEFAULT_CURRENCY,
    settings: row.settings ?? null,
    totalQuantity: lines.reduce((s, l) => s + l.quantity, 0),
    note: row.note,
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
    sentAt: row.sentAt,
    sendError: row.sendError ?? null,
    createdByName: creator[0]?.name ?? null,
    can: permissions(actor, row),
    nextStatus: NEXT_STATUS[row.status] ?? null,
  };
}

export async function getPartsRequest(actor: Actor, id: string): Promise<PartsRequestView> {
  const db = await getDb();
  return viewOf(actor, await rowForActor(actor, id, db), db);
}

export async function listPartsRequests(actor: Actor, query: z.infer<typeof listQuerySchema>) {
  const db = await getDb();
  const conditions = [visibleTo(actor)];
  if (query.status) conditions.push(eq(partsRequests.status, query.status));
  if (query.scope === 'incoming') {
    // Not drafts, nor requests still being sent: the desk sees a request once the mail server took it.
    conditions.push(inArray(partsRequests.dealerOrgId, actor.memberOrgIds), sql`${partsRequests.status} not in ('draft', 'sending')`);
  } else if (query.scope === 'own') {
    conditions.push(inArray(partsRequests.orgId, actor.memberOrgIds));
  }
  const rows = await db
    .select({
      id: partsRequests.id,
      status: partsRequests.status,
      source: partsRequests.source,
      orgId: partsRequests.orgId,
      dealerOrgId: partsRequests.dealerOrgId,
      orgName: organisations.name,
      machineId: partsRequests.machineId,
      machineNickname: machines.nickname,
      lines: partsRequests.lines,
      note: partsRequests.note,
      createdAt: partsRequests.createdAt,
      updatedAt: partsRequests.updatedAt,
      sentAt: partsRequests.sentAt,
      sendError: partsRequests.sendError,
      dealerCurrency: sql<string | null>`(select d.currency from organisations d where d.id = ${partsRequests.dealerOrgId})`,
    })
    .from(partsRequests)
    .innerJoin(organisations, eq(organisations.id, partsRequests.orgId))
    .leftJoin(machines, eq(machines.id, partsRequests.machineId))
    .where(and(...conditions))
    .orderBy(desc(partsRequests.updatedAt))
    .limit(200);
  return {
    items: rows.map(({ lines, dealerCurrency, ...r }) => ({
      ...r,
      currency: dealerCurrency ?? DEFAULT_CURRENCY,
      number: requestNumber(r.id),
      statusWords: STATUS_WORDS[r.status],
      lineCount: lines.length,
      totalQuantity: lines.reduce((s, l) => s + l.quantity, 0),
      totalCents: lines.reduce((s, l) => s + l.quantity * l.unitPriceCents, 0),
      can: permissions(actor, r),
    })),
  };
}

// ---------------------------------------------------------------------------------------------
// Writing

/** The dealer a farm's requests go to (a dealer's own machine: the dealer itself). */
async function dealerFor(orgId: string, db: Pick<Db, 'select'>): Promise<string | null> {
  const [org] = await db.select({ kind: organisations.kind, dealerId: organisations.dealerId }).from(organisations).where(eq(organisations.id, orgId)).limit(1);
  if (!org) return null;
  return org.kind === 'dealer' ? orgId : org.dealerId;
}

/**
 * Request lines for part numbers and quantities, checked against a family's catalog: an unknown
 * part number is bad input naming its field (`${fieldPrefix}.<i>.partNumber`). Equal part
 * numbers add up; quantity 0 drops a line.
 */
export function linesFromInput(
  input: readonly { partNumber: string; quantity: number }[],
  catalog: readonly CatalogPart[],
  fieldPrefix = 'lines',
  familyName = 'this machine',
): PartsRequestLine[] {
  const byNumber = indexCatalog(catalog).byPartNumber;
  const out: PartsRequestLine[] = [];
  input.forEach((l, i) => {
    const part = byNumber.get(l.partNumber);
    if (!part) {
      const field = `${fieldPrefix}.${i}.partNumber`;
      throw new HttpError(400, `${field}: ${l.partNumber} is not a part of the ${familyName} catalog`, field);
    }
    if (l.quantity <= 0) return;
    const same = out.find((o) => o.partNumber === part.partNumber);
    if (same) same.quantity += l.quantity;
    else {
      const b = bomLine(part, l.quantity);
      out.push({ partNumber: b.partNumber, description: b.description, hand: b.hand, quantity: b.quantity, unitPriceCents: b.unitPriceCents });
    }
  });
  const tooMany = out.findIndex((l) => l.quantity > MAX_QTY);
  if (tooMany >= 0) throw new HttpError(400, `${fieldPrefix}.${tooMany}.quantity: at most ${MAX_QTY} of one part`, `${fieldPrefix}.${tooMany}.quantity`);
  return out;
}

function mergeLines(existing: readonly PartsRequestLine[], added: readonly PartsRequestLine[]): PartsRequestLine[] {
  const out = existing.map((l) => ({ ...l }));
  for (const l of added) {
    const same = out.find((o) => o.partNumber === l.partNumber);
    if (same) same.quantity = Math.min(MAX_QTY, same.quantity + l.quantity);
    else out.push({ ...l });
  }
  return out;
}

const settingsOf = (l: Layout): PartsRequestSettings => ({ rotorRpm: l.rotorRpm, clearanceMm: l.clearanceMm, vaneSetting: l.vaneSetting });

/** The settings a request carries, in the reader's units: "rotor speed 420 rpm · concave clearance 0.98 in · vanes medium". */
export function requestSettingsWords(settings: PartsRequestSettings, units: UnitSystem): string {
  return [
    `rotor speed ${settings.rotorRpm} rpm`,
    `concave clearance ${formatLength(mm(settings.clearanceMm), units)}`,
    `vanes ${settings.vaneSetting.replace('-', ' ')}`,
  ].join(' · ');
}

const NOTHING_TO_ORDER = 'Nothing to order: everything it needs is on the machine or on the shelf.';

export async function createPartsRequest(actor: Actor, input: CreatePartsRequest): Promise<PartsRequestView> {
  let machineId: string;
  let orgId: string;
  let lines: PartsRequestLine[];
  let detail: Record<string, unknown> = {};
  let autoNote = '';
  let settings: PartsRequestSettings | null = null;
  if (input.from === 'plan') {
    const proposal = await proposePlan(actor, input);
    const plan = requirePlan(proposal.plan);
    machineId = proposal.machine.id;
    orgId = proposal.machine.orgId;
    lines = plan.purchases.map((p) => ({ partNumber: p.partNumber, description: p.description, hand: p.hand, quantity: p.quantity, unitPriceCents: p.unitPriceCents }));
    if (!lines.length) throw new HttpError(422, `${NOTHING_TO_ORDER} The plan buys nothing.`, 'crop');
    detail = { crop: input.crop, mode: input.mode, fingerprint: plan.fingerprint };
    settings = settingsOf(plan.layout);
    autoNote = `For the change to ${input.crop.replace('-', ' ')} on ${proposal.machine.nickname}.`;
  } else if (input.from === 'layout') {
    const { layout, machine, family } = await getLayout(actor, input.layoutId).catch(
      whenNotFound(() => new HttpError(404, 'Layout not found', 'layoutId')),
    );
    const version = await getVersion(actor, layout.id, input.version ?? layout.currentVersion).catch(
      whenNotFound(() => new HttpError(400, `version: this layout has no version ${input.version}`, 'version')),
    );
    const [catalog, installed, shelf] = await Promise.all([catalogForFamily(family.id, undefined, machine.orgId), installedLayout(machine.id), shelfOf(machine.orgId)]);
    const bom = billOfMaterials(indexCatalog(catalog), version.body, installed?.layout ?? null, shelf);
    if (bom.unknown.length)
      throw new HttpError(400, `layoutId: the layout holds part numbers the catalog does not know (${bom.unknown.join(', ')})`, 'layoutId');
    lines = bom.lines.map((l) => ({ partNumber: l.partNumber, description: l.description, hand: l.hand, quantity: l.quantity, unitPriceCents: l.unitPriceCents }));
    if (!lines.length) throw new HttpError(422, `${NOTHING_TO_ORDER} The layout adds no parts.`, 'layoutId');
    machineId = machine.id;
    orgId = machine.orgId;
    detail = { layoutId: layout.id, version: version.version };
    settings = settingsOf(version.body);
    autoNote = `Parts for “${layout.name}” version ${version.version} on ${machine.nickname}.`;
  } else {
    const ctx = await machineForActor(actor, input.machineId);
    lines = linesFromInput(input.lines, await catalogForFamily(ctx.family.id, undefined, ctx.machine.orgId), 'lines', ctx.family.name);
    machineId = ctx.machine.id;
    orgId = ctx.machine.orgId;
  }
  const db = await getDb();
  const id = await db.transaction(async (tx) => {
    const dealerOrgId = await dealerFor(orgId, tx);
    const [row] = await tx
      .insert(partsRequests)
      .values({ orgId, dealerOrgId, machineId, source: input.from, status: 'draft', lines, settings, note: input.note || autoNote, createdBy: actor.id })
      .returning({ id: partsRequests.id });
    await audit(tx, actor, 'create', 'parts-request', row!.id, { source: input.from, lines: lines.length, ...detail }, orgId);
    return row!.id;
  });
  return getPartsRequest(actor, id);
}

/**
 * Adds lines to the machine's open draft request of the same source, or starts one. For other
 * areas (inspections: flagged elements to replace) — part numbers are checked against the
 * machine's catalog (400 naming `lines.<i>.partNumber`), equal part numbers add up, and the
 * change is audited. Returns the request as its page shows it.
 */
export async function addLinesToDraftRequest(
  actor: Actor,
  machineId: string,
  lines: readonly LineInput[],
  source: PartsRequestSource,
  noteText = '',
): Promise<PartsRequestView> {
  const ctx = await machineForActor(actor, machineId);
  if (!(PARTS_WRITERS as readonly string[]).includes(actor.role)) throw new HttpError(403, `This needs one of these roles: ${PARTS_WRITERS.join(', ')}.`);
  const added = linesFromInput(lines, await catalogForFamily(ctx.family.id, undefined, ctx.machine.orgId), 'lines', ctx.family.name);
  if (!added.length) throw new HttpError(400, 'lines: give at least one part with a quantity', 'lines');
  const db = await getDb();
  const id = await db.transaction(async (tx) => {
    const [draft] = await tx
      .select()
      .from(partsRequests)
      .where(and(eq(partsRequests.machineId, ctx.machine.id), eq(partsRequests.status, 'draft'), eq(partsRequests.source, source)))
      .orderBy(partsRequests.createdAt)
      .limit(1)
      .for('update');
    if (draft) {
      const merged = mergeLines(draft.lines, added);
      const nextNote = noteText ? (draft.note ? `${draft.note}\n${noteText}` : noteText) : draft.note;
      await tx.update(partsRequests).set({ lines: merged, note: nextNote, updatedAt: sql`now()` }).where(eq(partsRequests.id, draft.id));
      await audit(tx, actor, 'add-lines', 'parts-request', draft.id, { source, lines: added }, draft.orgId);
      return draft.id;
    }
    const dealerOrgId = await dealerFor(ctx.machine.orgId, tx);
    const [row] = await tx
      .insert(partsRequests)
      .values({ orgId: ctx.machine.orgId, dealerOrgId, machineId: ctx.machine.id, source, status: 'draft', lines: added, note: noteText, createdBy: actor.id })
      .returning({ id: partsRequests.id });
    await audit(tx, actor, 'create', 'parts-request', row!.id, { source, lines: added }, ctx.machine.orgId);
    return row!.id;
  });
  return getPartsRequest(actor, id);
}

function assertDraft(row: Row, what: string) {
  if (row.status !== 'draft')
    throw new HttpError(409, `This request is ${STATUS_WORDS[row.status].toLowerCase()}; only a draft can be ${what}.`, 'status');
}

function assertWriter(actor: Actor) {
  if (!(PARTS_WRITERS as readonly string[]).includes(actor.role)) throw new HttpError(403, `This needs one of these roles: ${PARTS_WRITERS.join(', ')}.`);
}

/** The catalog a request's lines are checked against: its machine's family. */
async function catalogOfRequest(row: Row): Promise<{ catalog: CatalogPart[]; familyName: string }> {
  const db = await getDb();
  if (!row.machineId) return { catalog: [], familyName: 'this machine' };
  const [m] = await db
    .select({ familyId: machines.familyId, familyName: families.name })
    .from(machines)
    .innerJoin(families, eq(families.id, machines.familyId))
    .where(eq(machines.id, row.machineId))
    .limit(1);
  if (!m) return { catalog: [], familyName: 'this machine' };
  return { catalog: await catalogForFamily(m.familyId, undefined, row.orgId), familyName: m.familyName };
}

export async function updatePartsRequest(actor: Actor, id: string, input: z.infer<typeof updatePartsRequestSchema>) {
  assertWriter(actor);
  const row = await rowForActor(actor, id);
  if (!actor.visibleOrgIds.includes(row.orgId)) throw new HttpError(403, 'Only the farm and its dealer’s staff change a request.');
  assertDraft(row, 'changed');
  const changes: Partial<Pick<Row, 'lines' | 'note'>> = {};
  if (input.lines) {
    // Known lines keep the price they were added at; new part numbers take today's catalog.
    const { catalog, familyName } = await catalogOfRequest(row);
    const fresh = linesFromInput(input.lines, catalog, 'lines', familyName);
    changes.lines = fresh.map((l) => {
      const old = row.lines.find((o) => o.partNumber === l.partNumber);
      return old ? { ...old, quantity: l.quantity } : l;
    });
  }
  if (input.note !== undefined) changes.note = input.note;
  const db = await getDb();
  await db.transaction(async (tx) => {
    const moved = await tx
      .update(partsRequests)
      .set({ ...changes, updatedAt: sql`now()` })
      .where(and(eq(partsRequests.id, row.id), eq(partsRequests.status, 'draft')))
      .returning({ id: partsRequests.id });
    if (!moved.length) throw new HttpError(409, 'This request was sent meanwhile; it can no longer be changed.', 'status');
    await audit(tx, actor, 'update', 'parts-request', row.id, { lines: changes.lines?.map((l) => [l.partNumber, l.quantity]), note: changes.note !== undefined }, row.orgId);
  });
  return getPartsRequest(actor, id);
}

export async function deletePartsRequest(actor: Actor, id: string) {
  assertWriter(actor);
  const row = await rowForActor(actor, id);
  if (!actor.visibleOrgIds.includes(row.orgId)) throw new HttpError(403, 'Only the farm and its dealer’s staff delete a request.');
  assertDraft(row, 'deleted');
  const db = await getDb();
  await db.transaction(async (tx) => {
    const gone = await tx
      .delete(partsRequests)
      .where(and(eq(partsRequests.id, row.id), eq(partsRequests.status, 'draft')))
      .returning({ id: partsRequests.id });
    if (!gone.length) throw new HttpError(409, 'This request was sent meanwhile; it can no longer be deleted.', 'status');
    await audit(tx, actor, 'delete', 'parts-request', row.id, { lines: row.lines.length }, row.orgId);
  });
  return { deleted: row.id };
}

// ---------------------------------------------------------------------------------------------
// Sending and the parts desk


/** The request as a CSV file (papaparse, formulas neutralised): one row per line and a total row. */
export function partsRequestCsv(view: Pick<PartsRequestView, 'lines' | 'totalCents' | 'totalQuantity' | 'currency'>): string {
  const plain = moneyAmount;
  return toCsv(
    ['Part number', 'Description', 'Hand', 'Quantity', 'Unit price', 'Line total', 'Currency'],
    [
      ...view.lines.map((l) => [l.partNumber, l.description, l.hand ?? '', l.quantity, plain(l.unitPriceCents), plain(l.lineTotalCents), view.currency]),
      ['', 'Total', '', view.totalQuantity, '', plain(view.totalCents), view.currency],
    ],
  );
}

export function csvFileName(view: Pick<PartsRequestView, 'number'>) {
  return `${view.number.toLowerCase()}.csv`;
}

function mailText(view: PartsRequestView, actor: Actor, link: string): string {
  // Amounts in columns headed with the currency: plain grouped numbers line up.
  const money = (cents: number) => formatNumber(cents / 100, { digits: 2 });
  const rows = view.lines.map((l) => {
    const hand = l.hand ? `${l.hand} hand` : '';
    return `  ${String(l.quantity).padStart(3)} × ${l.partNumber.padEnd(14)} ${hand.padEnd(10)} ${money(l.unitPriceCents).padStart(10)}  ${money(l.lineTotalCents).padStart(11)}  ${l.description}`;
  });
  const machine = view.machine ? `${view.machine.nickname}, ${view.machine.familyName}, serial ${view.machine.serial}` : '—';
  return [
    `Parts request ${view.number} from ${view.org.name}`,
    '',
    `Machine:      ${machine}`,
    `Requested by: ${actor.name} <${actor.email}>`,
    `Made from:    ${SOURCE_WORDS[view.source]}`,
    ...(view.note ? [`Note:         ${view.note.replace(/\n/g, '\n              ')}`] : []),
    ...(view.settings ? [`Settings:     ${requestSettingsWords(view.settings, actor.unitSystem)} (after fitting)`] : []),
    '',
    `  Qty   Part number    Hand       Unit ${view.currency}   Line ${view.currency}  Description`,
    ...rows,
    '',
    `  ${String(view.totalQuantity).padStart(3)} parts${' '.repeat(31)}Total ${formatMoney(view.totalCents, view.currency).padStart(11)}`,
    '',
    `Open the request: ${link}`,
    'The attached CSV file lists the same lines.',
  ].join('\n');
}

/** Why a send failed, in the words the request page and the API show. */
function failureWords(err: unknown): string {
  if (err instanceof HttpError) return err.message;
  return 'The mail could not be sent.';
}

/**
 * Sends a draft to the dealer's parts desk, copying the owner, as an outbox: the request is
 * claimed as `sending` (so two clicks cannot send twice, and the desk cannot act on it yet), the
 * mail server is asked outside any transaction and within its deadline, and then the request is
 * `sent`; if the mail server refuses or does not answer, it goes back to draft with the reason,
 * and the caller hears so (502, or 504 when it timed out). A request with no lines, or a farm
 * without a dealer's parts desk, is refused before anything is written or sent.
 */
export async function submitPartsRequest(actor: Actor, id: string, origin: string) {
  assertWriter(actor);
  const db = await getDb();
  const row = await rowForActor(actor, id, db);
  if (!actor.visibleOrgIds.includes(row.orgId)) throw new HttpError(403, 'Only the farm and its dealer’s staff send a request.');
  assertDraft(row, 'sent');
  const view = await viewOf(actor, row, db);
  if (!view.lines.length) throw new HttpError(400, 'lines: the request has no parts to order', 'lines');
  const desk = view.dealer?.partsDeskEmail;
  if (!desk) throw new HttpError(422, `${view.org.name} has no dealer parts desk to send to; ask an administrator to set one.`, 'dealer');

  const claimed = await db.transaction(async (tx) => {
    const moved = await tx
      .update(partsRequests)
      .set({ status: 'sending', sendingSince: sql`now()`, sendError: null, updatedAt: sql`now()` })
      .where(and(eq(partsRequests.id, row.id), eq(partsRequests.status, 'draft')))
      .returning({ id: partsRequests.id });
    if (!moved.length) return false;
    await audit(tx, actor, 'submit', 'parts-request', row.id, { to: desk, cc: view.org.ownerEmail }, row.orgId);
    return true;
  });
  if (!claimed) throw new HttpError(409, 'This request was sent meanwhile.', 'status');

  const sent = { ...view, status: 'sent' as const };
  const cc = view.org.ownerEmail && view.org.ownerEmail !== desk ? [view.org.ownerEmail] : [];
  const machineWords = view.machine ? `: ${view.machine.nickname} (${view.machine.familyName})` : '';
  let info: Awaited<ReturnType<typeof sendMail>>;
  try {
    info = await sendMail({
      to: [desk],
      cc,
      replyTo: actor.email,
      subject: `Parts request ${view.number} from ${view.org.name}${machineWords}`,
      text: mailText(sent, actor, `${origin}/parts-requests/${view.id}`),
      attachments: [{ filename: csvFileName(view), content: partsRequestCsv(view), contentType: 'text/csv' }],
    });
  } catch (err) {
    const reason = failureWords(err);
    await db.transaction(async (tx) => {
      await tx
        .update(partsRequests)
        .set({ status: 'draft', sentAt: null, sendingSince: null, sendError: reason, updatedAt: sql`now()` })
        .where(and(eq(partsRequests.id, row.id), eq(partsRequests.status, 'sending')));
      await audit(tx, actor, 'submit-failed', 'parts-request', row.id, { reason }, row.orgId);
    });
    const status = err instanceof HttpError && err.status >= 500 ? err.status : 502;
    throw new HttpError(status, `${reason} The request is a draft again.`, 'mail', { status: 'draft', reason });
  }
  await db.transaction(async (tx) => {
    const done = await tx
      .update(partsRequests)
      .set({ status: 'sent', sentAt: sql`now()`, sendingSince: null, sendError: null, updatedAt: sql`now()` })
      .where(and(eq(partsRequests.id, row.id), eq(partsRequests.status, 'sending')))
      .returning({ id: partsRequests.id });
    // Not sending any more: it was returned to draft as stuck while the mail server took its time.
    await audit(tx, actor, done.length ? 'mailed' : 'mailed-late', 'parts-request', row.id, { messageId: info.messageId, accepted: info.accepted }, row.orgId);
  });
  return getPartsRequest(actor, id);
}

/** The reason a request left `sending` by a stopped server shows once it is a draft again. */
export const STUCK_SEND_REASON =
  'The server stopped while this request was being sent, so it may not have reached the parts desk. Check with the desk, or send it again.';

/**
 * Returns requests left `sending` to draft, with the reason. At the start of the embedded store
 * every one is stuck (this process is the store's only user); with a PostgreSQL server another
 * instance may be sending right now, so only those sending for longer than a mail deadline and a
 * margin. Returns how many were returned.
 */
export async function recoverStuckSends(db: Db, opts: { olderThanMs?: number } = {}): Promise<number> {
  const olderThanMs = opts.olderThanMs ?? mailDeadlineMs() + 60_000;
  return db.transaction(async (tx) => {
    const rows = await tx
      .update(partsRequests)
      .set({ status: 'draft', sentAt: null, sendingSince: null, sendError: STUCK_SEND_REASON, updatedAt: sql`now()` })
      .where(
        and(
          eq(partsRequests.status, 'sending'),
          sql`(${partsRequests.sendingSince} is null or ${partsRequests.sendingSince} <= now() - make_interval(secs => ${olderThanMs / 1000}))`,
        ),
      )
      .returning({ id: partsRequests.id, orgId: partsRequests.orgId });
    for (const r of rows) await audit(tx, null, 'send-recovered', 'parts-request', r.id, { reason: STUCK_SEND_REASON }, r.orgId);
    return rows.length;
  });
}

/**
 * The parts desk moves a request one step on: sent → acknowledged → ready → picked up. Only
 * staff of the dealer it was sent to; any other step is a 409 naming the next one. When the parts
 * are ready the owner hears by e-mail (best effort: the status stands if the mail fails).
 */
export async function advancePartsRequest(actor: Actor, id: string, status: PartsRequestStatus, origin: string) {
  const db = await getDb();
  const row = await rowForActor(actor, id, db);
  if (!row.dealerOrgId || !actor.memberOrgIds.includes(row.dealerOrgId) || !(DESK_ROLES as readonly string[]).includes(actor.role))
    throw new HttpError(403, 'Only the parts desk of the dealer the request went to moves its status.');
  if (row.status === 'sending')
    throw new HttpError(409, 'This request is still being sent; the parts desk can acknowledge it once the mail server has accepted it.', 'status');
  const next = NEXT_STATUS[row.status];
  if (!next) throw new HttpError(409, `This request is ${STATUS_WORDS[row.status].toLowerCase()}; its status does not move on from here.`, 'status');
  if (status !== next) throw new HttpError(409, `status: this request is ${STATUS_WORDS[row.status].toLowerCase()}; the next status is “${next}”.`, 'status', { next });
  await db.transaction(async (tx) => {
    const moved = await tx
      .update(partsRequests)
      .set({ status: next, updatedAt: sql`now()` })
      .where(and(eq(partsRequests.id, row.id), eq(partsRequests.status, row.status)))
      .returning({ id: partsRequests.id });
    if (!moved.length) throw new HttpError(409, 'Someone moved this request meanwhile; reload it.', 'status');
    await audit(tx, actor, 'status', 'parts-request', row.id, { from: row.status, to: next }, row.orgId);
  });
  const view = await getPartsRequest(actor, id);
  let mailed: boolean | null = null;
  if (next === 'ready' && view.org.ownerEmail) {
    try {
      await sendMail({
        to: [view.org.ownerEmail],
        replyTo: view.dealer?.partsDeskEmail ?? undefined,
        subject: `Parts request ${view.number} is ready for pick-up`,
        text: [
          `The parts of request ${view.number}${view.machine ? ` for ${view.machine.nickname}` : ''} are ready at ${view.dealer?.name ?? 'the dealer'}.`,
          '',
          ...view.lines.map((l) => `  ${String(l.quantity).padStart(3)} × ${l.partNumber}  ${l.description}`),
          '',
          `Open the request: ${origin}/parts-requests/${view.id}`,
        ].join('\n'),
      });
      mailed = true;
    } catch {
      mailed = false;
    }
  }
  return { ...view, mailed };
}

/** The saved layouts a request can be made from: the current version of each, newest first. */
export async function requestLayoutChoices(actor: Actor) {
  const db = await getDb();
  return db
    .select({
      id: layouts.id,
      name: layouts.name,
      currentVersion: layouts.currentVersion,
      machineId: machines.id,
      machineNickname: machines.nickname,
      orgName: organisations.name,
    })
    .from(layouts)
    .innerJoin(machines, eq(machines.id, layouts.machineId))
    .innerJoin(organisations, eq(organisations.id, machines.orgId))
    .where(inArray(layouts.orgId, actor.visibleOrgIds))
    .orderBy(organisations.name, machines.nickname, desc(layouts.updatedAt))
    .limit(300);
}
