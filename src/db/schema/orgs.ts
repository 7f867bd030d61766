import { pgTable, text, uuid, timestamp, primaryKey, index } from 'drizzle-orm/pg-core';

/**
 * A farm, a dealer, or the installation itself ('instance': holds the instance administrators,
 * who run the installation and see no tenant's machines). A farm may name the dealer that serves it.
 */
export const organisations = pgTable('organisations', {
  id: uuid('id').primaryKey().defaultRandom(),
  name: text('name').notNull(),
  kind: text('kind', { enum: ['farm', 'dealer', 'instance'] }).notNull(),
  dealerId: uuid('dealer_id'),
  partsDeskEmail: text('parts_desk_email'),
  ownerEmail: text('owner_email'),
  /**
   * A dealer's currency (ISO 4217 code): its price list, and every price its customer farms see,
   * are in it. Null: the catalog's currency (DEFAULT_CURRENCY in domain/format.ts). Unused for farms.
   */
  currency: text('currency'),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export const users = pgTable('users', {
  id: uuid('id').primaryKey().defaultRandom(),
  email: text('email').notNull().unique(),
  name: text('name').notNull(),
  passwordHash: text('password_hash').notNull(),
  unitSystem: text('unit_system', { enum: ['metric', 'imperial'] })
    .notNull()
    .default('metric'),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

/**
 * Roles are held per membership. `instance_admin` runs the installation (backups, instance
 * settings, the shared machine-family catalog); `dealer_admin` runs one dealer (its people,
 * customer farms, price list, stock and mailbox).
 */
export const roles = ['operator', 'technician', 'trainer', 'dealer_admin', 'instance_admin'] as const;
export type Role = (typeof roles)[number];

/** A user's place in an organisation, with the role they hold there. */
export const memberships = pgTable(
  'memberships',
  {
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    orgId: uuid('org_id')
      .notNull()
      .references(() => organisations.id, { onDelete: 'cascade' }),
    role: text('role', { enum: roles }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.orgId] }), index('memberships_org_idx').on(t.orgId)],
);
