#!/usr/bin/env node
// `npm run bench`: builds once, runs every benchmark under bench/, and prints a table of figures
// against the budgets in the quality bars. Figures, not tests: nothing here fails the build.
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { cpus, loadavg, totalmem } from 'node:os';
import { verdict } from '../bench/verdict.mjs';

const outDir = process.env.CAGEWRIGHT_OUT_DIR ?? 'dist-bench';
const env = { ...process.env, CAGEWRIGHT_OUT_DIR: outDir, ASTRO_TELEMETRY_DISABLED: '1' };
const only = process.argv.slice(2);

const BENCHES = [
  { name: 'rules', cmd: ['npx', 'tsx', 'bench/domain.ts'] },
  { name: 'planner', cmd: ['npx', 'tsx', 'bench/planner.ts'] },
  { name: 'classroom', cmd: ['npx', 'tsx', 'bench/classroom.ts'] },
  { name: 'api', cmd: ['node', 'bench/api.mjs'], needsBuild: true },
  { name: 'js-size', cmd: ['node', 'bench/js-size.mjs'], needsBuild: true },
  { name: 'scale', cmd: ['node', 'bench/scale.mjs'], needsBuild: true },
  { name: 'crash', cmd: ['node', 'bench/crash.mjs'], needsBuild: true },
  { name: 'editor-drop', cmd: ['node', 'bench/editor-drop.mjs'], needsBuild: true },
];

const selected = BENCHES.filter((b) => only.length === 0 || only.includes(b.name));
if (selected.some((b) => b.needsBuild) && !process.env.BENCH_SKIP_BUILD) {
  const r = spawnSync('npx', ['astro', 'build'], { stdio: 'inherit', env });
  if (r.status !== 0) process.exit(1);
}

const rows = [];
for (const b of selected) {
  const script = b.cmd[b.cmd.length - 1];
  if (!existsSync(script)) {
    rows.push({ bench: b.name, figure: '(script missing)', value: '—', unit: '', budget: '', ok: false });
    continue;
  }
  console.error(`▶ ${b.name}`);
  const r = spawnSync(b.cmd[0], b.cmd.slice(1), { env, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  process.stderr.write(r.stderr ?? '');
  let found = 0;
  for (const line of (r.stdout ?? '').split('\n')) {
    const t = line.trim();
    if (!t.startsWith('{')) {
      if (t) console.error(`  ${t}`);
      continue;
    }
    try {
      const row = JSON.parse(t);
      if (row.figure !== undefined) {
        rows.push({ bench: b.name, load: loadavg()[0].toFixed(1), ...row });
        found++;
      }
    } catch {
      // a line that is not a figure (the bench's own output)
    }
  }
  if (r.status !== 0 || found === 0)
    rows.push({ bench: b.name, figure: `(exit ${r.status})`, value: '—', unit: '', budget: '', ok: false });
}

const [l1, l5] = loadavg();
console.log(
  `\nmachine: ${cpus().length} × ${cpus()[0]?.model ?? 'cpu'}, ${Math.round(totalmem() / 2 ** 30)} GB, Node ${process.version}; load average ${l1.toFixed(1)} (1 min) ${l5.toFixed(1)} (5 min) at the end`,
);
const widths = [10, 52, 14, 12, 6, 5];
const cell = (s, w) =>
  String(s)
    .padEnd(w)
    .slice(0, Math.max(w, String(s).length));
console.log(['bench', 'figure', 'value', 'budget', 'within', 'load'].map((h, i) => cell(h, widths[i])).join(' │ '));
console.log(widths.map((w) => '─'.repeat(w)).join('─┼─'));
for (const r of rows) {
  const value = `${r.value}${r.unit ? ' ' + r.unit : ''}`;
  console.log([r.bench, r.figure, value, r.budget, verdict(r), r.load ?? ''].map((v, i) => cell(v, widths[i])).join(' │ '));
}
