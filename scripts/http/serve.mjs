// The HTTP server around Astro's handler, so `npm start` answers like production:
// - static files that the build precompressed (scripts/http/precompress.mjs) go out as their
//   .br or .gz twin, whichever the browser accepts (brotli first), from memory;
// - everything else (pages, API JSON, static files without a twin) is compressed on the fly by
//   the `compression` package (brotli or gzip by Accept-Encoding, above 1 KB);
// - every compressible response says `Vary: Accept-Encoding`; without Accept-Encoding nothing is
//   encoded.
import http from 'node:http';
import https from 'node:https';
import { readFileSync, statSync } from 'node:fs';
import { extname, relative, sep } from 'node:path';
import compression from 'compression';
import Negotiator from 'negotiator';
import send from 'send';
import { TEXT_TYPES, walk } from './precompress.mjs';

const ENCODINGS = [
  ['br', '.br'],
  ['gzip', '.gz'],
];

/**
 * The client folder (the build's static files), read once at start in one walk: the URL path of
 * every file, and url path → { type, immutable, variants: { br?: {body, etag, mtime}, gzip?: … } }
 * for the text files the build precompressed.
 */
export function indexClient(clientDir) {
  const files = new Set();
  const precompressed = new Map();
  if (!statSync(clientDir, { throwIfNoEntry: false })?.isDirectory()) return { files, precompressed };
  for (const path of walk(clientDir)) {
    const urlPath = '/' + relative(clientDir, path).split(sep).join('/');
    files.add(urlPath);
    const type = TEXT_TYPES[extname(path)];
    if (!type) continue;
    const variants = {};
    for (const [encoding, suffix] of ENCODINGS) {
      const twin = statSync(path + suffix, { throwIfNoEntry: false });
      if (!twin?.isFile()) continue;
      variants[encoding] = {
        body: readFileSync(path + suffix),
        etag: `W/"${encoding}-${twin.size.toString(16)}-${Math.floor(twin.mtimeMs).toString(16)}"`,
        mtime: twin.mtime.toUTCString(),
      };
    }
    if (Object.keys(variants).length > 0) precompressed.set(urlPath, { type, immutable: urlPath.startsWith('/_astro/'), variants });
  }
  return { files, precompressed };
}

function pathOf(url = '/') {
  const q = url.search(/[?#]/);
  return q === -1 ? url : url.slice(0, q);
}

/** Sends the precompressed twin the request accepts; false when it accepts none. */
function sendPrecompressed(req, res, entry) {
  const offered = Object.keys(entry.variants);
  const encoding = new Negotiator(req).encoding([...offered, 'identity'], offered);
  const variant = encoding && entry.variants[encoding];
  if (!variant) return false;
  res.setHeader('Content-Type', entry.type);
  res.setHeader('Content-Encoding', encoding);
  res.setHeader('Vary', 'Accept-Encoding');
  res.setHeader('ETag', variant.etag);
  res.setHeader('Last-Modified', variant.mtime);
  res.setHeader('Cache-Control', entry.immutable ? 'public, max-age=31536000, immutable' : 'public, max-age=0');
  res.setHeader('X-Content-Type-Options', 'nosniff');
  const inm = req.headers['if-none-match'];
  if (inm && inm.split(',').some((t) => t.trim() === variant.etag)) {
    res.statusCode = 304;
    res.end();
    return true;
  }
  res.setHeader('Content-Length', variant.body.length);
  res.statusCode = 200;
  res.end(req.method === 'HEAD' ? undefined : variant.body);
  return true;
}

/** Streams one of the client folder's files (one without a precompressed twin the request accepts). */
function sendFile(req, res, path, clientDir, fallback) {
  const stream = send(req, path, { root: clientDir, dotfiles: 'deny' });
  let started = false;
  stream.on('headers', () => {
    if (path.startsWith('/_astro/')) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
  });
  stream.on('file', () => (started = true));
  stream.on('error', (err) => {
    if (!started) return fallback();
    console.error(String(err));
    if (!res.headersSent) res.writeHead(500);
    res.end();
  });
  stream.pipe(res);
}

/**
 * Serves the built app: Astro's handler in middleware mode (pages and endpoints only) behind
 * precompressed static files and on-the-fly compression. The client folder is indexed once at
 * start, so a request for a page or an endpoint goes straight to the app: Astro's standalone
 * handler looked for a file on disk first for every request (two file-system calls and an error
 * object each time a page or an endpoint was asked for).
 */
export function compressingHandler(appHandler, { clientDir }) {
  const { files, precompressed } = indexClient(clientDir);
  const compress = compression({ threshold: 1024 });
  return (req, res) => {
    try {
      decodeURI(req.url);
    } catch {
      res.writeHead(400);
      res.end('Bad request.');
      return;
    }
    const path = pathOf(req.url);
    const read = req.method === 'GET' || req.method === 'HEAD';
    const entry = read && precompressed.get(path);
    if (entry && sendPrecompressed(req, res, entry)) return;
    compress(req, res, () => {
      if (read && files.has(path)) sendFile(req, res, path, clientDir, () => appHandler(req, res));
      else appHandler(req, res);
    });
  };
}

/** Listens on HOST:PORT (https when SERVER_CERT_PATH and SERVER_KEY_PATH are set, as Astro's own server). */
export function listen(handler, { host, port }) {
  const server =
    process.env.SERVER_CERT_PATH && process.env.SERVER_KEY_PATH
      ? https.createServer({ key: readFileSync(process.env.SERVER_KEY_PATH), cert: readFileSync(process.env.SERVER_CERT_PATH) }, handler)
      : http.createServer(handler);
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      server.off('error', reject);
      resolve(server);
    });
  });
}
