/**
 * Every page of the app, listed from src/pages itself, with its route params filled from the
 * demo data through the API. A new page file without a way to fill its params fails the specs
 * that use this list (the phone-width check and the accessibility run), so no page is left out.
 */
import { expect, type APIRequestContext, type Browser } from '@playwright/test';
import { readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { signIn, type DEMO } from './helpers';

const baseURL = `http://127.0.0.1:${process.env.CAGEWRIGHT_E2E_PORT ?? 4391}`;

/** Route patterns ('/machines/[id]/layouts/[layoutId]') of every page file under src/pages (no API routes). */
export function pageRoutes(root = 'src/pages'): string[] {
  const out: string[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir).sort()) {
      const full = join(dir, name);
      if (statSync(full).isDirectory()) {
        if (relative(root, full) !== 'api') walk(full);
      } else if (/\.(astro|md|mdx|html)$/.test(name)) {
        const rel = relative(root, full)
          .replace(/\.(astro|md|mdx|html)$/, '')
          .replace(/(^|\/)index$/, '');
        out.push(`/${rel}`);
      }
    }
  };
  walk(root);
  return out;
}

/** Ids of the demo world a page's params are filled with. */
export interface DemoIds {
  machineId: string;
  layoutId: string;
  familyId: string;
  partNumber: string;
  inspectionId: string;
  partsRequestId: string;
  deckId: string;
  shareToken: string;
  deckShareToken: string;
  jobId: string;
  /** A part record of the machine (part history), one with wear measured where there is one. */
  partRecordId: string;
}

/** How each pattern with params is filled (the pattern exactly as the folder spells it). */
const FILL: Record<string, (d: DemoIds) => string> = {
  '/admin/catalog/families/[id]': (d) => `/admin/catalog/families/${d.familyId}`,
  '/admin/catalog/parts/[partNumber]': (d) => `/admin/catalog/parts/${d.partNumber}`,
  '/classroom/[deckId]': (d) => `/classroom/${d.deckId}`,
  '/classroom/[deckId]/present': (d) => `/classroom/${d.deckId}/present`,
  '/classroom/[deckId]/presenter': (d) => `/classroom/${d.deckId}/presenter`,
  '/classroom/compare': (d) => `/classroom/compare?a=starter:${d.familyId}:wheat&b=starter:${d.familyId}:corn`,
  '/inspections/[id]': (d) => `/inspections/${d.inspectionId}`,
  '/inspections/[id]/report': (d) => `/inspections/${d.inspectionId}/report`,
  '/inspections/history/[machineId]': (d) => `/inspections/history/${d.machineId}`,
  '/machines/[id]': (d) => `/machines/${d.machineId}`,
  '/machines/[id]/card': (d) => `/machines/${d.machineId}/card?crop=wheat`,
  '/machines/[id]/loss-check': (d) => `/machines/${d.machineId}/loss-check`,
  '/machines/[id]/season': (d) => `/machines/${d.machineId}/season`,
  '/machines/[id]/hours': (d) => `/machines/${d.machineId}/hours`,
  '/machines/[id]/parts/[recordId]': (d) => `/machines/${d.machineId}/parts/${d.partRecordId}`,
  '/machines/[id]/layouts/[layoutId]': (d) => `/machines/${d.machineId}/layouts/${d.layoutId}`,
  '/machines/[id]/layouts/[layoutId]/compare': (d) => `/machines/${d.machineId}/layouts/${d.layoutId}/compare`,
  '/machines/[id]/layouts/[layoutId]/history': (d) => `/machines/${d.machineId}/layouts/${d.layoutId}/history`,
  '/machines/[id]/layouts/[layoutId]/share': (d) => `/machines/${d.machineId}/layouts/${d.layoutId}/share`,
  '/jobs/[id]': (d) => `/jobs/${d.jobId}`,
  '/jobs/[id]/sheet': (d) => `/jobs/${d.jobId}/sheet`,
  '/parts-requests/[id]': (d) => `/parts-requests/${d.partsRequestId}`,
  '/share/[token]': (d) => `/share/${d.shareToken}`,
  '/share/deck/[token]': (d) => `/share/deck/${d.deckShareToken}`,
};

/** Every page as a URL to open; throws naming a page whose params nobody knows how to fill. */
export function pageUrls(d: DemoIds): { route: string; url: string }[] {
  return pageRoutes().map((route) => {
    if (!route.includes('[')) return { route, url: FILL[route]?.(d) ?? route };
    const fill = FILL[route];
    if (!fill) throw new Error(`e2e/pages.ts: no way to fill the params of ${route}; add it to FILL`);
    return { route, url: fill(d) };
  });
}

async function signedIn(browser: Browser, who: keyof typeof DEMO): Promise<{ request: APIRequestContext; close: () => Promise<void> }> {
  const context = await browser.newContext({ baseURL: process.env.PLAYWRIGHT_BASE_URL ?? baseURL });
  const page = await context.newPage();
  await signIn(page, who);
  return { request: page.request, close: () => context.close() };
}

/** Finds (or makes: a share link of each kind) the demo ids, signed in as the technician and the trainer. */
export async function demoIds(browser: Browser): Promise<DemoIds> {
  const techSession = await signedIn(browser, 'technician');
  const tech = techSession.request;
  const machines = (await (await tech.get('/api/machines?q=North%20Quarter')).json()).items as { id: string; familyId: string }[];
  const machine = machines[0]!;
  const layouts = (await (await tech.get(`/api/machines/${machine.id}/layouts`)).json()).layouts as { id: string }[];
  const layoutId = layouts[0]!.id;
  const layout = await (await tech.get(`/api/layouts/${layoutId}`)).json();
  const partNumber = layout.current.body.elements[0].partNumber as string;
  const inspections = (await (await tech.get('/api/inspections?pageSize=100')).json()).items as { id: string }[];
  const requests = await (await tech.get('/api/parts-requests')).json();
  const partsRequestId = ((requests.items ?? requests.requests ?? requests) as { id: string }[])[0]!.id;
  // The demo's job card (seeded), or the first the technician sees.
  const jobId = ((await (await tech.get('/api/jobs')).json()).items as { id: string }[])[0]!.id;
  const share = await tech.post('/api/share-links', { data: { layoutId, version: layout.layout.currentVersion, label: 'page run' } });
  expect(share.status()).toBe(201);
  const sb = await share.json();
  const parts = (await (await tech.get(`/api/machines/${machine.id}/parts`)).json()).current as {
    record: { id: string };
    points: unknown[];
  }[];
  const partRecordId = (parts.find((p) => p.points.length > 1) ?? parts[0])?.record.id;
  const trainerSession = await signedIn(browser, 'trainer');
  const trainer = trainerSession.request;
  const decks = (await (await trainer.get('/api/decks')).json()).decks as { id: string; slideCount: number }[];
  const deckId = decks.find((x) => x.slideCount > 0)!.id;
  const ds = await trainer.post(`/api/decks/${deckId}/share`, { data: { label: 'page run' } });
  expect(ds.status()).toBe(201);
  const dsb = await ds.json();
  const ids: DemoIds = {
    machineId: machine.id,
    layoutId,
    familyId: machine.familyId ?? layout.layout?.familyId,
    partNumber,
    inspectionId: inspections[0]!.id,
    partsRequestId,
    deckId,
    shareToken: sb.token ?? sb.link?.token,
    deckShareToken: dsb.token ?? dsb.link?.token,
    jobId,
    partRecordId: partRecordId!,
  };
  await techSession.close();
  await trainerSession.close();
  for (const [k, v] of Object.entries(ids)) expect(v, k).toBeTruthy();
  return ids;
}
