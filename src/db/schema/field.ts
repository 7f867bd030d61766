import { pgTable, text, uuid, timestamp, integer, jsonb, real, boolean, primaryKey, index } from 'drizzle-orm/pg-core';
import type { LossCheckParsed, LossCheckResult } from '~/lib/domain/field-check';
import { organisations, users } from './orgs';
import { machines } from './fleet';
import { families } from './catalog';

/**
 * One loss check behind a machine: where and when, the crop, the settings at that moment, what
 * was counted (`input`) and what it came to (`result`). The figures the season log sorts and
 * charts are kept in columns too.
 */
export const lossChecks = pgTable(
  'loss_checks',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    machineId: uuid('machine_id')
      .notNull()
      .references(() => machines.id, { onDelete: 'cascade' }),
    orgId: uuid('org_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    fieldName: text('field_name').notNull(),
    checkedAt: timestamp('checked_at', { withTimezone: true }).notNull(),
    crop: text('crop').notNull(),
    moisturePct: real('moisture_pct'),
    /** The saved layout and version installed at the time, when the machine's record names one. */
    layoutId: uuid('layout_id'),
    layoutVersion: integer('layout_version'),
    rotorRpm: integer('rotor_rpm').notNull(),
    clearanceMm: real('clearance_mm').notNull(),
    vaneSetting: text('vane_setting').notNull(),
    fanRpm: integer('fan_rpm'),
    upperSieveMm: real('upper_sieve_mm'),
    lowerSieveMm: real('lower_sieve_mm'),
    input: jsonb('input').$type<LossCheckParsed>().notNull(),
    result: jsonb('result').$type<LossCheckResult>().notNull(),
    harvestBuPerAc: real('harvest_bu_per_ac').notNull(),
    harvestPct: real('harvest_pct').notNull(),
    verdict: text('verdict', { enum: ['within', 'over'] }).notNull(),
    createdBy: uuid('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('loss_checks_machine_idx').on(t.machineId, t.checkedAt)],
);

/**
 * A dealer's starting values for the rest of the machine, per machine family and crop: cleaning
 * fan, sieve openings, feeder and header notes. `invented` marks demo values.
 */
export const startingValues = pgTable(
  'starting_values',
  {
    dealerId: uuid('dealer_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    familyId: text('family_id')
      .notNull()
      .references(() => families.id),
    crop: text('crop').notNull(),
    fanRpm: integer('fan_rpm'),
    upperSieveMm: real('upper_sieve_mm'),
    lowerSieveMm: real('lower_sieve_mm'),
    feederNote: text('feeder_note').notNull().default(''),
    headerNote: text('header_note').notNull().default(''),
    invented: boolean('invented').notNull().default(false),
    updatedBy: uuid('updated_by').references(() => users.id),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.dealerId, t.familyId, t.crop] })],
);
