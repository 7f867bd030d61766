/** Reading job cards: one with everything its page and sheet show, or a page of them. */
import { and, asc, count, desc, eq, inArray } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { getDb, type Db } from '~/lib/server/db';
import { jobCards, jobParts, jobSteps, layouts, machineHours, machines, memberships, organisations, users } from '~/db/schema';
import { can, type Actor } from '~/lib/server/access';
import { notFound } from '~/lib/server/http';
import {
  estimateJob,
  JOB_CAUTIONS,
  missingItems,
  signOffChecklist,
  type ChecklistAnswers,
  type FittedPart,
  type JobStepKind,
} from '~/lib/domain/jobs';
import { partName } from '~/lib/domain/vocabulary';
import { catalogForFamily, machineForActor } from '~/lib/server/services/machines';
import { pricingDealerOf } from '~/lib/server/services/prices';
import { ratesForOrg } from './rates';
import type { ListJobsQuery } from './schemas';

export type JobRow = typeof jobCards.$inferSelect;

/** A job card the actor may see; another organisation's is not found. */
export async function jobRowForActor(actor: Actor, id: string, db?: Db): Promise<JobRow> {
  const d = db ?? (await getDb());
  const [row] = await d
    .select()
    .from(jobCards)
    .where(and(eq(jobCards.id, id), inArray(jobCards.orgId, actor.visibleOrgIds)))
    .limit(1);
  if (!row) throw notFound('Job card not found');
  return row;
}

/** People who may be assigned work on an organisation's machines: its own and its dealer's, who manage jobs. */
export async function assignablePeople(orgId: string, db?: Db) {
  const d = db ?? (await getDb());
  const dealerId = await pricingDealerOf(orgId, d);
  const rows = await d
    .select({ id: users.id, name: users.name, role: memberships.role })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(inArray(memberships.orgId, dealerId ? [orgId, dealerId] : [orgId]))
    .orderBy(asc(users.name));
  const seen = new Set<string>();
  return rows.filter((r) => can(r.role, 'jobs.manage') && !seen.has(r.id) && seen.add(r.id)).map(({ id, name }) => ({ id, name }));
}

