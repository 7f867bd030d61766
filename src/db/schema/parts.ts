import { pgTable, text, uuid, timestamp, jsonb, index } from 'drizzle-orm/pg-core';
import { organisations, users } from './orgs';
import { machines } from './fleet';
import type { Layout } from '~/lib/domain/schemas';

/** `sending`: claimed for sending, until the mail server accepts (then `sent`) or fails (back to `draft`). */
export const partsRequestStatuses = ['draft', 'sending', 'sent', 'acknowledged', 'ready', 'picked-up'] as const;

export interface PartsRequestLine {
  partNumber: string;
  description: string;
  hand: 'left' | 'right' | null;
  quantity: number;
  unitPriceCents: number;
}

/** The settings the layout a request was made for asks of the machine, stored in mm and rpm. */
export interface PartsRequestSettings {
  rotorRpm: number;
  clearanceMm: number;
  vaneSetting: string;
}

/** A blocks-fit finding as it stood when a request was made or sent: code, title and its places in words. */
export interface PartsRequestFitFinding {
  code: string;
  title: string;
  places: string[];
}

/**
 * A technician's or administrator's decision to order for a layout that does not fit: why, who,
 * when, and the blocks-fit findings it covered.
 */
export interface PartsRequestFitOverride {
  reason: string;
  byUserId: string;
  byName: string;
  byRole: string;
  at: string;
  findings: PartsRequestFitFinding[];
}

/** A bill of materials sent from a farm to its dealer's parts desk. */
export const partsRequests = pgTable(
  'parts_requests',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    orgId: uuid('org_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    dealerOrgId: uuid('dealer_org_id').references(() => organisations.id),
    machineId: uuid('machine_id').references(() => machines.id, { onDelete: 'set null' }),
    source: text('source', { enum: ['plan', 'layout', 'inspection', 'manual'] })
      .notNull()
      .default('manual'),
    status: text('status', { enum: partsRequestStatuses }).notNull().default('draft'),
    lines: jsonb('lines').$type<PartsRequestLine[]>().notNull().default([]),
    note: text('note').notNull().default(''),
    /** Settings of the layout it was made for (plan or layout requests); shown in the reader's units. */
    settings: jsonb('settings').$type<PartsRequestSettings>(),
    /** The layout the lines were worked out for (layout and plan requests), checked again at submit. */
    fitLayout: jsonb('fit_layout').$type<Layout>(),
    /** Set when the layout had blocks-fit findings and someone allowed to gave a reason to order anyway. */
    fitOverride: jsonb('fit_override').$type<PartsRequestFitOverride>(),
    createdBy: uuid('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp('sent_at', { withTimezone: true }),
    /** When sending began (status `sending`); a request left sending too long is returned to draft. */
    sendingSince: timestamp('sending_since', { withTimezone: true }),
    /** Why the last send failed, shown with the draft until it is sent. */
    sendError: text('send_error'),
  },
  (t) => [index('parts_requests_org_idx').on(t.orgId), index('parts_requests_dealer_idx').on(t.dealerOrgId)],
);
