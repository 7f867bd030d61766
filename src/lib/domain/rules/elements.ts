/** Rules for the element ring: position, hand, zone, empty half-positions, and the crop's fit. */
import { AGGRESSIVE_ELEMENT_TYPES, OPEN_ELEMENT_TYPES } from '~/lib/domain/crops';
import { isRoundHole, kernelPassage, LARGER_KERNEL_BASIS, PASSAGE_MARGIN_BASIS } from '~/lib/domain/cage-metrics';
import type { KernelSize } from '~/lib/domain/crops';
import type { ElementPlace } from '~/lib/domain/places';
import type { CropId, ElementPart, Opening, Side, Zone } from '~/lib/domain/schemas';
import { emit, type RuleContext } from './context';
import { resolvePart } from './parts';
import { elementPlaceWords as halfWords, elementTypeName as elementWord, partNameWithHand as partWords } from '~/lib/domain/vocabulary';
import { cropAdjective, cropNoun, cropSays, kernelOf, kernelsOf } from '~/lib/domain/vocabulary';
import { capitalise, fmtMm, withArticle } from '~/lib/domain/words';

const SIDES: readonly Side[] = ['left', 'right'];

export function checkElements(ctx: RuleContext): void {
  const { fam, family, layout, crop } = ctx;
  const filled = new Set<string>();

  for (const e of layout.elements) {
    const key = `${e.position}:${e.side}`;
    const place = { kind: 'element', position: e.position, side: e.side } as const;
    const where = halfWords(e.position, e.side);
    const zone = fam.zoneByPosition[e.position];
    if (!zone) {
      emit(
        ctx,
        'FIT_POSITION_UNKNOWN',
        'blocks-fit',
        [place],
        `No position ${e.position} on this cage`,
        `The ${family.name} cage has positions 1 to ${family.positions.length}; an element is placed at position ${e.position}.`,
        `Remove it, or move it to a position from 1 to ${family.positions.length}.`,
      );
      continue;
    }
    if (filled.has(key)) {
      emit(
        ctx,
        'LAYOUT_DUPLICATE_PLACE',
        'blocks-fit',
        [place],
        `Two elements at ${where}`,
        `A half-position holds one element; this layout lists ${e.partNumber} there as well.`,
        'Remove one of the two.',
      );
      continue;
    }
    filled.add(key);
    const part = resolvePart(ctx, e.partNumber, 'element', place, where);
    if (!part) continue;
    checkFit(ctx, part, e.position, e.side, zone);
    checkCrop(ctx, part, e.position, e.side, zone);
  }
  checkClosedZones(ctx);

  for (const p of family.positions) {
    for (const side of SIDES) {
      if (filled.has(`${p.index}:${side}`)) continue;
      emit(
        ctx,
        'FIT_EMPTY_POSITION',
        'blocks-fit',
        [{ kind: 'element', position: p.index, side }],
        `Nothing at ${halfWords(p.index, side)}`,
        `Every half-position must hold an element: an open gap lets unthreshed crop and straw fall straight through and leaves the rotor nothing to work against there.`,
        `Fit a ${side}-hand ${elementWord(p.zone === 'threshing' ? crop.suggested.threshing : crop.suggested.separating)} element (suggested for ${cropNoun(crop.id)} in the ${p.zone} zone).`,
      );
    }
  }
}

function checkFit(ctx: RuleContext, part: ElementPart, position: number, side: Side, zone: Zone): void {
  const place = { kind: 'element', position, side } as const;
  if (part.hand !== side) {
    emit(
      ctx,
      'FIT_HAND_MISMATCH',
      'blocks-fit',
      [place],
      `${part.hand === 'left' ? 'Left' : 'Right'}-hand element in the ${side} half`,
      `${part.partNumber} is a ${partWords(part)} at ${halfWords(position, side)}. Left and right elements differ in length by about 12.7 mm (0.5 in), so an element never fits the other side (common practice).`,
      `Use the ${side}-hand version of this element.`,
    );
  }
  const splitForbidden =
    ctx.family.cageKind === 'split' &&
    ((part.role === 'concave' && zone === 'separating') || (part.role === 'grate' && zone === 'threshing'));
  if (splitForbidden || !part.zones.includes(zone)) {
    const what = part.role === 'either' ? 'element' : part.role;
    emit(
      ctx,
      'FIT_ZONE_FORBIDDEN',
      'blocks-fit',
      [place],
      `${what[0]!.toUpperCase()}${what.slice(1)} in the ${zone} zone`,
      ctx.family.cageKind === 'split'
        ? `On a split cage concaves fit the front (threshing) positions only and grates the rear (separating) positions only; ${part.partNumber} is a ${partWords(part)} at ${halfWords(position, side)}.`
        : `${part.partNumber} (${partWords(part)}) is made for the ${part.zones.join(' and ')} zone, not the ${zone} zone at ${halfWords(position, side)}.`,
      `Fit a ${zone === 'threshing' ? (ctx.family.cageKind === 'split' ? 'concave' : 'threshing element') : ctx.family.cageKind === 'split' ? 'grate' : 'separating element'} here.`,
    );
  }
}

