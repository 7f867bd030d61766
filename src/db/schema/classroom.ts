import { pgTable, text, uuid, timestamp, integer, jsonb, index } from 'drizzle-orm/pg-core';
import type { Layout } from '~/lib/domain/schemas';
import { organisations, users } from './orgs';
import { layoutVersions } from './fleet';

export const decks = pgTable(
  'decks',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    orgId: uuid('org_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    title: text('title').notNull(),
    createdBy: uuid('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('decks_org_idx').on(t.orgId)],
);

/** A slide shows a saved layout version, or a sample layout made for teaching. */
export const deckSlides = pgTable(
  'deck_slides',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    deckId: uuid('deck_id')
      .notNull()
      .references(() => decks.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
    title: text('title').notNull(),
    notes: text('notes').notNull().default(''),
    layoutVersionId: uuid('layout_version_id').references(() => layoutVersions.id, { onDelete: 'set null' }),
    sampleLayout: jsonb('sample_layout').$type<Layout>(),
  },
  (t) => [index('deck_slides_deck_idx').on(t.deckId)],
);
