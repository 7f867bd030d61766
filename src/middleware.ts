import { defineMiddleware, sequence } from 'astro:middleware';
import { sessionUserId } from './lib/server/auth/session';
import { store } from './lib/server/db';
import { actorFor } from './lib/server/access';
import { errorResponse } from './lib/server/http';
import { DataDirInUseError } from './lib/server/data-dir-lock';

/**
 * Paths open without a session: sign-in, Auth.js itself, shared read-only views, health, assets,
 * and the backup route (which checks an instance administrator's session or the host's backup token itself).
 */
const PUBLIC = [/^\/signin\/?$/, /^\/api\/auth\//, /^\/share\//, /^\/api\/health\/?$/, /^\/api\/admin\/backup\/?$/, /^\/_astro\//, /^\/favicon/, /^\/fonts\//];

const isPublic = (path: string) => PUBLIC.some((re) => re.test(path));

const CSP = [
  "default-src 'self'",
  "script-src 'self' 'unsafe-inline'",
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self'",
  "connect-src 'self'",
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
].join('; ');

function setSecurityHeaders(h: Headers) {
  if (!h.has('content-security-policy')) h.set('content-security-policy', CSP);
  h.set('x-content-type-options', 'nosniff');
  h.set('referrer-policy', 'same-origin');
  h.set('x-frame-options', 'DENY');
  h.set('permissions-policy', 'camera=(self), geolocation=(), microphone=()');
}

const securityHeaders = defineMiddleware(async (_ctx, next) => {
  const res = await next();
  try {
    setSecurityHeaders(res.headers);
    return res;
  } catch {
    // Some responses (redirects made by Response.redirect) have immutable headers: copy them.
    const copy = new Response(res.body, res);
    setSecurityHeaders(copy.headers);
    return copy;
  }
});

const identity = defineMiddleware(async (ctx, next) => {
  ctx.locals.actor = null;
  ctx.locals.requestId = crypto.randomUUID();
  const path = ctx.url.pathname;
  const isApi = path.startsWith('/api/');
  try {
    if (!path.startsWith('/api/auth/') && !path.startsWith('/_astro/')) {
      const uid = await sessionUserId(ctx.request);
      if (uid) ctx.locals.actor = await actorFor(await store(), uid);
    }
  } catch (err) {
    if (err instanceof DataDirInUseError) return errorResponse(503, err.message);
    console.error('cagewright: could not read the session:', err);
  }
  if (!ctx.locals.actor && !isPublic(path)) {
    if (isApi) return errorResponse(401, 'Sign in first.');
    const nextUrl = encodeURIComponent(path + ctx.url.search);
    return ctx.redirect(`/signin?next=${nextUrl}`, 303);
  }
  return next();
});

export const onRequest = sequence(securityHeaders, identity);
