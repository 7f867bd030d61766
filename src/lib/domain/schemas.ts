/**
 * The formats Cagewright exchanges: machine families, catalog parts, layouts and findings.
 * One zod schema per format; API routes, the editor island, the database seed and the check
 * command all import these, so a layout means the same thing everywhere.
 *
 * Each `fooSchema` has a type `Foo = z.infer<typeof fooSchema>`. Object schemas that carry
 * cross-field checks (`.superRefine`) also export their plain shape as `fooBaseSchema`, because
 * zod refuses `.pick()`/`.omit()` on refined objects (forms may want a subset).
 */
import { z } from 'zod';
import { isCurrencyCode } from './format';
import { storableString } from './text';
import {
  BAR_KIND_VALUES,
  CAGE_KIND_VALUES,
  CLEARANCE_MAX_MM,
  CLEARANCE_MIN_MM,
  CROP_ID_VALUES,
  DRUM_ID_VALUES,
  ELEMENT_ROLE_VALUES,
  ELEMENT_TYPE_VALUES,
  INDEX_MAX,
  LAYOUT_FORMAT,
  RPM_MAX,
  RPM_MIN,
  SETTING_FIELD_VALUES,
  SEVERITY_VALUES,
  SIDE_VALUES,
  VANE_CONTROL_VALUES,
  VANE_SETTING_VALUES,
  ZONE_VALUES,
} from './values';

export { CLEARANCE_MAX_MM, CLEARANCE_MIN_MM, LAYOUT_FORMAT, RPM_MAX, RPM_MIN };

// ---------------------------------------------------------------------------------------------
// Enumerations

export const zoneSchema = z.enum(ZONE_VALUES);
export type Zone = z.infer<typeof zoneSchema>;

export const sideSchema = z.enum(SIDE_VALUES);
export type Side = z.infer<typeof sideSchema>;

/** modular: any element in any position; split: concaves in front, grates at the rear. */
export const cageKindSchema = z.enum(CAGE_KIND_VALUES);
export type CageKind = z.infer<typeof cageKindSchema>;

export const elementTypeSchema = z.enum(ELEMENT_TYPE_VALUES);
export type ElementType = z.infer<typeof elementTypeSchema>;

/** Split cages: a concave goes in front only, a grate at the rear only. Modular parts: 'either'. */
export const elementRoleSchema = z.enum(ELEMENT_ROLE_VALUES);
export type ElementRole = z.infer<typeof elementRoleSchema>;

export const barKindSchema = z.enum(BAR_KIND_VALUES);
export type BarKind = z.infer<typeof barKindSchema>;

export const vaneControlSchema = z.enum(VANE_CONTROL_VALUES);
export type VaneControl = z.infer<typeof vaneControlSchema>;

export const vaneSettingSchema = z.enum(VANE_SETTING_VALUES);
export type VaneSetting = z.infer<typeof vaneSettingSchema>;

export const drumIdSchema = z.enum(DRUM_ID_VALUES);
export type DrumId = z.infer<typeof drumIdSchema>;

export const cropIdSchema = z.enum(CROP_ID_VALUES);
export type CropId = z.infer<typeof cropIdSchema>;

/** blocks-fit: will not bolt on / cannot run; hurts-crop: works badly for the crop; advice. */
export const severitySchema = z.enum(SEVERITY_VALUES);
export type Severity = z.infer<typeof severitySchema>;

export const settingFieldSchema = z.enum(SETTING_FIELD_VALUES);
export type SettingField = z.infer<typeof settingFieldSchema>;

// ---------------------------------------------------------------------------------------------
// Small building blocks

/** An ISO 4217 code, upper-cased as typed ("eur" → "EUR"); see `isCurrencyCode` in format.ts. */
export const currencyCodeSchema = z
  .string()
  .trim()
  .transform((s) => s.toUpperCase())
  .refine(isCurrencyCode, 'use a three-letter ISO 4217 currency code, such as USD, EUR or CAD');

const index1 = z.int().min(1).max(INDEX_MAX);
/** Lower-case words joined by dashes: 'tamarack-m4'. */
export const slugSchema = z
  .string()
  .min(2)
  .max(60)
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'use lower-case letters, digits and dashes');
/** Upper-case letters and digits joined by dashes: 'CW-FW-L-04'. */
export const partNumberSchema = z
  .string()
  .min(2)
  .max(40)
  .regex(/^[A-Z0-9]+(?:-[A-Z0-9]+)*$/, 'use upper-case letters, digits and dashes');

