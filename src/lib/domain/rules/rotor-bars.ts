/**
 * Rules for the bars on the rotor: every mounting carries a bar, opposite bars are a matched set
 * (balance), a straight bar spans a pair of in-line mounts, discharge bars sit at the rear.
 * The model of the mountings (opposite rows, straight-bar spans, discharge mounts, the balance
 * physics and its sources) is in ../rotor.ts.
 */
import { drumFor } from '~/lib/domain/compute';
import {
  BALANCE_MASS_TOLERANCE_KG,
  DEFAULT_ROTOR_MASS_KG,
  NEWTONS_PER_LBF,
  ROTOR_BALANCE_GRADE_MM_S,
  mountLoads,
  outOfBalanceForceN,
  permissibleForceN,
  rotorModel,
  type MountLoad,
} from '~/lib/domain/rotor';
import type { BarKind, Place, RotorBarPart } from '~/lib/domain/schemas';
import { countOf, withArticle } from '~/lib/domain/words';
import { emit, type RuleContext } from './context';
import { resolvePart } from './parts';
import { barPlaceWords as barWords } from '~/lib/domain/vocabulary';
import { listWords } from '~/lib/domain/words';
import { cropNoun, cropVerb } from '~/lib/domain/vocabulary';

interface Placed {
  row: number;
  position: number;
  place: Place;
}

const BAR_KIND_WORDS: Record<BarKind, string> = {
  rasp: 'rasp bar',
  'smooth-rasp': 'smooth rasp bar',
  'spike-rasp': 'spike rasp bar',
  straight: 'straight bar',
  discharge: 'discharge bar',
};
const barKindWord = (k: BarKind): string => BAR_KIND_WORDS[k];
const bar = (row: number, position: number) => ({ kind: 'bar', row, position }) as const;
const capitalise = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);
const round = (n: number, digits: number) => {
  const f = 10 ** digits;
  return Math.round(n * f) / f;
};

