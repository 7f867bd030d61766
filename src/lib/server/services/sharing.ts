import { and, desc, eq, inArray, isNotNull, sql } from 'drizzle-orm';
import { z } from 'zod';
import { getDb } from '~/lib/server/db';
import { catalogParts, layouts, layoutVersions, machines, organisations, shareLinks, users } from '~/db/schema';
import { computeSettings } from '~/lib/domain/compute';
import { checkLayout } from '~/lib/domain/rules';
import type { CatalogPart } from '~/lib/domain/schemas';
import { currencyFor, priceCatalogFor } from './prices';
import type { Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError, notFound } from '~/lib/server/http';
import { familyById } from './machines';
import { hashToken, lookUpToken, newToken, statusOf } from '~/lib/server/share-links';

export const createShareSchema = z.object({
  layoutId: z.uuid(),
  /** The saved version to share; the link keeps showing that version after later saves. */
  version: z.int32().min(1),
  label: z.string().trim().max(120).default(''),
  /** Optional end of the link's life (ISO 8601 with an offset); must lie in the future. */
  expiresAt: z.iso.datetime({ offset: true, error: 'give a date and time such as 2026-09-30T18:00:00Z' }).nullable().optional(),
});

export const shareListQuerySchema = z.object({
  layoutId: z.uuid().optional(),
  status: z.enum(['active', 'all']).default('all'),
});

export async function createShareLink(actor: Actor, input: z.infer<typeof createShareSchema>) {
  const db = await getDb();
  const [layout] = await db
    .select()
    .from(layouts)
    .where(and(eq(layouts.id, input.layoutId), inArray(layouts.orgId, actor.visibleOrgIds)))
    .limit(1);
  if (!layout) throw notFound('Layout not found', 'layoutId');
  const [version] = await db
    .select({ id: layoutVersions.id })
    .from(layoutVersions)
    .where(and(eq(layoutVersions.layoutId, layout.id), eq(layoutVersions.version, input.version)))
    .limit(1);
  if (!version) throw new HttpError(400, `version: this layout has no version ${input.version}`, 'version');
  const expiresAt = input.expiresAt ? new Date(input.expiresAt) : null;
  if (expiresAt && expiresAt.getTime() <= Date.now()) throw new HttpError(400, 'expiresAt: choose a time in the future', 'expiresAt');
  const token = newToken();
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(shareLinks)
      .values({
        orgId: layout.orgId,
        tokenHash: hashToken(token),
        layoutVersionId: version.id,
        label: input.label,
        expiresAt,
        createdBy: actor.id,
      })
      .returning();
    await audit(
      tx,
      actor,
      'share',
      'share-link',
      row!.id,
      { layoutId: layout.id, version: input.version, label: input.label, expiresAt: expiresAt?.toISOString() ?? null },
      layout.orgId,
    );
    const { tokenHash: _hidden, ...link } = row!;
    return { link: { ...link, layoutId: layout.id, version: input.version, status: statusOf(row!) }, token, path: `/share/${token}` };
  });
}

/** The share links of layouts the actor may see (never their tokens: only hashes are kept). */
export async function listShareLinks(actor: Actor, query: z.infer<typeof shareListQuerySchema>) {
  const db = await getDb();
  const where = [inArray(shareLinks.orgId, actor.visibleOrgIds), isNotNull(shareLinks.layoutVersionId)];
  if (query.layoutId) where.push(eq(layoutVersions.layoutId, query.layoutId));
  const rows = await db
    .select({
      id: shareLinks.id,
      label: shareLinks.label,
      createdAt: shareLinks.createdAt,
      expiresAt: shareLinks.expiresAt,
      revokedAt: shareLinks.revokedAt,
      createdByName: users.name,
      layoutId: layoutVersions.layoutId,
      version: layoutVersions.version,
      layoutName: layouts.name,
      machineId: layouts.machineId,
      machineNickname: machines.nickname,
      orgId: shareLinks.orgId,
    })
    .from(shareLinks)
    .innerJoin(layoutVersions, eq(layoutVersions.id, shareLinks.layoutVersionId))
    .innerJoin(layouts, eq(layouts.id, layoutVersions.layoutId))
    .innerJoin(machines, eq(machines.id, layouts.machineId))
    .leftJoin(users, eq(users.id, shareLinks.createdBy))
    .where(and(...where))
    .orderBy(desc(shareLinks.createdAt));
  const now = new Date();
  const out = rows.map((r) => ({ ...r, status: statusOf(r, now) }));
  return query.status === 'active' ? out.filter((r) => r.status === 'active') : out;
}

