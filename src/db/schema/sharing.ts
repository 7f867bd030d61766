import { pgTable, text, uuid, timestamp, index } from 'drizzle-orm/pg-core';
import { organisations, users } from './orgs';
import { layoutVersions } from './fleet';
import { decks } from './classroom';

/** A read-only link to a layout version or a deck. Only the token's hash is stored. */
export const shareLinks = pgTable(
  'share_links',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    orgId: uuid('org_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    tokenHash: text('token_hash').notNull().unique(),
    layoutVersionId: uuid('layout_version_id').references(() => layoutVersions.id, { onDelete: 'cascade' }),
    deckId: uuid('deck_id').references(() => decks.id, { onDelete: 'cascade' }),
    label: text('label').notNull().default(''),
    expiresAt: timestamp('expires_at', { withTimezone: true }),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    createdBy: uuid('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('share_links_org_idx').on(t.orgId)],
);