export function checkRotorBars(ctx: RuleContext): void {
  const { fam, family, layout, crop } = ctx;
  const model = rotorModel(family);
  const seen = new Set<string>();
  /** Places whose entry could not be resolved to a part of this family (already a finding). */
  const unresolved = new Set<string>();
  const resolved = new Map<string, RotorBarPart>();
  const straight: Placed[] = [];
  const discharge: Placed[] = [];
  const straightAtRear: Placed[] = [];
  const rear = family.rearPosition;
  const cropWord = cropNoun(crop.id);

  for (const b of layout.rotorBars) {
    const key = `${b.row}:${b.position}`;
    const place = bar(b.row, b.position);
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
      emit(
        ctx,
        'LAYOUT_DUPLICATE_PLACE',
        'blocks-fit',
        [place],
        `Two bars at ${where}`,
        'One mounting holds one bar.',
        'Remove one of the two.',
      );
      continue;
    }
    seen.add(key);
    const part = resolvePart(ctx, b.partNumber, 'rotor-bar', place, where);
    if (!part) {
      unresolved.add(key);
      continue;
    }
    resolved.set(key, part);
    if (part.barKind === 'straight') {
      const span = model.spanByFront.get(key);
      if (span) {
        straight.push({ row: b.row, position: b.position, place });
      } else if (model.spanByRear.has(key)) {
        // Judged after the loop: a second straight bar on a pair, or one listed from the rear.
        straightAtRear.push({ row: b.row, position: b.position, place });
      } else {
        unresolved.add(key);
        emit(
          ctx,
          'BAR_STRAIGHT_NOT_IN_LINE',
          'blocks-fit',
          [place],
          'Straight bar where rasp bars are not in line',
          `A straight interrupter bar bolts across a pair of in-line rasp-bar mounts; at ${where} there is no such pair, so it has nothing to bolt to.`,
          'Move the straight bar to the front of an in-line pair on the rotor strip.',
        );
      }
    } else if (part.barKind === 'discharge') {
      discharge.push({ row: b.row, position: b.position, place });
    }
  }

  // A straight bar takes both mounts of its span: nothing else bolts at the rear one.
  const covered = new Set<string>();
  for (const s of straight) {
    const span = model.spanByFront.get(`${s.row}:${s.position}`)!;
    const rearKey = `${span.row}:${span.rear}`;
    covered.add(rearKey);
    const other = resolved.get(rearKey) ?? (seen.has(rearKey) ? null : undefined);
    if (other === undefined) continue;
    unresolved.add(rearKey);
    const twice = other?.barKind === 'straight';
    emit(
      ctx,
      'BAR_UNDER_STRAIGHT',
      'blocks-fit',
      [bar(span.row, span.rear), s.place],
      twice ? `Two straight bars on one pair of mounts` : `No mount left at ${barWords(span.row, span.rear)}`,
      twice
        ? `One straight bar spans the in-line mounts of row ${span.row} at positions ${span.front} and ${span.rear}; a second one listed at position ${span.rear} has no mount and would be ordered for nothing.`
        : `The straight bar from position ${span.front} of row ${span.row} is one part across the mounts at positions ${span.front} and ${span.rear}; the ${other ? barKindWord(other.barKind) : 'bar'} at position ${span.rear} has no mount left.`,
      twice
        ? `Remove the straight bar at position ${span.rear}; the one at position ${span.front} covers both mounts.`
        : `Remove the bar at position ${span.rear}, or take the straight bar off and fit spike rasp bars on both mounts (common practice).`,
    );
  }

  for (const s of straightAtRear) {
    const span = model.spanByRear.get(`${s.row}:${s.position}`)!;
    if (covered.has(`${s.row}:${s.position}`)) continue; // the pair's own straight bar: said above
    unresolved.add(`${s.row}:${s.position}`);
    emit(
      ctx,
      'BAR_STRAIGHT_NOT_IN_LINE',
      'blocks-fit',
      [s.place],
      'Straight bar listed at the rear of its pair',
      `A straight bar is one part bolted across the two in-line mounts of row ${span.row} at positions ${span.front} and ${span.rear}; it is placed from the front mount (position ${span.front}).`,
      `Place the straight bar at position ${span.front} of row ${span.row}; it takes both mounts.`,
    );
  }

  // Every mounting the family has carries a bar (a straight bar fills its pair).
  const emptyByRow = new Map<number, number[]>();
  for (const p of family.rotorBarPlaces) {
    const key = `${p.row}:${p.position}`;
    if (seen.has(key) || covered.has(key)) continue;
    emptyByRow.set(p.row, [...(emptyByRow.get(p.row) ?? []), p.position]);
  }
  for (const [row, positions] of emptyByRow) {
    emit(
      ctx,
      'BAR_PLACE_EMPTY',
      'hurts-crop',
      positions.map((p) => bar(row, p)),
      `Rotor bar row ${row}: nothing at ${positions.length === 1 ? 'position' : 'positions'} ${listWords(positions)}`,
      `The ${family.name} rotor has a bar mounting at ${countOf(positions.length, 'place')} of row ${row} that carries nothing. Without a bar there the rotor does not move and rub the crop at that place, and the rotor runs out of balance against the bars opposite.`,
      `Fit ${positions.length === 1 ? 'a bar' : 'bars'} matching the ones on the opposite row.`,
    );
  }

  checkBalance(ctx, unresolved);

  // Discharge bars belong at the rear; an extra opposite pair may sit one position ahead of a
  // rear pair (common practice). That they come in opposite pairs is the balance check's job.
  const rearCount = discharge.filter((d) => d.position === rear).length;
  const notRear = discharge.filter((d) => d.position !== rear && d.position !== rear - 1).map((d) => d.place);
  const extras = discharge.filter((d) => d.position === rear - 1);
  if (notRear.length) {
    emit(
      ctx,
      'BAR_DISCHARGE_NOT_REAR',
      'hurts-crop',
      notRear,
      'Discharge bars away from the rear',
      `Discharge bars throw crop out at the rear of the rotor (position ${rear}); further forward they push crop out of the threshing and separating zones early and raise rotor loss. An extra pair may sit at position ${rear - 1} only.`,
      `Move them to position ${rear}, or to position ${rear - 1} as an extra pair.`,
    );
  }
  if (extras.length && rearCount === 0) {
    emit(
      ctx,
      'BAR_DISCHARGE_EXTRA_NOT_OPPOSITE',
      'hurts-crop',
      extras.map((e) => e.place),
      'Extra discharge bars without a rear pair',
      `Discharge bars at position ${rear - 1} are an extra pair that goes with a pair at the rear (position ${rear}); this rotor has none at the rear, so crop is thrown out before it is separated.`,
      `Fit a pair of discharge bars at position ${rear} first, on opposite rows.`,
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
      'Take the straight bars off and fit spike rasp bars on the two mounts each one frees (common practice).',
    );
  }
  if (!straight.length && crop.rotorBars.straight === 'wanted' && model.spans.length) {
    emit(
      ctx,
      'BAR_STRAIGHT_SUGGESTED',
      'advice',
      model.spans.map((s) => bar(s.row, s.front)),
      `Straight bars help in ${cropWord}`,
      crop.rotorBars.advice,
      `Bolt one straight bar across each pair of in-line mounts (${countOf(model.spans.length, 'bar')}), in place of the rasp bars there.`,
    );
  }
  if (!discharge.length && crop.rotorBars.discharge === 'wanted') {
    const rearPlaces = model.dischargeRearRows.map((r) => bar(r, rear));
    emit(
      ctx,
      'BAR_DISCHARGE_SUGGESTED',
      'advice',
      rearPlaces,
      `Discharge bars help in ${cropWord}`,
      crop.rotorBars.advice,
      `Fit a pair of discharge bars at position ${rear}${rearPlaces.length === 2 ? `, rows ${rearPlaces[0]!.row} and ${rearPlaces[1]!.row} (opposite each other)` : ''}.`,
    );
  }
}

