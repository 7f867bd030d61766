/** Rules for cover plates on the cage top. */
import type { Place } from '~/lib/domain/schemas';
import { emit, type RuleContext } from './context';
import { resolvePart } from './parts';
import { coverPlaceWords as coverWords, cropNoun } from '~/lib/domain/vocabulary';

export function checkCoverPlates(ctx: RuleContext): void {
  const { fam, family, layout, crop } = ctx;
  const seen = new Set<string>();
  const fitted: Place[] = [];
  const unslotted: Place[] = [];
  const adjustable = layout.vaneControl !== 'fixed';
  const plateSections = family.cageTopSections.filter((s) => s.coverPlateSides.length > 0);
  const whereAllowed = plateSections.length
    ? plateSections.map((s) => `section ${s.index} (${s.coverPlateSides.join(' or ')})`).join('; ')
    : 'nowhere on this cage';

  for (const c of layout.coverPlates) {
    const place = { kind: 'cover', section: c.section, side: c.side } as const;
    const where = coverWords(c.section, c.side);
    const section = fam.sectionByIndex.get(c.section);
    if (!section) {
      emit(
        ctx,
        'COVER_SECTION_UNKNOWN',
        'blocks-fit',
        [place],
        `No cage-top section ${c.section}`,
        `The ${family.name} cage top has sections 1 to ${family.cageTopSections.length}.`,
        `Remove the plate, or move it to ${whereAllowed}.`,
      );
      continue;
    }
    const key = `${c.section}:${c.side}`;
    if (seen.has(key)) {
      emit(
        ctx,
        'LAYOUT_DUPLICATE_PLACE',
        'blocks-fit',
        [place],
        `Two cover plates at ${where}`,
        'One slot holds one plate.',
        'Remove one of the two.',
      );
      continue;
    }
    seen.add(key);
    const part = resolvePart(ctx, c.partNumber, 'cover-plate', place, where);
    if (!part) continue;
    fitted.push(place);
    if (!part.slotted && layout.vaneControl === 'fixed' && section.coverPlateSides.includes(c.side)) unslotted.push(place);
    if (part.side !== c.side) {
      emit(
        ctx,
        'FIT_HAND_MISMATCH',
        'blocks-fit',
        [place],
        `${part.side === 'left' ? 'Left' : 'Right'} cover plate on the ${c.side} side`,
        `${part.partNumber} is made for the ${part.side} side of the cage top; its holes and slots do not line up on the ${c.side} side.`,
        `Use the ${c.side} cover plate.`,
      );
    }
    if (!section.coverPlateSides.includes(c.side)) {
      emit(
        ctx,
        'COVER_OUTSIDE_SECTION',
        'blocks-fit',
        [place],
        `Cover plate outside its section`,
        `Cover plates bolt to ${whereAllowed}; ${where} has no mounting for one.`,
        `Move the plate to ${whereAllowed}, or remove it.`,
      );
    } else if (c.side === 'left' && adjustable) {
      emit(
        ctx,
        'COVER_VANE_LINKAGE',
        'blocks-fit',
        [place, { kind: 'setting', field: 'vaneControl' }],
        'Left cover plate blocked by the vane linkage',
        `On a machine with ${layout.vaneControl} vanes the adjusting linkage runs over the left side of the cage top, so the left cover plate cannot go on; the right plate always fits (common practice).`,
        'Remove the left plate; in extreme hard threshing fit the right plate alone.',
      );
    }
  }

  // Slots in a cover plate let the vane bolts pass, so vanes set with bolts can still be moved
  // with the plate on (common practice, no published source).
  if (unslotted.length) {
    emit(
      ctx,
      'COVER_UNSLOTTED_VANES',
      'advice',
      [...unslotted, { kind: 'setting', field: 'vaneSetting' }],
      unslotted.length === 1 ? 'Cover plate without vane-bolt slots' : 'Cover plates without vane-bolt slots',
      `This machine's vanes are set with bolts, and a cover plate without slots covers those bolts: to change the vane setting the plate must come off first. A slotted plate lets the bolts pass, so the vanes can be moved with the plate on (common practice).`,
      'Fit the slotted version of the plate, or plan to take the plate off whenever the vanes are reset.',
    );
  }

  if (fitted.length && crop.threshability !== 'hard') {
    emit(
      ctx,
      'COVER_NOT_NEEDED',
      'advice',
      fitted,
      `Cover plates are rarely needed in ${cropNoun(crop.id)}`,
      `Cover plates keep hard-to-thresh heads in the threshing zone longer, at the cost of separating area and capacity.${adjustable ? ' On adjustable-vane machines the linkage already closes much of the cage top (common practice).' : ''}`,
      'Take the plates off unless you see unthreshed heads in the tank or behind the machine.',
    );
  }
}
