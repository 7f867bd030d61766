#!/usr/bin/env node
// Starts the built server: makes sure an AUTH_SECRET exists (generated once into the data
// directory), starts Astro's standalone server, then opens the store (migrations and the demo
// seed run here, at boot) and prints where to go.
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { resolve, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { serveApp } from './serve-app.mjs';

const dataDir = resolve(process.env.CAGEWRIGHT_DATA_DIR ?? 'data');
process.env.CAGEWRIGHT_DATA_DIR = dataDir;
process.env.HOST ??= '127.0.0.1';
process.env.PORT ??= '4321';
process.env.NODE_ENV ??= 'production';
// `--force-unlock`: take over the data directory from an owner that is not provably gone (see
// src/lib/server/data-dir-lock.ts). Only after checking that no other server uses it.
if (process.argv.includes('--force-unlock')) process.env.CAGEWRIGHT_FORCE_UNLOCK = '1';

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

const outDir = resolve(process.env.CAGEWRIGHT_OUT_DIR ?? 'dist');
const entry = join(outDir, 'server', 'entry.mjs');
if (!existsSync(entry)) {
  console.error(`cagewright: no build at ${entry}. Run \`npm run build\` first (npm start does it for you).`);
  process.exit(1);
}

// Photo uploads go to a local S3-compatible fake unless a real bucket (or the disk store) is configured.
const fakes = [];
if (!process.env.S3_ENDPOINT && process.env.CAGEWRIGHT_STORAGE !== 'disk') fakes.push(import('./fakes/s3.mjs').then((m) => m.startFakeS3({ dataDir })));
// Mail goes to a local fake SMTP server (messages kept in <data dir>/mailbox) unless SMTP_URL names a real one.
if (!process.env.SMTP_URL) fakes.push(import('./fakes/smtp.mjs').then((m) => m.startFakeSmtp({ dataDir })));
const started = Date.now();
// The fakes start while the server loads; the app reads their addresses lazily, and the store
// (whose demo seed stores photos) opens only at the health check below, after both are up.
globalThis.__cagewrightBootReady = Promise.all(fakes);
// Astro's own standalone server would take the client address from X-Forwarded-For as sent:
// serve its handler through ours instead, which decides the address (scripts/serve-app.mjs).
// Files Astro serves itself (/_astro/*, /fonts/*, the favicon) never pass the middleware, so the
// headers every answer needs are set on our server, before any handler runs.
process.env.ASTRO_NODE_AUTOSTART = 'disabled';
const [app] = await Promise.all([import(pathToFileURL(entry).href), globalThis.__cagewrightBootReady]);
const astroServer = await serveApp(app.handler, { host: process.env.HOST, port: process.env.PORT });
// Same rule as src/lib/server/security-headers.ts: HSTS only when the public URL is https.
const httpsOnly = (() => {
  try {
    return new URL(process.env.CAGEWRIGHT_PUBLIC_URL?.trim() ?? '').protocol === 'https:';
  } catch {
    return false;
  }
})();
astroServer.prependListener('request', (req, res) => {
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

const base = `http://${process.env.HOST}:${process.env.PORT}`;
for (let attempt = 0; ; attempt++) {
  try {
    const res = await fetch(`${base}/api/health`);
    const body = await res.json();
    if (res.ok) {
      console.log(`cagewright: ready at ${base} (store: ${body.store}, ${Date.now() - started} ms)`);
      break;
    }
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
