import { pgTable, text, uuid, timestamp, integer, index } from 'drizzle-orm/pg-core';
import { users } from './orgs';

/**
 * Sign-in attempts, one row per key (`account:<e-mail as typed>` or `address:<client address>`).
 * An attempt is reserved here, in one statement, before its password is checked, so parallel
 * requests and several server processes share the count. `next_at` is when the next attempt
 * may be reserved (see src/lib/server/auth/throttle.ts).
 */
export const signinThrottle = pgTable('signin_throttle', {
  key: text('key').primaryKey(),
  attempts: integer('attempts').notNull(),
  nextAt: timestamptz('next_at'),
  lastAt: timestamptz('last_at'),
});

/**
 * A signed-in session. The session cookie carries the id; the middleware accepts a cookie only
 * while its row is open, so signing out (or a password, role or membership change, which end
 * every session of that user through database triggers) ends it on every server process.
 */
export const sessions = pgTable(
  'sessions',
  {
    id: text('id').primaryKey(),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    createdAt: timestamptz('created_at'),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    endedAt: timestamp('ended_at', { withTimezone: true }),
    endedReason: text('ended_reason'),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

function timestamptz(name: string) {
  return timestamp(name, { withTimezone: true }).notNull().defaultNow();
}
