import { pgTable, text, uuid, timestamp, integer, boolean, jsonb, index, primaryKey } from 'drizzle-orm/pg-core';
import { organisations, users } from './orgs';
import { machines } from './fleet';

/** Where a job card came from: an accepted plan (a saved layout version), an inspection, or typed by hand. */
export const jobOrigins = ['plan', 'inspection', 'hand'] as const;
/** planned → in_progress → done → signed_off (domain/jobs/status.ts says what each move needs). */
export const jobStatuses = ['planned', 'in_progress', 'done', 'signed_off'] as const;
/** Where a part of the job comes from. */
export const jobPartSources = ['dealer_stock', 'farm_shelf', 'on_order'] as const;

/**
 * A job card: work on one machine, with its steps, its parts, the technician it is assigned to,
 * its status with who moved it and when, and the sign-off checklist answered at the end.
 */
export const jobCards = pgTable(
  'job_cards',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    machineId: uuid('machine_id')
      .notNull()
      .references(() => machines.id, { onDelete: 'cascade' }),
    /** The machine's organisation (visibility follows it). */
    orgId: uuid('org_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    title: text('title').notNull(),
    origin: text('origin', { enum: jobOrigins }).notNull(),
    /** For a plan: the layout and the version the job installs. */
    layoutId: uuid('layout_id'),
    layoutVersion: integer('layout_version'),
    /** For an inspection: the inspection its steps came from. */
    inspectionId: uuid('inspection_id'),
    status: text('status', { enum: jobStatuses }).notNull().default('planned'),
    assignedTo: uuid('assigned_to').references(() => users.id),
    /** Sign-off checklist answers, kept when the job is signed off (domain/jobs/checklist.ts). */
    checklist: jsonb('checklist').$type<Record<string, boolean | string>>().notNull().default({}),
    createdBy: uuid('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    startedBy: uuid('started_by').references(() => users.id),
    startedAt: timestamp('started_at', { withTimezone: true }),
    doneBy: uuid('done_by').references(() => users.id),
    doneAt: timestamp('done_at', { withTimezone: true }),
    signedOffBy: uuid('signed_off_by').references(() => users.id),
    signedOffAt: timestamp('signed_off_at', { withTimezone: true }),
    /** When the owner's e-mail about the sign-off was accepted by the mail server (null: not sent). */
    ownerMailedAt: timestamp('owner_mailed_at', { withTimezone: true }),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('job_cards_org_idx').on(t.orgId, t.createdAt.desc()), index('job_cards_machine_idx').on(t.machineId)],
);

/** The steps of a job card, in working order. */
export const jobSteps = pgTable(
  'job_steps',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    jobId: uuid('job_id')
      .notNull()
      .references(() => jobCards.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
    kind: text('kind').notNull(),
    text: text('text').notNull(),
    /** Minutes typed for this step; null: the dealer's flat rate for its kind. */
    minutes: integer('minutes'),
    /** The parts the step handles (the sign-off checklist reads their bolt torque). */
    partNumbers: jsonb('part_numbers').$type<string[]>().notNull().default([]),
    /** A part heavier than one person should lift alone is handled in this step. */
    heavy: boolean('heavy').notNull().default(false),
    done: boolean('done').notNull().default(false),
    doneBy: uuid('done_by').references(() => users.id),
    doneAt: timestamp('done_at', { withTimezone: true }),
  },
  (t) => [index('job_steps_job_idx').on(t.jobId, t.position)],
);

/** The parts a job card uses, and where each comes from. */
export const jobParts = pgTable(
  'job_parts',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    jobId: uuid('job_id')
      .notNull()
      .references(() => jobCards.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
    partNumber: text('part_number').notNull(),
    quantity: integer('quantity').notNull(),
    source: text('source', { enum: jobPartSources }).notNull(),
  },
  (t) => [index('job_parts_job_idx').on(t.jobId, t.position)],
);

/** A dealer's flat-rate minutes per kind of job-card step (kinds without a row take the defaults). */
export const flatRates = pgTable(
  'flat_rates',
  {
    dealerId: uuid('dealer_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    kind: text('kind').notNull(),
    minutes: integer('minutes').notNull(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.dealerId, t.kind] })],
);
