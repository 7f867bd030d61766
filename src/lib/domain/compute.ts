/**
 * Everything the editor and the share page show beside the diagram, computed from a layout on
 * its machine family: tip speed, the crop's rpm window, kernel passage, open area per zone,
 * aggressiveness, capacity and the loss-count rule for the crop.
 */
import { asCatalogIndex, indexFamily, type CatalogIndex } from './catalog';
import {
  aggressivenessIndex,
  capacityFactor,
  elementPassages,
  openAreaByZone,
  threshingElementTypes,
  type CapacityFactor,
  type ElementPassage,
  type OpenAreaByZone,
} from './cage-metrics';
import { cropPrograms } from './crops';
import { cropLossBasis, kernelsPerFt2PerBuAc, kernelsPerM2PerBuAc, type LossBasis } from './loss';
import type { CatalogPart, CropId, DrumId, Layout, MachineFamily } from './schemas';
import { inRpmWindow, rpmWindow, tipSpeed, type RpmWindow } from './speed';
import { mm, msToFpm, rpm, type FeetPerMinute, type MetresPerSecond, type Mm } from './units';

export * from './speed';
export * from './loss';
export * from './cage-metrics';

/** The family's drum option for an id, or its first option when the family lacks that drum. */
export function drumFor(family: MachineFamily, id: DrumId): { id: DrumId; label: string; diameterMm: number } {
  return family.drumOptions.find((d) => d.id === id) ?? family.drumOptions[0]!;
}

export interface Settings {
  crop: CropId;
  drum: DrumId;
  diameterMm: Mm;
  tipSpeedMs: MetresPerSecond;
  tipSpeedFpm: FeetPerMinute;
  rpmWindow: RpmWindow;
  rpmInWindow: boolean;
  passage: ElementPassage[];
  openArea: OpenAreaByZone;
  aggressivenessIndex: number;
  capacity: CapacityFactor;
  lossRule: {
    lbPerBu: number;
    tkwG: number;
    kernelsPerFt2PerBuAc: number;
    kernelsPerM2PerBuAc: number;
    /** A published rule of thumb for this crop, when there is one. */
    published: { value: number; source: string } | null;
    /** The basis a loss check uses by default: the published count where there is one. */
    basis: LossBasis;
  };
  parts: { totalMassKg: number; totalPriceCents: number; count: number };
}

export function computeSettings(family: MachineFamily, catalog: readonly CatalogPart[] | CatalogIndex, layout: Layout): Settings {
  const cat = asCatalogIndex(catalog);
  const fam = indexFamily(family);
  const crop = cropPrograms[layout.crop];
  const drum = drumFor(family, layout.drum);
  const diameterMm = mm(drum.diameterMm);
  const v = tipSpeed(diameterMm, rpm(layout.rotorRpm));
  const speedWindow = rpmWindow(crop, { id: layout.drum, diameterMm: drum.diameterMm });
  const openArea = openAreaByZone(layout, fam, cat);

  let straightBars = 0;
  for (const b of layout.rotorBars) {
    const p = cat.byPartNumber.get(b.partNumber);
    if (p?.kind === 'rotor-bar' && p.barKind === 'straight') straightBars++;
  }
  let totalMassKg = 0;
  let totalPriceCents = 0;
  let count = 0;
  for (const item of [...layout.elements, ...layout.coverPlates, ...layout.rotorBars]) {
    const p = cat.byPartNumber.get(item.partNumber);
    if (!p) continue;
    totalMassKg += p.massKg;
    totalPriceCents += p.priceCents;
    count++;
  }

  return {
    crop: layout.crop,
    drum: layout.drum,
    diameterMm,
    tipSpeedMs: v,
    tipSpeedFpm: msToFpm(v),
    rpmWindow: speedWindow,
    rpmInWindow: inRpmWindow(layout.rotorRpm, speedWindow),
    passage: elementPassages(layout, cat, crop),
    openArea,
    aggressivenessIndex: aggressivenessIndex({
      threshingElements: threshingElementTypes(layout, fam, cat),
      tipSpeed: v,
      clearanceMm: layout.clearanceMm,
      vaneSetting: layout.vaneSetting,
      coverPlates: layout.coverPlates.length,
      straightBars,
    }),
    capacity: capacityFactor(layout.drum, crop, openArea),
    lossRule: {
      lbPerBu: crop.bushel.usLb.value,
      tkwG: crop.tkwG.value,
      kernelsPerFt2PerBuAc: kernelsPerFt2PerBuAc(crop.bushel.usLb.value, crop.tkwG.value),
      kernelsPerM2PerBuAc: kernelsPerM2PerBuAc(crop.bushel.usLb.value, crop.tkwG.value),
      published: crop.publishedLossCount,
      basis: cropLossBasis(crop),
    },
    parts: { totalMassKg: Math.round(totalMassKg * 100) / 100, totalPriceCents, count },
  };
}
