import { createHash } from 'node:crypto';
import pg from 'pg';
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export const TEST_SECRET = 'integration-test-secret-not-for-production-0123456789';

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as { port: number };
      srv.close(() => resolve(port));
    });
    srv.on('error', reject);
  });
}

export function buildOnce() {
  if (process.env.CAGEWRIGHT_SKIP_BUILD === '1') return;
  const r = spawnSync('npx', ['astro', 'build'], {
    stdio: 'inherit',
    // vitest sets NODE_ENV=test, which would build React's development JSX runtime (jsxDEV)
    // into the server chunks and break every page that renders a React component on the server.
    env: { ...process.env, NODE_ENV: 'production', CAGEWRIGHT_OUT_DIR: outDir(), ASTRO_TELEMETRY_DISABLED: '1' },
  });
  if (r.status !== 0) throw new Error('astro build failed');
}

export const outDir = () => process.env.CAGEWRIGHT_OUT_DIR ?? 'dist-test';

export interface RunningServer {
  baseUrl: string;
  port: number;
  dataDir: string;
  child: ChildProcess;
  /** Everything the server printed so far (stdout and stderr). */
  output: () => string;
  stop: (signal?: NodeJS.Signals) => Promise<number | null>;
}

/** Starts the built server on a free port; resolves once it printed that it is ready. */
/**
 * In server mode (DATABASE_URL set) each data directory gets a database of its own on that
 * server, so a test that starts its own server starts from a fresh store, as it does with the
 * embedded store, and two servers on one data directory share one database.
 */
export async function databaseFor(dataDir: string): Promise<string | undefined> {
  const base = process.env.DATABASE_URL;
  if (!base) return undefined;
  const name = 'cw_it_' + createHash('sha1').update(dataDir).digest('hex').slice(0, 16);
  const admin = new pg.Client({ connectionString: base });
  await admin.connect();
  try {
    const exists = await admin.query('select 1 from pg_database where datname = $1', [name]);
    if (exists.rowCount === 0) await admin.query(`create database "${name}"`);
  } finally {
    await admin.end();
  }
  const url = new URL(base);
  url.pathname = `/${name}`;
  return url.toString();
}

export async function startServer(opts: { dataDir?: string; env?: Record<string, string>; args?: string[] } = {}): Promise<RunningServer> {
  const port = await freePort();
  const dataDir = opts.dataDir ?? mkdtempSync(join(tmpdir(), 'cagewright-it-'));
  const databaseUrl = await databaseFor(dataDir);
  const child = spawn(process.execPath, ['scripts/start.mjs', ...(opts.args ?? [])], {
    env: {
      ...process.env,
      PORT: String(port),
      HOST: '127.0.0.1',
      CAGEWRIGHT_DATA_DIR: dataDir,
      ...(databaseUrl ? { DATABASE_URL: databaseUrl } : {}),
      CAGEWRIGHT_OUT_DIR: outDir(),
      CAGEWRIGHT_BCRYPT_ROUNDS: '4',
      CAGEWRIGHT_TEST_FIXTURES: '1',
      // One worker unless asked, so a suite's server is one process as with the embedded store;
      // workers.test.ts and two-instances.test.ts prove the several-process case.
      CAGEWRIGHT_WORKERS: process.env.CAGEWRIGHT_WORKERS ?? '1',
      AUTH_SECRET: TEST_SECRET,
      // Every suite signs in from 127.0.0.1 and some fail on purpose: the per-address limit would
      // soon refuse everyone. signin-throttle.test.ts sets it back to test it.
      CAGEWRIGHT_SIGNIN_ADDRESS_FREE: '10000',
      ...opts.env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
  await new Promise<void>((resolve, reject) => {
    // A loaded shared machine can take longer than 30 s to migrate and seed; never leave the child behind.
    const timer = setTimeout(
      () => {
        child.kill('SIGKILL');
        reject(new Error(`server did not start:\n${output}`));
      },
      Number(process.env.CAGEWRIGHT_START_TIMEOUT_MS ?? 120_000),
    );
    const onData = (b: Buffer) => {
      output += b.toString();
      if (output.includes('cagewright: ready')) {
        clearTimeout(timer);
        resolve();
      }
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', (b: Buffer) => {
      output += b.toString();
      if (process.env.CAGEWRIGHT_TEST_VERBOSE) process.stderr.write(b);
    });
    void exited.then((code) => {
      clearTimeout(timer);
      reject(new Error(`server exited (${code}) before it was ready:\n${output}`));
    });
  });
  return {
    baseUrl: `http://127.0.0.1:${port}`,
    port,
    dataDir,
    child,
    output: () => output,
    stop: async (signal = 'SIGTERM') => {
      if (child.exitCode === null) child.kill(signal);
      return exited;
    },
  };
}

export function removeDir(dir: string) {
  rmSync(dir, { recursive: true, force: true });
}