/** Small grains: the cereals whose heads must be rubbed out in the threshing zone (trade usage). */
export const SMALL_GRAINS: ReadonlySet<CropId> = new Set(['wheat', 'barley', 'oats', 'rice']);
/** Small-seeded crops: seed under about 2 mm across, carried along by fine chaff (trade usage). */
export const SMALL_SEEDED: ReadonlySet<CropId> = new Set(['canola', 'grass-seed']);

/** "thickness", "width" or "length": which of the kernel's measured sizes `value` is. */
function dimensionName(k: KernelSize, value: number): string {
  return value === k.thicknessMm ? 'thickness' : value === k.widthMm ? 'width' : 'length';
}

/** "5 mm × 25 mm slots" or "round holes 14 mm across". */
function openingInWords(o: Opening): string {
  return isRoundHole(o) ? `round holes ${fmtMm(o.width)} across` : `${fmtMm(o.width)} × ${fmtMm(o.length)} slots`;
}

function checkPassage(ctx: RuleContext, part: ElementPart, position: number, side: Side, zone: Zone): void {
  const { crop } = ctx;
  const place = { kind: 'element', position, side } as const;
  const p = kernelPassage(part.openingMm, crop.kernel);
  if (p.verdict !== 'blocked' && p.verdict !== 'tight') return;
  const o = part.openingMm!;
  const dim = dimensionName(crop.kernel, p.meanSizeMm);
  const through =
    p.opening === 'hole'
      ? `A round hole lets a kernel through by its ${dim}, its middle size`
      : `A slot lets a kernel through by its ${dim}, its smallest size`;
  const suggested = elementWord(zone === 'threshing' ? crop.suggested.threshing : crop.suggested.separating);
  const suggestion = suggested === elementWord(part.elementType) ? 'an element with a wider opening' : withArticle(`${suggested} element`);
  if (p.verdict === 'blocked') {
    emit(
      ctx,
      'CROP_OPENING_TOO_SMALL',
      'hurts-crop',
      [place],
      `Opening too small for ${cropNoun(crop.id)}`,
      `The ${elementWord(part.elementType)} element at ${halfWords(position, side)} has ${openingInWords(o)}. ${through}, ${fmtMm(p.meanSizeMm)} on ${withArticle('average')} ${kernelOf(crop.id)} (${crop.kernel.source}): short by ${fmtMm(-p.meanMarginMm!)}. Threshed grain rides on to the rear and out with the straw.`,
      `Fit ${suggestion} here.`,
    );
    return;
  }
  emit(
    ctx,
    'CROP_OPENING_TIGHT',
    'hurts-crop',
    [place],
    `Opening tight for the larger ${kernelsOf(crop.id)}`,
    `The ${elementWord(part.elementType)} element at ${halfWords(position, side)} has ${openingInWords(o)}. ${through}: ${fmtMm(p.meanSizeMm)} on average (${crop.kernel.source}), about ${fmtMm(p.largerSizeMm)} on the larger ones (${LARGER_KERNEL_BASIS}). A moving kernel needs ${fmtMm(p.requiredMarginMm)} to spare (${PASSAGE_MARGIN_BASIS}), so the opening is ${fmtMm(-p.spareMm!)} short for the larger ${kernelsOf(crop.id)}: they ride on to the rear and out with the straw.`,
    `Fit ${suggestion} here.`,
  );
}

