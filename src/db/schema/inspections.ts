import { pgTable, text, uuid, timestamp, integer, jsonb, index } from 'drizzle-orm/pg-core';
import { organisations, users } from './orgs';
import { machines } from './fleet';

export const inspections = pgTable(
  'inspections',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    machineId: uuid('machine_id')
      .notNull()
      .references(() => machines.id, { onDelete: 'cascade' }),
    orgId: uuid('org_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    status: text('status', { enum: ['open', 'finished'] })
      .notNull()
      .default('open'),
    title: text('title').notNull().default(''),
    startedBy: uuid('started_by').references(() => users.id),
    startedAt: timestamp('started_at', { withTimezone: true }).notNull().defaultNow(),
    finishedAt: timestamp('finished_at', { withTimezone: true }),
  },
  (t) => [index('inspections_machine_idx').on(t.machineId)],
);

/** One checklist line: an installed element, cover plate or rotor-bar row. */
export const inspectionItems = pgTable(
  'inspection_items',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    inspectionId: uuid('inspection_id')
      .notNull()
      .references(() => inspections.id, { onDelete: 'cascade' }),
    placeKey: text('place_key').notNull(),
    partNumber: text('part_number'),
    label: text('label').notNull(),
    conditions: jsonb('conditions').$type<string[]>().notNull().default([]),
    severity: text('severity', { enum: ['ok', 'watch', 'replace'] })
      .notNull()
      .default('ok'),
    measurements: jsonb('measurements').$type<Record<string, number>>().notNull().default({}),
    note: text('note').notNull().default(''),
    position: integer('position').notNull().default(0),
  },
  (t) => [index('inspection_items_inspection_idx').on(t.inspectionId)],
);

export const photos = pgTable(
  'photos',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    itemId: uuid('item_id')
      .notNull()
      .references(() => inspectionItems.id, { onDelete: 'cascade' }),
    orgId: uuid('org_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    storageKey: text('storage_key').notNull(),
    thumbKey: text('thumb_key'),
    contentType: text('content_type').notNull(),
    bytes: integer('bytes').notNull(),
    createdBy: uuid('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('photos_item_idx').on(t.itemId)],
);
