/**
 * Parts requests: making, changing and deleting drafts; lines always checked against the machine's
 * catalog.
 */
import { and, eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import { getDb, type Db } from '~/lib/server/db';
import {
  families,
  machines,
  organisations,
  partsRequests,
  type PartsRequestFitOverride,
  type PartsRequestLine,
  type PartsRequestSettings,
} from '~/db/schema';
import { formatLength, mm, type UnitSystem } from '~/lib/domain/units';
import { indexCatalog } from '~/lib/domain/catalog';
import type { CatalogPart, Layout, MachineFamily } from '~/lib/domain/schemas';
import { billOfMaterials, bomLine } from '~/lib/domain/planner';
import { can, rolesFor, type Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError, whenNotFound } from '~/lib/server/http';
import { getVersion, getLayout } from '~/lib/server/services/layouts';
import { catalogForFamily, installedLayout, machineForActor } from '~/lib/server/services/machines';
import { proposePlan, requirePlan, shelfOf } from '~/lib/server/services/planner';
import { blockingFindings, judgeFit } from './fit';
import { type Row, rowForActor } from './rows';
import { type CreatePartsRequest, type LineInput, MAX_QTY, updatePartsRequestSchema } from './schemas';
import { type PartsRequestSource, STATUS_WORDS } from './statuses';
import { type PartsRequestView, getPartsRequest } from './views';

/** The dealer a farm's requests go to (a dealer's own machine: the dealer itself). */
async function dealerFor(orgId: string, db: Pick<Db, 'select'>): Promise<string | null> {
  const [org] = await db
    .select({ kind: organisations.kind, dealerId: organisations.dealerId })
    .from(organisations)
    .where(eq(organisations.id, orgId))
    .limit(1);
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
      out.push({
        partNumber: b.partNumber,
        description: b.description,
        hand: b.hand,
        quantity: b.quantity,
        unitPriceCents: b.unitPriceCents,
      });
    }
  });
  const tooMany = out.findIndex((l) => l.quantity > MAX_QTY);
  if (tooMany >= 0)
    throw new HttpError(400, `${fieldPrefix}.${tooMany}.quantity: at most ${MAX_QTY} of one part`, `${fieldPrefix}.${tooMany}.quantity`);
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
  /** The layout the lines are for (plan and layout requests), and the override if it does not fit. */
  let fitLayout: Layout | null = null;
  let fitOverride: PartsRequestFitOverride | null = null;
  if (input.from === 'plan') {
    const proposal = await proposePlan(actor, input);
    const plan = requirePlan(proposal.plan);
    machineId = proposal.machine.id;
    orgId = proposal.machine.orgId;
    lines = plan.purchases.map((p) => ({
      partNumber: p.partNumber,
      description: p.description,
      hand: p.hand,
      quantity: p.quantity,
      unitPriceCents: p.unitPriceCents,
    }));
    if (!lines.length) throw new HttpError(422, `${NOTHING_TO_ORDER} The plan buys nothing.`, 'crop');
    fitLayout = plan.layout;
    fitOverride = judgeFit(actor, blockingFindings(proposal.family, proposal.catalog, plan.layout), input.overrideReason);
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
    const [catalog, installed, shelf] = await Promise.all([
      catalogForFamily(family.id, undefined, machine.orgId),
      installedLayout(machine.id),
      shelfOf(machine.orgId),
    ]);
    const bom = billOfMaterials(indexCatalog(catalog), version.body, installed?.layout ?? null, shelf);
    if (bom.unknown.length)
      throw new HttpError(400, `layoutId: the layout holds part numbers the catalog does not know (${bom.unknown.join(', ')})`, 'layoutId');
    lines = bom.lines.map((l) => ({
      partNumber: l.partNumber,
      description: l.description,
      hand: l.hand,
      quantity: l.quantity,
      unitPriceCents: l.unitPriceCents,
    }));
    if (!lines.length) throw new HttpError(422, `${NOTHING_TO_ORDER} The layout adds no parts.`, 'layoutId');
    fitLayout = version.body;
    fitOverride = judgeFit(actor, blockingFindings(family, catalog, version.body), input.overrideReason);
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
      .values({
        orgId,
        dealerOrgId,
        machineId,
        source: input.from,
        status: 'draft',
        lines,
        settings,
        fitLayout,
        fitOverride,
        note: input.note || autoNote,
        createdBy: actor.id,
      })
      .returning({ id: partsRequests.id });
    await audit(tx, actor, 'create', 'parts-request', row!.id, { source: input.from, lines: lines.length, ...detail }, orgId);
    if (fitOverride)
      await audit(
        tx,
        actor,
        'override-fit',
        'parts-request',
        row!.id,
        { reason: fitOverride.reason, findings: fitOverride.findings.map((f) => ({ code: f.code, places: f.places })), ...detail },
        orgId,
      );
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
  if (!can(actor, 'parts.request')) throw new HttpError(403, `This needs one of these roles: ${rolesFor('parts.request').join(', ')}.`);
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
      await tx
        .update(partsRequests)
        .set({ lines: merged, note: nextNote, updatedAt: sql`now()` })
        .where(eq(partsRequests.id, draft.id));
      await audit(tx, actor, 'add-lines', 'parts-request', draft.id, { source, lines: added }, draft.orgId);
      return draft.id;
    }
    const dealerOrgId = await dealerFor(ctx.machine.orgId, tx);
    const [row] = await tx
      .insert(partsRequests)
      .values({
        orgId: ctx.machine.orgId,
        dealerOrgId,
        machineId: ctx.machine.id,
        source,
        status: 'draft',
        lines: added,
        note: noteText,
        createdBy: actor.id,
      })
      .returning({ id: partsRequests.id });
    await audit(tx, actor, 'create', 'parts-request', row!.id, { source, lines: added }, ctx.machine.orgId);
    return row!.id;
  });
  return getPartsRequest(actor, id);
}

export function assertDraft(row: Row, what: string) {
  if (row.status !== 'draft')
    throw new HttpError(409, `This request is ${STATUS_WORDS[row.status].toLowerCase()}; only a draft can be ${what}.`, 'status');
}

export function assertWriter(actor: Actor) {
  if (!can(actor, 'parts.request')) throw new HttpError(403, `This needs one of these roles: ${rolesFor('parts.request').join(', ')}.`);
}

/** The catalog a request's lines are checked against: its machine's family (and that family, for the fit check at submit). */
export async function catalogOfRequest(row: Row): Promise<{ catalog: CatalogPart[]; familyName: string; family: MachineFamily | null }> {
  const db = await getDb();
  if (!row.machineId) return { catalog: [], familyName: 'this machine', family: null };
  const [m] = await db
    .select({ familyId: machines.familyId, familyName: families.name, family: families.spec })
    .from(machines)
    .innerJoin(families, eq(families.id, machines.familyId))
    .where(eq(machines.id, row.machineId))
    .limit(1);
  if (!m) return { catalog: [], familyName: 'this machine', family: null };
  return { catalog: await catalogForFamily(m.familyId, undefined, row.orgId), familyName: m.familyName, family: m.family };
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
    await audit(
      tx,
      actor,
      'update',
      'parts-request',
      row.id,
      { lines: changes.lines?.map((l) => [l.partNumber, l.quantity]), note: changes.note !== undefined },
      row.orgId,
    );
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
