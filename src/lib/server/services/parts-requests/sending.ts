/**
 * Parts requests: sending to the parts desk through the outbox, and recovering sends a stop left
 * behind.
 */
import { and, eq, sql } from 'drizzle-orm';
import { getDb, type Db } from '~/lib/server/db';
import { partsRequests } from '~/db/schema';
import { ROLE_LABEL, type Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError } from '~/lib/server/http';
import { mailDeadlineMs, sendMail } from '~/lib/server/services/mail';
import { csvFileName, partsRequestCsv } from './csv';
import { catalogOfRequest, requestSettingsWords } from './drafts';
import { blockingFindings, fitFindingWords, refuseAtSubmit, uncoveredAtSubmit } from './fit';
import { DEFAULT_LOCALE, formatDateTime, formatMoney, formatNumber } from '~/lib/domain/format';
import { assertDraft, assertWriter } from './drafts';
import { rowForActor } from './rows';
import { SOURCE_WORDS } from './statuses';
import { type PartsRequestView, getPartsRequest, viewOf } from './views';

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
    ...(view.fitOverride ? ['', ...fitOverrideMailLines(view.fitOverride)] : []),
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

/** The override in the mail to the parts desk: the layout does not fit, who ordered anyway, why, and the findings. */
function fitOverrideMailLines(o: NonNullable<PartsRequestView['fitOverride']>): string[] {
  const role = ROLE_LABEL[o.byRole as keyof typeof ROLE_LABEL] ?? o.byRole;
  return [
    'ORDERED FOR A LAYOUT THAT DOES NOT FIT',
    `Override by:  ${o.byName} (${role.toLowerCase()}), ${formatDateTime(o.at, { locale: DEFAULT_LOCALE })}`,
    `Reason:       ${o.reason.replace(/\n/g, '\n              ')}`,
    'Findings:',
    ...o.findings.map((f) => `  - ${fitFindingWords(f)}`),
  ];
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
  if (row.fitLayout) {
    // The kept layout, checked again with today's rules and catalog (see fit.ts).
    const { catalog, family } = await catalogOfRequest(row);
    const uncovered = family ? uncoveredAtSubmit(blockingFindings(family, catalog, row.fitLayout), row.fitOverride ?? null) : [];
    if (uncovered.length) throw refuseAtSubmit(uncovered);
  }
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
    await audit(
      tx,
      actor,
      done.length ? 'mailed' : 'mailed-late',
      'parts-request',
      row.id,
      { messageId: info.messageId, accepted: info.accepted },
      row.orgId,
    );
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
