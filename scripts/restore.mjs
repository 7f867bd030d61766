#!/usr/bin/env node
// `npm run restore -- <backup.tar.gz> [--data-dir <dir>] [--keep-secret-from <old data dir>]`:
// unpacks a snapshot into an empty data directory (default ./data), then checks it opens and
// counts the rows of each table.
// - Files are written readable by this user only (files 0600, directories 0700).
// - An archive never brings a session secret, backup token or owner file (older archives that
//   carry them have them dropped). The restored directory gets a fresh session secret, so every
//   session signed before is refused and everyone signs in again; `--keep-secret-from <dir>`
//   copies the secret of that (old) data directory instead, keeping people signed in.
import { chmodSync, copyFileSync, existsSync, lstatSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { join, resolve } from 'node:path';
import { withoutSecrets } from './lib/backup-archive.mjs';

process.umask(0o077);
const args = process.argv.slice(2);
const valueFlags = ['--data-dir', '--keep-secret-from'];
const file = args.find((a, i) => !a.startsWith('--') && !valueFlags.includes(args[i - 1]));
const flag = (name) => {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : undefined;
};
const dataDir = resolve(flag('--data-dir') ?? process.env.CAGEWRIGHT_DATA_DIR ?? 'data');
const keepFrom = flag('--keep-secret-from');
if (!file || !existsSync(file) || (args.includes('--keep-secret-from') && !keepFrom)) {
  console.error('usage: npm run restore -- <backup.tar.gz> [--data-dir <empty directory>] [--keep-secret-from <old data dir>]');
  process.exit(2);
}
if (keepFrom && !existsSync(join(resolve(keepFrom), 'auth-secret'))) {
  console.error(`--keep-secret-from: ${resolve(keepFrom)} holds no auth-secret to keep`);
  process.exit(2);
}
if (existsSync(dataDir) && readdirSync(dataDir).length > 0) {
  console.error(`refusing to restore into ${dataDir}: it is not empty. Pick an empty directory (or move the old one away).`);
  process.exit(2);
}
mkdirSync(dataDir, { recursive: true, mode: 0o700 });
const archive = await withoutSecrets(readFileSync(file));
const { PGlite } = await import('@electric-sql/pglite');
const db = await PGlite.create({ dataDir, loadDataDir: new Blob([archive]) });
const tables = await db.query(`select table_name from information_schema.tables where table_schema = 'public' order by 1`);
for (const { table_name } of tables.rows) {
  const { rows } = await db.query(`select count(*)::int as n from "${table_name}"`);
  console.log(`${table_name.padEnd(20)} ${rows[0].n}`);
}
await db.close();
// Photo files archived beside the snapshot, if any.
const filesArchive = file.replace(/\.tar\.gz$/, '') + '-files.tar.gz';
if (existsSync(filesArchive)) {
  const { spawnSync } = await import('node:child_process');
  const r = spawnSync(
    'tar',
    [
      '-xzf',
      filesArchive,
      '-C',
      dataDir,
      '--no-same-permissions',
      '--exclude=auth-secret',
      '--exclude=backup-token',
      '--exclude=cagewright.owner',
    ],
    { stdio: 'inherit' },
  );
  if (r.status !== 0) {
    console.error(`could not unpack ${filesArchive}`);
    process.exit(1);
  }
  console.log(`photo files restored from ${filesArchive}`);
}

// The session secret: fresh unless told to keep the old directory's.
const secretFile = join(dataDir, 'auth-secret');
rmSync(secretFile, { force: true });
if (keepFrom) {
  copyFileSync(join(resolve(keepFrom), 'auth-secret'), secretFile);
  console.log(`session secret kept from ${resolve(keepFrom)}: people stay signed in`);
} else {
  writeFileSync(secretFile, randomBytes(32).toString('base64url'), { mode: 0o600 });
  console.log('a fresh session secret was written: everyone signs in again');
}

// Readable by this user only, whatever modes the archive carried.
(function privatise(dir) {
  chmodSync(dir, 0o700);
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    const st = lstatSync(p);
    if (st.isSymbolicLink()) continue;
    if (st.isDirectory()) privatise(p);
    else chmodSync(p, 0o600);
  }
})(dataDir);
console.log(`restored into ${dataDir}; start the server with CAGEWRIGHT_DATA_DIR=${dataDir} npm run serve`);