/** The whole job card: machine, people, steps with their minutes, parts, estimate, checklist, hours. */
export async function getJob(actor: Actor, id: string, dbArg?: Db) {
  const db = dbArg ?? (await getDb());
  const row = await jobRowForActor(actor, id, db);
  const ctx = await machineForActor(actor, row.machineId, db);
  const [steps, parts, rates, catalog, hours, layout, people] = await Promise.all([
    db.select().from(jobSteps).where(eq(jobSteps.jobId, row.id)).orderBy(asc(jobSteps.position)),
    db.select().from(jobParts).where(eq(jobParts.jobId, row.id)).orderBy(asc(jobParts.position)),
    ratesForOrg(row.orgId, db),
    catalogForFamily(ctx.family.id, db),
    db
      .select({
        engineHours: machineHours.engineHours,
        separatorHours: machineHours.separatorHours,
        correctionReason: machineHours.correctionReason,
        recordedAt: machineHours.recordedAt,
      })
      .from(machineHours)
      .where(and(eq(machineHours.source, 'job_card'), eq(machineHours.sourceId, row.id)))
      .orderBy(desc(machineHours.recordedAt))
      .limit(1),
    row.layoutId
      ? db.select({ id: layouts.id, name: layouts.name }).from(layouts).where(eq(layouts.id, row.layoutId)).limit(1)
      : Promise.resolve([]),
    userNames(db, [row.assignedTo, row.createdBy, row.startedBy, row.doneBy, row.signedOffBy]),
  ]);
  const doneByNames = await userNames(
    db,
    steps.map((s) => s.doneBy),
  );
  const byNumber = new Map(catalog.map((p) => [p.partNumber, p] as const));
  const estimate = estimateJob(
    steps.map((s) => ({ kind: s.kind as JobStepKind, minutes: s.minutes, done: s.done })),
    rates,
  );
  // Parts fitted: those the steps handle and those the job brings.
  const fittedNumbers = new Set([
    ...steps.flatMap((s) => (['install', 'move', 'swap', 'replace'].includes(s.kind) ? s.partNumbers : [])),
    ...parts.map((p) => p.partNumber),
  ]);
  const fitted: FittedPart[] = [...fittedNumbers].flatMap((pn) => {
    const part = byNumber.get(pn);
    return part ? [{ name: partName(part), boltTorqueNm: part.boltTorqueNm }] : [];
  });
  const checklist = signOffChecklist(fitted, actor.unitSystem);
  const answers = row.checklist as ChecklistAnswers;
  return {
    id: row.id,
    title: row.title,
    origin: row.origin,
    status: row.status,
    layout: row.layoutId ? { id: row.layoutId, name: layout[0]?.name ?? null, version: row.layoutVersion } : null,
    inspectionId: row.inspectionId,
    machine: {
      id: ctx.machine.id,
      nickname: ctx.machine.nickname,
      serial: ctx.machine.serial,
      familyName: ctx.family.name,
      orgId: ctx.machine.orgId,
      orgName: ctx.orgName,
    },
    assignedTo: row.assignedTo ? { id: row.assignedTo, name: people.get(row.assignedTo) ?? '' } : null,
    createdAt: row.createdAt,
    createdByName: row.createdBy ? (people.get(row.createdBy) ?? null) : null,
    startedAt: row.startedAt,
    startedByName: row.startedBy ? (people.get(row.startedBy) ?? null) : null,
    doneAt: row.doneAt,
    doneByName: row.doneBy ? (people.get(row.doneBy) ?? null) : null,
    signedOffAt: row.signedOffAt,
    signedOffByName: row.signedOffBy ? (people.get(row.signedOffBy) ?? null) : null,
    ownerMailedAt: row.ownerMailedAt,
    steps: steps.map((s, i) => ({
      id: s.id,
      n: i + 1,
      kind: s.kind as JobStepKind,
      text: s.text,
      minutes: s.minutes,
      estimatedMinutes: estimate.perStep[i]!,
      heavy: s.heavy,
      partNumbers: s.partNumbers,
      done: s.done,
      doneAt: s.doneAt,
      doneByName: s.doneBy ? (doneByNames.get(s.doneBy) ?? null) : null,
    })),
    parts: parts.map((p) => ({
      id: p.id,
      partNumber: p.partNumber,
      name: byNumber.get(p.partNumber)?.name ?? null,
      quantity: p.quantity,
      source: p.source,
    })),
    estimate: { totalMinutes: estimate.totalMinutes, remainingMinutes: estimate.remainingMinutes },
    checklist: checklist.map((item) => ({ ...item, answer: answers[item.id] ?? null })),
    checklistMissing: missingItems(answers, checklist).map((i) => i.id),
    hours: hours[0] ?? null,
    cautions: JOB_CAUTIONS,
  };
}
export type JobView = Awaited<ReturnType<typeof getJob>>;

async function userNames(db: Db, ids: readonly (string | null)[]): Promise<Map<string, string>> {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))];
  if (!wanted.length) return new Map();
  const rows = await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, wanted));
  return new Map(rows.map((r) => [r.id, r.name] as const));
}

/** One page of the job cards the actor may see, newest first; by status or machine. */
export async function listJobs(actor: Actor, query: ListJobsQuery) {
  const db = await getDb();
  const conditions = [inArray(jobCards.orgId, actor.visibleOrgIds)];
  if (query.status) conditions.push(eq(jobCards.status, query.status));
  if (query.machineId) conditions.push(eq(jobCards.machineId, query.machineId));
  const where = and(...conditions);
  const assignee = alias(users, 'assignee');
  const [items, [c]] = await Promise.all([
    db
      .select({
        id: jobCards.id,
        title: jobCards.title,
        origin: jobCards.origin,
        status: jobCards.status,
        createdAt: jobCards.createdAt,
        signedOffAt: jobCards.signedOffAt,
        machineId: jobCards.machineId,
        machineNickname: machines.nickname,
        orgName: organisations.name,
        assigneeName: assignee.name,
      })
      .from(jobCards)
      .innerJoin(machines, eq(machines.id, jobCards.machineId))
      .innerJoin(organisations, eq(organisations.id, jobCards.orgId))
      .leftJoin(assignee, eq(assignee.id, jobCards.assignedTo))
      .where(where)
      .orderBy(desc(jobCards.createdAt), desc(jobCards.id))
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize),
    db.select({ n: count() }).from(jobCards).where(where),
  ]);
  return { items, total: c?.n ?? 0, page: query.page, pageSize: query.pageSize };
}
