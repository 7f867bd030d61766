/**
 * What the classroom pages show: a deck's slides with each layout's family, findings and
 * computed settings (present, presenter and shared views), and the two sides of a comparison.
 * Pages call these directly; the deck's own writes live in decks.ts.
 */
import { and, eq, inArray } from 'drizzle-orm';
import { getDb } from '~/lib/server/db';
import { catalogParts, deckSlides, decks, layouts, layoutVersions, machines, organisations } from '~/db/schema';
import { computeSettings, type Settings } from '~/lib/domain/compute';
import {
  cropIdSchema,
  slugSchema,
  type CatalogPart,
  type CropId,
  type Finding,
  type Layout,
  type MachineFamily,
} from '~/lib/domain/schemas';
import { cropPrograms } from '~/lib/domain/crops';
import { starterLayout } from '~/lib/domain/starter';
import { checkLayout } from '~/lib/domain/rules';
import type { Actor } from '~/lib/server/access';
import { HttpError, notFound } from '~/lib/server/http';
import { getDeck, resolveDeckShareToken, type DeckRecord, type SlideRecord } from './decks';
import { catalogForFamily, familyById, familyChoices } from './machines';

export interface SlideView extends SlideRecord {
  familyId: string | null;
  findings: Finding[];
  settings: Settings | null;
}

export interface DeckShow {
  deck: DeckRecord;
  slides: SlideView[];
  families: Record<string, MachineFamily>;
  /** Every part of each family, retired ones too: an older layout may still name them. */
  catalogs: Record<string, CatalogPart[]>;
}

async function fullCatalog(familyId: string): Promise<CatalogPart[]> {
  const db = await getDb();
  const rows = await db.select({ spec: catalogParts.spec }).from(catalogParts).where(eq(catalogParts.familyId, familyId));
  return rows.map((r) => r.spec);
}

/** Families and catalogs for a set of family ids (unknown ids are left out). */
export async function familyContext(familyIds: Iterable<string>) {
  const families: Record<string, MachineFamily> = {};
  const catalogs: Record<string, CatalogPart[]> = {};
  for (const id of new Set(familyIds)) {
    const family = await familyById(id);
    if (!family) continue;
    families[id] = family;
    catalogs[id] = await fullCatalog(id);
  }
  return { families, catalogs };
}

export async function showSlides(deck: DeckRecord, slides: SlideRecord[]): Promise<DeckShow> {
  const { families, catalogs } = await familyContext(slides.flatMap((s) => (s.layout ? [s.layout.familyId] : [])));
  const views = slides.map((s): SlideView => {
    const family = s.layout ? families[s.layout.familyId] : undefined;
    if (!s.layout || !family) return { ...s, layout: family ? s.layout : null, familyId: null, findings: [], settings: null };
    const catalog = catalogs[family.id]!;
    return {
      ...s,
      familyId: family.id,
      findings: checkLayout(family, catalog, s.layout),
      settings: computeSettings(family, catalog, s.layout),
    };
  });
  return { deck, slides: views, families, catalogs };
}

/** A deck as the presentation shows it, for a signed-in viewer. */
export async function deckShow(actor: Actor, deckId: string): Promise<DeckShow> {
  const { deck, slides } = await getDeck(actor, deckId);
  return showSlides(deck, slides);
}

/** A deck as its share link shows it; see resolveDeckShareToken for the statuses. */
export async function sharedDeckShow(token: string) {
  const r = await resolveDeckShareToken(token);
  if (r.status !== 'ok') return r;
  return { status: 'ok' as const, show: await showSlides(r.deck, r.slides), link: r.link };
}

// ---------------------------------------------------------------------------------------------
// Compare: what a side of the comparison may be

/**
 * A layout to compare, written in the query string:
 *   version:<layout version id> (or the bare id) · slide:<deck slide id> · starter:<family>:<crop>
 */
