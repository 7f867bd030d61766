import { pgTable, text, uuid, timestamp, real, index } from 'drizzle-orm/pg-core';
import { organisations, users } from './orgs';
import { machines } from './fleet';

/** Where a machine-hours reading was taken. */
export const hoursSources = ['inspection', 'job_card', 'loss_check', 'manual'] as const;

/**
 * One reading of a machine's hour meters (engine and separator), taken at an inspection, a job
 * card, a loss check, or by hand. Readings only go up; a lower one is kept only with the reason
 * it corrects the record (`correctionReason`), see domain/machine-hours.ts.
 */
export const machineHours = pgTable(
  'machine_hours',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    machineId: uuid('machine_id')
      .notNull()
      .references(() => machines.id, { onDelete: 'cascade' }),
    orgId: uuid('org_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    engineHours: real('engine_hours').notNull(),
    separatorHours: real('separator_hours').notNull(),
    source: text('source', { enum: hoursSources }).notNull(),
    /** The inspection, job card or loss check it was read at (null when read by hand). */
    sourceId: uuid('source_id'),
    correctionReason: text('correction_reason'),
    recordedBy: uuid('recorded_by').references(() => users.id),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('machine_hours_machine_idx').on(t.machineId, t.recordedAt.desc())],
);
