#!/usr/bin/env node
// `npm test`: lint (ESLint, Prettier's check), type check, build once, then unit + integration tests (vitest) against that build, then the
// browser tests (Playwright on Debian chromium). With CAGEWRIGHT_PG_URL set (CI does), the
// integration suite runs a second time against that PostgreSQL server, beside the first run.
import { spawn, spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { ensureChromium } from './ensure-chromium.mjs';

const outDir = process.env.CAGEWRIGHT_OUT_DIR ?? 'dist-test';
const env = { ...process.env, CAGEWRIGHT_OUT_DIR: outDir, CAGEWRIGHT_SKIP_BUILD: '1', ASTRO_TELEMETRY_DISABLED: '1' };

const failed = [];

/** Runs one stage; a failure stops the run unless `keepGoing` (then it fails at the end). */
function run(title, cmd, args, extraEnv = {}, keepGoing = false) {
  console.log(`\n▶ ${title}`);
  const started = Date.now();
  const r = spawnSync(cmd, args, { stdio: 'inherit', env: { ...env, ...extraEnv } });
  const took = `${((Date.now() - started) / 60_000).toFixed(1)} min`;
  if (r.status !== 0) {
    console.error(`\n✗ ${title} failed (exit ${r.status ?? r.signal}, ${took}).`);
    if (!keepGoing) process.exit(r.status || 1);
    failed.push(title);
  } else console.log(`\n✓ ${title} (${took})`);
}

/** Runs stages side by side (each on one core mostly); prints each one's output whole when it ends. A failure of any stops the run after all have ended. */
async function runTogether(stages) {
  console.log(`\n▶ ${stages.map((s) => s.title).join(' and ')}, side by side`);
  const results = await Promise.all(
    stages.map(
      ({ title, cmd, args, env: extraEnv = {} }) =>
        new Promise((resolve) => {
          const started = Date.now();
          const child = spawn(cmd, args, { env: { ...env, ...extraEnv }, stdio: ['ignore', 'pipe', 'pipe'] });
          const out = [];
          child.stdout.on('data', (d) => out.push(d));
          child.stderr.on('data', (d) => out.push(d));
          child.on('close', (code, signal) => {
            const took = `${((Date.now() - started) / 60_000).toFixed(1)} min`;
            console.log(`\n▶ ${title}`);
            process.stdout.write(Buffer.concat(out));
            if (code === 0) console.log(`\n✓ ${title} (${took})`);
            else console.error(`\n✗ ${title} failed (exit ${code ?? signal}, ${took}).`);
            resolve(code === 0);
          });
        }),
    ),
  );
  if (results.includes(false)) process.exit(1);
}

if (!ensureChromium()) process.exit(1);
// Lint and the type check read the sources and write nothing: side by side they take the longer one's time.
await runTogether([
  { title: 'lint (ESLint, Prettier)', cmd: 'npm', args: ['run', '--silent', 'lint'] },
  { title: 'type check (astro check)', cmd: 'npx', args: ['astro', 'check'] },
]);
run('build', 'npx', ['astro', 'build']);
// The embedded-store run keeps about one core busy (its integration files run one at a time
// against one server); the PostgreSQL-server run, with a server and store of its own, takes the
// other core beside it instead of waiting its turn.
const vitestStages = [{ title: 'unit and integration tests (embedded PGlite)', cmd: 'npx', args: ['vitest', 'run'] }];
if (process.env.CAGEWRIGHT_PG_URL) {
  vitestStages.push({
    title: 'integration tests (PostgreSQL server)',
    cmd: 'npx',
    args: ['vitest', 'run', '--project', 'integration'],
    env: { DATABASE_URL: process.env.CAGEWRIGHT_PG_URL },
  });
}
await runTogether(vitestStages);
// Browser tests (Debian chromium) in two runs, each with its own server and fresh store. The specs
// share their server's store and change it, so they run one at a time; the every-page sweep only
// reads pages (its six role tests are independent) and is most of the time, so it gets two
// workers in a run of its own. Both runs go ahead even if the other failed.
const sweep = 'e2e/every-page.spec.ts';
const specs = readdirSync('e2e')
  .filter((f) => f.endsWith('.spec.ts'))
  .map((f) => `e2e/${f}`)
  .filter((f) => f !== sweep);
run('browser tests (Debian chromium), one spec at a time', 'npx', ['playwright', 'test', '--workers=1', ...specs], {}, true);
run('browser tests: every page as each role (two workers)', 'npx', ['playwright', 'test', '--workers=2', sweep], {}, true);
if (failed.length) {
  console.error(`\n✗ failed: ${failed.join('; ')}`);
  process.exit(1);
}
console.log('\n✓ all tests passed');
