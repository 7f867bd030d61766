/**
 * Crop-change planner speed: the largest demo family (most places to fill), a full shelf (every
 * part of the catalog on hand, as many as there are places), every installed crop × every target
 * crop × both modes. Prints the median and the worst pair's median in ms a plan, against the
 * budget of 5 ms a plan (docs: quality bars).
 *
 *   npx tsx bench/planner.ts
 */
import { performance } from 'node:perf_hooks';
import { cropIds } from '~/lib/domain/crops';
import { indexCatalog } from '~/lib/domain/catalog';
import { demoCatalog, demoFamilies } from '~/lib/domain/demo-catalog';
import { starterLayout } from '~/lib/domain/starter';
import { planCropChange, type PlanMode } from '~/lib/domain/planner';
import type { CropId, Layout, MachineFamily } from '~/lib/domain/schemas';

const BUDGET_MS = 5;
const REPEATS = Number(process.env.BENCH_REPEATS ?? 15);

const places = (f: MachineFamily) =>
  f.positions.length * 2 + f.rotorBarPlaces.length + f.cageTopSections.reduce((n, s) => n + s.coverPlateSides.length, 0);
const family = [...demoFamilies].sort((a, b) => places(b) - places(a))[0]!;
const catalog = indexCatalog(demoCatalog);
const shelf: Record<string, number> = Object.fromEntries(
  demoCatalog.filter((p) => p.fitGroup === family.fitGroup).map((p) => [p.partNumber, places(family)]),
);

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
};

// Warm up the JIT on a few plans first.
for (let i = 0; i < 200; i++)
  planCropChange({ family, catalog, installed: starterLayout(family, cropIds[i % cropIds.length]!, demoCatalog), shelf, crop: 'corn' });

const all: number[] = [];
const pairs: { ms: number; from: CropId; to: CropId; mode: PlanMode }[] = [];
const run = (from: CropId, to: CropId, mode: PlanMode, repeats: number) => {
  const installed: Layout = starterLayout(family, from, demoCatalog);
  const times: number[] = [];
  for (let r = 0; r < repeats; r++) {
    const t0 = performance.now();
    const plan = planCropChange({ family, catalog, installed, shelf, crop: to, mode });
    times.push(performance.now() - t0);
    if (!plan.ok || plan.counts.purchases !== 0) throw new Error(`full shelf should buy nothing (${from} → ${to}, ${mode})`);
  }
  return times;
};
for (const from of cropIds)
  for (const to of cropIds)
    for (const mode of ['program', 'on-hand'] as const) {
      const times = run(from, to, mode, REPEATS);
      all.push(...times);
      pairs.push({ ms: median(times), from, to, mode });
    }
// The machine is shared and noisy: measure the five slowest pairs again, many times each, and
// report the slowest of their medians as the worst case.
const again = [...pairs]
  .sort((a, b) => b.ms - a.ms)
  .slice(0, 5)
  .map((p) => {
    const times = run(p.from, p.to, p.mode, 200);
    const sorted = [...times].sort((a, b) => a - b);
    return { ...p, ms: median(times), p95: sorted[Math.floor(sorted.length * 0.95)]! };
  });
const worst = again.sort((a, b) => b.ms - a.ms)[0]!;

console.log(
  `planner: ${family.name} (${places(family)} places), full shelf, ${cropIds.length}×${cropIds.length} crop pairs × 2 modes, ${REPEATS} runs each`,
);
console.log(`  median of all plans : ${median(all).toFixed(3)} ms a plan`);
console.log(
  `  worst pair          : ${worst.ms.toFixed(3)} ms a plan median, p95 ${worst.p95.toFixed(3)} ms, over 200 runs (${worst.from} → ${worst.to}, ${worst.mode})`,
);
console.log(`  budget              : ${BUDGET_MS} ms a plan — ${worst.ms <= BUDGET_MS ? 'within budget' : 'OVER BUDGET'}`);
// JSON lines for scripts/bench.mjs to tabulate.
console.log(
  JSON.stringify({
    bench: 'planner',
    figure: `worst plan, ${family.name}, full shelf (median of 200)`,
    value: Number(worst.ms.toFixed(3)),
    unit: 'ms',
    budget: `≤ ${BUDGET_MS} ms`,
    ok: worst.ms <= BUDGET_MS,
  }),
);
console.log(
  JSON.stringify({
    bench: 'planner',
    figure: `median plan, ${family.name}, full shelf`,
    value: Number(median(all).toFixed(3)),
    unit: 'ms',
    budget: `≤ ${BUDGET_MS} ms`,
    ok: median(all) <= BUDGET_MS,
  }),
);
