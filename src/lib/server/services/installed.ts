import { count, desc, eq, inArray, or, sql } from 'drizzle-orm';
import { z } from 'zod';
import { getDb } from '~/lib/server/db';
import { auditLog, installed, layouts, layoutVersions, shareLinks, users } from '~/db/schema';
import { checkLayout } from '~/lib/domain/rules';
import { layoutSchema, type Layout } from '~/lib/domain/schemas';
import type { Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError, whenNotFound } from '~/lib/server/http';
import { checkStateless } from './check';
import { catalogForFamily, machineForActor } from './machines';
import { versionOf } from './layouts';
import { recordInstallHistory } from './part-history';

/**
 * What is bolted in a machine today: either a layout document, or a saved layout version of
 * this machine that was just fitted ("mark as installed").
 */
export const putInstalledSchema = z
  .object({
    layout: layoutSchema.optional(),
    fromLayout: z.object({ layoutId: z.uuid(), version: z.int32().min(1) }).optional(),
  })
  .superRefine((v, ctx) => {
    if (!v.layout === !v.fromLayout)
      ctx.addIssue({ code: 'custom', path: ['layout'], message: 'give either a layout or fromLayout (a saved version), not both' });
  });

export async function getInstalled(actor: Actor, machineId: string) {
  const ctx = await machineForActor(actor, machineId);
  const db = await getDb();
  const [row] = await db
    .select({ layout: installed.layout, updatedAt: installed.updatedAt, updatedByName: users.name })
    .from(installed)
    .leftJoin(users, eq(users.id, installed.updatedBy))
    .where(eq(installed.machineId, ctx.machine.id))
    .limit(1);
  if (!row) return { machineId: ctx.machine.id, installed: null, findings: [] };
  const catalog = await catalogForFamily(ctx.family.id);
  return { machineId: ctx.machine.id, installed: row, findings: checkLayout(ctx.family, catalog, row.layout) };
}

export async function putInstalled(actor: Actor, machineId: string, input: z.infer<typeof putInstalledSchema>) {
  const ctx = await machineForActor(actor, machineId);
  let layout: Layout;
  let source: Record<string, unknown> = {};
  let from: { layoutId: string; version: number } | null = null;
  if (input.fromLayout) {
    const db = await getDb();
    const [l] = await db.select().from(layouts).where(eq(layouts.id, input.fromLayout.layoutId)).limit(1);
    if (!l || l.machineId !== ctx.machine.id)
      throw new HttpError(400, 'fromLayout.layoutId: not a layout of this machine', 'fromLayout.layoutId');
    layout = (
      await versionOf(l.id, input.fromLayout.version).catch(
        whenNotFound(
          () => new HttpError(400, `fromLayout.version: this layout has no version ${input.fromLayout!.version}`, 'fromLayout.version'),
        ),
      )
    ).body;
    source = { fromLayout: l.id, version: input.fromLayout.version };
    from = { layoutId: l.id, version: input.fromLayout.version };
  } else {
    layout = input.layout!;
    if (layout.familyId !== ctx.machine.familyId)
      throw new HttpError(400, `layout.familyId: this machine is of family ${ctx.machine.familyId}`, 'layout.familyId');
  }
  // Unknown part numbers are bad input, named by field (same check as the stateless check).
  const { findings } = await checkStateless(layout);
  const db = await getDb();
  await db.transaction(async (tx) => {
    // Part history first, while the installed row still holds what comes out.
    const history = await recordInstallHistory(tx, actor, ctx.machine, layout);
    await tx
      .insert(installed)
      .values({
        machineId: ctx.machine.id,
        layout,
        sourceLayoutId: from?.layoutId ?? null,
        sourceVersion: from?.version ?? null,
        updatedBy: actor.id,
      })
      .onConflictDoUpdate({
        target: installed.machineId,
        set: {
          layout,
          sourceLayoutId: from?.layoutId ?? null,
          sourceVersion: from?.version ?? null,
          updatedBy: actor.id,
          updatedAt: sql`now()`,
        },
      });
    await audit(tx, actor, 'install', 'machine', ctx.machine.id, { crop: layout.crop, ...source, parts: history }, ctx.machine.orgId);
  });
  return getInstalled(actor, machineId).then((r) => ({ ...r, findings }));
}

/** How many layouts the machine page (and its API) shows at a time. */
export const LAYOUTS_SHOWN = 50;

/**
 * The machine page's data: the machine, its family, what is installed, one page of its layouts
 * (most recently changed first, LAYOUTS_SHOWN at a time) with their total, and its recent
 * activity (over all its layouts, not only the ones on the page).
 */
export async function machineOverview(actor: Actor, machineId: string, layoutPage = 1) {
  const ctx = await machineForActor(actor, machineId);
  const db = await getDb();
  const [inst, layoutRows, [counted], activity] = await Promise.all([
    getInstalled(actor, machineId),
    db
      .select({
        id: layouts.id,
        name: layouts.name,
        currentVersion: layouts.currentVersion,
        updatedAt: layouts.updatedAt,
        crop: sql<string>`${layoutVersions.body} ->> 'crop'`,
        savedByName: users.name,
        activeShares: sql<number>`(select count(*)::int from ${shareLinks} s join ${layoutVersions} lv on lv.id = s.layout_version_id
          where lv.layout_id = layouts.id and s.revoked_at is null and (s.expires_at is null or s.expires_at > now()))`,
      })
      .from(layouts)
      .innerJoin(layoutVersions, sql`${layoutVersions.layoutId} = ${layouts.id} and ${layoutVersions.version} = ${layouts.currentVersion}`)
      .leftJoin(users, eq(users.id, layoutVersions.createdBy))
      .where(eq(layouts.machineId, ctx.machine.id))
      .orderBy(desc(layouts.updatedAt), desc(layouts.id))
      .limit(LAYOUTS_SHOWN)
      .offset((Math.max(1, layoutPage) - 1) * LAYOUTS_SHOWN),
    db.select({ n: count() }).from(layouts).where(eq(layouts.machineId, ctx.machine.id)),
    recentActivity(ctx.machine.id),
  ]);
  return {
    ...ctx,
    installed: inst.installed,
    installedFindings: inst.findings,
    layouts: layoutRows,
    layoutTotal: counted?.n ?? 0,
    layoutPage: Math.max(1, layoutPage),
    activity,
  };
}

/**
 * The audit trail of a machine and all its layouts, newest first: who did what, when, with the
 * layout's name (read through audit_log_entity_idx, however many layouts and saves there are).
 */
export async function recentActivity(machineId: string, limit = 20) {
  const db = await getDb();
  const ofMachine = db
    .select({ id: sql<string>`${layouts.id}::text` })
    .from(layouts)
    .where(eq(layouts.machineId, machineId));
  return db
    .select({
      at: auditLog.at,
      action: auditLog.action,
      entity: auditLog.entity,
      entityId: auditLog.entityId,
      detail: auditLog.detail,
      byName: users.name,
      layoutName: layouts.name,
    })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.userId))
    .leftJoin(layouts, sql`${auditLog.entity} = 'layout' and ${layouts.id}::text = ${auditLog.entityId}`)
    .where(or(eq(auditLog.entityId, machineId), inArray(auditLog.entityId, ofMachine)))
    .orderBy(desc(auditLog.at), desc(auditLog.id))
    .limit(limit);
}
