/**
 * Demo data, invented for this product: two machine families and their parts. Nothing here
 * describes a real machine; names, part numbers, sizes, masses and prices are ours.
 *
 * Part numbers: CW-<type>-<hand>-<family code>[C|G]
 *   type: FW fine-wire, WW wide-wire, SW skip-wire, RB round-bar, PF perforated, BL blank,
 *         CB close-bar, CP cover plate; rotor bars CW-BR-<kind>-<family code> with kind
 *         RS rasp, SR smooth rasp, SP spike rasp, ST straight, DC discharge.
 *   family code: 04 Tamarack M4 (modular), 06 Sedge S6 (split; C concave, G grate).
 */
import type { CatalogPart, ElementPart, ElementRole, ElementType, MachineFamily, RotorBarPlace, Side, Zone } from './schemas';

const FOUR_ROWS = [
  { index: 1, angleDeg: 0 },
  { index: 2, angleDeg: 90 },
  { index: 3, angleDeg: 180 },
  { index: 4, angleDeg: 270 },
];

function barPlaces(positions: number, inLine: (row: number, position: number) => boolean): RotorBarPlace[] {
  const out: RotorBarPlace[] = [];
  for (const r of FOUR_ROWS) for (let p = 1; p <= positions; p++) out.push({ row: r.index, position: p, inLine: inLine(r.index, p) });
  return out;
}

export const tamarackM4: MachineFamily = {
  id: 'tamarack-m4',
  name: 'Tamarack M4',
  fitGroup: 'tamarack',
  cageKind: 'modular',
  positions: [
    { index: 1, zone: 'threshing' },
    { index: 2, zone: 'threshing' },
    { index: 3, zone: 'separating' },
    { index: 4, zone: 'separating' },
  ],
  drumOptions: [
    { id: 'full', label: 'Full drum', diameterMm: 762 },
    { id: 'slim', label: 'Slim drum', diameterMm: 762 },
  ],
  vaneControls: ['fixed', 'powered'],
  cageTopSections: [
    { index: 1, positions: [1], coverPlateSides: [] },
    { index: 2, positions: [2, 3], coverPlateSides: ['left', 'right'] },
    { index: 3, positions: [4], coverPlateSides: [] },
  ],
  rotorBarRows: FOUR_ROWS,
  rotorBarPlaces: barPlaces(4, (row, p) => (row === 1 || row === 3) && p <= 2),
  rearPosition: 4,
  rotorMassKg: 480,
};

export const sedgeS6: MachineFamily = {
  id: 'sedge-s6',
  name: 'Sedge S6',
  fitGroup: 'sedge',
  cageKind: 'split',
  positions: [
    { index: 1, zone: 'threshing' },
    { index: 2, zone: 'threshing' },
    { index: 3, zone: 'threshing' },
    { index: 4, zone: 'separating' },
    { index: 5, zone: 'separating' },
    { index: 6, zone: 'separating' },
  ],
  drumOptions: [{ id: 'full', label: 'Full drum', diameterMm: 762 }],
  vaneControls: ['manual'],
  cageTopSections: [
    { index: 1, positions: [1, 2], coverPlateSides: [] },
    { index: 2, positions: [3, 4], coverPlateSides: ['left', 'right'] },
    { index: 3, positions: [5, 6], coverPlateSides: [] },
  ],
  rotorBarRows: FOUR_ROWS,
  rotorBarPlaces: barPlaces(6, (row, p) => (row === 2 || row === 4) && (p === 2 || p === 3)),
  rearPosition: 6,
  rotorMassKg: 430,
};

export const demoFamilies: readonly MachineFamily[] = [tamarackM4, sedgeS6];

interface ElementSpec {
  code: string;
  label: string;
  opening: { width: number; length: number } | null;
  openArea: number;
  /** Mass of the modular element, kg; split concaves and grates scale from it. */
  massKg: number;
  priceCents: number;
}

