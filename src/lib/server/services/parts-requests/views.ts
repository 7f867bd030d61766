/** Parts requests: one request or a list as the API and the pages show it. */
import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import { z } from 'zod';
import { getDb, type Db } from '~/lib/server/db';
import {
  families,
  machines,
  organisations,
  partsRequests,
  users,
  type PartsRequestFitOverride,
  type PartsRequestLine,
  type PartsRequestSettings,
} from '~/db/schema';
import { DEFAULT_CURRENCY } from '~/lib/domain/format';
import type { Actor } from '~/lib/server/access';
import { permissions } from './permissions';
import { type Row, rowForActor, visibleTo } from './rows';
import { listQuerySchema } from './schemas';
import { NEXT_STATUS, type PartsRequestSource, type PartsRequestStatus, STATUS_WORDS, requestNumber } from './statuses';

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
  /** Set when a technician or administrator ordered for a layout with blocks-fit findings: why, who, when, which findings. */
  fitOverride: PartsRequestFitOverride | null;
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
export async function viewOf(actor: Actor, row: Row, db: Db): Promise<PartsRequestView> {
  const ids = [row.orgId, ...(row.dealerOrgId ? [row.dealerOrgId] : [])];
  const [orgRows, machineRows, creator] = await Promise.all([
    db
      .select({
        id: organisations.id,
        name: organisations.name,
        ownerEmail: organisations.ownerEmail,
        partsDeskEmail: organisations.partsDeskEmail,
        currency: organisations.currency,
      })
      .from(organisations)
      .where(inArray(organisations.id, ids)),
    row.machineId
      ? db
          .select({
            id: machines.id,
            nickname: machines.nickname,
            serial: machines.serial,
            familyId: machines.familyId,
            familyName: families.name,
          })
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
    fitOverride: row.fitOverride ?? null,
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
