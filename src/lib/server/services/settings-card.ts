import { and, desc, eq } from 'drizzle-orm';
import { getDb } from '~/lib/server/db';
import { catalogParts, layouts, layoutVersions } from '~/db/schema';
import { computeSettings } from '~/lib/domain/compute';
import { checkLayout } from '~/lib/domain/rules';
import type { CatalogPart, CropId, Layout } from '~/lib/domain/schemas';
import type { Actor } from '~/lib/server/access';
import { HttpError } from '~/lib/server/http';
import { installedVersionOf, lastLossCheck } from './field-checks';
import { installedLayout, machineForActor } from './machines';
import { dealerOfOrg, startingValuesFor } from './starting-values';

/** Where the card's cage comes from: what is installed, or the newest saved layout of the crop. */
export type CardSource =
  | { kind: 'installed'; layout: Layout; shareable: { layoutId: string; version: number } | null }
  | { kind: 'saved'; layout: Layout; name: string; shareable: { layoutId: string; version: number } };

/**
 * The settings card of a machine for one crop: the cage, its settings, the dealer's starting
 * values for the rest of the machine, the last loss check, and which saved version a QR code
 * may point to. Another organisation's machine is not found; a crop without a layout on this
 * machine is not found either (the page offers the crops it has).
 */
export async function settingsCard(actor: Actor, machineId: string, wanted?: CropId) {
  const db = await getDb();
  const ctx = await machineForActor(actor, machineId, db);
  const [current, saved, catalogRows, dealerId] = await Promise.all([
    installedLayout(ctx.machine.id, db),
    db
      .select({ id: layouts.id, name: layouts.name, version: layouts.currentVersion, body: layoutVersions.body })
      .from(layouts)
      .innerJoin(layoutVersions, and(eq(layoutVersions.layoutId, layouts.id), eq(layoutVersions.version, layouts.currentVersion)))
      .where(eq(layouts.machineId, ctx.machine.id))
      .orderBy(desc(layouts.updatedAt)),
    // Retired parts still describe what an older layout names.
    db.select({ spec: catalogParts.spec }).from(catalogParts).where(eq(catalogParts.familyId, ctx.family.id)),
    dealerOfOrg(ctx.machine.orgId, db),
  ]);
  const catalog: CatalogPart[] = catalogRows.map((r) => r.spec);
  const crops = [...new Set([current?.layout.crop, ...saved.map((s) => s.body.crop)].filter((c): c is CropId => !!c))];
  const crop = wanted ?? current?.layout.crop ?? crops[0];
  if (!crop) throw new HttpError(404, 'This machine has no layout yet: save or install one first.', 'crop');

  let source: CardSource | null = null;
  if (current && current.layout.crop === crop) {
    source = { kind: 'installed', layout: current.layout, shareable: await installedVersionOf(db, ctx.machine.id, current.layout) };
  } else {
    const s = saved.find((x) => x.body.crop === crop);
    if (s) source = { kind: 'saved', layout: s.body, name: s.name, shareable: { layoutId: s.id, version: s.version } };
  }
  if (!source) throw new HttpError(404, `No layout for this crop on ${ctx.machine.nickname}.`, 'crop');

  const [start, last] = await Promise.all([
    dealerId ? startingValuesFor(dealerId, ctx.family.id, crop, db) : Promise.resolve(null),
    lastLossCheck(ctx.machine.id, crop, db),
  ]);
  return {
    ...ctx,
    crop,
    crops,
    source,
    catalog,
    settings: computeSettings(ctx.family, catalog, source.layout),
    findings: checkLayout(ctx.family, catalog, source.layout),
    startingValues: start,
    lastCheck: last,
    generatedAt: new Date(),
  };
}
