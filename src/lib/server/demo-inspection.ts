import { and, eq } from 'drizzle-orm';
import sharp from 'sharp';
import type { Db } from './db';
import * as t from '~/db/schema';
import {
  buildChecklist,
  clearanceReadingKey,
  countSeverities,
  replacementLines,
  type ConditionId,
  type InspectionSeverity,
} from '~/lib/domain/inspection';
import type { CatalogPart } from '~/lib/domain/schemas';
import { storage, type ObjectStorage } from './storage';
import { ServiceUnavailableError } from './deadline';
import { makeThumbnail, photoKeys } from './services/photos';

/** The demo machine inspected before the season, and who did it (all invented). */
const DEMO_SERIAL = 'LK-2291-A';
const DEMO_INSPECTOR = 'tomas@kestrel.example';
const DAY = 24 * 3600 * 1000;

interface Finding {
  conditions: ConditionId[];
  severity: InspectionSeverity;
  wearMm?: number;
  note: string;
  photos?: ('wires' | 'bent')[];
}

const FINDINGS: Record<string, Finding> = {
  'element:1:left': {
    conditions: ['wires-missing', 'edge-wear'],
    severity: 'replace',
    wearMm: 7.5,
    note: 'Three wires gone near the front edge; bars dished 7.5 mm under the straight edge.',
    photos: ['wires', 'bent'],
  },
  'element:2:right': {
    conditions: ['bent-bars'],
    severity: 'replace',
    wearMm: 4.5,
    note: 'Two bars pushed in, probably a stone last autumn. Not worth straightening.',
    photos: ['bent'],
  },
  'element:3:left': {
    conditions: ['bolts-loose'],
    severity: 'watch',
    note: 'Rear bolt was finger-loose; tightened. Check after the first week.',
  },
  'row:1': { conditions: ['edge-wear'], severity: 'watch', wearMm: 3.5, note: 'Leading edges rounding; fine for this season.' },
};

