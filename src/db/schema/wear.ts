import { sql } from 'drizzle-orm';
import { pgTable, text, uuid, timestamp, real, index, uniqueIndex } from 'drizzle-orm/pg-core';
import { organisations, users } from './orgs';
import { machines } from './fleet';
import { inspectionItems, inspections } from './inspections';

/** Where a part came from when it was bolted into a place. */
export const partOrigins = ['start', 'new', 'shelf', 'moved'] as const;
/** Where a part went when it was taken out of a place. */
export const partDestinations = ['shelf', 'moved'] as const;

/**
 * One stint of a part at one place of a machine (`element:2:left`, `cover:2:right`, `bar:1:4`):
 * installed then (with the separator hours then), removed later (to the farm's shelf, or moved
 * to another place in the same install). A part that comes back from the shelf, or moves, opens a
 * new record that names its previous one (`previousRecordId`) and carries the separator hours it
 * already ran (`carriedHours`), so its wear is followed across machines. `start`: the first record
 * of a machine's history (what was installed when history began; its earlier hours unknown).
 */
export const partRecords = pgTable(
  'part_records',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    machineId: uuid('machine_id')
      .notNull()
      .references(() => machines.id, { onDelete: 'cascade' }),
    orgId: uuid('org_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    placeKey: text('place_key').notNull(),
    partNumber: text('part_number').notNull(),
    installedAt: timestamp('installed_at', { withTimezone: true }).notNull().defaultNow(),
    /** The machine's separator hours when it went in (null: no reading then). */
    installedSeparatorHours: real('installed_separator_hours'),
    origin: text('origin', { enum: partOrigins }).notNull(),
    previousRecordId: uuid('previous_record_id'),
    /** Separator hours the part ran in earlier records (on this or other machines). */
    carriedHours: real('carried_hours').notNull().default(0),
    removedAt: timestamp('removed_at', { withTimezone: true }),
    removedSeparatorHours: real('removed_separator_hours'),
    removedTo: text('removed_to', { enum: partDestinations }),
    installedBy: uuid('installed_by').references(() => users.id),
    removedBy: uuid('removed_by').references(() => users.id),
  },
  (t) => [
    index('part_records_machine_idx').on(t.machineId, t.placeKey, t.installedAt.desc()),
    index('part_records_shelf_idx')
      .on(t.orgId, t.partNumber, t.removedAt.desc())
      .where(sql`${t.removedTo} = 'shelf'`),
    // A part leaves the shelf (or a place) once: one later record per earlier one.
    uniqueIndex('part_records_previous_uq')
      .on(t.previousRecordId)
      .where(sql`${t.previousRecordId} is not null`),
  ],
);

/**
 * A wear measurement from a finished inspection, kept against the part record it was taken on,
 * with the machine's separator hours at the inspection (null when none was known).
 */
export const wearMeasurements = pgTable(
  'wear_measurements',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    partRecordId: uuid('part_record_id')
      .notNull()
      .references(() => partRecords.id, { onDelete: 'cascade' }),
    orgId: uuid('org_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    inspectionId: uuid('inspection_id')
      .notNull()
      .references(() => inspections.id, { onDelete: 'cascade' }),
    inspectionItemId: uuid('inspection_item_id')
      .notNull()
      .references(() => inspectionItems.id, { onDelete: 'cascade' }),
    wearMm: real('wear_mm').notNull(),
    separatorHours: real('separator_hours'),
    measuredAt: timestamp('measured_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('wear_measurements_record_idx').on(t.partRecordId, t.measuredAt),
    uniqueIndex('wear_measurements_item_record_uq').on(t.inspectionItemId, t.partRecordId),
  ],
);
