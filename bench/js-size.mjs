#!/usr/bin/env node
// Gzipped JavaScript a page loads: the scripts and island components its HTML names, plus every
// chunk they import statically, each counted once, read from the build's client folder.
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { gzipSync } from 'node:zlib';
import { tmpdir } from 'node:os';
import { join, resolve, dirname } from 'node:path';
import { signIn, startServer } from './lib.mjs';

const outDir = resolve(process.env.CAGEWRIGHT_OUT_DIR ?? 'dist');
const clientDir = join(outDir, 'client');
const report = (figure, value, budget, ok, unit = '') =>
  console.log(JSON.stringify({ bench: 'js-size', figure, value, unit, budget, ok }));

export function scriptsOf(html) {
  const urls = new Set();
  for (const m of html.matchAll(/<script[^>]*\ssrc="([^"]+)"/g)) urls.add(m[1]);
  for (const m of html.matchAll(/(?:component-url|renderer-url|before-hydration-url)="([^"]+)"/g)) if (m[1]) urls.add(m[1]);
  // Inline module scripts that import chunks.
  for (const m of html.matchAll(/<script[^>]*>([\s\S]*?)<\/script>/g)) {
    for (const i of m[1].matchAll(/(?:import\(|from\s*|import\s*)["'](\/_astro\/[^"']+\.js)["']/g)) urls.add(i[1]);
  }
  return [...urls].filter((u) => u.startsWith('/'));
}

export function gzippedClosure(urls) {
  const seen = new Set();
  let bytes = 0;
  let inlineBytes = 0;
  const visit = (file) => {
    if (seen.has(file) || !existsSync(file)) return;
    seen.add(file);
    const src = readFileSync(file);
    bytes += gzipSync(src).length;
    for (const m of src.toString().matchAll(/(?:import|from)\s*["'](\.{1,2}\/[^"']+\.js)["']/g)) visit(resolve(dirname(file), m[1]));
  };
  for (const u of urls) visit(join(clientDir, u));
  return { bytes: bytes + inlineBytes, files: seen.size };
}

function inlineScriptBytes(html) {
  let total = 0;
  for (const m of html.matchAll(/<script(?![^>]*\ssrc=)[^>]*>([\s\S]*?)<\/script>/g)) total += gzipSync(Buffer.from(m[1])).length;
  return total;
}

async function measure(base, cookie, path) {
  const res = await fetch(base + path, { headers: cookie ? { cookie } : {} });
  if (res.status !== 200) return null;
  const html = await res.text();
  const { bytes, files } = gzippedClosure(scriptsOf(html));
  return { bytes: bytes + inlineScriptBytes(html), files };
}

const dir = mkdtempSync(join(tmpdir(), 'cagewright-bench-js-'));
try {
  const s = await startServer({ dataDir: dir });
  const cookie = await signIn(s.base, 'tomas@kestrel.example');
  const headers = { cookie, origin: s.base, 'content-type': 'application/json' };
  const home = await (await fetch(`${s.base}/`, { headers })).text();
  const machineId = home.match(/\/machines\/([0-9a-f-]{36})/)[1];
  const list = await (await fetch(`${s.base}/api/machines/${machineId}/layouts`, { headers })).json();
  const layout = list.layouts[0];
  const editor = await measure(s.base, cookie, `/machines/${machineId}/layouts/${layout.id}`);
  if (editor) report('editor page JS (gzip)', Math.round(editor.bytes / 102.4) / 10, '≤ 160 KB', editor.bytes <= 160 * 1024, 'KB');
  else report('editor page JS (gzip)', 'page missing', '≤ 160 KB', false);

  const version = await (await fetch(`${s.base}/api/layouts/${layout.id}`, { headers })).json();
  const share = await fetch(`${s.base}/api/share-links`, {
    method: 'POST',
    headers,
    body: JSON.stringify({ layoutId: layout.id, version: version.layout.currentVersion, label: 'bench' }),
  });
  const shareBody = share.ok ? await share.json() : null;
  const url = shareBody?.url ?? shareBody?.link?.url ?? (shareBody?.token ? `/share/${shareBody.token}` : null);
  const sharePage = url ? await measure(s.base, null, new URL(url, s.base).pathname) : null;
  if (sharePage) report('share page JS (gzip)', Math.round(sharePage.bytes / 102.4) / 10, '≤ 15 KB', sharePage.bytes <= 15 * 1024, 'KB');
  else report('share page JS (gzip)', 'page missing', '≤ 15 KB', false);
  await s.stop();
} finally {
  rmSync(dir, { recursive: true, force: true });
}