// ---------------------------------------------------------------------------------------------
// Places: where on the cage something sits (also where a finding is pinned)

export const placeSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('element'), position: index1, side: sideSchema }),
  z.object({ kind: z.literal('cover'), section: index1, side: sideSchema }),
  z.object({ kind: z.literal('bar'), row: index1, position: index1 }),
  z.object({ kind: z.literal('setting'), field: settingFieldSchema }),
]);
export type Place = z.infer<typeof placeSchema>;

// ---------------------------------------------------------------------------------------------
// Machine family

export const cagePositionSchema = z.object({ index: index1, zone: zoneSchema });
export type CagePosition = z.infer<typeof cagePositionSchema>;

export const drumOptionSchema = z.object({
  id: drumIdSchema,
  label: storableString().min(1).max(60),
  /** Across the rasp bars. */
  diameterMm: z.number().min(200).max(1500),
});
export type DrumOption = z.infer<typeof drumOptionSchema>;

export const cageTopSectionSchema = z.object({
  index: index1,
  /** The positions this section of the cage top lies over. */
  positions: z.array(index1).min(1),
  /** The sides on which a cover plate may bolt to this section (empty: none). */
  coverPlateSides: z.array(sideSchema),
});
export type CageTopSection = z.infer<typeof cageTopSectionSchema>;

export const rotorBarRowSchema = z.object({
  index: index1,
  /** Where the row sits around the rotor, degrees from an arbitrary zero. */
  angleDeg: z.number().min(0).lt(360),
});
export type RotorBarRow = z.infer<typeof rotorBarRowSchema>;

export const rotorBarPlaceSchema = z.object({
  row: index1,
  /** Along the rotor, same numbering as the cage positions. */
  position: index1,
  /** Two rasp bars stand in line here, so a straight bar can bolt across them. */
  inLine: z.boolean(),
});
export type RotorBarPlace = z.infer<typeof rotorBarPlaceSchema>;

export const machineFamilyBaseSchema = z.object({
  id: slugSchema,
  name: storableString().min(1).max(80),
  /** Parts fit a family when their fitGroup matches. Families of one generation may share it. */
  fitGroup: slugSchema,
  cageKind: cageKindSchema,
  positions: z.array(cagePositionSchema).min(1).max(16),
  drumOptions: z.array(drumOptionSchema).min(1),
  /** The vane control kinds a machine of this family may have. */
  vaneControls: z.array(vaneControlSchema).min(1),
  cageTopSections: z.array(cageTopSectionSchema),
  rotorBarRows: z.array(rotorBarRowSchema),
  rotorBarPlaces: z.array(rotorBarPlaceSchema),
  /** The last position (discharge end). */
  rearPosition: index1,
  /** The threshing rotor's own mass, kg, for the balance check (rotor.ts has the default). */
  rotorMassKg: z.number().min(20).max(5000).optional(),
});

export const machineFamilySchema = machineFamilyBaseSchema.superRefine((f, ctx) => {
  f.positions.forEach((p, i) => {
    if (p.index !== i + 1) ctx.addIssue({ code: 'custom', path: ['positions', i, 'index'], message: `expected position ${i + 1}` });
    if (i > 0 && f.positions[i - 1]!.zone === 'separating' && p.zone === 'threshing')
      ctx.addIssue({ code: 'custom', path: ['positions', i, 'zone'], message: 'threshing positions come before separating ones' });
  });
  if (f.rearPosition !== f.positions.length) ctx.addIssue({ code: 'custom', path: ['rearPosition'], message: 'must be the last position' });
  const drums = new Set<string>();
  f.drumOptions.forEach((d, i) => {
    if (drums.has(d.id)) ctx.addIssue({ code: 'custom', path: ['drumOptions', i, 'id'], message: 'duplicate drum option' });
    drums.add(d.id);
  });
  f.cageTopSections.forEach((s, i) => {
    if (s.index !== i + 1) ctx.addIssue({ code: 'custom', path: ['cageTopSections', i, 'index'], message: `expected section ${i + 1}` });
    s.positions.forEach((p, j) => {
      if (p > f.positions.length)
        ctx.addIssue({ code: 'custom', path: ['cageTopSections', i, 'positions', j], message: 'no such position' });
    });
  });
  const rows = new Set(f.rotorBarRows.map((r) => r.index));
  f.rotorBarRows.forEach((r, i) => {
    if (r.index !== i + 1) ctx.addIssue({ code: 'custom', path: ['rotorBarRows', i, 'index'], message: `expected row ${i + 1}` });
  });
  const seen = new Set<string>();
  f.rotorBarPlaces.forEach((p, i) => {
    if (!rows.has(p.row)) ctx.addIssue({ code: 'custom', path: ['rotorBarPlaces', i, 'row'], message: 'no such row' });
    if (p.position > f.positions.length)
      ctx.addIssue({ code: 'custom', path: ['rotorBarPlaces', i, 'position'], message: 'no such position' });
    const key = `${p.row}:${p.position}`;
    if (seen.has(key)) ctx.addIssue({ code: 'custom', path: ['rotorBarPlaces', i], message: 'duplicate place' });
    seen.add(key);
  });
});
export type MachineFamily = z.infer<typeof machineFamilySchema>;

