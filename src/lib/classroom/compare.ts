/**
 * Two layouts side by side, for class: each difference (element, cover plate, rotor bar,
 * setting) with what the rules say about that place on either side, the findings one layout
 * has and the other does not, and the computed figures next to each other. Pure: built from
 * domain functions only, so the page, the island and the tests read the same thing.
 */
import { computeSettings, type Settings } from '~/lib/domain/compute';
import { cropPrograms } from '~/lib/domain/crops';
import { rpmWindowWords } from '~/lib/domain/speed';
import { describePlace, diffLayouts, type LayoutDiff, type LayoutDifference } from '~/lib/domain/diff';
import { placeKey } from '~/lib/domain/places';
import { checkLayout } from '~/lib/domain/rules';
import type { CatalogPart, Finding, Layout, MachineFamily, Place, SettingField } from '~/lib/domain/schemas';
import { formatLength, formatSpeed, mm, type UnitSystem } from '~/lib/domain/units';

export interface CompareInput {
  family: MachineFamily;
  catalog: readonly CatalogPart[];
  layout: Layout;
}

export interface ComparedSide extends CompareInput {
  findings: Finding[];
  settings: Settings;
}

export interface DifferenceRow {
  /** 1-based, in the order of diffLayouts (settings, elements, cover plates, rotor bars). */
  n: number;
  difference: LayoutDifference;
  kindWords: 'Setting' | 'Element' | 'Cover plate' | 'Rotor bar';
  where: string;
  before: string;
  after: string;
  /** Findings pinned to this place in A and in B. */
  rulesA: Finding[];
  rulesB: Finding[];
}

export interface MetricRow {
  label: string;
  a: string;
  b: string;
  /** The two read differently. */
  differs: boolean;
}

export interface Comparison {
  a: ComparedSide;
  b: ComparedSide;
  diff: LayoutDiff;
  /**
   * The differences to show. Across two machine families every part number differs, so there a
   * part counts as changed only when it is of another kind (element type and hand, bar kind,
   * plate side) — a rasp bar against a rasp bar of the other family is not a difference.
   */
  rows: DifferenceRow[];
  counts: LayoutDiff['counts'];
  /** The places of `rows`, to mark on both diagrams. */
  places: Place[];
  /** Findings only A has, only B has, and both have (matched by code and places). */
  findings: { onlyA: Finding[]; onlyB: Finding[]; both: Finding[] };
  metrics: MetricRow[];
}

const KIND_WORDS = { setting: 'Setting', element: 'Element', cover: 'Cover plate', bar: 'Rotor bar' } as const;

const findingKey = (f: Finding) => `${f.code}|${f.places.map(placeKey).sort().join(',')}`;

const VANE_WORDS: Record<string, string> = { 'very-slow': 'very slow', slow: 'slow', medium: 'medium', fast: 'fast' };

/** A setting's value as people say it. */
export function settingValueWords(
  field: SettingField,
  value: string | number,
  family: MachineFamily,
  units: UnitSystem = 'metric',
): string {
  switch (field) {
    case 'crop':
      return cropPrograms[value as keyof typeof cropPrograms]?.name ?? String(value);
    case 'drum':
      return family.drumOptions.find((d) => d.id === value)?.label ?? `${value} drum`;
    case 'rotorRpm':
      return `${value} rpm`;
    case 'clearanceMm':
      return formatLength(mm(Number(value)), units);
    case 'vaneControl':
      return `${value} vanes`;
    case 'vaneSetting':
      return VANE_WORDS[String(value)] ?? String(value);
  }
}

/** What a part is, regardless of the family it is made for. */
function partKind(partNumber: string | null, catalog: readonly CatalogPart[]): string | null {
  const part = partNumber === null ? undefined : catalog.find((p) => p.partNumber === partNumber);
  if (!part) return partNumber;
  if (part.kind === 'element') return `element:${part.elementType}:${part.hand}`;
  if (part.kind === 'cover-plate') return `cover:${part.side}`;
  return `bar:${part.barKind}`;
}

