#!/usr/bin/env node
// JavaScript over the wire: every page with an island (and the share page, which must have
// none) is opened in Chromium with an empty cache; the bytes received for each script, as the
// server sent them (compressed by Accept-Encoding), are summed from the DevTools protocol's
// Network.loadingFinished (encodedDataLength). This counts what the page really loads, the
// islands' chunks included, and nothing the page does not load. The page is scrolled to its end
// first, so islands that load when seen (client:visible) are counted too.
//
// Each page is opened as a role that may open it (the catalog pages as the instance administrator,
// who owns the shared catalog). Every page file under src/pages with an island must have a row
// here: one without is reported as missing, so a new island cannot go unmeasured.
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium } from '@playwright/test';
import { signIn, startServer } from './lib.mjs';

const report = (figure, value, budget, ok, unit = '') =>
  console.log(JSON.stringify({ bench: 'js-size', figure, value, unit, budget, ok, load: loadavg()[0].toFixed(1) }));
const kb = (n) => Math.round(n / 102.4) / 10;

const dir = mkdtempSync(join(tmpdir(), 'cagewright-bench-js-'));
const s = await startServer({ dataDir: dir });
const browser = await chromium.launch({
  executablePath: process.env.CAGEWRIGHT_CHROMIUM ?? '/usr/bin/chromium',
  args: [
    '--no-sandbox',
    '--disable-gpu',
    '--disable-quic',
    '--disable-background-networking',
    '--disable-component-update',
    '--disable-sync',
    '--no-first-run',
  ],
});

/** Opens `path` in a fresh context (empty cache) as `email` and sums the script bytes received. */
async function scriptBytes(email, path) {
  const context = await browser.newContext({ baseURL: s.base });
  if (email) {
    const cookies = (await signIn(s.base, email)).split('; ').map((c) => {
      const i = c.indexOf('=');
      return { name: c.slice(0, i), value: c.slice(i + 1), url: s.base };
    });
    await context.addCookies(cookies);
  }
  const page = await context.newPage();
  const cdp = await context.newCDPSession(page);
  await cdp.send('Network.enable');
  const scripts = new Map();
  cdp.on('Network.responseReceived', (e) => {
    if (e.type === 'Script')
      scripts.set(e.requestId, {
        url: e.response.url,
        encoding: e.response.headers['content-encoding'] ?? e.response.headers['Content-Encoding'] ?? 'none',
        bytes: 0,
      });
  });
  cdp.on('Network.loadingFinished', (e) => {
    const sc = scripts.get(e.requestId);
    if (sc) sc.bytes = e.encodedDataLength;
  });
  const res = await page.goto(path, { waitUntil: 'networkidle' });
  const status = res?.status() ?? 0;
  // Islands that load when they come into view: scroll through the page, then let the network settle.
  await page.evaluate(async () => {
    for (let y = 0; y < document.documentElement.scrollHeight; y += window.innerHeight) {
      window.scrollTo(0, y);
      await new Promise((r) => requestAnimationFrame(() => setTimeout(r, 50)));
    }
    window.scrollTo(0, document.documentElement.scrollHeight);
  });
  await page.waitForLoadState('networkidle');
  await context.close();
  const list = [...scripts.values()];
  return {
    status,
    bytes: list.reduce((n, x) => n + x.bytes, 0),
    files: list.length,
    encodings: [...new Set(list.map((x) => x.encoding))].join('+') || 'none',
  };
}

