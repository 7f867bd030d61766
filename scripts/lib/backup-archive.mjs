// What a backup archive of the embedded store may carry. PGlite's `dumpDataDir` packs the whole
// data directory, which also holds the server's own secrets and its owner file; those never
// leave the host. Used by the server's backup route and by `npm run backup`/`npm run restore`.
import { createGunzip, createGzip } from 'node:zlib';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import tar from 'tar-stream';

/** Files of the data directory that are never archived (top level, by name). */
export const NEVER_ARCHIVED = ['auth-secret', 'backup-token', 'cagewright.owner'];

/** True when an archive entry names one of them (with or without a leading slash or ./). */
export function isSecretEntry(name) {
  const clean = String(name)
    .replace(/^(\.?\/)+/, '')
    .replace(/\/+$/, '');
  return NEVER_ARCHIVED.some((n) => clean === n || clean.startsWith(`${n}/`));
}

/** A gzipped tar without the entries `isSecretEntry` names; everything else byte for byte. */
export async function withoutSecrets(gzippedTar) {
  const extract = tar.extract();
  const pack = tar.pack();
  const chunks = [];
  extract.on('entry', (header, stream, next) => {
    if (isSecretEntry(header.name)) {
      stream.on('end', next);
      stream.resume();
      return;
    }
    stream.pipe(pack.entry(header, next));
  });
  extract.on('finish', () => pack.finalize());
  const out = pipeline(pack, createGzip(), async function (source) {
    for await (const c of source) chunks.push(c);
  });
  await pipeline(Readable.from([gzippedTar]), createGunzip(), extract);
  await out;
  return Buffer.concat(chunks);
}

/** The names of an archive's entries (tests, and restore's own check). */
export async function entryNames(gzippedTar) {
  const extract = tar.extract();
  const names = [];
  extract.on('entry', (header, stream, next) => {
    names.push(header.name);
    stream.on('end', next);
    stream.resume();
  });
  await pipeline(Readable.from([gzippedTar]), createGunzip(), extract);
  return names;
}
