import { defineMiddleware, sequence } from 'astro:middleware';
import { sessionRef } from './lib/server/auth/session';
import { withClientAddress } from './lib/server/auth/client-address';
import { store } from './lib/server/db';
import { actorFor } from './lib/server/access';
import { errorResponse, HttpError } from './lib/server/http';
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
      const ref = await sessionRef(ctx.request);
      if (ref) ctx.locals.actor = await actorFor(await store(), ref.uid, ref.sid);
    }
  } catch (err) {
    if (err instanceof DataDirInUseError) {
      // The details (path, holder's process) are for the console, never for a response.
      console.error(`cagewright: ${err.message}`);
      return errorResponse(503, err.publicMessage, undefined, { code: 'data-dir-in-use' });
    }
    console.error('cagewright: could not read the session:', err);
  }
  if (!ctx.locals.actor && !isPublic(path)) {
    if (isApi) return errorResponse(401, 'Sign in first.');
    const nextUrl = encodeURIComponent(path + ctx.url.search);
    return ctx.redirect(`/signin?next=${nextUrl}`, 303);
  }
  if (isApi) return next();
  try {
    return await next();
  } catch (err) {
    // A page that lets a refusal through (a form that is not a form, one too large) answers with
    // its status and message, never a 500; anything else is still a fault.
    if (err instanceof HttpError && err.status < 500) return errorPage(err.status, err.message);
    throw err;
  }
});

function errorPage(status: number, message: string): Response {
  const text = message.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
  return new Response(`<!doctype html><html lang="en"><meta charset="utf-8"><title>Cagewright</title><main><h1>That did not work</h1><p>${text}</p><p><a href="/">Back to the start</a></p></main></html>`, {
    status,
    headers: { 'content-type': 'text/html; charset=utf-8', 'cache-control': 'no-store' },
  });
}

function clientAddressOf(ctx: { clientAddress: string }): string | null {
  try {
    return ctx.clientAddress; // decided by scripts/start.mjs (see auth/client-address.ts)
  } catch {
    return null;
  }
}

/**
 * Auth.js's routes run knowing the client address (the sign-in throttle counts by it). A
 * throttled sign-in redirects to /signin?code=throttled-<unix seconds>; the same time also goes
 * out as Retry-After for clients that read headers.
 */
const signInContext = defineMiddleware(async (ctx, next) => {
  if (!ctx.url.pathname.startsWith('/api/auth/')) return next();
  const res = await withClientAddress(clientAddressOf(ctx), next);
  const location = res.headers.get('location');
  const until = location ? /[?&]code=throttled-(\d+)/.exec(location) : null;
  if (until) {
    const seconds = String(Math.max(1, Number(until[1]) - Math.floor(Date.now() / 1000)));
    try {
      res.headers.set('retry-after', seconds);
    } catch {
      // A redirect made by Response.redirect has immutable headers: copy it.
      const copy = new Response(res.body, res);
      copy.headers.set('retry-after', seconds);
      return copy;
    }
  }
  return res;
});

export const onRequest = sequence(securityHeaders, identity, signInContext);
