/** Making a job card: from an accepted plan (a saved layout version), a finished inspection, or by hand. */
import { and, eq, inArray } from 'drizzle-orm';
import { getDb, type Db } from '~/lib/server/db';
import { jobCards, jobParts, jobSteps, layouts } from '~/db/schema';
import type { Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError, notFound, whenNotFound } from '~/lib/server/http';
import { isoDay } from '~/lib/domain/format';
import { CONDITIONS } from '~/lib/domain/inspection';
import { jobFromInspection, jobFromLayout, type DraftPart, type JobStepKind } from '~/lib/domain/jobs';
import { purchaseAvailability, stepAvailability } from '~/lib/domain/planner/availability';
import { getInspection } from '~/lib/server/services/inspections';
import { versionOf } from '~/lib/server/services/layouts';
import { catalogForFamily, installedLayout, machineForActor, type MachineContext } from '~/lib/server/services/machines';
import { shelfOf } from '~/lib/server/services/planner';
import { dealerStockFor } from '~/lib/server/services/stock';
import type { CreateJob } from './schemas';
import { assignablePeople, getJob } from './views';

interface Draft {
  ctx: MachineContext;
  title: string;
  origin: 'plan' | 'inspection' | 'hand';
  layoutId?: string;
  layoutVersion?: number;
  inspectionId?: string;
  steps: { kind: JobStepKind; text: string; minutes?: number | null; heavy?: boolean; partNumbers?: string[] }[];
  parts: DraftPart[];
}

async function fromPlan(actor: Actor, layoutId: string, version: number, title: string | undefined): Promise<Draft> {
  const db = await getDb();
  const [layout] = await db
    .select()
    .from(layouts)
    .where(and(eq(layouts.id, layoutId), inArray(layouts.orgId, actor.visibleOrgIds)))
    .limit(1);
  if (!layout) throw notFound('Layout not found', 'layoutId');
  const target = (
    await versionOf(layout.id, version).catch(
      whenNotFound(() => new HttpError(400, `version: this layout has no version ${version}`, 'version')),
    )
  ).body;
  const ctx = await machineForActor(actor, layout.machineId);
  const [catalog, installed, shelf, dealerStock] = await Promise.all([
    catalogForFamily(ctx.family.id),
    installedLayout(ctx.machine.id),
    shelfOf(ctx.machine.orgId),
    dealerStockFor(ctx.machine.orgId),
  ]);
  const input = {
    family: ctx.family,
    catalog,
    installed: installed?.layout ?? null,
    target,
    shelf,
    vaneControl: ctx.machine.vaneControl,
    units: actor.unitSystem,
  };
  // Once to learn what is bought, once more with where each purchase comes from (as the planner does).
  const first = jobFromLayout(input);
  if (first.unknown.length)
    throw new HttpError(400, `version: the catalog no longer has ${first.unknown.join(', ')}, so this version cannot be fitted`, 'version');
  const purchases = first.parts.filter((p) => p.source !== 'farm_shelf');
  const job = purchases.length
    ? jobFromLayout({ ...input, availability: stepAvailability(purchaseAvailability(purchases, dealerStock), isoDay(new Date())) })
    : first;
  return {
    ctx,
    title: title ?? `Fit ${layout.name}, version ${version}`,
    origin: 'plan',
    layoutId: layout.id,
    layoutVersion: version,
    steps: job.steps,
    parts: job.parts,
  };
}

