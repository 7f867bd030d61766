#!/usr/bin/env node
// Starts the built server: makes sure an AUTH_SECRET exists (generated once into the data
// directory), serves Astro's handler through our HTTP layer (the client address decided by us,
// scripts/serve-app.mjs; precompressed static files and compressed pages, scripts/http/serve.mjs;
// the headers every answer needs, static files included), then opens the store (migrations and the demo seed
// run here, at boot) and prints where to go.
//
// With DATABASE_URL the server runs as several worker processes (node:cluster) sharing the port,
// one per core unless CAGEWRIGHT_WORKERS says otherwise. With the embedded store (PGlite) it stays
// one process: PGlite lives inside the process that opened it and its data directory has one
// owner (cagewright.owner), so a second process could not reach the data.
import cluster from 'node:cluster';
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { availableParallelism } from 'node:os';
import { resolve, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { serveApp } from './serve-app.mjs';

const dataDir = resolve(process.env.CAGEWRIGHT_DATA_DIR ?? 'data');
process.env.CAGEWRIGHT_DATA_DIR = dataDir;
process.env.HOST ??= '127.0.0.1';
process.env.PORT ??= '4321';
process.env.NODE_ENV ??= 'production';
// We listen ourselves (below), around Astro's handler (the adapter's middleware mode): Astro's own
// standalone server would take the client address from X-Forwarded-For as sent.
process.env.ASTRO_NODE_AUTOSTART = 'disabled';
// `--force-unlock`: take over the data directory from an owner that is not provably gone (see
// src/lib/server/data-dir-lock.ts). Only after checking that no other server uses it.
if (process.argv.includes('--force-unlock')) process.env.CAGEWRIGHT_FORCE_UNLOCK = '1';

const outDir = resolve(process.env.CAGEWRIGHT_OUT_DIR ?? 'dist');
const entry = join(outDir, 'server', 'entry.mjs');
const base = `http://${process.env.HOST}:${process.env.PORT}`;

/** Imports the built app and serves it on HOST:PORT (in a worker, the port is shared). */
async function serveBuiltApp() {
  const [{ handler }, { compressingHandler }] = await Promise.all([import(pathToFileURL(entry).href), import('./http/serve.mjs')]);
  const server = await serveApp(compressingHandler(handler, { clientDir: join(outDir, 'client') }), {
    host: process.env.HOST,
    port: Number(process.env.PORT),
  });
  // Files served without the middleware (/_astro/*, /fonts/*, the favicon) need these headers too.
  server.prependListener('request', (req, res) => {
    res.setHeader('x-content-type-options', 'nosniff');
    if (httpsOnly) res.setHeader('strict-transport-security', 'max-age=31536000');
    // A body refused before it was read to the end (413 while streaming): the answer is sent, then
    // the rest is read and dropped for a moment so the client can read the answer (closing at once
    // would reset the connection under it), and the connection is closed if it keeps coming.
    res.once('finish', () => {
      if (req.complete || req.destroyed) return;
      req.on('data', () => {});
      req.resume();
      const timer = setTimeout(() => req.socket?.destroy(), 2000);
      timer.unref();
      req.once('end', () => clearTimeout(timer));
    });
  });
  return server;
}

// Same rule as src/lib/server/security-headers.ts: HSTS only when the public URL is https.
const httpsOnly = (() => {
  try {
    return new URL(process.env.CAGEWRIGHT_PUBLIC_URL?.trim() ?? '').protocol === 'https:';
  } catch {
    return false;
  }
})();

if (cluster.isWorker) {
  await serveBuiltApp();
} else {
  await startPrimary();
}

function workerCount() {
  const asked = process.env.CAGEWRIGHT_WORKERS;
  if (asked !== undefined && asked !== '' && !/^[1-9]\d*$/.test(asked)) {
    console.error(`cagewright: CAGEWRIGHT_WORKERS must be a whole number of 1 or more (got "${asked}").`);
    process.exit(1);
  }
  if (!process.env.DATABASE_URL) {
    if (asked && asked !== '1')
      console.error(
        'cagewright: the embedded store has one owner, so the server runs as one process (set DATABASE_URL for several workers).',
      );
    return 1;
  }
  return asked ? Number(asked) : availableParallelism();
}

async function startPrimary() {
  if (!process.env.AUTH_SECRET) {
    mkdirSync(dataDir, { recursive: true });
    const file = join(dataDir, 'auth-secret');
    if (!existsSync(file)) writeFileSync(file, randomBytes(32).toString('base64url'), { mode: 0o600 });
    process.env.AUTH_SECRET = readFileSync(file, 'utf8').trim();
  }

  // `npm run backup` proves it runs on this machine with this token (see /api/admin/backup). A new
  // one at every start: a token that ever left the host (an old copy of the directory) opens nothing.
  {
    mkdirSync(dataDir, { recursive: true });
    const file = join(dataDir, 'backup-token');
    rmSync(file, { force: true });
    writeFileSync(file, randomBytes(32).toString('base64url'), { mode: 0o600, flag: 'wx' });
  }

  if (!existsSync(entry)) {
    console.error(`cagewright: no build at ${entry}. Run \`npm run build\` first (npm start does it for you).`);
    process.exit(1);
  }
  const workers = workerCount();

  // Photo uploads go to a local S3-compatible fake unless a real bucket (or the disk store) is configured.
  const fakes = [];
  if (!process.env.S3_ENDPOINT && process.env.CAGEWRIGHT_STORAGE !== 'disk')
    fakes.push(import('./fakes/s3.mjs').then((m) => m.startFakeS3({ dataDir })));
  // Mail goes to a local fake SMTP server (messages kept in <data dir>/mailbox) unless SMTP_URL names a real one.
  if (!process.env.SMTP_URL) fakes.push(import('./fakes/smtp.mjs').then((m) => m.startFakeSmtp({ dataDir })));
  const started = Date.now();

  if (workers === 1) {
    // The fakes start while the server loads; the app reads their addresses lazily, and the store
    // (whose demo seed stores photos) opens only at the health check below, after both are up.
    globalThis.__cagewrightBootReady = Promise.all(fakes);
    await Promise.all([serveBuiltApp(), globalThis.__cagewrightBootReady]);
    const body = await openStore();
    console.log(`cagewright: ready at ${base} (store: ${body.store}, ${Date.now() - started} ms)`);
    return;
  }

  // Workers inherit this process's environment, so the fakes' addresses must be set first.
  await Promise.all(fakes);
  cluster.setupPrimary({ exec: fileURLToPath(import.meta.url) });
  let stopping = false;
  const fork = () =>
    new Promise((resolveFork, rejectFork) => {
      const w = cluster.fork();
      w.once('listening', () => resolveFork(w));
      w.once('exit', (code) => rejectFork(new Error(`a worker exited (${code}) before it listened`)));
    });
  // One worker first: its store opens at the health check, runs the migrations and the seed
  // once; the others then find the store ready.
  try {
    await fork();
    const body = await openStore();
    await Promise.all(Array.from({ length: workers - 1 }, fork));
    console.log(`cagewright: ready at ${base} (store: ${body.store}, ${workers} workers, ${Date.now() - started} ms)`);
  } catch (err) {
    console.error('cagewright: the workers did not start:', err.message);
    stopping = true;
    for (const w of Object.values(cluster.workers ?? {})) w?.process.kill('SIGTERM');
    process.exit(1);
  }
  cluster.on('exit', (w, code, signal) => {
    if (stopping) {
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0);
      return;
    }
    console.error(`cagewright: worker ${w.process.pid} stopped (${signal ?? code}); starting another`);
    cluster.fork();
  });
  const stop = (signal) => {
    if (stopping) return;
    stopping = true;
    const live = Object.values(cluster.workers ?? {});
    if (live.length === 0) process.exit(0);
    // Each worker closes its connection pool on the signal (src/lib/server/db.ts) and exits.
    for (const w of live) w?.process.kill(signal);
  };
  process.once('SIGTERM', () => stop('SIGTERM'));
  process.once('SIGINT', () => stop('SIGINT'));
}

/** Opens the store through /api/health (a broken store fails the start, not the first user). */
async function openStore() {
  for (let attempt = 0; ; attempt++) {
    try {
      const res = await fetch(`${base}/api/health`);
      const body = await res.json();
      if (res.ok) return body;
      console.error(`cagewright: the store did not open: ${body?.error?.message ?? res.status}`);
      process.exit(1);
    } catch (err) {
      if (attempt > 100) {
        console.error('cagewright: the server did not answer:', err);
        process.exit(1);
      }
      await new Promise((r) => setTimeout(r, 50));
    }
  }
}