export type CompareRef =
  { kind: 'version'; id: string } | { kind: 'slide'; id: string } | { kind: 'starter'; familyId: string; crop: CropId };

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function parseCompareRef(raw: string | null | undefined): CompareRef | null {
  if (!raw) return null;
  if (UUID.test(raw)) return { kind: 'version', id: raw };
  const [kind, ...rest] = raw.split(':');
  if ((kind === 'version' || kind === 'slide') && rest.length === 1 && UUID.test(rest[0]!)) return { kind, id: rest[0]! };
  if (kind === 'starter' && rest.length === 2) {
    const family = slugSchema.safeParse(rest[0]);
    const crop = cropIdSchema.safeParse(rest[1]);
    if (family.success && crop.success) return { kind: 'starter', familyId: family.data, crop: crop.data };
  }
  return null;
}

export function compareRefString(ref: CompareRef): string {
  return ref.kind === 'starter' ? `starter:${ref.familyId}:${ref.crop}` : `${ref.kind}:${ref.id}`;
}

export interface CompareSideSource {
  ref: string;
  /** What the side is, in a few words: "wheat setup v1 · North Quarter". */
  label: string;
  detail: string;
  layout: Layout;
  family: MachineFamily;
  catalog: CatalogPart[];
}

/** One side of a comparison, as the actor may see it; anything else is not found. */
export async function compareSide(actor: Actor, ref: CompareRef, field: string): Promise<CompareSideSource> {
  const db = await getDb();
  let layout: Layout;
  let label: string;
  let detail: string;
  if (ref.kind === 'version') {
    const [v] = await db
      .select({
        body: layoutVersions.body,
        version: layoutVersions.version,
        name: layouts.name,
        nickname: machines.nickname,
        orgName: organisations.name,
      })
      .from(layoutVersions)
      .innerJoin(layouts, eq(layouts.id, layoutVersions.layoutId))
      .innerJoin(machines, eq(machines.id, layouts.machineId))
      .innerJoin(organisations, eq(organisations.id, machines.orgId))
      .where(and(eq(layoutVersions.id, ref.id), inArray(layouts.orgId, actor.visibleOrgIds)))
      .limit(1);
    if (!v) throw notFound('Layout version not found', field);
    layout = v.body;
    label = `${v.name}, version ${v.version}`;
    detail = `${v.nickname} · ${v.orgName}`;
  } else if (ref.kind === 'slide') {
    const [s] = await db
      .select({ deckId: deckSlides.deckId, title: deckSlides.title, position: deckSlides.position, deckTitle: decks.title })
      .from(deckSlides)
      .innerJoin(decks, eq(decks.id, deckSlides.deckId))
      .where(and(eq(deckSlides.id, ref.id), inArray(decks.orgId, actor.visibleOrgIds)))
      .limit(1);
    if (!s) throw notFound('Slide not found', field);
    const { slides } = await getDeck(actor, s.deckId);
    const slide = slides.find((x) => x.id === ref.id);
    if (!slide?.layout) throw notFound('This slide has no layout to compare', field);
    layout = slide.layout;
    label = slide.title;
    detail = `Slide ${s.position} of “${s.deckTitle}”`;
  } else {
    const family = await familyById(ref.familyId);
    if (!family) throw notFound('Machine family not found', field);
    layout = starterLayout(family, ref.crop, await catalogForFamily(family.id));
    label = `Suggested start for ${cropPrograms[ref.crop].name.toLowerCase()}`;
    detail = `${family.name} · sample layout`;
  }
  const family = await familyById(layout.familyId);
  if (!family) throw new HttpError(404, 'The layout’s machine family no longer exists', field);
  return { ref: compareRefString(ref), label, detail, layout, family, catalog: await fullCatalog(family.id) };
}

/** What the compare page's chooser offers: layouts on visible machines and a starter per crop. */
export async function compareChoices(
  versions: { layoutVersionId: string; layoutName: string; version: number; machineNickname: string; orgName: string; crop: CropId }[],
) {
  const families = await familyChoices();
  return [
    ...versions.map((v) => ({
      ref: `version:${v.layoutVersionId}`,
      group: 'Layouts on machines',
      label: `${v.orgName} · ${v.machineNickname} · ${v.layoutName} (v${v.version}, ${cropPrograms[v.crop].name.toLowerCase()})`,
    })),
    ...families.flatMap((f) =>
      cropIdSchema.options.map((crop) => ({
        ref: `starter:${f.id}:${crop}`,
        group: `Suggested starts · ${f.name}`,
        label: `${f.name} · ${cropPrograms[crop].name}`,
      })),
    ),
  ];
}
