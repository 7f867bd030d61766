import { describe, expect, it } from 'vitest';
import { Client, signedIn } from './client';
import { fill, pageRoutes } from './routes';

function expectSecurityHeaders(res: Response, where: string) {
  const csp = res.headers.get('content-security-policy') ?? '';
  expect(csp, `${where}: CSP`).toContain("default-src 'self'");
  expect(csp, `${where}: frame-ancestors`).toContain("frame-ancestors 'none'");
  expect(res.headers.get('x-content-type-options'), `${where}: nosniff`).toBe('nosniff');
  expect(res.headers.get('referrer-policy'), `${where}: referrer policy`).toBeTruthy();
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

  it('are on API answers too', async () => {
    const anon = new Client();
    expectSecurityHeaders(await anon.fetch('/api/me'), '/api/me');
    expectSecurityHeaders(await anon.fetch('/api/health'), '/api/health');
  });
});