const ELEMENT_SPECS: Record<ElementType, ElementSpec> = {
  'fine-wire': { code: 'FW', label: 'Fine-wire', opening: { width: 5, length: 25 }, openArea: 0.38, massKg: 44.5, priceCents: 118_500 },
  'wide-wire': { code: 'WW', label: 'Wide-wire', opening: { width: 14, length: 40 }, openArea: 0.5, massKg: 41, priceCents: 112_000 },
  'skip-wire': { code: 'SW', label: 'Skip-wire', opening: { width: 28, length: 40 }, openArea: 0.62, massKg: 37.5, priceCents: 104_000 },
  'round-bar': { code: 'RB', label: 'Round-bar', opening: { width: 12, length: 45 }, openArea: 0.45, massKg: 47, priceCents: 131_000 },
  perforated: { code: 'PF', label: 'Perforated plate', opening: { width: 14, length: 14 }, openArea: 0.32, massKg: 39, priceCents: 97_500 },
  blank: { code: 'BL', label: 'Blank plate', opening: null, openArea: 0, massKg: 33, priceCents: 61_000 },
  'close-bar': { code: 'CB', label: 'Close-bar', opening: { width: 4, length: 20 }, openArea: 0.28, massKg: 49.5, priceCents: 139_000 },
};

const TYPES = Object.keys(ELEMENT_SPECS) as ElementType[];
const HANDS: readonly Side[] = ['left', 'right'];
const hc = (s: Side) => (s === 'left' ? 'L' : 'R');
const cents = (n: number) => Math.round(n / 100) * 100;
const kgs = (n: number) => Math.round(n * 10) / 10;

function element(
  type: ElementType,
  hand: Side,
  fitGroup: string,
  familyCode: string,
  familyName: string,
  role: ElementRole,
  zones: Zone[],
  scale: number,
): ElementPart {
  const s = ELEMENT_SPECS[type];
  const suffix = role === 'concave' ? 'C' : role === 'grate' ? 'G' : '';
  const what = role === 'either' ? 'element' : role;
  return {
    kind: 'element',
    partNumber: `CW-${s.code}-${hc(hand)}-${familyCode}${suffix}`,
    name: `${s.label} ${what}, ${hand} hand, ${familyName}`,
    fitGroup,
    elementType: type,
    role,
    hand,
    zones,
    openingMm: s.opening,
    openArea: s.openArea,
    // The left element is about 12.7 mm longer (common practice): a touch heavier.
    massKg: kgs(s.massKg * scale * (hand === 'left' ? 1.01 : 1)),
    priceCents: cents(s.priceCents * scale),
    // Invented demo torque for the mounting bolts (not from any manual).
    boltTorqueNm: 130,
  };
}

function familyParts(family: MachineFamily, familyCode: string, plateMassKg: number): CatalogPart[] {
  const parts: CatalogPart[] = [];
  const g = family.fitGroup;
  for (const type of TYPES)
    for (const hand of HANDS) {
      if (family.cageKind === 'modular') {
        parts.push(element(type, hand, g, familyCode, family.name, 'either', ['threshing', 'separating'], 1));
      } else {
        parts.push(element(type, hand, g, familyCode, family.name, 'concave', ['threshing'], 0.85));
        parts.push(element(type, hand, g, familyCode, family.name, 'grate', ['separating'], 0.75));
      }
    }
  for (const side of HANDS)
    parts.push({
      kind: 'cover-plate',
      partNumber: `CW-CP-${hc(side)}-${familyCode}`,
      name: `Cover plate, ${side}, ${family.name}`,
      fitGroup: g,
      side,
      slotted: true,
      massKg: plateMassKg,
      priceCents: 24_500,
      // Invented demo torque (not from any manual).
      boltTorqueNm: 45,
    });
  const bars: [string, 'rasp' | 'smooth-rasp' | 'spike-rasp' | 'straight' | 'discharge', string, number, number][] = [
    ['RS', 'rasp', 'Rasp bar', 6.8, 8_900],
    ['SR', 'smooth-rasp', 'Smooth-top rasp bar', 6.6, 9_400],
    ['SP', 'spike-rasp', 'Spike rasp bar', 7.4, 11_200],
    ['ST', 'straight', 'Straight interrupter bar', 5.2, 7_300],
    ['DC', 'discharge', 'Discharge bar', 8.1, 12_800],
  ];
  for (const [code, barKind, label, massKg, priceCents] of bars)
    parts.push({
      kind: 'rotor-bar',
      partNumber: `CW-BR-${code}-${familyCode}`,
      name: `${label}, ${family.name}`,
      fitGroup: g,
      barKind,
      massKg,
      priceCents,
      // Invented demo torque (not from any manual).
      boltTorqueNm: 95,
    });
  return parts;
}

export const demoCatalog: readonly CatalogPart[] = [...familyParts(tamarackM4, '04', 11.5), ...familyParts(sedgeS6, '06', 9.8)];

export function demoFamily(id: string): MachineFamily | undefined {
  return demoFamilies.find((f) => f.id === id);
}
