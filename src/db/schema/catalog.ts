import { pgTable, text, uuid, timestamp, integer, bigint, jsonb, boolean, primaryKey, index } from 'drizzle-orm/pg-core';
import type { CatalogPart, MachineFamily } from '~/lib/domain/schemas';
import { organisations } from './orgs';

/** A machine family; `spec` holds the domain's MachineFamily document. */
export const families = pgTable('families', {
  id: text('id').primaryKey(),
  name: text('name').notNull(),
  spec: jsonb('spec').$type<MachineFamily>().notNull(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** A catalog part; `spec` holds the domain's CatalogPart document. */
export const catalogParts = pgTable(
  'catalog_parts',
  {
    partNumber: text('part_number').primaryKey(),
    familyId: text('family_id')
      .notNull()
      .references(() => families.id),
    kind: text('kind', { enum: ['element', 'cover-plate', 'rotor-bar'] }).notNull(),
    spec: jsonb('spec').$type<CatalogPart>().notNull(),
    active: boolean('active').notNull().default(true),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('catalog_parts_family_idx').on(t.familyId)],
);

/**
 * Parts an organisation holds on its shelf (a dealer's stock, a farm's spares). For a dealer,
 * `leadDays` is about how many days an order of the part takes when its shelf has too few
 * (null: the dealer has not said).
 */
export const stock = pgTable(
  'stock',
  {
    orgId: uuid('org_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    partNumber: text('part_number')
      .notNull()
      .references(() => catalogParts.partNumber),
    quantity: integer('quantity').notNull().default(0),
    leadDays: integer('lead_days'),
  },
  (t) => [primaryKey({ columns: [t.orgId, t.partNumber] })],
);

/**
 * A dealer's own price for a catalog part, in whole cents. Where a dealer has no price for a
 * part, the catalog's list price (`spec.priceCents`, kept by the instance administrators) applies.
 */
export const dealerPrices = pgTable(
  'dealer_prices',
  {
    dealerId: uuid('dealer_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    partNumber: text('part_number')
      .notNull()
      .references(() => catalogParts.partNumber),
    priceCents: integer('price_cents').notNull(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.dealerId, t.partNumber] })],
);

/**
 * One row counting changes to the catalog (families and catalog_parts). Statement triggers bump
 * it on every insert, update, delete or truncate of those tables, whoever writes (services, the
 * seed, another process on the same PostgreSQL server), so a process can keep the catalog in
 * memory and know with one tiny query whether it is still current (src/lib/server/catalog-cache.ts).
 */
export const catalogRevision = pgTable('catalog_revision', {
  id: integer('id').primaryKey().default(1),
  revision: bigint('revision', { mode: 'number' }).notNull().default(0),
});
