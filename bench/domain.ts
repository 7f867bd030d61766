/**
 * Rules benchmark: checks 10,000 generated layouts and prints the median time per layout.
 * Run: npx tsx bench/domain.ts [count]
 *
 * Layouts are generated from a fixed seed: a starter layout for a random family, crop, drum and
 * vane control, then a few random edits (any part of the family in any half-position, cover
 * plates, rotor bars swapped or taken off, rotor speed, clearance), so the rules meet both clean
 * and faulty layouts, the balance and clearance checks included. Every generated layout is
 * schema-valid (`layoutSchema`); the bench reports the median (the budget) and the p99.
 */
import { performance } from 'node:perf_hooks';
import {
  checkLayout,
  computeSettings,
  cropIdSchema,
  demoCatalog,
  demoFamilies,
  indexCatalog,
  layoutSchema,
  starterLayout,
  vaneSettingSchema,
  type Layout,
  type MachineFamily,
} from '~/lib/domain/index';

const count = Number(process.argv[2] ?? 10_000);

// Small deterministic PRNG (mulberry32) so every run checks the same layouts.
function prng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
const rand = prng(20240601);
const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)]!;

function generate(): { family: MachineFamily; layout: Layout } {
  const family = pick(demoFamilies);
  const crop = pick(cropIdSchema.options);
  const layout = starterLayout(family, crop, demoCatalog, {
    drum: pick(family.drumOptions).id,
    vaneControl: pick(family.vaneControls),
  });
  const parts = demoCatalog.filter((p) => p.fitGroup === family.fitGroup || rand() < 0.02);
  const elements = parts.filter((p) => p.kind === 'element');
  const edits = Math.floor(rand() * 4);
  let l: Layout = { ...layout, elements: [...layout.elements], rotorBars: [...layout.rotorBars], coverPlates: [...layout.coverPlates] };
  for (let i = 0; i < edits; i++) {
    const r = rand();
    if (r < 0.5) {
      const idx = Math.floor(rand() * l.elements.length);
      l.elements[idx] = { ...l.elements[idx]!, partNumber: pick(elements).partNumber };
    } else if (r < 0.6) {
      l.elements.splice(Math.floor(rand() * l.elements.length), 1);
    } else if (r < 0.75) {
      const plate = pick(parts.filter((p) => p.kind === 'cover-plate'));
      const section = 1 + Math.floor(rand() * family.cageTopSections.length);
      const side = rand() < 0.5 ? 'left' : 'right';
      if (!l.coverPlates.some((c) => c.section === section && c.side === side))
        l.coverPlates.push({ section, side, partNumber: plate.partNumber });
    } else if (r < 0.82) {
      const idx = Math.floor(rand() * l.rotorBars.length);
      const bar = pick(parts.filter((p) => p.kind === 'rotor-bar'));
      if (l.rotorBars[idx]) l.rotorBars[idx] = { ...l.rotorBars[idx]!, partNumber: bar.partNumber };
    } else if (r < 0.9) {
      l.rotorBars.splice(Math.floor(rand() * l.rotorBars.length), 1);
    } else {
      l = { ...l, rotorRpm: 100 + Math.floor(rand() * 1400), clearanceMm: 0.5 + rand() * 40, vaneSetting: pick(vaneSettingSchema.options) };
    }
  }
  return { family, layout: l };
}

/** A generated layout that the schema accepts (the rare invalid one is drawn again). */
function generateValid(): { family: MachineFamily; layout: Layout } {
  for (;;) {
    const c = generate();
    const parsed = layoutSchema.safeParse(c.layout);
    if (parsed.success) return { family: c.family, layout: parsed.data };
  }
}

const cases = Array.from({ length: count }, generateValid);
const index = indexCatalog(demoCatalog);

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

function measure(label: string, fn: (c: (typeof cases)[number]) => unknown): { med: number; p99: number } {
  for (let i = 0; i < Math.min(2000, cases.length); i++) fn(cases[i]!); // warm up the JIT
  const times: number[] = new Array(cases.length);
  let sink = 0;
  for (let i = 0; i < cases.length; i++) {
    const t0 = performance.now();
    const out = fn(cases[i]!);
    times[i] = (performance.now() - t0) * 1000;
    sink += Array.isArray(out) ? out.length : 1;
  }
  const med = median(times);
  const sorted = [...times].sort((a, b) => a - b);
  const p95 = sorted[Math.floor(times.length * 0.95)]!;
  const p99 = sorted[Math.min(times.length - 1, Math.floor(times.length * 0.99))]!;
  console.log(`${label.padEnd(44)} median ${med.toFixed(2)} µs   p95 ${p95.toFixed(2)} µs   p99 ${p99.toFixed(2)} µs   (${sink} results)`);
  return { med, p99 };
}

let findingsTotal = 0;
for (const c of cases) findingsTotal += checkLayout(c.family, index, c.layout).length;
console.log(`${cases.length} generated layouts, ${(findingsTotal / cases.length).toFixed(2)} findings per layout on average`);
const { med, p99 } = measure('checkLayout (indexed catalog)', (c) => checkLayout(c.family, index, c.layout));
measure('checkLayout (catalog array, indexed per call)', (c) => checkLayout(c.family, demoCatalog, c.layout));
measure('computeSettings (indexed catalog)', (c) => computeSettings(c.family, index, c.layout));
console.log(
  `median per layout: ${med.toFixed(2)} µs (target ≤ 50 µs) ${med <= 50 ? 'OK' : 'OVER'}; p99 ${p99.toFixed(2)} µs over ${cases.length} random valid layouts`,
);
// One JSON line for scripts/bench.mjs to tabulate.
console.log(
  JSON.stringify({
    bench: 'rules',
    figure: `checkLayout median per layout (${cases.length} layouts)`,
    value: Number(med.toFixed(2)),
    unit: 'µs',
    budget: '≤ 50 µs',
    ok: med <= 50,
  }),
);
console.log(
  JSON.stringify({
    bench: 'rules',
    figure: `checkLayout p99 per layout (${cases.length} random valid layouts)`,
    value: Number(p99.toFixed(2)),
    unit: 'µs',
    budget: '(reported)',
    ok: true,
  }),
);
