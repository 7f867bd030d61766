/**
 * Classroom figures: rendering talking points, the crop-path model (recomputed when the class
 * tries another vane setting), drawing kernel fates, and a side-by-side comparison. Prints one
 * JSON line per figure for scripts/bench.mjs. Figures, not tests.
 *   npx tsx bench/classroom.ts
 */
import { compareLayouts } from '~/lib/classroom/compare';
import { cropPathModel, kernelFate, seeded } from '~/lib/classroom/crop-path';
import { cropIds } from '~/lib/domain/crops';
import { demoCatalog, demoFamilies } from '~/lib/domain/demo-catalog';
import { starterLayout } from '~/lib/domain/starter';
import { indexCatalog } from '~/lib/domain/catalog';
import { renderNotes } from '~/lib/server/markdown';

function median(xs: number[]) {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

function measure(label: string, runs: number, fn: (i: number) => void): number {
  for (let i = 0; i < Math.min(200, runs); i++) fn(i); // warm up
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    fn(i);
    times.push((performance.now() - t) * 1000);
  }
  const m = median(times);
  console.log(`${label}: median ${m.toFixed(1)} µs over ${runs} runs`);
  return m;
}

const catalog = indexCatalog(demoCatalog);
const layouts = demoFamilies.flatMap((f) => cropIds.map((c) => ({ family: f, layout: starterLayout(f, c, demoCatalog) })));
const notes = [
  '- **Fine-wire elements in the threshing zone** rub the heads hard and hold the small kernel until it is free.',
  '- **Wide-wire at the rear** lets loose kernels drop through quickly, so little goes out over the rotor.',
  '- Rasp bars only: straight bars cost power and are not needed in small grains (common practice).',
  '',
  '*Ask the class:* what happens to a pea on this cage? See [the guide](https://example.org/guide).',
  '',
  '| crop | element |',
  '| --- | --- |',
  '| wheat | fine-wire |',
  '| peas | round-bar |',
].join('\n');

const rows: { figure: string; value: number; unit: string; budget: string; ok: boolean }[] = [];
const md = measure(`renderNotes (${notes.length} characters)`, 5000, () => renderNotes(notes));
rows.push({
  figure: 'talking points to safe HTML, median per slide',
  value: Number(md.toFixed(1)),
  unit: 'µs',
  budget: '≤ 1000 µs',
  ok: md <= 1000,
});

const cp = measure('cropPathModel', 5000, (i) => {
  const c = layouts[i % layouts.length]!;
  cropPathModel(c.family, catalog, c.layout);
});
rows.push({ figure: 'crop-path model, median per layout', value: Number(cp.toFixed(1)), unit: 'µs', budget: '≤ 1000 µs', ok: cp <= 1000 });

const model = cropPathModel(layouts[0]!.family, catalog, layouts[0]!.layout);
const random = seeded(1);
const kf = measure('kernelFate ×36 (one cage of kernels)', 5000, () => {
  for (let k = 0; k < 36; k++) kernelFate(model, random);
});
rows.push({ figure: 'kernel fates for 36 kernels', value: Number(kf.toFixed(1)), unit: 'µs', budget: '≤ 1000 µs', ok: kf <= 1000 });

const cmp = measure('compareLayouts', 2000, (i) => {
  const a = layouts[i % layouts.length]!;
  const b = layouts[(i * 7 + 3) % layouts.length]!;
  compareLayouts(
    { family: a.family, catalog: demoCatalog, layout: a.layout },
    { family: b.family, catalog: demoCatalog, layout: b.layout },
  );
});
rows.push({
  figure: 'side-by-side comparison, median per pair',
  value: Number(cmp.toFixed(1)),
  unit: 'µs',
  budget: '≤ 5000 µs',
  ok: cmp <= 5000,
});

for (const r of rows) console.log(JSON.stringify({ bench: 'classroom', ...r }));
