/**
 * A starting layout for a family and a crop: what a new layout, a teaching sample and the planner's
 * target begin from. Domain logic over any catalog (demo or a dealer's), kept out of the demo data.
 */
import { cropPrograms } from './crops';
import { isDischargeMount, rotorModel } from './rotor';
import { drumFor } from './compute';
import { rpmWindow, startRpm } from './speed';
import { adviseVaneSetting } from './vanes';
import { passageMargin } from './cage-metrics';
import type {
  CatalogPart,
  CropId,
  DrumId,
  ElementPart,
  ElementRole,
  Layout,
  MachineFamily,
  Side,
  VaneControl,
  VaneSetting,
  Zone,
} from './schemas';
import { LAYOUT_FORMAT } from './schemas';

const HANDS: readonly Side[] = ['left', 'right'];

export interface StarterOptions {
  drum?: DrumId;
  vaneControl?: VaneControl;
}

/** A vane setting the crop suits and the control can take (the slower one where the crop is hard to thresh). */
function vaneSettingFor(crop: CropId, control: VaneControl): VaneSetting {
  const c = cropPrograms[crop];
  const from: VaneSetting = c.threshability === 'hard' ? 'slow' : c.fragile ? 'fast' : 'medium';
  return adviseVaneSetting(control, c.vanes.suits, from);
}

/**
 * A layout for `family` in `crop` that the rules pass (advice at most): the crop's suggested
 * element in each half-position, correctly handed and of the right role, rasp bars on every
 * rotor mount (one straight bar across each in-line pair for corn, spike rasp bars on those mounts
 * otherwise; an opposite pair of discharge bars at the rear and one ahead of it for hemp), and a
 * right cover plate for hard-threshing crops. Settings start slow and wide: the rotor at the slow
 * end of the crop's speed window (its "start here" band where it has one) on the chosen drum, the
 * concave at the wide end of its clearance window, and vanes the crop suits that the control can
 * take; tighten only as losses call for it (Iowa State University Extension, Hanna, 2017).
 * Falls back to any element of the family that fits and passes the kernel when the suggested
 * type is missing from the catalog.
 */
export function starterLayout(family: MachineFamily, crop: CropId, catalog: readonly CatalogPart[], options: StarterOptions = {}): Layout {
  const c = cropPrograms[crop];
  const mine = catalog.filter((p) => p.fitGroup === family.fitGroup);
  const elements = mine.filter((p): p is ElementPart => p.kind === 'element');
  const roleFor = (zone: Zone): ElementRole[] => (family.cageKind === 'split' ? [zone === 'threshing' ? 'concave' : 'grate'] : ['either']);
  const pick = (zone: Zone, hand: Side): ElementPart | undefined => {
    const fits = elements.filter((e) => e.hand === hand && e.zones.includes(zone) && roleFor(zone).includes(e.role));
    const want = zone === 'threshing' ? c.suggested.threshing : c.suggested.separating;
    return fits.find((e) => e.elementType === want) ?? fits.find((e) => (passageMargin(e.openingMm, c.kernel) ?? 0) > 0);
  };

  const layoutElements: Layout['elements'] = [];
  for (const p of family.positions)
    for (const side of HANDS) {
      const part = pick(p.zone, side);
      if (part) layoutElements.push({ position: p.index, side, partNumber: part.partNumber });
    }

  const bar = (kind: string) => mine.find((p) => p.kind === 'rotor-bar' && p.barKind === kind)?.partNumber;
  const rasp = bar('rasp');
  // In-line mounts: one straight bar across each pair where the crop wants it; otherwise spike
  // rasp bars go on those mounts (common practice, no published source).
  const inLineBar = bar('spike-rasp') ?? rasp;
  const straight = c.rotorBars.straight === 'wanted' ? bar('straight') : undefined;
  const discharge = c.rotorBars.discharge === 'wanted' ? bar('discharge') : undefined;
  const model = rotorModel(family);
  const rotorBars: Layout['rotorBars'] = [];
  for (const place of family.rotorBarPlaces) {
    const key = `${place.row}:${place.position}`;
    let partNumber = place.inLine ? inLineBar : rasp;
    if (straight && model.spanByRear.has(key)) continue; // the straight bar in front takes this mount
    if (straight && model.spanByFront.has(key)) partNumber = straight;
    if (discharge && isDischargeMount(family, place.row, place.position)) partNumber = discharge;
    if (partNumber) rotorBars.push({ row: place.row, position: place.position, partNumber });
  }

  const drumId: DrumId = options.drum ?? (family.drumOptions.some((d) => d.id === 'full') ? 'full' : family.drumOptions[0]!.id);
  const drum = drumFor(family, drumId);
  const vaneControl = options.vaneControl ?? family.vaneControls[0]!;

  const coverPlates: Layout['coverPlates'] = [];
  if (c.threshability === 'hard') {
    const section = family.cageTopSections.find((s) => s.coverPlateSides.includes('right'));
    const plate = mine.find((p) => p.kind === 'cover-plate' && p.side === 'right');
    if (section && plate) coverPlates.push({ section: section.index, side: 'right', partNumber: plate.partNumber });
  }

  return {
    format: LAYOUT_FORMAT,
    familyId: family.id,
    crop,
    drum: drumId,
    vaneControl,
    vaneSetting: vaneSettingFor(crop, vaneControl),
    rotorRpm: startRpm(rpmWindow(c, { id: drumId, diameterMm: drum.diameterMm })),
    clearanceMm: c.clearanceMm.maxMm,
    elements: layoutElements,
    coverPlates,
    rotorBars,
  };
}
