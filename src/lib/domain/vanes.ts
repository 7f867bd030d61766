/**
 * Vane control: what each kind of control can be set to and where it is changed
 * (common practice, no published source).
 */
import type { VaneControl, VaneSetting } from './schemas';
import { VANE_SETTING_VALUES } from './values';

/** Every vane setting, slowest first. */
export const VANE_SETTINGS: readonly VaneSetting[] = VANE_SETTING_VALUES;

/**
 * The settings each control can take. Bolt-set vanes have bolt holes for slow, medium and fast
 * only; the linkage and powered controls move through the whole range, very slow included
 * (common practice, no published source).
 */
export const VANE_SETTINGS_BY_CONTROL: Readonly<Record<VaneControl, readonly VaneSetting[]>> = {
  fixed: ['slow', 'medium', 'fast'],
  manual: ['very-slow', 'slow', 'medium', 'fast'],
  powered: ['very-slow', 'slow', 'medium', 'fast'],
};

/** How a control is changed, in words (common practice). */
export const VANE_CONTROL_HOW: Readonly<Record<VaneControl, string>> = {
  fixed: 'bolt-set vanes, changed by hand in the shop (engine off, rotor stopped) by moving the vane bolts',
  manual: 'adjustable vanes, changed at the linkage on the machine (engine off)',
  powered: 'powered vanes, changed from the cab',
};

export const VANE_SETTING_WORDS: Readonly<Record<VaneSetting, string>> = {
  'very-slow': 'very slow',
  slow: 'slow',
  medium: 'medium',
  fast: 'fast',
};

export function vaneSettingsFor(control: VaneControl): readonly VaneSetting[] {
  return VANE_SETTINGS_BY_CONTROL[control];
}

/**
 * The setting to advise: among those the control can take, one the crop suits, nearest to
 * `from`; if the control can take none the crop suits, the available setting nearest to them.
 * Never a setting the control cannot take.
 */
export function adviseVaneSetting(control: VaneControl, suits: readonly VaneSetting[], from: VaneSetting): VaneSetting {
  const can = vaneSettingsFor(control);
  const idx = (v: VaneSetting) => VANE_SETTINGS.indexOf(v);
  const both = can.filter((v) => suits.includes(v));
  const pool = both.length ? both : can;
  const target = both.length ? idx(from) : Math.round(suits.reduce((a, v) => a + idx(v), 0) / suits.length);
  return [...pool].sort((a, b) => Math.abs(idx(a) - target) - Math.abs(idx(b) - target) || idx(a) - idx(b))[0]!;
}
