/**
 * The value lists and limits of the layout format, as plain data. The zod schemas in
 * `schemas.ts` are built from them; code that only needs a list or a limit (the islands: the
 * editor, the drawing, the vocabulary) reads it here, so the browser is not sent zod for it.
 */

export const ZONE_VALUES = ['threshing', 'separating'] as const;
export const SIDE_VALUES = ['left', 'right'] as const;
export const CAGE_KIND_VALUES = ['modular', 'split'] as const;
export const ELEMENT_TYPE_VALUES = ['fine-wire', 'wide-wire', 'skip-wire', 'round-bar', 'perforated', 'blank', 'close-bar'] as const;
export const ELEMENT_ROLE_VALUES = ['concave', 'grate', 'either'] as const;
export const BAR_KIND_VALUES = ['rasp', 'smooth-rasp', 'spike-rasp', 'straight', 'discharge'] as const;
export const VANE_CONTROL_VALUES = ['fixed', 'manual', 'powered'] as const;
export const VANE_SETTING_VALUES = ['very-slow', 'slow', 'medium', 'fast'] as const;
export const DRUM_ID_VALUES = ['full', 'slim'] as const;
export const CROP_ID_VALUES = [
  'wheat',
  'barley',
  'oats',
  'canola',
  'field-peas',
  'lentils',
  'soybeans',
  'edible-beans',
  'corn',
  'rice',
  'sunflower',
  'grass-seed',
  'sorghum',
  'hemp',
] as const;
export const SEVERITY_VALUES = ['blocks-fit', 'hurts-crop', 'advice'] as const;
export const SETTING_FIELD_VALUES = ['crop', 'drum', 'rotorRpm', 'clearanceMm', 'vaneControl', 'vaneSetting'] as const;

/** Positions, sections and rows are counted from 1, up to this many. */
export const INDEX_MAX = 64;

export const LAYOUT_FORMAT = 'cagewright.layout/1' as const;
export const RPM_MIN = 100;
export const RPM_MAX = 1500;
export const CLEARANCE_MIN_MM = 0.5;
export const CLEARANCE_MAX_MM = 80;
