// Shared helpers for the benchmark scripts: start the built server, sign in, run autocannon.
import { spawn } from 'node:child_process';
import { createServer } from 'node:net';
import autocannon from 'autocannon';

export const DEMO_PASSWORD = 'cage-demo-2026';

export function freePort() {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address();
      srv.close(() => resolve(port));
    });
    srv.on('error', reject);
  });
}

export async function startServer({ dataDir, outDir = process.env.CAGEWRIGHT_OUT_DIR ?? 'dist', env = {}, nodeArgs = [] }) {
  const port = await freePort();
  const t0 = performance.now();
  const child = spawn(process.execPath, [...nodeArgs, 'scripts/start.mjs'], {
    env: {
      ...process.env,
      PORT: String(port),
      HOST: '127.0.0.1',
      CAGEWRIGHT_DATA_DIR: dataDir,
      CAGEWRIGHT_OUT_DIR: outDir,
      AUTH_SECRET: 'bench-secret-not-for-production-0123456789',
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  child.stdout.on('data', (b) => (out += b));
  child.stderr.on('data', (b) => (out += b));
  const exited = new Promise((r) => child.on('exit', r));
  const base = `http://127.0.0.1:${port}`;
  // First 200 of a route that opens the store (/api/health opens it and runs a query), measured
  // from spawn: a page that answers before the store is open would flatter the cold start.
  let firstOk = null;
  for (let i = 0; i < 1500 && firstOk === null; i++) {
    try {
      const res = await fetch(`${base}/api/health`);
      if (res.status === 200) firstOk = performance.now() - t0;
    } catch {
      // not listening yet: try again
    }
    if (firstOk === null) await new Promise((r) => setTimeout(r, 20));
    if (child.exitCode !== null) throw new Error(`server exited:\n${out}`);
  }
  for (let i = 0; i < 1500 && !out.includes('cagewright: ready'); i++) await new Promise((r) => setTimeout(r, 20));
  return {
    base,
    port,
    firstOkMs: firstOk,
    stop: async (signal = 'SIGTERM') => {
      if (child.exitCode === null) child.kill(signal);
      await exited;
    },
  };
}

/** Signs in through Auth.js like a browser and returns the cookie header. */
export async function signIn(base, email) {
  const jar = new Map();
  const keep = (res) => {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      jar.set(pair.slice(0, i), pair.slice(i + 1));
    }
  };
  const cookie = () => [...jar].map(([k, v]) => `${k}=${v}`).join('; ');
  const r1 = await fetch(`${base}/api/auth/csrf`);
  keep(r1);
  const { csrfToken } = await r1.json();
  const r2 = await fetch(`${base}/api/auth/callback/credentials`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', origin: base, cookie: cookie() },
    body: new URLSearchParams({ csrfToken, email, password: DEMO_PASSWORD, callbackUrl: '/' }).toString(),
  });
  keep(r2);
  if (![...jar.keys()].some((k) => k.includes('session-token'))) throw new Error(`sign-in failed for ${email}`);
  return cookie();
}

export function cannon(opts) {
  return new Promise((resolve, reject) => {
    autocannon({ connections: 50, duration: 10, ...opts }, (err, result) => (err ? reject(err) : resolve(result)));
  });
}

export function summary(result) {
  const p95 = result.latency.p97_5 !== undefined ? percentile(result, 95) : null;
  return {
    rps: Math.round(result.requests.average),
    p50: result.latency.p50,
    p95,
    p99: result.latency.p99,
    errors: result.errors + result.timeouts + (result.non2xx ?? 0),
    non2xx: result.non2xx ?? 0,
  };
}

// autocannon reports p90 and p97.5 but not p95: interpolate between them.
function percentile(result, p) {
  const l = result.latency;
  if (p === 95) return Math.round((l.p90 + (l.p97_5 - l.p90) * (5 / 7.5)) * 10) / 10;
  return null;
}