export async function revokeShareLink(actor: Actor, id: string) {
  const db = await getDb();
  const [row] = await db
    .select()
    .from(shareLinks)
    .where(and(eq(shareLinks.id, id), inArray(shareLinks.orgId, actor.visibleOrgIds)))
    .limit(1);
  if (!row) throw notFound('Share link not found', 'id');
  if (row.revokedAt) return { id: row.id, revokedAt: row.revokedAt, status: 'revoked' as const };
  return db.transaction(async (tx) => {
    const [done] = await tx
      .update(shareLinks)
      .set({ revokedAt: sql`now()` })
      .where(eq(shareLinks.id, row.id))
      .returning({ id: shareLinks.id, revokedAt: shareLinks.revokedAt });
    await audit(tx, actor, 'revoke', 'share-link', row.id, { label: row.label }, row.orgId);
    return { ...done!, status: 'revoked' as const };
  });
}

export type ResolvedShare =
  { status: 'not-found' } | { status: 'expired'; expiresAt: Date } | { status: 'ok'; view: Awaited<ReturnType<typeof shareView>> };

/**
 * What a share token opens, read-only. An unknown or revoked token is simply not found (404);
 * a link past its expiry is gone (410). Nothing is written on the way.
 */
export async function resolveShareToken(token: string): Promise<ResolvedShare> {
  const found = await lookUpToken(token, 'layout');
  if (found.status !== 'ok') return found;
  const { row } = found;
  const view = await shareView(row.layoutVersionId!);
  if (!view) return { status: 'not-found' };
  return { status: 'ok', view: { ...view, link: { label: row.label, expiresAt: row.expiresAt, createdAt: row.createdAt } } };
}

async function shareView(layoutVersionId: string) {
  const db = await getDb();
  const [v] = await db
    .select({
      version: layoutVersions.version,
      body: layoutVersions.body,
      note: layoutVersions.note,
      savedAt: layoutVersions.createdAt,
      layoutName: layouts.name,
      machineNickname: machines.nickname,
      machineSerial: machines.serial,
      familyId: machines.familyId,
      orgId: machines.orgId,
      orgName: organisations.name,
    })
    .from(layoutVersions)
    .innerJoin(layouts, eq(layouts.id, layoutVersions.layoutId))
    .innerJoin(machines, eq(machines.id, layouts.machineId))
    .innerJoin(organisations, eq(organisations.id, machines.orgId))
    .where(eq(layoutVersions.id, layoutVersionId))
    .limit(1);
  if (!v) return null;
  const family = await familyById(v.familyId);
  if (!family) return null;
  // Retired parts still describe what an older version names, so the shared view lists them too.
  // Prices as the machine's dealer charges them (services/prices.ts).
  const catalog: CatalogPart[] = await priceCatalogFor(
    (await db.select({ spec: catalogParts.spec }).from(catalogParts).where(eq(catalogParts.familyId, family.id))).map((r) => r.spec),
    v.orgId,
    db,
  );
  return {
    ...v,
    family,
    catalog,
    currency: await currencyFor(v.orgId, db),
    findings: checkLayout(family, catalog, v.body),
    settings: computeSettings(family, catalog, v.body),
    link: null as null | { label: string; expiresAt: Date | null; createdAt: Date },
  };
}
