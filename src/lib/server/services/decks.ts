/**
 * Classroom decks: an ordered list of slides, each showing a saved layout version of a machine
 * the author may see, or a sample layout made for teaching. Decks belong to the author's home
 * organisation (the dealer, for trainers and technicians) and are seen by its staff.
 * Read-only share links for decks use the same token scheme as layout links (sharing.ts).
 */
import { and, asc, count, desc, eq, inArray, isNull, max, or, sql } from 'drizzle-orm';
import { z } from 'zod';
import { getDb, type Db } from '../db';
import { deckSlides, decks, layouts, layoutVersions, machines, organisations, shareLinks, users } from '../../../db/schema';
import { cropIdSchema, layoutSchema, slugSchema, type Layout } from '../../domain/schemas';
import { starterLayout } from '../../domain/starter';
import type { Actor } from '../access';
import { audit } from '../audit';
import { HttpError, notFound } from '../http';
import { renderNotes } from '../markdown';
import { catalogForFamily, familyById } from './machines';
import { hashToken, lookUpToken, newToken, statusOf, type ShareStatus } from '../share-links';

/** Who builds, changes and presents decks: the dealer's trainers and technicians. */
export const DECK_ROLES = ['trainer', 'technician'] as const;

export const MAX_SLIDES = 200;

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

// ---------------------------------------------------------------------------------------------
// Input formats

const deckTitle = z.string().trim().min(1, { error: 'give the deck a title' }).max(120);
const slideTitle = z.string().trim().min(1, { error: 'give the slide a title' }).max(160);
const notes = z.string().max(10_000);

export const createDeckSchema = z.object({ title: deckTitle });
export const updateDeckSchema = z.object({ title: deckTitle });

/** Where a slide's layout comes from: give exactly one when adding, at most one when changing. */
const layoutSource = {
  /** A saved version of a layout on a machine the author may see. */
  layoutVersionId: z.uuid().optional(),
  /** A sample layout made for teaching. */
  sampleLayout: layoutSchema.optional(),
  /** A sample started from the suggested layout for a crop on a machine family. */
  starter: z.object({ familyId: slugSchema, crop: cropIdSchema }).optional(),
};

export const addSlideSchema = z.object({ title: slideTitle, notes: notes.default(''), ...layoutSource });
export const updateSlideSchema = z.object({ title: slideTitle.optional(), notes: notes.optional(), ...layoutSource });
export const reorderSlidesSchema = z.object({
  /** Every slide id of the deck, in the new order. */
  order: z.array(z.uuid()).max(MAX_SLIDES),
});
export const createDeckShareSchema = z.object({
  label: z.string().trim().max(120).default(''),
  /** Optional end of the link's life (ISO 8601 with an offset); must lie in the future. */
  expiresAt: z.iso
    .datetime({ offset: true, error: 'give a date and time such as 2026-09-30T18:00:00Z' })
    .nullable()
    .optional(),
});

// ---------------------------------------------------------------------------------------------
// Views

export type SlideSource =
  | {
      kind: 'version';
      layoutVersionId: string;
      layoutId: string;
      layoutName: string;
      version: number;
      machineId: string;
      machineNickname: string;
      orgName: string;
    }
  | { kind: 'sample' }
  /** The layout was deleted, or its farm is no longer one the viewer may see. */
  | { kind: 'missing' };

export interface SlideRecord {
  id: string;
  position: number;
  title: string;
  notes: string;
  /** The talking points rendered to safe HTML (see markdown.ts). */
  notesHtml: string;
  source: SlideSource;
  layout: Layout | null;
}

export interface DeckRecord {
  id: string;
  orgId: string;
  title: string;
  createdBy: string | null;
  createdByName: string | null;
  createdAt: Date;
  updatedAt: Date;
}

const deckColumns = {
  id: decks.id,
  orgId: decks.orgId,
  title: decks.title,
  createdBy: decks.createdBy,
  createdByName: users.name,
  createdAt: decks.createdAt,
  updatedAt: decks.updatedAt,
};

async function deckForActor(actor: Actor, deckId: string, db?: Db | Tx): Promise<DeckRecord> {
  const d = db ?? (await getDb());
  const [row] = await d
    .select(deckColumns)
    .from(decks)
    .leftJoin(users, eq(users.id, decks.createdBy))
    .where(and(eq(decks.id, deckId), inArray(decks.orgId, actor.visibleOrgIds)))
    .limit(1);
  if (!row) throw notFound('Deck not found', 'id');
  return row;
}

