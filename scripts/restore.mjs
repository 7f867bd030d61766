#!/usr/bin/env node
// `npm run restore -- <backup.tar.gz> [--data-dir <dir>]`: unpacks a snapshot into an empty
// data directory (default ./data), then checks it opens and counts the rows of each table.
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';

const args = process.argv.slice(2);
const file = args.find((a) => !a.startsWith('--') && args[args.indexOf(a) - 1] !== '--data-dir');
const dirArg = args.indexOf('--data-dir');
const dataDir = resolve(dirArg >= 0 ? args[dirArg + 1] : process.env.CAGEWRIGHT_DATA_DIR ?? 'data');
if (!file || !existsSync(file)) {
  console.error('usage: npm run restore -- <backup.tar.gz> [--data-dir <empty directory>]');
  process.exit(2);
}
if (existsSync(dataDir) && readdirSync(dataDir).length > 0) {
  console.error(`refusing to restore into ${dataDir}: it is not empty. Pick an empty directory (or move the old one away).`);
  process.exit(2);
}
const { PGlite } = await import('@electric-sql/pglite');
const db = await PGlite.create({ dataDir, loadDataDir: new Blob([readFileSync(file)]) });
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
  const r = spawnSync('tar', ['-xzf', filesArchive, '-C', dataDir], { stdio: 'inherit' });
  if (r.status !== 0) {
    console.error(`could not unpack ${filesArchive}`);
    process.exit(1);
  }
  console.log(`photo files restored from ${filesArchive}`);
}
console.log(`restored into ${dataDir}; start the server with CAGEWRIGHT_DATA_DIR=${dataDir} npm run serve`);
