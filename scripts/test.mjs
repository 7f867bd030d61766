#!/usr/bin/env node
// `npm test`: lint (ESLint, Prettier's check), type check, build once, then unit + integration tests (vitest) against that build, then the
// browser tests (Playwright on Debian chromium). With CAGEWRIGHT_PG_URL set (CI does), the
// integration suite runs a second time against that PostgreSQL server.
import { spawnSync } from 'node:child_process';
import { ensureChromium } from './ensure-chromium.mjs';

const outDir = process.env.CAGEWRIGHT_OUT_DIR ?? 'dist-test';
const env = { ...process.env, CAGEWRIGHT_OUT_DIR: outDir, CAGEWRIGHT_SKIP_BUILD: '1', ASTRO_TELEMETRY_DISABLED: '1' };

function run(title, cmd, args, extraEnv = {}) {
  console.log(`\n▶ ${title}`);
  const r = spawnSync(cmd, args, { stdio: 'inherit', env: { ...env, ...extraEnv } });
  if (r.status !== 0) {
    console.error(`\n✗ ${title} failed (exit ${r.status ?? r.signal}).`);
    process.exit(r.status || 1);
  }
}

if (!ensureChromium()) process.exit(1);
run('lint (ESLint, Prettier)', 'npm', ['run', '--silent', 'lint']);
run('type check (astro check)', 'npx', ['astro', 'check']);
run('build', 'npx', ['astro', 'build']);
run('unit and integration tests (embedded PGlite)', 'npx', ['vitest', 'run']);
if (process.env.CAGEWRIGHT_PG_URL) {
  run('integration tests (PostgreSQL server)', 'npx', ['vitest', 'run', '--project', 'integration'], {
    DATABASE_URL: process.env.CAGEWRIGHT_PG_URL,
  });
}
run('browser tests (Debian chromium)', 'npx', ['playwright', 'test']);
console.log('\n✓ all tests passed');