async function fromInspection(actor: Actor, inspectionId: string, title: string | undefined): Promise<Draft> {
  const inspection = await getInspection(actor, inspectionId).catch(whenNotFound(() => notFound('Inspection not found', 'inspectionId')));
  if (inspection.status !== 'finished')
    throw new HttpError(
      409,
      'inspectionId: finish the inspection first; its lines marked replace or watch become the steps',
      'inspectionId',
    );
  const label = new Map(CONDITIONS.map((c) => [c.id, c.label] as const));
  const job = jobFromInspection(
    inspection.items
      .filter((l) => l.kind !== 'survey')
      .map((l) => ({
        label: l.label,
        partNumber: l.partNumber,
        severity: l.severity,
        findings: l.conditions.map((c) => label.get(c) ?? c),
        note: l.note,
      })),
  );
  if (!job.steps.length) throw new HttpError(400, 'inspectionId: no line of this inspection is marked replace or watch', 'inspectionId');
  const ctx = await machineForActor(actor, inspection.machine.id);
  return {
    ctx,
    title: title ?? `Work from the inspection${inspection.title ? ` “${inspection.title}”` : ''}`,
    origin: 'inspection',
    inspectionId: inspection.id,
    steps: job.steps,
    parts: job.parts,
  };
}

/** Part numbers the machine's catalog does not know, named by field (`parts.2.partNumber`). */
export async function checkParts(ctx: MachineContext, parts: readonly { partNumber: string }[], db?: Db) {
  const known = new Set((await catalogForFamily(ctx.family.id, db)).map((p) => p.partNumber));
  const bad = parts.findIndex((p) => !known.has(p.partNumber));
  if (bad >= 0)
    throw new HttpError(
      400,
      `parts.${bad}.partNumber: ${parts[bad]!.partNumber} is not a part of the ${ctx.family.name}`,
      `parts.${bad}.partNumber`,
    );
}

/** The assignee must manage jobs for the machine's organisation or its dealer. */
export async function checkAssignee(orgId: string, userId: string | null | undefined, db?: Db) {
  if (!userId) return;
  const people = await assignablePeople(orgId, db);
  if (!people.some((p) => p.id === userId))
    throw new HttpError(400, 'assignedTo: assign a technician of the farm or of its dealer', 'assignedTo');
}

export async function createJob(actor: Actor, input: CreateJob) {
  let draft: Draft;
  if (input.origin === 'plan') draft = await fromPlan(actor, input.layoutId, input.version, input.title);
  else if (input.origin === 'inspection') draft = await fromInspection(actor, input.inspectionId, input.title);
  else {
    const ctx = await machineForActor(actor, input.machineId);
    await checkParts(ctx, input.parts);
    draft = { ctx, title: input.title, origin: 'hand', steps: input.steps, parts: input.parts };
  }
  const { machine } = draft.ctx;
  await checkAssignee(machine.orgId, input.assignedTo);
  const db = await getDb();
  const id = await db.transaction(async (tx) => {
    const [job] = await tx
      .insert(jobCards)
      .values({
        machineId: machine.id,
        orgId: machine.orgId,
        title: draft.title,
        origin: draft.origin,
        layoutId: draft.layoutId ?? null,
        layoutVersion: draft.layoutVersion ?? null,
        inspectionId: draft.inspectionId ?? null,
        assignedTo: input.assignedTo ?? null,
        createdBy: actor.id,
      })
      .returning({ id: jobCards.id });
    await insertSteps(tx, job!.id, draft.steps);
    await insertParts(tx, job!.id, draft.parts);
    await audit(
      tx,
      actor,
      'job.create',
      'job',
      job!.id,
      { origin: draft.origin, machineId: machine.id, steps: draft.steps.length },
      machine.orgId,
    );
    return job!.id;
  });
  return getJob(actor, id);
}

export async function insertSteps(db: Pick<Db, 'insert'>, jobId: string, steps: Draft['steps']) {
  if (!steps.length) return;
  await db.insert(jobSteps).values(
    steps.map((s, i) => ({
      jobId,
      position: i,
      kind: s.kind,
      text: s.text,
      minutes: s.minutes ?? null,
      heavy: s.heavy ?? false,
      partNumbers: s.partNumbers ?? [],
    })),
  );
}

export async function insertParts(db: Pick<Db, 'insert'>, jobId: string, parts: readonly DraftPart[]) {
  if (!parts.length) return;
  await db
    .insert(jobParts)
    .values(parts.map((p, i) => ({ jobId, position: i, partNumber: p.partNumber, quantity: p.quantity, source: p.source })));
}
