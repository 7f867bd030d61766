/** Slides: add (a saved layout version, a sample layout or a starter), change, remove, reorder. */
import { and, count, eq, inArray, max, sql } from 'drizzle-orm';
import { z } from 'zod';
import { getDb } from '~/lib/server/db';
import { deckSlides, decks, layouts, layoutVersions } from '~/db/schema';
import type { Layout } from '~/lib/domain/schemas';
import { starterLayout } from '~/lib/domain/starter';
import type { Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError, notFound } from '~/lib/server/http';
import { catalogForFamily, familyById } from '~/lib/server/services/machines';
import { addSlideSchema, reorderSlidesSchema, updateSlideSchema } from './schemas';
import { deckForActor, MAX_SLIDES, slidesOf, type DeckRecord, type SlideRecord, type Tx } from './records';
import { getDeck } from './decks';

type SourceInput = Pick<z.infer<typeof addSlideSchema>, 'layoutVersionId' | 'sampleLayout' | 'starter'>;

const SOURCE_FIELDS = ['layoutVersionId', 'sampleLayout', 'starter'] as const;

/** A sample layout must be of a known family and name only parts of that family's catalog. */
async function validateSample(layout: Layout, field: string): Promise<Layout> {
  const family = await familyById(layout.familyId);
  if (!family) throw new HttpError(400, `${field}.familyId: no machine family "${layout.familyId}"`, `${field}.familyId`);
  const known = new Set((await catalogForFamily(family.id)).map((p) => p.partNumber));
  const lists = [
    ['elements', layout.elements],
    ['coverPlates', layout.coverPlates],
    ['rotorBars', layout.rotorBars],
  ] as const;
  for (const [name, items] of lists)
    items.forEach((item, i) => {
      if (!known.has(item.partNumber)) {
        const f = `${field}.${name}.${i}.partNumber`;
        throw new HttpError(400, `${f}: ${item.partNumber} is not a part of the ${family.name} catalog`, f);
      }
    });
  return layout;
}

/**
 * Turns a slide's source into what is stored: a layout version id the actor may see (another
 * organisation's or an unknown one is not found), or a validated sample layout.
 */
async function resolveSource(actor: Actor, input: SourceInput): Promise<{ layoutVersionId: string | null; sampleLayout: Layout | null }> {
  if (input.layoutVersionId) {
    const db = await getDb();
    const [v] = await db
      .select({ id: layoutVersions.id })
      .from(layoutVersions)
      .innerJoin(layouts, eq(layouts.id, layoutVersions.layoutId))
      .where(and(eq(layoutVersions.id, input.layoutVersionId), inArray(layouts.orgId, actor.visibleOrgIds)))
      .limit(1);
    if (!v) throw notFound('Layout version not found', 'layoutVersionId');
    return { layoutVersionId: v.id, sampleLayout: null };
  }
  if (input.sampleLayout) return { layoutVersionId: null, sampleLayout: await validateSample(input.sampleLayout, 'sampleLayout') };
  const { familyId, crop } = input.starter!;
  const family = await familyById(familyId);
  if (!family) throw new HttpError(400, `starter.familyId: no machine family "${familyId}"`, 'starter.familyId');
  return { layoutVersionId: null, sampleLayout: starterLayout(family, crop, await catalogForFamily(family.id)) };
}

function sourcesGiven(input: SourceInput) {
  return SOURCE_FIELDS.filter((f) => input[f] !== undefined);
}

/** Locks the deck row for the rest of the transaction, so slide positions change one at a time. */
async function lockDeck(tx: Tx, deckId: string) {
  await tx.select({ id: decks.id }).from(decks).where(eq(decks.id, deckId)).for('update');
}

const touch = (tx: Tx, deckId: string) =>
  tx
    .update(decks)
    .set({ updatedAt: sql`now()` })
    .where(eq(decks.id, deckId));

async function slideOf(deck: DeckRecord, slideId: string, actor: Actor): Promise<SlideRecord> {
  const slide = (await slidesOf(deck.id, actor.visibleOrgIds)).find((s) => s.id === slideId);
  if (!slide) throw notFound('Slide not found', 'slideId');
  return slide;
}