// ---------------------------------------------------------------------------------------------
// Catalog parts

const partCommon = {
  partNumber: partNumberSchema,
  name: storableString().min(1).max(120),
  fitGroup: slugSchema,
  massKg: z.number().positive().max(500),
  /** Unit price in cents of the catalog currency. */
  priceCents: z.int().min(0),
  /** Tightening torque of the part's mounting bolts, N·m; absent: the operator's manual gives it. */
  boltTorqueNm: z.number().positive().max(2000).optional(),
};

export const openingSchema = z.object({
  /** The narrow way across an opening (between wires or bars, or a hole's diameter). */
  width: z.number().positive().max(200),
  /** The long way (along the wires); equal to width for a round hole. */
  length: z.number().positive().max(400),
});
export type Opening = z.infer<typeof openingSchema>;

export const elementPartSchema = z.object({
  kind: z.literal('element'),
  ...partCommon,
  elementType: elementTypeSchema,
  role: elementRoleSchema,
  hand: sideSchema,
  zones: z.array(zoneSchema).min(1),
  /** Opening size in mm; null for a blank plate. */
  openingMm: openingSchema.nullable(),
  /** Open share of the element's face, 0..1. */
  openArea: z.number().min(0).max(1),
});
export type ElementPart = z.infer<typeof elementPartSchema>;

export const coverPlatePartSchema = z.object({
  kind: z.literal('cover-plate'),
  ...partCommon,
  side: sideSchema,
  /** Slotted so vane bolts pass through. */
  slotted: z.boolean(),
});
export type CoverPlatePart = z.infer<typeof coverPlatePartSchema>;

export const rotorBarPartSchema = z.object({
  kind: z.literal('rotor-bar'),
  ...partCommon,
  barKind: barKindSchema,
});
export type RotorBarPart = z.infer<typeof rotorBarPartSchema>;

export const catalogPartSchema = z.discriminatedUnion('kind', [elementPartSchema, coverPlatePartSchema, rotorBarPartSchema]);
export type CatalogPart = z.infer<typeof catalogPartSchema>;
export type CatalogPartKind = CatalogPart['kind'];

// ---------------------------------------------------------------------------------------------
// Layout: the exchange format

export const placedElementSchema = z.object({ position: index1, side: sideSchema, partNumber: partNumberSchema });
export type PlacedElement = z.infer<typeof placedElementSchema>;
export const placedCoverPlateSchema = z.object({ section: index1, side: sideSchema, partNumber: partNumberSchema });
export type PlacedCoverPlate = z.infer<typeof placedCoverPlateSchema>;
export const placedRotorBarSchema = z.object({ row: index1, position: index1, partNumber: partNumberSchema });
export type PlacedRotorBar = z.infer<typeof placedRotorBarSchema>;

