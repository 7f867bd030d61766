/** Parts requests: the parts desk's workflow. */
import { and, eq, sql } from 'drizzle-orm';
import { getDb } from '~/lib/server/db';
import { partsRequests } from '~/db/schema';
import { can, type Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError } from '~/lib/server/http';
import { sendMail } from '~/lib/server/services/mail';
import { rowForActor } from './rows';
import { NEXT_STATUS, type PartsRequestStatus, STATUS_WORDS } from './statuses';
import { getPartsRequest } from './views';

/**
 * The parts desk moves a request one step on: sent → acknowledged → ready → picked up. Only
 * staff of the dealer it was sent to; any other step is a 409 naming the next one. When the parts
 * are ready the owner hears by e-mail (best effort: the status stands if the mail fails).
 */
export async function advancePartsRequest(actor: Actor, id: string, status: PartsRequestStatus, origin: string) {
  const db = await getDb();
  const row = await rowForActor(actor, id, db);
  if (!row.dealerOrgId || !actor.memberOrgIds.includes(row.dealerOrgId) || !can(actor, 'parts.desk'))
    throw new HttpError(403, 'Only the parts desk of the dealer the request went to moves its status.');
  if (row.status === 'sending')
    throw new HttpError(
      409,
      'This request is still being sent; the parts desk can acknowledge it once the mail server has accepted it.',
      'status',
    );
  const next = NEXT_STATUS[row.status];
  if (!next)
    throw new HttpError(409, `This request is ${STATUS_WORDS[row.status].toLowerCase()}; its status does not move on from here.`, 'status');
  if (status !== next)
    throw new HttpError(409, `status: this request is ${STATUS_WORDS[row.status].toLowerCase()}; the next status is “${next}”.`, 'status', {
      next,
    });
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
