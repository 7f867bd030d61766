/** Rules for the element ring: position, hand, zone, empty half-positions, and the crop's fit. */
import { AGGRESSIVE_ELEMENT_TYPES, OPEN_ELEMENT_TYPES } from '../crops';
import { passageMargin } from '../cage-metrics';
import type { ElementPart, Side, Zone } from '../schemas';
import { emit, type RuleContext } from './context';
import { resolvePart } from './parts';
import { elementPlaceWords as halfWords, elementTypeName as elementWord, partNameWithHand as partWords } from '../vocabulary';
import { fmtMm } from '../words';

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
        `Fit a ${side}-hand ${elementWord(p.zone === 'threshing' ? crop.suggested.threshing : crop.suggested.separating)} element (suggested for ${crop.name.toLowerCase()} in the ${p.zone} zone).`,
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

function checkCrop(ctx: RuleContext, part: ElementPart, position: number, side: Side, zone: Zone): void {
  const { crop } = ctx;
  const place = { kind: 'element', position, side } as const;
  const cropWord = crop.name.toLowerCase();
  const margin = passageMargin(part.openingMm, crop.kernel);
  if (margin !== null && margin <= 0) {
    emit(
      ctx,
      'CROP_OPENING_TOO_SMALL',
      'hurts-crop',
      [place],
      `Opening too small for ${cropWord}`,
      `The ${elementWord(part.elementType)} opening at ${halfWords(position, side)} is ${fmtMm(part.openingMm!.width)} × ${fmtMm(part.openingMm!.length)}; a ${cropWord} kernel needs more than ${fmtMm(crop.passingSizeMm)} across (short by ${fmtMm(-margin)}). Threshed grain rides on to the rear and out with the straw.`,
      `Fit a ${elementWord(zone === 'threshing' ? crop.suggested.threshing : crop.suggested.separating)} element here.`,
    );
  }
  if (part.elementType === 'blank' && !crop.blankPlatesUsed) {
    emit(
      ctx,
      'CROP_BLANK_PLATE',
      'hurts-crop',
      [place],
      `Blank plate in a ${cropWord} cage`,
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
      `${elementWord(part.elementType)} element cracks ${cropWord}`,
      `${crop.name} crack and split easily; a ${elementWord(part.elementType)} element at ${halfWords(position, side)} rubs hard and raises damage (common practice).`,
      `Use a gentler element here, such as ${elementWord(zone === 'threshing' ? crop.suggested.threshing : crop.suggested.separating)}.`,
    );
  }
  if (crop.threshability === 'hard' && zone === 'threshing' && OPEN_ELEMENT_TYPES.has(part.elementType)) {
    emit(
      ctx,
      'CROP_OPEN_HARD_THRESHING',
      'hurts-crop',
      [place],
      `Open element leaves ${cropWord} heads unthreshed`,
      `${crop.name} is hard to thresh. An open ${elementWord(part.elementType)} element in the threshing zone at ${halfWords(position, side)} lets heads through before they are threshed, and they leave as whitecaps (common practice).`,
      `Use a ${elementWord(crop.suggested.threshing)} element in the threshing zone.`,
    );
  }
}
