import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { Client, signedIn } from './client';
import { fill, pageRoutes } from './routes';
import { outDir, removeDir, startServer, type RunningServer } from './server';

const directive = (csp: string, name: string) =>
  csp
    .split(';')
    .map((d) => d.trim())
    .find((d) => d.startsWith(`${name} `)) ?? '';

function expectSecurityHeaders(res: Response, where: string) {
  const csp = res.headers.get('content-security-policy') ?? '';
  expect(csp, `${where}: CSP`).toContain("default-src 'self'");
  expect(csp, `${where}: frame-ancestors`).toContain("frame-ancestors 'none'");
  expect(res.headers.get('x-content-type-options'), `${where}: nosniff`).toBe('nosniff');
  expect(res.headers.get('referrer-policy'), `${where}: referrer policy`).toBeTruthy();
  // Scripts only from this origin or by hash: never 'unsafe-inline' (nor eval).
  const scripts = directive(csp, 'script-src');
  expect(scripts, `${where}: script-src`).toMatch(/^script-src 'self'/);
  expect(scripts, `${where}: script-src`).not.toMatch(/'unsafe-inline'|'unsafe-eval'|\*/);
  // No HSTS unless the public URL is https (it is not configured here).
  expect(res.headers.get('strict-transport-security'), `${where}: HSTS`).toBeNull();
}

/** The inline scripts of a page, and whether each one's SHA-256 is in the page's script-src. */
async function inlineScriptsCovered(res: Response): Promise<{ count: number; uncovered: string[] }> {
  const { createHash } = await import('node:crypto');
  const scripts = directive(res.headers.get('content-security-policy') ?? '', 'script-src');
  const html = await res.text();
  const inline = [...html.matchAll(/<script(?![^>]*\bsrc=)[^>]*>([\s\S]*?)<\/script>/g)].map((m) => m[1]!);
  const uncovered = inline.filter((body) => !scripts.includes(`'sha256-${createHash('sha256').update(body).digest('base64')}'`));
  return { count: inline.length, uncovered: uncovered.map((b) => b.slice(0, 80)) };
}

describe('security headers', () => {
  it('are on every page (signed in and signed out), whatever its status', async () => {
    const admin = await signedIn('instanceAdmin');
    const anon = new Client();
    const pages = pageRoutes();
    expect(pages.length).toBeGreaterThan(3);
    for (const route of pages) {
      const path = fill(route, { token: 'not-a-real-token' });
      expectSecurityHeaders(await admin.fetch(path), `${path} (admin)`);
      expectSecurityHeaders(await anon.fetch(path), `${path} (signed out)`);
    }
  });

  it('signed-in pages are never stored (private, no-store); every inline script is allowed by its hash', async () => {
    const admin = await signedIn('dealerAdmin');
    let islands = 0;
    for (const route of pageRoutes()) {
      const path = fill(route, { token: 'not-a-real-token' });
      const res = await admin.fetch(path);
      if ((res.headers.get('content-type') ?? '').startsWith('text/html')) {
        expect(res.headers.get('cache-control'), `${path}: cache-control`).toBe('private, no-store');
        const { count, uncovered } = await inlineScriptsCovered(res);
        islands += count;
        expect(uncovered, `${path}: inline scripts without a hash in the CSP`).toEqual([]);
      } else await res.arrayBuffer();
    }
    // The machines page alone hydrates an island: the bootstrap scripts were there to check.
    expect(islands).toBeGreaterThan(0);
  });

  it('static files the server sends itself carry nosniff too', async () => {
    const anon = new Client();
    const assets = readdirSync(join(outDir(), 'client', '_astro'));
    const js = assets.find((a) => a.endsWith('.js'))!;
    const css = assets.find((a) => a.endsWith('.css'));
    for (const path of [`/_astro/${js}`, ...(css ? [`/_astro/${css}`] : []), '/favicon.svg']) {
      const res = await anon.fetch(path);
      expect(res.status, path).toBe(200);
      expect(res.headers.get('x-content-type-options'), `${path}: nosniff`).toBe('nosniff');
      await res.arrayBuffer();
    }
  });

  it('are on API answers too', async () => {
    const anon = new Client();
    expectSecurityHeaders(await anon.fetch('/api/me'), '/api/me');
    expectSecurityHeaders(await anon.fetch('/api/health'), '/api/health');
  });
});

describe('Strict-Transport-Security when the public URL is https', () => {
  let server: RunningServer;
  beforeAll(async () => {
    server = await startServer({ env: { CAGEWRIGHT_PUBLIC_URL: 'https://cages.example.net', CAGEWRIGHT_SEED: 'off' } });
  }, 120_000);
  afterAll(async () => {
    await server?.stop();
    if (server) removeDir(server.dataDir);
  });

  it('is sent on pages, API answers and static files', async () => {
    const anon = new Client(server.baseUrl);
    const js = readdirSync(join(outDir(), 'client', '_astro')).find((a) => a.endsWith('.js'))!;
    for (const path of ['/signin', '/api/health', '/api/me', '/machines']) {
      const res = await anon.fetch(path);
      expect(res.headers.get('strict-transport-security'), path).toMatch(/^max-age=\d{7,}/);
      await res.arrayBuffer();
    }
    // Files the adapter serves itself pass no middleware; the start script sets it for them.
    const asset = await anon.fetch(`/_astro/${js}`);
    expect(asset.headers.get('x-content-type-options')).toBe('nosniff');
    expect(asset.headers.get('strict-transport-security')).toMatch(/^max-age=\d{7,}/);
    await asset.arrayBuffer();
  });
});
