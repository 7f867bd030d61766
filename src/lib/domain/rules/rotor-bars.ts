/** Rules for the bars on the rotor: straight interrupter bars and discharge bars. */
import type { Place } from '../schemas';
import { emit, type RuleContext } from './context';
import { resolvePart } from './parts';
import { barPlaceWords as barWords } from '../vocabulary';
import { listWords } from '../words';
import { cropNoun, cropVerb } from '../vocabulary';

interface Placed {
  row: number;
  position: number;
  place: Place;
}

const opposite = (a: number, b: number) => Math.abs((((a - b + 180) % 360) + 360) % 360) < 1;

export function checkRotorBars(ctx: RuleContext): void {
  const { fam, family, layout, crop } = ctx;
  const seen = new Set<string>();
  const straight: Placed[] = [];
  const discharge: Placed[] = [];
  const rear = family.rearPosition;
  const cropWord = cropNoun(crop.id);

  for (const b of layout.rotorBars) {
    const key = `${b.row}:${b.position}`;
    const place = { kind: 'bar', row: b.row, position: b.position } as const;
    const where = barWords(b.row, b.position);
    const spot = fam.barPlaceByKey.get(key);
    if (!spot) {
      emit(
        ctx,
        'BAR_PLACE_UNKNOWN',
        'blocks-fit',
        [place],
        'No bar mounting there',
        `The ${family.name} rotor has no bar mounting at ${where}.`,
        'Remove the bar, or move it to a mounting shown on the rotor strip.',
      );
      continue;
    }
    if (seen.has(key)) {
      emit(ctx, 'LAYOUT_DUPLICATE_PLACE', 'blocks-fit', [place], `Two bars at ${where}`, 'One mounting holds one bar.', 'Remove one of the two.');
      continue;
    }
    seen.add(key);
    const part = resolvePart(ctx, b.partNumber, 'rotor-bar', place, where);
    if (!part) continue;
    if (part.barKind === 'straight') {
      straight.push({ row: b.row, position: b.position, place });
      if (!spot.inLine) {
        emit(
          ctx,
          'BAR_STRAIGHT_NOT_IN_LINE',
          'blocks-fit',
          [place],
          'Straight bar where rasp bars are not in line',
          `A straight interrupter bar bolts across two rasp bars standing in line; at ${where} they are not in line, so it has nothing to bolt to.`,
          'Move the straight bar to a place marked in line on the rotor strip.',
        );
      }
    } else if (part.barKind === 'discharge') {
      discharge.push({ row: b.row, position: b.position, place });
    }
  }

  // Discharge bars belong at the rear; an extra pair may sit one position ahead, each 180° from
  // a rear one (common practice).
  const rearRows = discharge.filter((d) => d.position === rear).map((d) => fam.rowAngle.get(d.row) ?? 0);
  const notRear: Place[] = [];
  const notOpposite: Place[] = [];
  const extras: Placed[] = [];
  for (const d of discharge) {
    if (d.position === rear) continue;
    if (d.position !== rear - 1) {
      notRear.push(d.place);
      continue;
    }
    extras.push(d);
    const angle = fam.rowAngle.get(d.row) ?? 0;
    if (!rearRows.some((r) => opposite(angle, r))) notOpposite.push(d.place);
  }
  if (notRear.length) {
    emit(
      ctx,
      'BAR_DISCHARGE_NOT_REAR',
      'hurts-crop',
      notRear,
      'Discharge bars away from the rear',
      `Discharge bars throw crop out at the rear of the rotor (position ${rear}); further forward they push crop out of the threshing and separating zones early and raise rotor loss. An extra pair may sit at position ${rear - 1} only.`,
      `Move them to position ${rear}, or to position ${rear - 1} opposite the rear pair.`,
    );
  }
  if (notOpposite.length || (extras.length && extras.length % 2 !== 0)) {
    emit(
      ctx,
      'BAR_DISCHARGE_EXTRA_NOT_OPPOSITE',
      'hurts-crop',
      notOpposite.length ? notOpposite : extras.map((e) => e.place),
      'Extra discharge bars not opposite the rear ones',
      rearRows.length
        ? `The extra pair at position ${rear - 1} goes 180° around the rotor from the discharge bars at position ${rear} (common practice); ${notOpposite.length ? `at ${listWords(notOpposite.map((p) => (p.kind === 'bar' ? `row ${p.row}` : '')))} there is no rear discharge bar opposite` : 'a single extra bar has no partner'}.`
        : `Extra discharge bars at position ${rear - 1} go with a pair at the rear (position ${rear}), 180° around the rotor from them; this rotor has none at the rear.`,
      rearRows.length
        ? `Move the extra bars to the rows 180° from the rear discharge bars, as a pair.`
        : `Fit discharge bars at position ${rear} first, then the extra pair opposite them.`,
    );
  }

  if (straight.length && crop.rotorBars.straight === 'not-needed') {
    emit(
      ctx,
      'BAR_STRAIGHT_NOT_NEEDED',
      'hurts-crop',
      straight.map((s) => s.place),
      `Straight bars are not needed in ${cropWord}`,
      `Straight interrupter bars slow the crop so corn kernels hidden in husks come free; ${cropWord} ${cropVerb(crop.id, 'does', 'do')} not need them, and they cost power (common practice).`,
      'Take the straight bars off; spike rasp bars can take their place.',
    );
  }
  if (!straight.length && crop.rotorBars.straight === 'wanted') {
    const inLine = family.rotorBarPlaces.filter((p) => p.inLine).map((p) => ({ kind: 'bar', row: p.row, position: p.position }) as const);
    if (inLine.length) {
      emit(
        ctx,
        'BAR_STRAIGHT_SUGGESTED',
        'advice',
        inLine,
        `Straight bars help in ${cropWord}`,
        crop.rotorBars.advice,
        'Bolt straight bars across the in-line rasp bars.',
      );
    }
  }
  if (!discharge.length && crop.rotorBars.discharge === 'wanted') {
    const rearPlaces = family.rotorBarPlaces.filter((p) => p.position === rear).map((p) => ({ kind: 'bar', row: p.row, position: p.position }) as const);
    emit(
      ctx,
      'BAR_DISCHARGE_SUGGESTED',
      'advice',
      rearPlaces,
      `Discharge bars help in ${cropWord}`,
      crop.rotorBars.advice,
      `Fit a pair of discharge bars at position ${rear}.`,
    );
  }
}
