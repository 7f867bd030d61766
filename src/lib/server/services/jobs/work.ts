/** Working a job card: edits, ticking steps off, moving its status, signing it off (and telling the owner). */
import { and, eq, inArray, sql } from 'drizzle-orm';
import { getDb } from '~/lib/server/db';
import { jobCards, jobParts, jobSteps, organisations } from '~/db/schema';
import type { Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError } from '~/lib/server/http';
import { editable, missingItems, moveProblems, STATUS_WORDS, type ChecklistAnswers, type MoveProblem } from '~/lib/domain/jobs';
import { formatDateTime } from '~/lib/domain/format';
import { putInstalled } from '~/lib/server/services/installed';
import { versionOf } from '~/lib/server/services/layouts';
import { recordHours } from '~/lib/server/services/machine-hours';
import { machineForActor } from '~/lib/server/services/machines';
import { sendMail } from '~/lib/server/services/mail';
import type { MoveJob, UpdateJob } from './schemas';
import { checkAssignee, checkParts, insertParts, insertSteps } from './create';
import { assignablePeople, getJob, jobRowForActor, type JobRow } from './views';

const wrongStatus = (row: JobRow, field: string, what: string) =>
  new HttpError(409, `${field}: ${what} (the job card is ${STATUS_WORDS[row.status].toLowerCase()})`, field);

export async function updateJob(actor: Actor, id: string, input: UpdateJob) {
  const db = await getDb();
  const row = await jobRowForActor(actor, id, db);
  const ctx = await machineForActor(actor, row.machineId, db);
  if (input.steps && row.status !== 'planned') throw wrongStatus(row, 'steps', 'steps are rewritten only while the job is planned');
  for (const field of ['title', 'assignedTo', 'parts'] as const)
    if (input[field] !== undefined && !editable(row.status)) throw wrongStatus(row, field, 'this changes only until the work is done');
  if (input.done && row.status !== 'in_progress') throw wrongStatus(row, 'done', 'steps are ticked off while the job is in progress');
  if (input.parts) await checkParts(ctx, input.parts, db);
  if (input.assignedTo !== undefined) await checkAssignee(row.orgId, input.assignedTo, db);
  if (input.done?.length) {
    const ids = (await db.select({ id: jobSteps.id }).from(jobSteps).where(eq(jobSteps.jobId, row.id))).map((s) => s.id);
    const bad = input.done.findIndex((d) => !ids.includes(d.id));
    if (bad >= 0) throw new HttpError(400, `done.${bad}.id: not a step of this job card`, `done.${bad}.id`);
  }
  await db.transaction(async (tx) => {
    const moved = await tx
      .update(jobCards)
      .set({
        ...(input.title !== undefined ? { title: input.title } : {}),
        ...(input.assignedTo !== undefined ? { assignedTo: input.assignedTo } : {}),
        updatedAt: sql`now()`,
      })
      .where(and(eq(jobCards.id, row.id), eq(jobCards.status, row.status)))
      .returning({ id: jobCards.id });
    if (!moved.length) throw new HttpError(409, 'Someone moved this job card meanwhile; reload it.', 'status');
    if (input.steps) {
      await tx.delete(jobSteps).where(eq(jobSteps.jobId, row.id));
      await insertSteps(tx, row.id, input.steps);
    }
    if (input.parts) {
      await tx.delete(jobParts).where(eq(jobParts.jobId, row.id));
      await insertParts(tx, row.id, input.parts);
    }
    for (const flag of [true, false]) {
      const ids = (input.done ?? []).filter((d) => d.done === flag).map((d) => d.id);
      if (!ids.length) continue;
      await tx
        .update(jobSteps)
        .set(flag ? { done: true, doneBy: actor.id, doneAt: sql`now()` } : { done: false, doneBy: null, doneAt: null })
        .where(and(eq(jobSteps.jobId, row.id), inArray(jobSteps.id, ids), eq(jobSteps.done, !flag)));
    }
    const changed = Object.fromEntries(Object.entries(input).map(([k, v]) => [k, Array.isArray(v) ? v.length : v]));
    await audit(tx, actor, 'job.update', 'job', row.id, changed, row.orgId);
  });
  return getJob(actor, id);
}

function refuse(problems: readonly MoveProblem[]): never {
  const first = problems[0]!;
  throw new HttpError(first.field === 'status' ? 409 : 400, problems.map((p) => `${p.field}: ${p.message}`).join('; '), first.field, {
    problems,
  });
}

/**
 * Moves a job card on. To done, the hours are recorded in the same transaction as the move (a
 * lower reading without a correction reason refuses both); a job from a plan then installs its
 * layout version on the machine.
 */