function checkCrop(ctx: RuleContext, part: ElementPart, position: number, side: Side, zone: Zone): void {
  const { crop } = ctx;
  const place = { kind: 'element', position, side } as const;
  const cropWord = cropNoun(crop.id);
  checkPassage(ctx, part, position, side, zone);
  if (part.elementType === 'blank' && !crop.blankPlatesUsed) {
    emit(
      ctx,
      'CROP_BLANK_PLATE',
      'hurts-crop',
      [place],
      `Blank plate in ${withArticle(cropAdjective(crop.id))} cage`,
      `A blank plate has no openings: ${cropWord} threshed over ${halfWords(position, side)} cannot fall through there and rides on to the positions behind it, which loads them and raises rotor loss. Blank plates are for crops such as sunflower, where whole heads must not drop through (common practice).`,
      `Fit a ${elementWord(zone === 'threshing' ? crop.suggested.threshing : crop.suggested.separating)} element here, unless this half is meant to be closed.`,
    );
  }
  if (crop.fragile && AGGRESSIVE_ELEMENT_TYPES.has(part.elementType)) {
    emit(
      ctx,
      'CROP_AGGRESSIVE_FRAGILE',
      'hurts-crop',
      [place],
      `${capitalise(elementWord(part.elementType))} element cracks ${cropWord}`,
      `${cropSays(crop.id, 'cracks and splits', 'crack and split')} easily; ${withArticle(elementWord(part.elementType))} element at ${halfWords(position, side)} rubs hard and raises damage (common practice).`,
      `Use a gentler element here, such as ${elementWord(zone === 'threshing' ? crop.suggested.threshing : crop.suggested.separating)}.`,
    );
  }
  if (crop.threshability === 'hard' && zone === 'threshing' && OPEN_ELEMENT_TYPES.has(part.elementType)) {
    emit(
      ctx,
      'CROP_OPEN_HARD_THRESHING',
      'hurts-crop',
      [place],
      `Open element leaves ${cropAdjective(crop.id)} heads unthreshed`,
      `${cropSays(crop.id, 'is', 'are')} hard to thresh. An open ${elementWord(part.elementType)} element in the threshing zone at ${halfWords(position, side)} lets heads through before they are threshed, and they leave as whitecaps (common practice).`,
      `Use a ${elementWord(crop.suggested.threshing)} element in the threshing zone.`,
    );
  }
  if (SMALL_GRAINS.has(crop.id) && zone === 'threshing' && part.elementType === 'skip-wire' && crop.threshability !== 'hard') {
    emit(
      ctx,
      'CROP_SKIP_WIRE_SMALL_GRAIN',
      'hurts-crop',
      [place],
      `Skip-wire leaves ${cropAdjective(crop.id)} heads unthreshed`,
      `Skip-wire has wires taken out for big, loose crops. In the threshing zone at ${halfWords(position, side)} its openings let whole ${cropAdjective(crop.id)} heads and pieces of heads drop through before the rotor has rubbed the grain out; they reach the sieves or leave as whitecaps (common practice, no published source).`,
      `Fit ${withArticle(`${elementWord(crop.suggested.threshing)} element`)} in the threshing zone.`,
    );
  }
  if (SMALL_SEEDED.has(crop.id) && part.elementType === 'close-bar') {
    emit(
      ctx,
      'CROP_CLOSE_BAR_SMALL_SEED',
      'hurts-crop',
      [place],
      `Close-bar grinds ${cropNoun(crop.id)} straw to chaff`,
      `Close-bar rubs hardest of all elements and has the least open area. At ${halfWords(position, side)} it breaks ${cropAdjective(crop.id)} straw and pods into fine chaff that loads the sieves, and the small seed rides out with it (common practice, no published source).`,
      `Fit ${withArticle(`${elementWord(zone === 'threshing' ? crop.suggested.threshing : crop.suggested.separating)} element`)} here.`,
    );
  }
}

/**
 * A zone whose every fitted element is closed (no opening at all) lets nothing through: grain
 * threshed there rides on, and with a closed separating zone everything leaves with the straw.
 * Raised in every crop, blank-plate crops included (common practice, no published source).
 */
function checkClosedZones(ctx: RuleContext): void {
  const { fam, layout, catalog, crop } = ctx;
  const byZone: Record<Zone, { places: ElementPlace[]; open: boolean }> = {
    threshing: { places: [], open: false },
    separating: { places: [], open: false },
  };
  for (const e of layout.elements) {
    const zone = fam.zoneByPosition[e.position];
    const part = catalog.byPartNumber.get(e.partNumber);
    if (!zone || !part || part.kind !== 'element') continue;
    byZone[zone].places.push({ kind: 'element', position: e.position, side: e.side });
    if (part.openingMm && part.openArea > 0) byZone[zone].open = true;
  }
  for (const zone of ['threshing', 'separating'] as const) {
    const z = byZone[zone];
    if (z.places.length === 0 || z.open) continue;
    emit(
      ctx,
      'ZONE_NO_OPEN_AREA',
      'hurts-crop',
      z.places,
      `No open area in the ${zone} zone`,
      zone === 'separating'
        ? `Every element in the separating zone is closed, so threshed ${cropNoun(crop.id)} cannot be shaken out of the straw: the grain still in the crop mat leaves over the rear with the straw, and rotor loss climbs (common practice, no published source).`
        : `Every element in the threshing zone is closed, so nothing threshed there can fall through to the sieves: all of it rides on into the separating zone, which overloads it and raises rotor loss${crop.blankPlatesUsed ? `; even in ${cropNoun(crop.id)}, where blank plates keep whole heads up, some threshing positions must stay open` : ''} (common practice, no published source).`,
      `Fit ${withArticle(`${elementWord(zone === 'threshing' ? crop.suggested.threshing : crop.suggested.separating)} element`)} in at least some of the ${zone} positions.`,
    );
  }
}
