// Precompressed static files: after `astro build`, every text file in the client folder
// (scripts, styles, SVG, JSON) gets a brotli (.br) and a gzip (.gz) twin beside it, made once at
// the highest settings, so the server never compresses a static file per request
// (scripts/http/serve.mjs sends the twin the browser accepts).
import { readdirSync, readFileSync, writeFileSync, statSync } from 'node:fs';
import { join, extname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { brotliCompressSync, gzipSync, constants } from 'node:zlib';

/** Content types of the files worth compressing, by extension. */
export const TEXT_TYPES = {
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.html': 'text/html; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.webmanifest': 'application/manifest+json',
  '.txt': 'text/plain; charset=utf-8',
  '.xml': 'application/xml',
};

/** Files below this size go out as they are (the framing costs more than it saves). */
const MIN_BYTES = 256;

export function* walk(dir) {
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) yield* walk(path);
    else if (entry.isFile()) yield path;
  }
}

/** Writes `.br` and `.gz` beside each text file of `dir`; returns what it wrote. */
export function precompressDir(dir) {
  let files = 0;
  let before = 0;
  let after = 0;
  for (const path of walk(dir)) {
    if (!(extname(path) in TEXT_TYPES)) continue;
    const src = readFileSync(path);
    if (src.length < MIN_BYTES) continue;
    const br = brotliCompressSync(src, {
      params: { [constants.BROTLI_PARAM_QUALITY]: 11, [constants.BROTLI_PARAM_SIZE_HINT]: src.length },
    });
    const gz = gzipSync(src, { level: 9 });
    // A twin that does not save anything is left out; the server then sends the file itself.
    if (br.length < src.length) writeFileSync(path + '.br', br);
    if (gz.length < src.length) writeFileSync(path + '.gz', gz);
    files++;
    before += src.length;
    after += Math.min(br.length, src.length);
  }
  return { files, before, after };
}

/** Astro integration: precompress the client folder when a build is done. */
export default function precompress() {
  let clientDir = null;
  return {
    name: 'cagewright-precompress',
    hooks: {
      'astro:config:done': ({ config }) => {
        clientDir = fileURLToPath(config.build.client);
      },
      'astro:build:done': ({ logger }) => {
        if (!clientDir || !statSync(clientDir, { throwIfNoEntry: false })?.isDirectory()) return;
        const { files, before, after } = precompressDir(clientDir);
        logger.info(`${files} static files precompressed (${Math.round(before / 1024)} KB → ${Math.round(after / 1024)} KB with brotli)`);
      },
    },
  };
}