function loadWords(l: MountLoad): string {
  return l.kind ? withArticle(barKindWord(l.kind)) : 'no bar';
}

/**
 * Opposite places (opposite rows, same position) must match in kind and mass. The out-of-balance
 * force of the mass difference at the set speed is F = m·r·ω² (r: half the drum's diameter across
 * the bars, an upper bound for the bar's centre of mass); above what the rotor may carry at
 * balance grade G 16 (ISO 21940-11) it blocks fit, below it hurts the crop.
 */
function checkBalance(ctx: RuleContext, unresolved: ReadonlySet<string>): void {
  const { family, layout, catalog, fam } = ctx;
  const model = rotorModel(family);
  if (model.oppositeRow.size === 0) return;
  const loads = mountLoads(family, catalog, layout);
  const drum = family.drumOptions.some((d) => d.id === layout.drum) ? drumFor(family, layout.drum) : family.drumOptions[0]!;
  const radiusM = drum.diameterMm / 2000;
  const rotorMass = family.rotorMassKg ?? DEFAULT_ROTOR_MASS_KG;
  const allowed = permissibleForceN(rotorMass, layout.rotorRpm);
  for (const p of family.rotorBarPlaces) {
    const o = model.oppositeRow.get(p.row);
    if (o === undefined || o < p.row) continue;
    const aKey = `${p.row}:${p.position}`;
    const bKey = `${o}:${p.position}`;
    if (!fam.barPlaceByKey.has(bKey) || unresolved.has(aKey) || unresolved.has(bKey)) continue;
    const a = loads.get(aKey)!;
    const b = loads.get(bKey)!;
    const dm = Math.abs(a.massKg - b.massKg);
    if (a.kind === b.kind && dm <= BALANCE_MASS_TOLERANCE_KG) continue;
    const force = outOfBalanceForceN(dm, radiusM, layout.rotorRpm);
    const blocks = force > allowed;
    const heavy = a.massKg >= b.massKg ? { row: p.row, load: a } : { row: o, load: b };
    const light = heavy.row === p.row ? { row: o, load: b } : { row: p.row, load: a };
    const forceWords = `${Math.round(force)} N (${Math.round(force / NEWTONS_PER_LBF)} lbf)`;
    const what =
      a.kind === b.kind
        ? `two ${barKindWord(a.kind!)}s whose catalog masses differ by ${round(dm, 2)} kg (a matched set is within ${BALANCE_MASS_TOLERANCE_KG * 1000} g, Cagewright's tolerance)`
        : `${loadWords(a)} at row ${p.row} and ${loadWords(b)} at row ${o}${dm > 0 ? `, ${round(dm, 2)} kg apart` : ''}; opposite bars are a matched set of one kind (common practice)`;
    emit(
      ctx,
      'BAR_UNBALANCED',
      blocks ? 'blocks-fit' : 'hurts-crop',
      [bar(p.row, p.position), bar(o, p.position)],
      `Rotor out of balance at position ${p.position}: rows ${p.row} and ${o}`,
      `${capitalise(barWords(p.row, p.position))} and its opposite place, ${barWords(o, p.position)} (180° around), carry ${what}. ` +
        `At ${layout.rotorRpm} rpm that is an out-of-balance force of ${forceWords}, from F = m·r·ω² with m = ${round(dm, 2)} kg at r = ${round(radiusM * 1000, 0)} mm (a standard mechanics text). ` +
        `A ${rotorMass} kg rotor balanced to grade G ${ROTOR_BALANCE_GRADE_MM_S} (ISO 21940-11) may carry at most ${Math.round(allowed)} N at this speed; ` +
        (blocks
          ? 'this is more, so the rotor shakes its bearings and the cage: do not run it like this.'
          : 'this is less, but the uneven bars still work the crop unevenly and wear the bearings.'),
      light.load.kind === null
        ? `Fit ${withArticle(barKindWord(heavy.load.kind!))} at ${barWords(light.row, p.position)} to match the one opposite.`
        : `Fit the same part at both places: ${heavy.load.part?.partNumber ?? 'a matching bar'} at ${barWords(light.row, p.position)}, or ${light.load.part?.partNumber ?? 'its match'} at ${barWords(heavy.row, p.position)}.`,
    );
  }
}
