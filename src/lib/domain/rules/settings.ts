/** Rules for the settings beside the diagram: family, drum, vane control and setting, rotor speed, clearance. */
import { MECHANICAL_MIN_CLEARANCE_MM, sourceInWords } from '~/lib/domain/crops';
import { drumFor } from '~/lib/domain/compute';
import { inRpmWindow, inStartBand, rpmWindow, rpmWindowWords, startRpm, type RpmWindow } from '~/lib/domain/speed';
import { VANE_CONTROL_HOW, VANE_SETTING_WORDS, adviseVaneSetting, vaneSettingsFor } from '~/lib/domain/vanes';
import { emit, type RuleContext } from './context';

const list = (xs: readonly string[]) => (xs.length <= 1 ? (xs[0] ?? '') : `${xs.slice(0, -1).join(', ')} or ${xs[xs.length - 1]}`);

/** Rotor speed: outside every cited range hurts the crop; outside the start band is advice. */
function checkSpeed(ctx: RuleContext, w: RpmWindow, drumLabel: string, diameterMm: number): void {
  const { layout, crop } = ctx;
  const speed = layout.rotorRpm;
  const shift = w.shiftRpm ? `, +${w.shiftRpm} rpm for the slim drum (common practice)` : '';
  const on = `on the ${drumLabel.toLowerCase()} (${diameterMm} mm${shift})`;
  const cited = w.ranges
    .map((r) => `${r.lo}–${r.hi} rpm, ${fmt(r.tipMinMs)}–${fmt(r.tipMaxMs)} m/s (${sourceInWords(r.source)})`)
    .join('; ');
  if (!inRpmWindow(speed, w)) {
    const lo = Math.min(...w.ranges.map((r) => r.lo));
    const hi = Math.max(...w.ranges.map((r) => r.hi));
    const slow = speed < lo ? true : speed > hi ? false : speed - nearestBelow(w, speed) < nearestAbove(w, speed) - speed;
    const target = slow ? (speed < lo ? lo : nearestAbove(w, speed)) : speed > hi ? hi : nearestBelow(w, speed);
    emit(
      ctx,
      'CROP_RPM_OUTSIDE_WINDOW',
      'hurts-crop',
      [{ kind: 'setting', field: 'rotorRpm' }],
      `Rotor ${slow ? 'too slow' : 'too fast'} for ${crop.name.toLowerCase()}`,
      `${layout.rotorRpm} rpm lies outside every speed range cited for ${crop.name.toLowerCase()} ${on}: ${cited}. ${slow ? 'Too slow, heads or pods go through unthreshed.' : 'Too fast, kernels crack: rotor speed is the main cause of cracked grain (USDA Yearbook of Agriculture 1961, "Seeds"; University of Wisconsin–Madison, "Combine Adjustments", 2006).'}`,
      slow
        ? `Raise the rotor speed to ${target} rpm; go up further only as losses call for it.`
        : `Lower the rotor speed to ${target} rpm or less.`,
    );
  } else if (!inStartBand(speed, w) && w.start) {
    const below = speed < w.start.lo;
    emit(
      ctx,
      'CROP_RPM_OUTSIDE_START',
      'advice',
      [{ kind: 'setting', field: 'rotorRpm' }],
      `Rotor ${below ? 'below' : 'above'} the usual starting band for ${crop.name.toLowerCase()}`,
      `${speed} rpm is inside a cited range (${rpmWindowWords(w)} ${on}), but the usual place to start is ${w.start.lo === w.start.hi ? `${w.start.lo} rpm` : `${w.start.lo}–${w.start.hi} rpm`} (${sourceInWords(w.start.source)}).`,
      below
        ? `Fine if it threshes cleanly; if heads or pods go through unthreshed, close the concave first, then come up towards ${startRpm(w)} rpm.`
        : `Start at ${startRpm(w)} rpm and go faster only if losses behind the machine call for it.`,
    );
  }
}

function nearestBelow(w: RpmWindow, speed: number): number {
  return Math.max(...w.ranges.filter((r) => r.hi < speed).map((r) => r.hi));
}
function nearestAbove(w: RpmWindow, speed: number): number {
  return Math.min(...w.ranges.filter((r) => r.lo > speed).map((r) => r.lo));
}
const fmt = (v: number) => (Math.round(v * 10) / 10).toString();