export const layoutBaseSchema = z.object({
  format: z.literal(LAYOUT_FORMAT),
  familyId: slugSchema,
  crop: cropIdSchema,
  drum: drumIdSchema,
  vaneControl: vaneControlSchema,
  vaneSetting: vaneSettingSchema,
  rotorRpm: z.int().min(RPM_MIN).max(RPM_MAX),
  /** Rotor to concave, mm. */
  clearanceMm: z.number().min(CLEARANCE_MIN_MM).max(CLEARANCE_MAX_MM),
  /** A half-position absent here is empty. */
  elements: z.array(placedElementSchema).max(128),
  coverPlates: z.array(placedCoverPlateSchema).max(64),
  /** What is bolted at each rotor bar place; a place absent here has nothing bolted on. */
  rotorBars: z.array(placedRotorBarSchema).max(256),
  note: storableString().max(2000).optional(),
});

export const layoutSchema = layoutBaseSchema.superRefine((l, ctx) => {
  const dup = <T>(items: T[], key: (t: T) => string, path: string, what: string) => {
    const seen = new Set<string>();
    items.forEach((t, i) => {
      const k = key(t);
      if (seen.has(k)) ctx.addIssue({ code: 'custom', path: [path, i], message: `two parts in one ${what} (${k})` });
      seen.add(k);
    });
  };
  dup(l.elements, (e) => `${e.position}:${e.side}`, 'elements', 'half-position');
  dup(l.coverPlates, (c) => `${c.section}:${c.side}`, 'coverPlates', 'cover-plate slot');
  dup(l.rotorBars, (b) => `${b.row}:${b.position}`, 'rotorBars', 'rotor bar place');
});
export type Layout = z.infer<typeof layoutSchema>;

// ---------------------------------------------------------------------------------------------
// Findings

/** Stable finding codes: the UI, tests and saved reports key on these; never rename one. */
export const findingCodeSchema = z.enum([
  // layout against its family
  'LAYOUT_FAMILY_MISMATCH',
  'LAYOUT_DUPLICATE_PLACE',
  'FIT_DRUM_UNAVAILABLE',
  'FIT_VANE_CONTROL_UNAVAILABLE',
  // parts
  'PART_UNKNOWN',
  'PART_WRONG_KIND',
  'FIT_GROUP_FOREIGN',
  // elements
  'FIT_POSITION_UNKNOWN',
  'FIT_HAND_MISMATCH',
  'FIT_ZONE_FORBIDDEN',
  'FIT_EMPTY_POSITION',
  // cover plates
  'COVER_SECTION_UNKNOWN',
  'COVER_OUTSIDE_SECTION',
  'COVER_VANE_LINKAGE',
  'COVER_NOT_NEEDED',
  // rotor bars
  'BAR_PLACE_UNKNOWN',
  'BAR_STRAIGHT_NOT_IN_LINE',
  'BAR_DISCHARGE_NOT_REAR',
  'BAR_DISCHARGE_EXTRA_NOT_OPPOSITE',
  'BAR_STRAIGHT_NOT_NEEDED',
  'BAR_STRAIGHT_SUGGESTED',
  'BAR_DISCHARGE_SUGGESTED',
  'BAR_PLACE_EMPTY',
  'BAR_UNDER_STRAIGHT',
  'BAR_UNBALANCED',
  'COVER_UNSLOTTED_VANES',
  // crop
  'CROP_OPENING_TOO_SMALL',
  'CROP_OPENING_TIGHT',
  'CROP_SKIP_WIRE_SMALL_GRAIN',
  'CROP_CLOSE_BAR_SMALL_SEED',
  'ZONE_NO_OPEN_AREA',
  'CROP_AGGRESSIVE_FRAGILE',
  'CROP_OPEN_HARD_THRESHING',
  'CROP_BLANK_PLATE',
  'CROP_RPM_OUTSIDE_WINDOW',
  'DRUM_SLIM_ADVICE',
  // settings: speed band, clearance, vanes
  'CROP_RPM_OUTSIDE_START',
  'FIT_CLEARANCE_BELOW_MINIMUM',
  'CROP_CLEARANCE_OUTSIDE_WINDOW',
  'FIT_VANE_SETTING_UNAVAILABLE',
  'CROP_VANES_AGAINST_CROP',
  'CROP_VANES_ADVICE',
]);
export type FindingCode = z.infer<typeof findingCodeSchema>;

export const findingSchema = z.object({
  code: findingCodeSchema,
  severity: severitySchema,
  places: z.array(placeSchema),
  title: z.string().min(1),
  explanation: z.string().min(1),
  fix: z.string().min(1),
});
export type Finding = z.infer<typeof findingSchema>;