/** The slides of a deck in order; layouts outside `visibleOrgIds` come back as missing. */
async function slidesOf(deckId: string, visibleOrgIds: readonly string[], db?: Db | Tx): Promise<SlideRecord[]> {
  const d = db ?? (await getDb());
  const rows = await d
    .select({
      id: deckSlides.id,
      position: deckSlides.position,
      title: deckSlides.title,
      notes: deckSlides.notes,
      layoutVersionId: deckSlides.layoutVersionId,
      sampleLayout: deckSlides.sampleLayout,
      body: layoutVersions.body,
      version: layoutVersions.version,
      layoutId: layouts.id,
      layoutName: layouts.name,
      layoutOrgId: layouts.orgId,
      machineId: machines.id,
      machineNickname: machines.nickname,
      orgName: organisations.name,
    })
    .from(deckSlides)
    .leftJoin(layoutVersions, eq(layoutVersions.id, deckSlides.layoutVersionId))
    .leftJoin(layouts, eq(layouts.id, layoutVersions.layoutId))
    .leftJoin(machines, eq(machines.id, layouts.machineId))
    .leftJoin(organisations, eq(organisations.id, machines.orgId))
    .where(eq(deckSlides.deckId, deckId))
    .orderBy(asc(deckSlides.position), asc(deckSlides.id));
  return rows.map((r) => {
    let source: SlideSource = { kind: 'missing' };
    let layout: Layout | null = null;
    if (r.layoutVersionId && r.body && r.layoutOrgId && visibleOrgIds.includes(r.layoutOrgId)) {
      source = {
        kind: 'version',
        layoutVersionId: r.layoutVersionId,
        layoutId: r.layoutId!,
        layoutName: r.layoutName!,
        version: r.version!,
        machineId: r.machineId!,
        machineNickname: r.machineNickname!,
        orgName: r.orgName!,
      };
      layout = r.body;
    } else if (!r.layoutVersionId && r.sampleLayout) {
      source = { kind: 'sample' };
      layout = r.sampleLayout;
    }
    return { id: r.id, position: r.position, title: r.title, notes: r.notes, notesHtml: renderNotes(r.notes), source, layout };
  });
}

// ---------------------------------------------------------------------------------------------
// Decks

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
    const [row] = await tx.update(decks).set({ title: input.title, updatedAt: sql`now()` }).where(eq(decks.id, deck.id)).returning();
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

// ---------------------------------------------------------------------------------------------
// Slides

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

const touch = (tx: Tx, deckId: string) => tx.update(decks).set({ updatedAt: sql`now()` }).where(eq(decks.id, deckId));

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
    await tx.update(deckSlides).set(changes).where(and(eq(deckSlides.id, before.id), eq(deckSlides.deckId, deck.id)));
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
    for (const [i, id] of input.order.entries()) await tx.update(deckSlides).set({ position: i + 1 }).where(eq(deckSlides.id, id));
    await touch(tx, deck.id);
    await audit(tx, actor, 'reorder-slides', 'deck', deck.id, { order: input.order }, deck.orgId);
  });
  return getDeck(actor, deck.id);
}

// ---------------------------------------------------------------------------------------------
// Read-only share links

export type DeckShareStatus = ShareStatus;

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
    await audit(tx, actor, 'share', 'deck', deck.id, { linkId: row!.id, label: input.label, expiresAt: expiresAt?.toISOString() ?? null }, deck.orgId);
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
    const done = await tx.update(shareLinks).set({ revokedAt: sql`now()` }).where(and(...where)).returning({ id: shareLinks.id });
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
  const [deck] = await db.select(deckColumns).from(decks).leftJoin(users, eq(users.id, decks.createdBy)).where(eq(decks.id, row.deckId!)).limit(1);
  if (!deck) return { status: 'not-found' };
  // The deck's organisation and, for a dealer, its customer farms.
  const orgs = await db
    .select({ id: organisations.id })
    .from(organisations)
    .where(or(eq(organisations.id, deck.orgId), eq(organisations.dealerId, deck.orgId)));
  const slides = await slidesOf(deck.id, orgs.map((o) => o.id));
  return { status: 'ok', deck, slides, link: { label: row.label, expiresAt: row.expiresAt, createdAt: row.createdAt } };
}

// ---------------------------------------------------------------------------------------------
// Choices for the deck editor

/** The current version of every layout on the machines the actor may see, to put on a slide. */
export async function slideLayoutChoices(actor: Actor) {
  const db = await getDb();
  const rows = await db
    .select({
      layoutId: layouts.id,
      layoutName: layouts.name,
      version: layouts.currentVersion,
      layoutVersionId: layoutVersions.id,
      body: layoutVersions.body,
      machineId: machines.id,
      machineNickname: machines.nickname,
      familyId: machines.familyId,
      orgName: organisations.name,
    })
    .from(layouts)
    .innerJoin(layoutVersions, and(eq(layoutVersions.layoutId, layouts.id), eq(layoutVersions.version, layouts.currentVersion)))
    .innerJoin(machines, eq(machines.id, layouts.machineId))
    .innerJoin(organisations, eq(organisations.id, machines.orgId))
    .where(inArray(layouts.orgId, actor.visibleOrgIds))
    .orderBy(asc(organisations.name), asc(machines.nickname), asc(layouts.name))
    .limit(500);
  return rows.map(({ body, ...r }) => ({ ...r, crop: body.crop }));
}