export async function addSlide(actor: Actor, deckId: string, input: z.infer<typeof addSlideSchema>) {
  const deck = await deckForActor(actor, deckId);
  const given = sourcesGiven(input);
  if (given.length !== 1)
    throw new HttpError(
      400,
      given.length === 0
        ? 'layoutVersionId: give a layout version, a sample layout or a starter (family and crop)'
        : `${given[1]}: give only one of layoutVersionId, sampleLayout and starter`,
      given.length === 0 ? 'layoutVersionId' : given[1],
    );
  const source = await resolveSource(actor, input);
  const db = await getDb();
  const id = await db.transaction(async (tx) => {
    await lockDeck(tx, deck.id);
    const [{ n, top }] = await tx
      .select({ n: count(), top: max(deckSlides.position) })
      .from(deckSlides)
      .where(eq(deckSlides.deckId, deck.id));
    if (Number(n) >= MAX_SLIDES) throw new HttpError(400, `title: a deck holds at most ${MAX_SLIDES} slides`, 'title');
    const [row] = await tx
      .insert(deckSlides)
      .values({ deckId: deck.id, position: (top ?? 0) + 1, title: input.title, notes: input.notes, ...source })
      .returning({ id: deckSlides.id });
    await touch(tx, deck.id);
    await audit(
      tx,
      actor,
      'add-slide',
      'deck',
      deck.id,
      { slideId: row!.id, title: input.title, source: source.layoutVersionId ? { layoutVersionId: source.layoutVersionId } : 'sample' },
      deck.orgId,
    );
    return row!.id;
  });
  return slideOf(deck, id, actor);
}

export async function getSlide(actor: Actor, deckId: string, slideId: string) {
  const deck = await deckForActor(actor, deckId);
  return slideOf(deck, slideId, actor);
}

export async function updateSlide(actor: Actor, deckId: string, slideId: string, input: z.infer<typeof updateSlideSchema>) {
  const deck = await deckForActor(actor, deckId);
  const before = await slideOf(deck, slideId, actor);
  const given = sourcesGiven(input);
  if (given.length > 1) throw new HttpError(400, `${given[1]}: give only one of layoutVersionId, sampleLayout and starter`, given[1]);
  const source = given.length === 1 ? await resolveSource(actor, input) : null;
  const changes = {
    ...(input.title !== undefined ? { title: input.title } : {}),
    ...(input.notes !== undefined ? { notes: input.notes } : {}),
    ...(source ?? {}),
  };
  if (Object.keys(changes).length === 0) return before;
  const db = await getDb();
  await db.transaction(async (tx) => {
    await tx
      .update(deckSlides)
      .set(changes)
      .where(and(eq(deckSlides.id, before.id), eq(deckSlides.deckId, deck.id)));
    await touch(tx, deck.id);
    await audit(
      tx,
      actor,
      'update-slide',
      'deck',
      deck.id,
      {
        slideId: before.id,
        fields: Object.keys(changes),
        ...(source ? { source: source.layoutVersionId ? { layoutVersionId: source.layoutVersionId } : 'sample' } : {}),
      },
      deck.orgId,
    );
  });
  return slideOf(deck, before.id, actor);
}

export async function deleteSlide(actor: Actor, deckId: string, slideId: string) {
  const deck = await deckForActor(actor, deckId);
  const slide = await slideOf(deck, slideId, actor);
  const db = await getDb();
  await db.transaction(async (tx) => {
    await lockDeck(tx, deck.id);
    await tx.delete(deckSlides).where(eq(deckSlides.id, slide.id));
    // Close the gap so positions stay 1..n.
    await tx
      .update(deckSlides)
      .set({ position: sql`${deckSlides.position} - 1` })
      .where(and(eq(deckSlides.deckId, deck.id), sql`${deckSlides.position} > ${slide.position}`));
    await touch(tx, deck.id);
    await audit(tx, actor, 'delete-slide', 'deck', deck.id, { slideId: slide.id, title: slide.title }, deck.orgId);
  });
  return { deleted: slide.id };
}

/** Puts the slides in the given order; the list must name every slide of the deck once. */
export async function reorderSlides(actor: Actor, deckId: string, input: z.infer<typeof reorderSlidesSchema>) {
  const deck = await deckForActor(actor, deckId);
  const db = await getDb();
  await db.transaction(async (tx) => {
    await lockDeck(tx, deck.id);
    const current = await tx.select({ id: deckSlides.id }).from(deckSlides).where(eq(deckSlides.deckId, deck.id));
    const ids = new Set(current.map((c) => c.id));
    const seen = new Set<string>();
    input.order.forEach((id, i) => {
      if (!ids.has(id)) throw new HttpError(400, `order.${i}: no slide ${id} in this deck`, `order.${i}`);
      if (seen.has(id)) throw new HttpError(400, `order.${i}: slide ${id} is listed twice`, `order.${i}`);
      seen.add(id);
    });
    if (seen.size !== ids.size) throw new HttpError(400, `order: list all ${ids.size} slides of the deck`, 'order');
    for (const [i, id] of input.order.entries())
      await tx
        .update(deckSlides)
        .set({ position: i + 1 })
        .where(eq(deckSlides.id, id));
    await touch(tx, deck.id);
    await audit(tx, actor, 'reorder-slides', 'deck', deck.id, { order: input.order }, deck.orgId);
  });
  return getDeck(actor, deck.id);
}
