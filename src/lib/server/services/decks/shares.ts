/** Read-only share links for decks (token handling in ../../share-links.ts). */
import { and, desc, eq, isNull, or, sql } from 'drizzle-orm';
import { z } from 'zod';
import { getDb } from '~/lib/server/db';
import { decks, organisations, shareLinks, users } from '~/db/schema';
import type { Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError, notFound } from '~/lib/server/http';
import { hashToken, lookUpToken, newToken, statusOf } from '~/lib/server/share-links';
import { createDeckShareSchema } from './schemas';
import { deckColumns, deckForActor, slidesOf, type DeckRecord, type SlideRecord } from './records';

const linkColumns = {
  id: shareLinks.id,
  deckId: shareLinks.deckId,
  label: shareLinks.label,
  createdAt: shareLinks.createdAt,
  expiresAt: shareLinks.expiresAt,
  revokedAt: shareLinks.revokedAt,
  createdByName: users.name,
};

export async function listDeckShares(actor: Actor, deckId: string) {
  const deck = await deckForActor(actor, deckId);
  const db = await getDb();
  const rows = await db
    .select(linkColumns)
    .from(shareLinks)
    .leftJoin(users, eq(users.id, shareLinks.createdBy))
    .where(eq(shareLinks.deckId, deck.id))
    .orderBy(desc(shareLinks.createdAt));
  const now = new Date();
  return { links: rows.map((r) => ({ ...r, status: statusOf(r, now) })) };
}

/** A new read-only link; the token is returned once and only its SHA-256 hash is kept. */
export async function createDeckShare(actor: Actor, deckId: string, input: z.infer<typeof createDeckShareSchema>) {
  const deck = await deckForActor(actor, deckId);
  const expiresAt = input.expiresAt ? new Date(input.expiresAt) : null;
  if (expiresAt && expiresAt.getTime() <= Date.now()) throw new HttpError(400, 'expiresAt: choose a time in the future', 'expiresAt');
  const token = newToken();
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(shareLinks)
      .values({ orgId: deck.orgId, tokenHash: hashToken(token), deckId: deck.id, label: input.label, expiresAt, createdBy: actor.id })
      .returning();
    await audit(
      tx,
      actor,
      'share',
      'deck',
      deck.id,
      { linkId: row!.id, label: input.label, expiresAt: expiresAt?.toISOString() ?? null },
      deck.orgId,
    );
    const { tokenHash: _hidden, ...link } = row!;
    return { link: { ...link, status: statusOf(row!) }, token, path: `/share/deck/${token}` };
  });
}

/** Revokes one link of the deck (`linkId`), or every link still active when none is named. */
export async function revokeDeckShare(actor: Actor, deckId: string, linkId: string | null) {
  const deck = await deckForActor(actor, deckId);
  const db = await getDb();
  return db.transaction(async (tx) => {
    const where = [eq(shareLinks.deckId, deck.id), isNull(shareLinks.revokedAt)];
    if (linkId) {
      const [exists] = await tx
        .select({ id: shareLinks.id })
        .from(shareLinks)
        .where(and(eq(shareLinks.id, linkId), eq(shareLinks.deckId, deck.id)))
        .limit(1);
      if (!exists) throw notFound('Share link not found', 'link');
      where.push(eq(shareLinks.id, linkId));
    }
    const done = await tx
      .update(shareLinks)
      .set({ revokedAt: sql`now()` })
      .where(and(...where))
      .returning({ id: shareLinks.id });
    if (done.length) await audit(tx, actor, 'revoke-share', 'deck', deck.id, { linkIds: done.map((d) => d.id) }, deck.orgId);
    return { revoked: done.map((d) => d.id) };
  });
}

export type ResolvedDeckShare =
  | { status: 'not-found' }
  | { status: 'expired'; expiresAt: Date }
  | { status: 'ok'; deck: DeckRecord; slides: SlideRecord[]; link: { label: string; expiresAt: Date | null; createdAt: Date } };

/**
 * What a deck's share token opens, read-only. Unknown or revoked: not found (404); past its
 * expiry: gone (410). The slides show what the deck's own organisation may see. Nothing is written.
 */
export async function resolveDeckShareToken(token: string): Promise<ResolvedDeckShare> {
  const found = await lookUpToken(token, 'deck');
  if (found.status !== 'ok') return found;
  const { row } = found;
  const db = await getDb();
  const [deck] = await db
    .select(deckColumns)
    .from(decks)
    .leftJoin(users, eq(users.id, decks.createdBy))
    .where(eq(decks.id, row.deckId!))
    .limit(1);
  if (!deck) return { status: 'not-found' };
  // The deck's organisation and, for a dealer, its customer farms.
  const orgs = await db
    .select({ id: organisations.id })
    .from(organisations)
    .where(or(eq(organisations.id, deck.orgId), eq(organisations.dealerId, deck.orgId)));
  const slides = await slidesOf(
    deck.id,
    orgs.map((o) => o.id),
  );
  return { status: 'ok', deck, slides, link: { label: row.label, expiresAt: row.expiresAt, createdAt: row.createdAt } };
}
