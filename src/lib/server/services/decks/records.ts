/** Who may use decks, what a deck and a slide look like, and loading them for an actor. */
import { and, asc, eq, inArray } from 'drizzle-orm';
import { getDb, type Db } from '~/lib/server/db';
import { deckSlides, decks, layouts, layoutVersions, machines, organisations, users } from '~/db/schema';
import type { Layout } from '~/lib/domain/schemas';
import type { Actor } from '~/lib/server/access';
import { notFound } from '~/lib/server/http';
import { renderNotes } from '~/lib/server/markdown';
import type { SlideRecord, SlideSource } from '~/lib/responses';

export const MAX_SLIDES = 200;

export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

export type { SlideRecord, SlideSource } from '~/lib/responses';

export interface DeckRecord {
  id: string;
  orgId: string;
  title: string;
  createdBy: string | null;
  createdByName: string | null;
  createdAt: Date;
  updatedAt: Date;
}

export const deckColumns = {
  id: decks.id,
  orgId: decks.orgId,
  title: decks.title,
  createdBy: decks.createdBy,
  createdByName: users.name,
  createdAt: decks.createdAt,
  updatedAt: decks.updatedAt,
};

export async function deckForActor(actor: Actor, deckId: string, db?: Db | Tx): Promise<DeckRecord> {
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
export async function slidesOf(deckId: string, visibleOrgIds: readonly string[], db?: Db | Tx): Promise<SlideRecord[]> {
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
