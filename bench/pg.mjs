// A throwaway PostgreSQL server for the benchmarks that need one (workers): initdb into a temp
// directory, start on a free port, create a database, stop and remove everything after.
// BENCH_DATABASE_URL (a server you already run, with a database the bench may fill) skips all this.
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, rmSync, chownSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { freePort } from './lib.mjs';

function serverBin() {
  const root = '/usr/lib/postgresql';
  if (!existsSync(root)) return null;
  const versions = readdirSync(root).sort((a, b) => Number(a) - Number(b));
  for (const v of versions.reverse()) if (existsSync(join(root, v, 'bin', 'postgres'))) return join(root, v, 'bin');
  return null;
}

/** Resolves to { url, stop } or null when no PostgreSQL server can be had. */
export async function throwawayPostgres(database = 'cagewright_bench') {
  if (process.env.BENCH_DATABASE_URL) return { url: process.env.BENCH_DATABASE_URL, stop: async () => {} };
  const bin = serverBin();
  if (!bin) return null;
  const dir = mkdtempSync(join(tmpdir(), 'cagewright-bench-pg-'));
  const port = await freePort();
  // initdb refuses to run as root: run the server as the postgres user then.
  let as = [];
  if (process.getuid?.() === 0) {
    if (spawnSync('id', ['postgres']).status !== 0) execFileSync('useradd', ['-r', '-m', 'postgres']);
    const uid = Number(execFileSync('id', ['-u', 'postgres']).toString());
    const gid = Number(execFileSync('id', ['-g', 'postgres']).toString());
    chownSync(dir, uid, gid);
    as = ['runuser', '-u', 'postgres', '--'];
  }
  const run = (cmd, args) => {
    const full = [...as, cmd, ...args];
    execFileSync(full[0], full.slice(1), { stdio: ['ignore', 'ignore', 'pipe'] });
  };
  run(join(bin, 'initdb'), ['-D', join(dir, 'data'), '-A', 'trust', '-U', 'cagewright']);
  run(join(bin, 'pg_ctl'), [
    '-D',
    join(dir, 'data'),
    '-o',
    `-p ${port} -k ${dir} -c listen_addresses=127.0.0.1 -c max_connections=200`,
    '-l',
    join(dir, 'log'),
    '-w',
    'start',
  ]);
  execFileSync(join(bin, 'createdb'), ['-h', '127.0.0.1', '-p', String(port), '-U', 'cagewright', database]);
  return {
    url: `postgres://cagewright@127.0.0.1:${port}/${database}`,
    stop: async () => {
      try {
        run(join(bin, 'pg_ctl'), ['-D', join(dir, 'data'), '-m', 'fast', 'stop']);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    },
  };
}