/** Concave clearance: below the mechanical minimum blocks fit; outside the crop's window hurts it. */
function checkClearance(ctx: RuleContext): void {
  const { layout, crop } = ctx;
  const c = layout.clearanceMm;
  const win = crop.clearanceMm;
  const place = [{ kind: 'setting', field: 'clearanceMm' } as const];
  if (c < MECHANICAL_MIN_CLEARANCE_MM) {
    emit(
      ctx,
      'FIT_CLEARANCE_BELOW_MINIMUM',
      'blocks-fit',
      place,
      `Concave clearance ${c} mm is below the mechanical minimum`,
      `Below ${MECHANICAL_MIN_CLEARANCE_MM} mm the rasp bars can touch the concave as the rotor deflects under load (common practice, no published source). No crop runs there.`,
      `Open the concave to at least ${MECHANICAL_MIN_CLEARANCE_MM} mm; for ${crop.name.toLowerCase()} start at ${win.maxMm} mm.`,
    );
    return;
  }
  if (c < win.minMm || c > win.maxMm) {
    const tight = c < win.minMm;
    emit(
      ctx,
      'CROP_CLEARANCE_OUTSIDE_WINDOW',
      'hurts-crop',
      place,
      `Concave ${tight ? 'too tight' : 'too wide'} for ${crop.name.toLowerCase()}`,
      `${crop.name} wants a concave clearance of ${win.minMm}–${win.maxMm} mm (${sourceInWords(win.source)}). At ${c} mm ${tight ? 'kernels are pinched between rasp bars and concave and crack, and the rotor takes more power' : 'heads or pods pass the concave without being threshed and go out with the straw'}.`,
      tight
        ? `Open the concave to ${win.minMm} mm or more; start at ${win.maxMm} mm and close it only as losses call for it.`
        : `Close the concave to ${win.maxMm} mm; fix unthreshed loss with clearance before speed (University of Wisconsin–Madison, "Combine Adjustments", 2006).`,
    );
  }
}

/** Vanes: the setting must be one the control can take, and should suit the crop. */
function checkVanes(ctx: RuleContext): void {
  const { layout, crop } = ctx;
  const control = layout.vaneControl;
  const setting = layout.vaneSetting;
  const can = vaneSettingsFor(control);
  const words = (xs: readonly string[]) => list(xs.map((x) => VANE_SETTING_WORDS[x as keyof typeof VANE_SETTING_WORDS]));
  const place = [{ kind: 'setting', field: 'vaneSetting' } as const];
  const suits = crop.vanes.suits.includes(setting);
  if (can.includes(setting) && suits) return;
  const advise = adviseVaneSetting(control, crop.vanes.suits, setting);
  if (!can.includes(setting)) {
    emit(
      ctx,
      'FIT_VANE_SETTING_UNAVAILABLE',
      'blocks-fit',
      [...place, { kind: 'setting', field: 'vaneControl' }],
      `${control === 'fixed' ? 'Bolt-set' : control === 'manual' ? 'Adjustable' : 'Powered'} vanes cannot be set ${VANE_SETTING_WORDS[setting]}`,
      `This machine has ${VANE_CONTROL_HOW[control]}; they take ${words(can)} only (common practice, no published source).`,
      `Set the vanes to ${VANE_SETTING_WORDS[advise]}${crop.vanes.suits.includes(advise) ? `, which suits ${crop.name.toLowerCase()}` : ''}.`,
    );
    return;
  }
  const hard = crop.threshability === 'hard';
  if (crop.vanes.against.includes(setting)) {
    emit(
      ctx,
      'CROP_VANES_AGAINST_CROP',
      'hurts-crop',
      place,
      `${VANE_SETTING_WORDS[setting][0]!.toUpperCase()}${VANE_SETTING_WORDS[setting].slice(1)} vanes work against ${crop.name.toLowerCase()}`,
      hard
        ? `${crop.name} is hard to thresh: ${VANE_SETTING_WORDS[setting]} vanes move it out of the threshing zone before heads are threshed (${crop.vanes.source}).`
        : `${crop.name} cracks easily: ${VANE_SETTING_WORDS[setting]} vanes keep it under the rasp bars longer than it needs (${crop.vanes.source}).`,
      `Set the vanes to ${VANE_SETTING_WORDS[advise]} (${VANE_CONTROL_HOW[control]}).`,
    );
  } else if (!suits) {
    emit(
      ctx,
      'CROP_VANES_ADVICE',
      'advice',
      place,
      `${crop.name} usually runs ${words(crop.vanes.suits)} vanes`,
      `${crop.vanes.source[0]!.toUpperCase()}${crop.vanes.source.slice(1)}. ${crop.name} usually runs ${words(crop.vanes.suits)}.`,
      advise === setting
        ? `These vanes can take nothing closer to what ${crop.name.toLowerCase()} wants (${VANE_CONTROL_HOW[control]}); watch losses.`
        : `Try ${VANE_SETTING_WORDS[advise]} (${VANE_CONTROL_HOW[control]}).`,
    );
  }
}

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
  checkSpeed(ctx, w, drum.label, drum.diameterMm);
  checkClearance(ctx);
  checkVanes(ctx);
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