function partWords(partNumber: string | null, catalog: readonly CatalogPart[]): string {
  if (partNumber === null) return 'empty';
  const part = catalog.find((p) => p.partNumber === partNumber);
  return part ? `${part.name} (${partNumber})` : `unknown part ${partNumber}`;
}

const pct = (x: number) => `${Math.round(x * 100)} %`;

function metrics(a: ComparedSide, b: ComparedSide, units: UnitSystem): MetricRow[] {
  const rows: [string, (s: ComparedSide) => string][] = [
    ['Rotor tip speed', (s) => formatSpeed(s.settings.tipSpeedMs, units)],
    [
      'Rotor speed for the crop',
      (s) => (s.settings.rpmInWindow ? 'inside the window' : 'outside the window') + ` (${rpmWindowWords(s.settings.rpmWindow)})`,
    ],
    ['Threshing aggressiveness index', (s) => String(Math.round(s.settings.aggressivenessIndex))],
    ['Open area, threshing zone (after cover plates)', (s) => pct(s.settings.openArea.threshing.after)],
    ['Open area, separating zone (after cover plates)', (s) => pct(s.settings.openArea.separating.after)],
    ['Capacity factor', (s) => s.settings.capacity.value.toFixed(2)],
    ['Elements the kernel cannot pass', (s) => String(s.settings.passage.filter((p) => p.passes === false).length)],
    [
      'Findings (blocks fit · hurts the crop · advice)',
      (s) => {
        const c = { 'blocks-fit': 0, 'hurts-crop': 0, advice: 0 };
        for (const f of s.findings) c[f.severity]++;
        return `${c['blocks-fit']} · ${c['hurts-crop']} · ${c.advice}`;
      },
    ],
  ];
  return rows.map(([label, f]) => {
    const x = f(a);
    const y = f(b);
    return { label, a: x, b: y, differs: x !== y };
  });
}

export function sideOf(input: CompareInput): ComparedSide {
  return {
    ...input,
    findings: checkLayout(input.family, input.catalog, input.layout),
    settings: computeSettings(input.family, input.catalog, input.layout),
  };
}

export function compareLayouts(aIn: CompareInput, bIn: CompareInput, units: UnitSystem = 'metric'): Comparison {
  const a = sideOf(aIn);
  const b = sideOf(bIn);
  const diff = diffLayouts(a.layout, b.layout);
  const at = (findings: Finding[], key: string) => findings.filter((f) => f.places.some((p) => placeKey(p) === key));
  const acrossFamilies = a.family.id !== b.family.id;
  const shown = diff.differences.filter(
    (d) => !acrossFamilies || d.kind === 'setting' || partKind(d.before, a.catalog) !== partKind(d.after, b.catalog),
  );
  const rows: DifferenceRow[] = shown.map((d, i) => {
    const key = placeKey(d.place);
    const before = d.kind === 'setting' ? settingValueWords(d.field, d.before, a.family, units) : partWords(d.before, a.catalog);
    const after = d.kind === 'setting' ? settingValueWords(d.field, d.after, b.family, units) : partWords(d.after, b.catalog);
    return {
      n: i + 1,
      difference: d,
      kindWords: KIND_WORDS[d.kind],
      where: describePlace(d.place),
      before,
      after,
      rulesA: at(a.findings, key),
      rulesB: at(b.findings, key),
    };
  });
  const keysA = new Set(a.findings.map(findingKey));
  const keysB = new Set(b.findings.map(findingKey));
  return {
    a,
    b,
    diff,
    rows,
    counts: {
      elements: shown.filter((d) => d.kind === 'element').length,
      coverPlates: shown.filter((d) => d.kind === 'cover').length,
      rotorBars: shown.filter((d) => d.kind === 'bar').length,
      settings: shown.filter((d) => d.kind === 'setting').length,
    },
    places: shown.map((d) => d.place),
    findings: {
      onlyA: a.findings.filter((f) => !keysB.has(findingKey(f))),
      onlyB: b.findings.filter((f) => !keysA.has(findingKey(f))),
      both: a.findings.filter((f) => keysB.has(findingKey(f))),
    },
    metrics: metrics(a, b, units),
  };
}