try {
  const olive = await signIn(s.base, 'olive@larkspur.example');
  const get = async (cookie, path) => fetch(s.base + path, { headers: { cookie, origin: s.base } });
  const machines = await (await get(olive, '/api/machines?q=North')).json();
  const machineId = machines.items[0].id;
  const layoutId = (await (await get(olive, `/api/machines/${machineId}/layouts`)).json()).layouts[0].id;
  const priya = await signIn(s.base, 'priya@kestrel.example');
  const deckId = (await (await get(priya, '/classroom')).text()).match(/\/classroom\/([0-9a-f-]{36})/)?.[1];
  const tomas = await signIn(s.base, 'tomas@kestrel.example');
  const inspectionId = (await (await get(tomas, '/inspections')).text()).match(/\/inspections\/([0-9a-f-]{36})/)?.[1];
  // The catalog belongs to the instance administrator: the catalog pages are opened as her.
  const noor = await signIn(s.base, 'noor@cagewright.example');
  const partsPage = await (await get(noor, '/admin/catalog')).text();
  const part = partsPage.match(/\/admin\/catalog\/parts\/([A-Za-z0-9-]+)/)?.[1];
  const familyId = partsPage.match(/\/admin\/catalog\/families\/(?!new\b)([A-Za-z0-9-]+)/)?.[1];

  const ADMIN = 'noor@cagewright.example';
  // [name, who, path, budget, the page file it measures]
  const pages = [
    [
      'editor',
      'olive@larkspur.example',
      `/machines/${machineId}/layouts/${layoutId}`,
      '≤ 160 KB',
      'machines/[id]/layouts/[layoutId].astro',
    ],
    ['machines list', 'olive@larkspur.example', '/machines', '(figure)', 'machines/index.astro'],
    ['loss check', 'olive@larkspur.example', `/machines/${machineId}/loss-check`, '(figure)', 'machines/[id]/loss-check.astro'],
    ['season log', 'olive@larkspur.example', `/machines/${machineId}/season`, '(figure)', 'machines/[id]/season.astro'],
    [
      'inspection checklist',
      'tomas@kestrel.example',
      inspectionId && `/inspections/${inspectionId}`,
      '(figure)',
      'inspections/[id]/index.astro',
    ],
    ['catalog', ADMIN, '/admin/catalog', '(figure)', 'admin/catalog/index.astro'],
    ['catalog: new family', ADMIN, '/admin/catalog/families/new', '(figure)', 'admin/catalog/families/new.astro'],
    [
      'catalog: a family',
      ADMIN,
      familyId && `/admin/catalog/families/${encodeURIComponent(familyId)}`,
      '(figure)',
      'admin/catalog/families/[id].astro',
    ],
    ['catalog: new part', ADMIN, '/admin/catalog/parts/new', '(figure)', 'admin/catalog/parts/new.astro'],
    [
      'catalog: a part',
      ADMIN,
      part && `/admin/catalog/parts/${encodeURIComponent(part)}`,
      '(figure)',
      'admin/catalog/parts/[partNumber].astro',
    ],
    ['classroom', 'priya@kestrel.example', '/classroom', '(figure)', 'classroom/index.astro'],
    ['classroom: a deck', 'priya@kestrel.example', deckId && `/classroom/${deckId}`, '(figure)', 'classroom/[deckId]/index.astro'],
    [
      'classroom: present',
      'priya@kestrel.example',
      deckId && `/classroom/${deckId}/present`,
      '(figure)',
      'classroom/[deckId]/present.astro',
    ],
    [
      'classroom: presenter',
      'priya@kestrel.example',
      deckId && `/classroom/${deckId}/presenter`,
      '(figure)',
      'classroom/[deckId]/presenter.astro',
    ],
    [
      'classroom: compare',
      'priya@kestrel.example',
      '/classroom/compare?a=starter:tamarack-m4:wheat&b=starter:tamarack-m4:canola',
      '(figure)',
      'classroom/compare.astro',
    ],
  ];
  // Every page file with an island (a client: directive) has a row above.
  const measured = new Set(pages.map((p) => p[4]));
  for (const file of readdirSync('src/pages', { recursive: true })) {
    const f = String(file).replaceAll('\\', '/');
    if (!f.endsWith('.astro') || measured.has(f)) continue;
    if (/\bclient:(load|idle|visible|media|only)\b/.test(readFileSync(join('src/pages', f), 'utf8')))
      report(`page with an island not measured: src/pages/${f}`, 'page missing', '(figure)', false);
  }
  for (const [name, email, path, budget] of pages) {
    if (!path) {
      report(`${name} page JS on the wire`, 'page missing', budget, false);
      continue;
    }
    const r = await scriptBytes(email, path);
    if (r.status !== 200) report(`${name} page JS on the wire`, `HTTP ${r.status}`, budget, false);
    else report(`${name} page JS on the wire (${r.files} files, ${r.encodings})`, kb(r.bytes), budget, true, 'KB');
  }

  const share = await fetch(`${s.base}/api/share-links`, {
    method: 'POST',
    headers: { cookie: olive, origin: s.base, 'content-type': 'application/json' },
    body: JSON.stringify({ layoutId, version: 1, label: 'bench' }),
  });
  const sharePath = share.ok ? (await share.json()).path : null;
  if (!sharePath) report('share page JS on the wire', 'page missing', '0', false);
  else {
    const r = await scriptBytes(null, sharePath);
    report(`share page JS on the wire (${r.files} files)`, r.status === 200 ? r.bytes : `HTTP ${r.status}`, '0', r.status === 200, 'bytes');
  }
} finally {
  await browser.close();
  await s.stop();
  rmSync(dir, { recursive: true, force: true });
}
