import { describe, expect, it } from 'vitest';
import { DEFAULT_CSP, HSTS, pagePolicy, publicUrl, setSecurityHeaders } from '~/lib/server/security-headers';

const directive = (csp: string, name: string) =>
  csp
    .split(';')
    .map((d) => d.trim())
    .find((d) => d.startsWith(`${name} `));

describe('security headers', () => {
  it('a page keeps Astro’s script hashes and never allows inline scripts', () => {
    const astro = "script-src 'self' 'sha256-abc=' 'unsafe-inline'; style-src 'self' 'sha256-def='";
    const csp = pagePolicy(astro);
    expect(directive(csp, 'script-src')).toBe("script-src 'self' 'sha256-abc='");
    expect(directive(csp, 'style-src')).toBe("style-src 'self' 'unsafe-inline'");
    expect(directive(csp, 'frame-ancestors')).toBe("frame-ancestors 'none'");
    expect(directive(pagePolicy(null), 'script-src')).toBe("script-src 'self'");
    expect(directive(DEFAULT_CSP, 'script-src')).toBe("script-src 'self'");
  });

  it('sends Strict-Transport-Security only when the public URL is https', () => {
    const run = (env: Record<string, string>) => {
      const h = new Headers({ 'content-type': 'application/json' });
      setSecurityHeaders(h, { html: false, signedIn: false, env });
      return h.get('strict-transport-security');
    };
    expect(run({ CAGEWRIGHT_PUBLIC_URL: 'https://cages.example.net' })).toBe(HSTS);
    expect(run({ CAGEWRIGHT_PUBLIC_URL: 'http://cages.example.net' })).toBeNull();
    expect(run({ CAGEWRIGHT_PUBLIC_URL: 'not a url' })).toBeNull();
    expect(run({})).toBeNull();
    expect(publicUrl({ CAGEWRIGHT_PUBLIC_URL: ' https://x.example/ ' })?.host).toBe('x.example');
  });

  it('signed-in pages are private and never stored; other answers keep their own caching', () => {
    const page = new Headers({ 'content-type': 'text/html', 'cache-control': 'public, max-age=600' });
    setSecurityHeaders(page, { html: true, signedIn: true, env: {} });
    expect(page.get('cache-control')).toBe('private, no-store');
    const anon = new Headers({ 'content-type': 'text/html' });
    setSecurityHeaders(anon, { html: true, signedIn: false, env: {} });
    expect(anon.get('cache-control')).toBe('no-store');
    const photo = new Headers({
      'content-type': 'image/png',
      'cache-control': 'private, max-age=86400, immutable',
      'content-security-policy': "default-src 'none'; sandbox",
    });
    setSecurityHeaders(photo, { html: false, signedIn: true, env: {} });
    expect(photo.get('cache-control')).toBe('private, max-age=86400, immutable');
    expect(photo.get('content-security-policy')).toBe("default-src 'none'; sandbox");
    expect(photo.get('x-content-type-options')).toBe('nosniff');
  });
});
