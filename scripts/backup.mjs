#!/usr/bin/env node
// `npm run backup [-- --out <file>]`: a consistent snapshot of the store.
// - Embedded store with the server running: asks the server for a snapshot (it owns the files).
// - Embedded store with no server: opens the store itself (taking the data-dir lock) and dumps it.
// - PostgreSQL server mode (DATABASE_URL): runs pg_dump.
import { chmodSync, existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { dirname, join, resolve } from 'node:path';
import { withoutSecrets } from './lib/backup-archive.mjs';

// Archives hold every tenant's data: only the server's user may read them.
process.umask(0o077);
const writePrivate = (file, data) => {
  writeFileSync(file, data, { mode: 0o600 });
  chmodSync(file, 0o600);
};

const args = process.argv.slice(2);
const outArg = args.indexOf('--out');
const stamp = new Date().toISOString().replace(/[:.]/g, '-');
const dataDir = resolve(process.env.CAGEWRIGHT_DATA_DIR ?? 'data');

function alive(pid) {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return e.code === 'EPERM';
  }
}

if (process.env.DATABASE_URL) {
  const out = resolve(outArg >= 0 ? args[outArg + 1] : `backups/cagewright-${stamp}.sql`);
  mkdirSync(dirname(out), { recursive: true });
  const r = spawnSync('pg_dump', ['--no-owner', '--file', out, process.env.DATABASE_URL], { stdio: 'inherit' });
  if (r.status !== 0) process.exit(r.status ?? 1);
  chmodSync(out, 0o600);
  console.log(`backup written: ${out} (restore with: psql "$DATABASE_URL" -f ${out})`);
  process.exit(0);
}

const out = resolve(outArg >= 0 ? args[outArg + 1] : `backups/cagewright-${stamp}.tar.gz`);
mkdirSync(dirname(out), { recursive: true });
const ownerFile = join(dataDir, 'cagewright.owner');
let owner = null;
if (existsSync(ownerFile)) {
  try {
    owner = JSON.parse(readFileSync(ownerFile, 'utf8'));
  } catch {
    // half-written or unreadable: treated as no owner named
  }
}

// The same rule as the server's (src/lib/server/data-dir-lock.ts): an owner is gone only when it
// provably is (this host, its process not running); one from another host, another boot or an
// unreadable file could be alive, so the backup refuses rather than open the files beside it.
const myBootId = (() => {
  try {
    return readFileSync('/proc/sys/kernel/random/boot_id', 'utf8').trim();
  } catch {
    return null;
  }
})();
const myHost = (await import('node:os')).hostname();
if (existsSync(ownerFile) && !process.argv.includes('--force-unlock')) {
  const sameMachine = owner && owner.host === myHost && !(owner.bootId && myBootId && owner.bootId !== myBootId);
  if (!owner?.pid || !sameMachine) {
    console.error(
      `backup refused: the data directory is held by ${owner?.pid ? `process ${owner.pid} on ${owner.host}` : 'an unreadable owner file'}, which may still be running. ` +
        'Run the backup on that machine, or pass --force-unlock once you are sure no server uses the directory.',
    );
    process.exit(1);
  }
}

if (owner?.pid && owner.host === myHost && alive(owner.pid)) {
  const port = owner.port ?? process.env.PORT ?? '4321';
  const token = readFileSync(join(dataDir, 'backup-token'), 'utf8').trim();
  const res = await fetch(`http://127.0.0.1:${port}/api/admin/backup`, {
    method: 'POST',
    headers: { 'x-cagewright-backup-token': token, origin: `http://127.0.0.1:${port}` },
  });
  if (!res.ok) {
    console.error(`backup failed: the server answered ${res.status} ${await res.text()}`);
    process.exit(1);
  }
  writePrivate(out, await withoutSecrets(Buffer.from(await res.arrayBuffer())));
  console.log(`backup written from the running server (pid ${owner.pid}): ${out}`);
} else {
  const { PGlite } = await import('@electric-sql/pglite');
  // Take the same owner file the server takes, so a server can't start mid-backup.
  const { openSync, writeSync, closeSync, rmSync } = await import('node:fs');
  rmSync(ownerFile, { force: true });
  const fd = openSync(ownerFile, 'wx');
  writeSync(
    fd,
    JSON.stringify({
      pid: process.pid,
      host: (await import('node:os')).hostname(),
      port: null,
      since: new Date().toISOString(),
      by: 'backup',
    }),
  );
  closeSync(fd);
  try {
    const db = await PGlite.create({ dataDir });
    await db.query('CHECKPOINT');
    const blob = await db.dumpDataDir('gzip');
    await db.close();
    writePrivate(out, await withoutSecrets(Buffer.from(await blob.arrayBuffer())));
    console.log(`backup written: ${out}`);
  } finally {
    rmSync(ownerFile, { force: true });
  }
}
// Photos live beside the database (the local object store or the disk store): archive them too.
// They are written before the row that names them, so a copy taken after the database snapshot
// holds every photo the snapshot knows.
const fileDirs = ['uploads', 's3'].filter((d) => existsSync(join(dataDir, d)));
if (fileDirs.length) {
  const filesOut = out.replace(/\.tar\.gz$/, '') + '-files.tar.gz';
  const r = spawnSync('tar', ['-czf', filesOut, '-C', dataDir, ...fileDirs], { stdio: 'inherit' });
  chmodSync(filesOut, 0o600);
  if (r.status !== 0) {
    console.error('backup of the photo files failed');
    process.exit(1);
  }
  console.log(`photo files written: ${filesOut}`);
}
console.log(`restore with: npm run restore -- ${out} --data-dir <empty directory>`);
