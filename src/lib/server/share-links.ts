import { createHash, randomBytes } from 'node:crypto';
import { and, eq, isNotNull } from 'drizzle-orm';
import { getDb } from './db';
import { shareLinks } from '~/db/schema';

/**
 * Read-only share links, for layouts and decks alike: the token (32 random bytes, base64url,
 * 43 characters; only its SHA-256 is stored), a link's status, and what a token resolves to.
 * The services for layouts (services/sharing.ts) and decks (services/decks/shares.ts) build on this.
 */
const TOKEN_BYTES = 32;
const TOKEN_RE = /^[A-Za-z0-9_-]{43}$/;

export const newToken = () => randomBytes(TOKEN_BYTES).toString('base64url');
export const hashToken = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');

export type ShareStatus = 'active' | 'revoked' | 'expired';

export function statusOf(row: { revokedAt: Date | null; expiresAt: Date | null }, now = new Date()): ShareStatus {
  if (row.revokedAt) return 'revoked';
  if (row.expiresAt && row.expiresAt.getTime() <= now.getTime()) return 'expired';
  return 'active';
}

export type ShareLinkRow = typeof shareLinks.$inferSelect;

/** What a token opens: an unknown or revoked one is simply not found (404), an expired one is gone (410). */
export type TokenLookup = { status: 'not-found' } | { status: 'expired'; expiresAt: Date } | { status: 'ok'; row: ShareLinkRow };

/** Finds the live link of a token of the given kind; nothing is written on the way. */
export async function lookUpToken(token: string, kind: 'layout' | 'deck'): Promise<TokenLookup> {
  if (!TOKEN_RE.test(token)) return { status: 'not-found' };
  const db = await getDb();
  const target = kind === 'layout' ? shareLinks.layoutVersionId : shareLinks.deckId;
  const [row] = await db
    .select()
    .from(shareLinks)
    .where(and(eq(shareLinks.tokenHash, hashToken(token)), isNotNull(target)))
    .limit(1);
  if (!row) return { status: 'not-found' };
  const status = statusOf(row);
  if (status === 'revoked') return { status: 'not-found' };
  if (status === 'expired') return { status: 'expired', expiresAt: row.expiresAt! };
  return { status: 'ok', row };
}
