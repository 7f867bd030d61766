/** Decks: list, read, create, rename, delete. */
import { asc, count, desc, eq, inArray, sql } from 'drizzle-orm';
import { z } from 'zod';
import { getDb } from '~/lib/server/db';
import { deckSlides, decks, users } from '~/db/schema';
import type { Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { updateDeckSchema, createDeckSchema } from './schemas';
import { deckColumns, deckForActor, slidesOf } from './records';

export async function listDecks(actor: Actor) {
  const db = await getDb();
  const rows = await db
    .select({ ...deckColumns, slideCount: count(deckSlides.id) })
    .from(decks)
    .leftJoin(users, eq(users.id, decks.createdBy))
    .leftJoin(deckSlides, eq(deckSlides.deckId, decks.id))
    .where(inArray(decks.orgId, actor.visibleOrgIds))
    .groupBy(decks.id, users.name)
    .orderBy(desc(decks.updatedAt), asc(decks.id));
  return { decks: rows.map((r) => ({ ...r, slideCount: Number(r.slideCount) })) };
}

export async function getDeck(actor: Actor, deckId: string) {
  const deck = await deckForActor(actor, deckId);
  return { deck, slides: await slidesOf(deck.id, actor.visibleOrgIds) };
}

export async function createDeck(actor: Actor, input: z.infer<typeof createDeckSchema>) {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [row] = await tx.insert(decks).values({ orgId: actor.homeOrgId, title: input.title, createdBy: actor.id }).returning();
    await audit(tx, actor, 'create', 'deck', row!.id, { title: row!.title }, row!.orgId);
    return row!;
  });
}

export async function updateDeck(actor: Actor, deckId: string, input: z.infer<typeof updateDeckSchema>) {
  const deck = await deckForActor(actor, deckId);
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(decks)
      .set({ title: input.title, updatedAt: sql`now()` })
      .where(eq(decks.id, deck.id))
      .returning();
    await audit(tx, actor, 'update', 'deck', deck.id, { title: { from: deck.title, to: input.title } }, deck.orgId);
    return row!;
  });
}

/** Removes a deck with its slides and its share links (the audit log stays). */
export async function deleteDeck(actor: Actor, deckId: string) {
  const deck = await deckForActor(actor, deckId);
  const db = await getDb();
  await db.transaction(async (tx) => {
    await tx.delete(decks).where(eq(decks.id, deck.id));
    await audit(tx, actor, 'delete', 'deck', deck.id, { title: deck.title }, deck.orgId);
  });
  return { deleted: deck.id };
}