/** A stand-in photograph drawn as an image: parallel wires over bars, some missing or bent. */
async function demoPicture(kind: 'wires' | 'bent', seed: number): Promise<Uint8Array> {
  const w = 800;
  const h = 600;
  const bars = [90, 250, 410, 570].map((x) => `<rect x="${x}" y="0" width="34" height="${h}" fill="#5c6670"/>`).join('');
  const wires: string[] = [];
  for (let y = 40, i = 0; y < h; y += 38, i++) {
    if (kind === 'wires' && (i === 3 || i === 4 || i === 6)) continue; // missing wires
    const sag = kind === 'bent' && i >= 5 && i <= 8 ? 26 : 0;
    wires.push(`<path d="M0 ${y} L300 ${y} Q400 ${y + sag} 500 ${y} L${w} ${y}" stroke="#aab3bc" stroke-width="9" fill="none"/>`);
  }
  const grime = Array.from({ length: 40 }, (_, i) => {
    const x = (i * 197 + seed * 61) % w;
    const y = (i * 113 + seed * 29) % h;
    return `<circle cx="${x}" cy="${y}" r="${6 + ((i * 7) % 14)}" fill="#3a2f22" opacity="0.25"/>`;
  }).join('');
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}">
    <rect width="${w}" height="${h}" fill="#2b3036"/>${bars}${wires.join('')}${grime}
    <rect x="40" y="${h - 90}" width="${w - 80}" height="14" fill="#d9b24c"/>
  </svg>`;
  return new Uint8Array(await sharp(Buffer.from(svg)).jpeg({ quality: 80 }).toBuffer());
}

/**
 * The demo's finished pre-season inspection of Larkspur's modular machine: two elements flagged
 * for replacement (their parts on a draft request), one line to watch, photos of the damage and
 * a clearance survey with one uneven position. Skips quietly when the demo machine is missing;
 * if storage refuses the photos, the inspection is kept without them.
 */
export async function seedDemoInspection(db: Db, store: ObjectStorage = storage()) {
  const [machine] = await db.select().from(t.machines).where(eq(t.machines.serial, DEMO_SERIAL)).limit(1);
  if (!machine) return;
  const [inst] = await db.select().from(t.installed).where(eq(t.installed.machineId, machine.id)).limit(1);
  const [family] = await db.select().from(t.families).where(eq(t.families.id, machine.familyId)).limit(1);
  const [inspector] = await db.select().from(t.users).where(eq(t.users.email, DEMO_INSPECTOR)).limit(1);
  const [org] = await db.select().from(t.organisations).where(eq(t.organisations.id, machine.orgId)).limit(1);
  if (!inst || !family || !inspector || !org) return;
  const catalog: CatalogPart[] = (
    await db.select({ spec: t.catalogParts.spec }).from(t.catalogParts).where(eq(t.catalogParts.familyId, family.id))
  ).map((r) => r.spec);
  const lines = buildChecklist(family.spec, inst.layout, catalog);
  const set = inst.layout.clearanceMm;
  const actor = { id: inspector.id, homeOrgId: org.dealerId ?? org.id };
  const startedAt = new Date(Date.now() - 3 * DAY);
  const finishedAt = new Date(startedAt.getTime() + 2 * 3600 * 1000);

  const pictures: { itemKey: string; bytes: Uint8Array; thumb: Uint8Array }[] = [];
  try {
    let n = 0;
    for (const [key, f] of Object.entries(FINDINGS))
      for (const kind of f.photos ?? []) {
        const bytes = await demoPicture(kind, ++n);
        pictures.push({ itemKey: key, bytes, thumb: await makeThumbnail(bytes) });
      }
  } catch (err) {
    console.error('cagewright: demo photos could not be drawn; the demo inspection has none:', err);
    pictures.length = 0;
  }

  // The photos go to the object store before the transaction (a slow store never holds the
  // database), the rows after; objects of a failed seed are left to the orphan sweep.
  const inspectionId = crypto.randomUUID();
  const stored: { itemKey: string; bytes: Uint8Array; photoId: string; keys: ReturnType<typeof photoKeys> }[] = [];
  for (const p of pictures) {
    const photoId = crypto.randomUUID();
    const keys = photoKeys(inspectionId, photoId, 'image/jpeg');
    try {
      await store.put(keys.original, p.bytes, 'image/jpeg');
      await store.put(keys.thumb, p.thumb, 'image/jpeg');
      stored.push({ itemKey: p.itemKey, bytes: p.bytes, photoId, keys });
    } catch (err) {
      console.error(`cagewright: a demo photo could not be stored (${store.where}); the demo inspection goes without it:`, err);
      if (err instanceof ServiceUnavailableError && err.timedOut) break; // the store is away: don't wait for each photo
    }
  }

  await db.transaction(async (tx) => {
    const [insp] = await tx
      .insert(t.inspections)
      .values({
        id: inspectionId,
        machineId: machine.id,
        orgId: machine.orgId,
        status: 'finished',
        title: 'Pre-season inspection',
        startedBy: inspector.id,
        startedAt,
        finishedAt,
      })
      .returning();
    const items: { id: string; placeKey: string; partNumber: string | null; severity: InspectionSeverity }[] = [];
    for (const [i, l] of lines.entries()) {
      const f = FINDINGS[l.placeKey];
      let measurements = { ...l.measurements };
      let severity: InspectionSeverity = f?.severity ?? 'ok';
      let note = f?.note ?? '';
      if (f?.wearMm !== undefined) measurements.wearMm = f.wearMm;
      if (l.kind === 'survey') {
        measurements = {
          ...measurements,
          ...surveyReadings(
            family.spec.positions.map((p) => p.index),
            set,
          ),
        };
        severity = 'watch';
        note = 'Position 2 sits wider on the right at the front; levelled the hanger and re-measured within tolerance.';
      }
      const [row] = await tx
        .insert(t.inspectionItems)
        .values({
          inspectionId: insp!.id,
          placeKey: l.placeKey,
          partNumber: l.partNumber,
          label: l.label,
          conditions: f?.conditions ?? [],
          severity,
          measurements,
          note,
          position: i,
        })
        .returning();
      items.push({ id: row!.id, placeKey: row!.placeKey, partNumber: row!.partNumber, severity });
    }
    for (const p of stored) {
      const item = items.find((x) => x.placeKey === p.itemKey)!;
      await tx.insert(t.photos).values({
        id: p.photoId,
        itemId: item.id,
        orgId: machine.orgId,
        storageKey: p.keys.original,
        thumbKey: p.keys.thumb,
        contentType: 'image/jpeg',
        bytes: p.bytes.byteLength,
        createdBy: inspector.id,
        createdAt: new Date(startedAt.getTime() + 30 * 60 * 1000),
      });
    }
    const { lines: parts } = replacementLines(items, inst.layout, catalog, family.spec);
    const request = parts.length
      ? await demoDraftRequest(tx, actor, {
          orgId: machine.orgId,
          dealerOrgId: org.dealerId,
          machineId: machine.id,
          source: 'inspection',
          lines: parts,
          note: `Replacements for ${machine.nickname} (serial ${machine.serial}) from the pre-season inspection.`,
        })
      : null;
    await tx.insert(t.auditLog).values([
      {
        at: startedAt,
        userId: inspector.id,
        orgId: machine.orgId,
        action: 'start',
        entity: 'inspection',
        entityId: insp!.id,
        detail: { machineId: machine.id, demo: true },
      },
      {
        at: finishedAt,
        userId: inspector.id,
        orgId: machine.orgId,
        action: 'finish',
        entity: 'inspection',
        entityId: insp!.id,
        detail: { machineId: machine.id, counts: countSeverities(items), partsRequestId: request?.id ?? null, lines: parts, demo: true },
      },
    ]);
  });
}

/** Readings on both sides, front and rear of each position: even, except position 2 right front. */
function surveyReadings(positions: number[], setMm: number): Record<string, number> {
  const out: Record<string, number> = {};
  for (const p of positions)
    for (const side of ['left', 'right'] as const)
      for (const end of ['front', 'rear'] as const) {
        const wobble = ((p * 3 + (side === 'left' ? 1 : 2) + (end === 'front' ? 0 : 1)) % 3) * 0.3;
        out[clearanceReadingKey(p, side, end)] =
          Math.round((setMm + wobble + (p === 2 && side === 'right' && end === 'front' ? 3.5 : 0)) * 10) / 10;
      }
  return out;
}

/**
 * The demo's draft request for the flagged parts, written straight into the table like the
 * rest of the seed (the store is still opening, so the parts-request service cannot be used).
 * Adds to the machine's inspection draft when one exists.
 */
async function demoDraftRequest(
  tx: Pick<Db, 'select' | 'insert' | 'update'>,
  actor: { id: string; homeOrgId: string },
  input: { orgId: string; dealerOrgId: string | null; machineId: string; source: 'inspection'; lines: t.PartsRequestLine[]; note: string },
): Promise<{ id: string }> {
  const [draft] = await tx
    .select()
    .from(t.partsRequests)
    .where(
      and(eq(t.partsRequests.machineId, input.machineId), eq(t.partsRequests.status, 'draft'), eq(t.partsRequests.source, input.source)),
    )
    .limit(1);
  if (draft) {
    const lines = draft.lines.map((l) => ({ ...l }));
    for (const l of input.lines) {
      const same = lines.find((x) => x.partNumber === l.partNumber);
      if (same) same.quantity += l.quantity;
      else lines.push({ ...l });
    }
    await tx
      .update(t.partsRequests)
      .set({ lines, note: draft.note ? `${draft.note}\n${input.note}` : input.note })
      .where(eq(t.partsRequests.id, draft.id));
    return { id: draft.id };
  }
  const [row] = await tx
    .insert(t.partsRequests)
    .values({
      orgId: input.orgId,
      dealerOrgId: input.dealerOrgId,
      machineId: input.machineId,
      source: input.source,
      status: 'draft',
      lines: input.lines,
      note: input.note,
      createdBy: actor.id,
    })
    .returning({ id: t.partsRequests.id });
  await tx.insert(t.auditLog).values({
    userId: actor.id,
    orgId: input.orgId,
    action: 'create',
    entity: 'parts-request',
    entityId: row!.id,
    detail: { source: input.source, lines: input.lines, demo: true },
  });
  return { id: row!.id };
}
