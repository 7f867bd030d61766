import { sourceInWords } from '../crops';
/** Rules for the settings beside the diagram: family, drum, vane control, rotor speed. */
import { drumFor } from '../compute';
import { inRpmWindow, rpmWindow, rpmWindowWhole } from '../speed';
import { emit, type RuleContext } from './context';
import { cropNoun, cropSays } from '../vocabulary';

export function checkSettings(ctx: RuleContext): void {
  const { family, layout, crop } = ctx;
  if (layout.familyId !== family.id) {
    emit(
      ctx,
      'LAYOUT_FAMILY_MISMATCH',
      'blocks-fit',
      [],
      'Layout made for another machine family',
      `This layout was planned for family "${layout.familyId}" but is being checked against ${family.name} ("${family.id}").`,
      `Check it against ${layout.familyId}, or rebuild it for ${family.name}.`,
    );
  }
  if (!family.drumOptions.some((d) => d.id === layout.drum)) {
    emit(
      ctx,
      'FIT_DRUM_UNAVAILABLE',
      'blocks-fit',
      [{ kind: 'setting', field: 'drum' }],
      `No ${layout.drum} drum for this family`,
      `${family.name} rotors come with ${family.drumOptions.map((d) => d.label).join(' or ')}.`,
      `Choose ${family.drumOptions.map((d) => d.label).join(' or ')}.`,
    );
  }
  if (!family.vaneControls.includes(layout.vaneControl)) {
    emit(
      ctx,
      'FIT_VANE_CONTROL_UNAVAILABLE',
      'blocks-fit',
      [{ kind: 'setting', field: 'vaneControl' }],
      `No ${layout.vaneControl} vanes on this family`,
      `${family.name} machines have ${family.vaneControls.join(' or ')} vanes.`,
      `Set the vane control to what the machine has: ${family.vaneControls.join(' or ')}.`,
    );
  }
  const drum = drumFor(family, layout.drum);
  const w = rpmWindow(crop, { id: layout.drum, diameterMm: drum.diameterMm });
  if (!inRpmWindow(layout.rotorRpm, w)) {
    const { lo, hi } = rpmWindowWhole(w);
    const slow = layout.rotorRpm < lo;
    emit(
      ctx,
      'CROP_RPM_OUTSIDE_WINDOW',
      'hurts-crop',
      [{ kind: 'setting', field: 'rotorRpm' }],
      `Rotor ${slow ? 'too slow' : 'too fast'} for ${cropNoun(crop.id)}`,
      `${cropSays(crop.id, 'wants', 'want')} a rotor tip speed of ${w.tipMinMs}–${w.tipMaxMs} m/s (${sourceInWords(w.source)}), which is ${lo}–${hi} rpm on the ${drum.label.toLowerCase()} (${drum.diameterMm} mm${w.shiftRpm ? `, +${w.shiftRpm} rpm for the slim drum, common practice` : ''}). At ${layout.rotorRpm} rpm ${slow ? 'heads go through unthreshed' : 'kernels crack: rotor speed is the main cause of cracked grain (USDA 1961; University of Wisconsin)'}.`,
      slow ? `Raise the rotor speed to at least ${lo} rpm; start low in the window and go up only as needed.` : `Lower the rotor speed to ${hi} rpm or less.`,
    );
  }
  // Once per layout, and only where it matters: the slim drum's extra capacity shows in heavy,
  // tough straw; in a light-strawed crop it brings only its costs (common practice).
  if (layout.drum === 'slim' && !crop.heavyStraw) {
    emit(
      ctx,
      'DRUM_SLIM_ADVICE',
      'advice',
      [{ kind: 'setting', field: 'drum' }],
      `Slim drum in ${crop.name.toLowerCase()}: tuning without the capacity gain`,
      `The slim drum gives about 20 % more capacity in heavy, tough straw and runs about 100 rpm faster, but it needs more fine tuning and loses more grain over the rotor (common practice). ${crop.name} is not a heavy-straw crop, so the extra capacity does not show here while the extra rotor loss does.`,
      'Check rotor loss behind the machine after each change of speed or clearance.',
    );
  }
}
