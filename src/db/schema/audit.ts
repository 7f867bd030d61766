import { pgTable, text, uuid, timestamp, jsonb, bigserial, index } from 'drizzle-orm/pg-core';

/** Who did what, when: one row per write. */
export const auditLog = pgTable(
  'audit_log',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
    userId: uuid('user_id'),
    orgId: uuid('org_id'),
    action: text('action').notNull(),
    entity: text('entity').notNull(),
    entityId: text('entity_id'),
    detail: jsonb('detail').$type<Record<string, unknown>>().notNull().default({}),
  },
  // entity: a machine page's recent activity (newest first by the ids of the machine and its layouts).
  (t) => [index('audit_log_org_idx').on(t.orgId, t.at), index('audit_log_entity_idx').on(t.entityId, t.at)],
);
