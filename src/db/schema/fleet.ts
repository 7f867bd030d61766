import { pgTable, text, uuid, timestamp, integer, jsonb, index, uniqueIndex } from 'drizzle-orm/pg-core';
import type { Layout } from '~/lib/domain/schemas';
import { organisations, users } from './orgs';
import { families } from './catalog';

export const machines = pgTable(
  'machines',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    orgId: uuid('org_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    familyId: text('family_id')
      .notNull()
      .references(() => families.id),
    drum: text('drum', { enum: ['full', 'slim'] }).notNull(),
    vaneControl: text('vane_control', { enum: ['fixed', 'manual', 'powered'] }).notNull(),
    serial: text('serial').notNull(),
    nickname: text('nickname').notNull(),
    notes: text('notes').notNull().default(''),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
    // Not declared here: search_text, a stored generated column (lower case name, serial and
    // notes in one value) that the list's text search reads; it is added by migration
    // 0013_machine_list_search.sql and read only by listMachines (services/machines.ts), so
    // no answer that returns a machine row carries it.
  },
  // The machines list filters by organisation and sorts by last change (its default) or name:
  // with these an organisation's page is read in order from the index, without sorting them all.
  // Dealer staff see several organisations at once; the indexes without the organisation give
  // their pages in order too (the store walks one index and skips other organisations' rows).
  // Every key ends in the id and runs one way: a descending list (the newest first) reads the
  // same index backwards, ties by id descending, so a keyset cursor (column, id) is one row
  // comparison the index can start at, even where thousands of machines share a time.
  (t) => [
    index('machines_org_idx').on(t.orgId),
    index('machines_org_updated_idx').on(t.orgId, t.updatedAt, t.id),
    index('machines_org_nickname_idx').on(t.orgId, t.nickname, t.id),
    index('machines_updated_idx').on(t.updatedAt, t.id),
    index('machines_nickname_idx').on(t.nickname, t.id),
  ],
);

/** What is bolted in the machine today. */
export const installed = pgTable('installed', {
  machineId: uuid('machine_id')
    .primaryKey()
    .references(() => machines.id, { onDelete: 'cascade' }),
  layout: jsonb('layout').$type<Layout>().notNull(),
  /** The saved layout version it was installed from, when it was (null for a layout given as it is). */
  sourceLayoutId: uuid('source_layout_id'),
  sourceVersion: integer('source_version'),
  updatedBy: uuid('updated_by').references(() => users.id),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** A named plan for a machine; its content lives in immutable versions. */
export const layouts = pgTable(
  'layouts',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    machineId: uuid('machine_id')
      .notNull()
      .references(() => machines.id, { onDelete: 'cascade' }),
    orgId: uuid('org_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    currentVersion: integer('current_version').notNull().default(1),
    createdBy: uuid('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('layouts_machine_idx').on(t.machineId), index('layouts_org_idx').on(t.orgId)],
);

export const layoutVersions = pgTable(
  'layout_versions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    layoutId: uuid('layout_id')
      .notNull()
      .references(() => layouts.id, { onDelete: 'cascade' }),
    version: integer('version').notNull(),
    body: jsonb('body').$type<Layout>().notNull(),
    note: text('note').notNull().default(''),
    createdBy: uuid('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('layout_versions_layout_version_uq').on(t.layoutId, t.version)],
);
