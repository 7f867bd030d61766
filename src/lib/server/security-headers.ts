/**
 * The headers every response carries. Pages get the Content-Security-Policy Astro computes for
 * them (experimental.csp in astro.config.mjs: the SHA-256 of every script it renders inline, the
 * island bootstrap included), so scripts never need 'unsafe-inline'; everything else gets a
 * fixed policy that allows scripts from this origin only.
 */

/** Every directive but script-src and style-src, the same for pages and the rest. */
export const BASE_DIRECTIVES = [
  "default-src 'self'",
  "img-src 'self' data: blob:",
  "font-src 'self'",
  "connect-src 'self'",
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
];

/**
 * Styles stay open to inline use: React and the cage diagram set `style` attributes, which hashes
 * cannot cover, and a style cannot run code. Scripts are the part that matters.
 */
const STYLE_SRC = "style-src 'self' 'unsafe-inline'";

/** The policy of answers that are not pages (API, redirects, errors): no inline script at all. */
export const DEFAULT_CSP = [...BASE_DIRECTIVES, "script-src 'self'", STYLE_SRC].join('; ');

/**
 * The policy for a page, from the one Astro set (if any): Astro's script-src with its hashes,
 * never 'unsafe-inline' (nor 'unsafe-eval'), plus our other directives.
 */
export function pagePolicy(astroPolicy: string | null): string {
  const astroScript = (astroPolicy ?? '')
    .split(';')
    .map((d) => d.trim())
    .find((d) => /^script-src\s/i.test(d));
  const sources = (astroScript ?? "script-src 'self'")
    .split(/\s+/)
    .slice(1)
    .filter((s) => s && !/^'unsafe-(inline|eval|hashes)'$/i.test(s));
  if (!sources.includes("'self'")) sources.unshift("'self'");
  return [...BASE_DIRECTIVES, `script-src ${sources.join(' ')}`, STYLE_SRC].join('; ');
}

/**
 * The address people reach this installation at (`CAGEWRIGHT_PUBLIC_URL`, e.g.
 * `https://cages.example.net`); null when unset or not a URL.
 */
export function publicUrl(env: NodeJS.ProcessEnv = process.env): URL | null {
  const raw = env.CAGEWRIGHT_PUBLIC_URL?.trim();
  if (!raw) return null;
  try {
    return new URL(raw);
  } catch {
    return null;
  }
}

/** One year; browsers then refuse plain http for this host. Sent only when the public URL is https. */
export const HSTS = 'max-age=31536000';

export interface HeaderContext {
  /** The response is a page (HTML). */
  html: boolean;
  /** Someone is signed in. */
  signedIn: boolean;
  env?: NodeJS.ProcessEnv;
  /**
   * `astro dev`: Astro computes no hashes there and Vite injects inline scripts, so pages keep
   * the old inline allowance. Never in a build.
   */
  dev?: boolean;
}

export function setSecurityHeaders(h: Headers, ctx: HeaderContext) {
  const astroPolicy = h.get('content-security-policy');
  if (ctx.html && ctx.dev)
    h.set('content-security-policy', [...BASE_DIRECTIVES, "script-src 'self' 'unsafe-inline'", STYLE_SRC].join('; '));
  else if (ctx.html) h.set('content-security-policy', pagePolicy(astroPolicy));
  else if (!astroPolicy) h.set('content-security-policy', DEFAULT_CSP);
  h.set('x-content-type-options', 'nosniff');
  h.set('referrer-policy', 'same-origin');
  h.set('x-frame-options', 'DENY');
  h.set('permissions-policy', 'camera=(self), geolocation=(), microphone=()');
  if (publicUrl(ctx.env)?.protocol === 'https:') h.set('strict-transport-security', HSTS);
  // A signed-in page holds that person's data: never kept by a shared cache or the back button's disk cache.
  if (ctx.html && ctx.signedIn) h.set('cache-control', 'private, no-store');
  else if (ctx.html && !h.has('cache-control')) h.set('cache-control', 'no-store');
}