export async function moveJob(actor: Actor, id: string, input: MoveJob) {
  const db = await getDb();
  const row = await jobRowForActor(actor, id, db);
  const ctx = await machineForActor(actor, row.machineId, db);
  const steps = await db
    .select({ done: jobSteps.done, text: jobSteps.text, position: jobSteps.position })
    .from(jobSteps)
    .where(eq(jobSteps.jobId, row.id));
  const selfAssign = !row.assignedTo && (await assignablePeople(row.orgId, db)).some((p) => p.id === actor.id);
  const problems = moveProblems(
    {
      status: row.status,
      assigned: !!row.assignedTo || selfAssign,
      openSteps: steps.sort((a, b) => a.position - b.position).flatMap((s, i) => (s.done ? [] : [{ n: i + 1, text: s.text }])),
      hoursGiven: !!input.hours,
    },
    input.status,
  );
  if (problems.length) refuse(problems);
  // The version a plan job installs must still be there before anything is written.
  if (input.status === 'done' && row.origin === 'plan' && row.layoutId && row.layoutVersion)
    await versionOf(row.layoutId, row.layoutVersion).catch(() => {
      throw new HttpError(409, 'status: the layout version this job installs is gone; nothing was written', 'status');
    });
  await db.transaction(async (tx) => {
    const set =
      input.status === 'in_progress'
        ? { status: input.status, startedBy: actor.id, startedAt: sql`now()`, ...(row.assignedTo ? {} : { assignedTo: actor.id }) }
        : { status: input.status, doneBy: actor.id, doneAt: sql`now()` };
    const moved = await tx
      .update(jobCards)
      .set({ ...set, updatedAt: sql`now()` })
      .where(and(eq(jobCards.id, row.id), eq(jobCards.status, row.status)))
      .returning({ id: jobCards.id });
    if (!moved.length) throw new HttpError(409, 'Someone moved this job card meanwhile; reload it.', 'status');
    if (input.status === 'done') await recordHours(tx, actor, ctx.machine, input.hours!, 'job_card', row.id, 'hours.');
    await audit(tx, actor, 'job.status', 'job', row.id, { from: row.status, to: input.status }, row.orgId);
  });
  let installed: boolean | null = null;
  if (input.status === 'done' && row.origin === 'plan' && row.layoutId && row.layoutVersion) {
    await putInstalled(actor, row.machineId, { fromLayout: { layoutId: row.layoutId, version: row.layoutVersion } });
    installed = true;
  }
  return { ...(await getJob(actor, id)), installed };
}

/**
 * Signs a done job card off with the checklist answers; an incomplete checklist is refused naming
 * every missing item, and nothing is written. The farm's owner is then told by e-mail (best
 * effort: the sign-off stands if the mail server is away; the job card says whether it went).
 */
export async function signOffJob(actor: Actor, id: string, answers: ChecklistAnswers, origin: string) {
  const db = await getDb();
  const view = await getJob(actor, id, db);
  if (view.status !== 'done')
    throw new HttpError(
      409,
      `status: only a done job card is signed off (this one is ${STATUS_WORDS[view.status].toLowerCase()})`,
      'status',
    );
  const missing = missingItems(answers, view.checklist);
  if (missing.length)
    throw new HttpError(
      400,
      `checklist: the sign-off checklist is not complete; missing: ${missing.map((m) => m.label).join('; ')}`,
      'checklist',
      { missing: missing.map((m) => ({ id: m.id, label: m.label })) },
    );
  await db.transaction(async (tx) => {
    const moved = await tx
      .update(jobCards)
      .set({ status: 'signed_off', signedOffBy: actor.id, signedOffAt: sql`now()`, checklist: answers, updatedAt: sql`now()` })
      .where(and(eq(jobCards.id, view.id), eq(jobCards.status, 'done')))
      .returning({ id: jobCards.id });
    if (!moved.length) throw new HttpError(409, 'Someone moved this job card meanwhile; reload it.', 'status');
    await audit(tx, actor, 'job.sign-off', 'job', view.id, { checklist: answers }, view.machine.orgId);
  });
  const signed = await getJob(actor, id, db);
  const [org] = await db
    .select({ ownerEmail: organisations.ownerEmail })
    .from(organisations)
    .where(eq(organisations.id, signed.machine.orgId))
    .limit(1);
  let mailed: boolean | null = null;
  if (org?.ownerEmail) {
    try {
      await sendMail({
        to: [org.ownerEmail],
        subject: `Job signed off: ${signed.title} (${signed.machine.nickname})`,
        text: signOffMail(signed, origin),
      });
      await db
        .update(jobCards)
        .set({ ownerMailedAt: sql`now()` })
        .where(eq(jobCards.id, signed.id));
      mailed = true;
    } catch {
      mailed = false;
    }
  }
  return { ...(await getJob(actor, id, db)), mailed };
}

function signOffMail(job: Awaited<ReturnType<typeof getJob>>, origin: string): string {
  const when = job.signedOffAt ? formatDateTime(job.signedOffAt) : '';
  return [
    `The job “${job.title}” on ${job.machine.nickname} (serial ${job.machine.serial}) was signed off by ${job.signedOffByName ?? 'the technician'} on ${when}.`,
    '',
    'Steps done:',
    ...job.steps.map((s) => `  ${s.n}. ${s.text}`),
    '',
    job.hours ? `Hour meters when the work was done: engine ${job.hours.engineHours} h, separator ${job.hours.separatorHours} h.` : '',
    'Checked before sign-off:',
    ...job.checklist.map((c) => `  - ${c.label}${c.id === 'lossCheck' ? ` (${String(c.answer)})` : ''}`),
    '',
    `The job sheet: ${origin}/jobs/${job.id}/sheet`,
  ].join('\n');
}
