import { defineMiddleware, sequence } from 'astro:middleware';
import { sessionRef } from './lib/server/auth/session';
import { withClientAddress } from './lib/server/auth/client-address';
import { store } from './lib/server/db';
import { actorFor } from './lib/server/actors';
import { errorResponse, HttpError, refuseUnstorable } from './lib/server/http';
import { setSecurityHeaders } from './lib/server/security-headers';
import { DataDirInUseError } from './lib/server/data-dir-lock';

/**
 * Paths open without a session: sign-in, Auth.js itself, shared read-only views, health, assets,
 * and the backup route (which checks an instance administrator's session or the host's backup token itself).
 */
const PUBLIC = [
  /^\/signin\/?$/,
  /^\/api\/auth\//,
  /^\/share\//,
  /^\/api\/health\/?$/,
  /^\/api\/admin\/backup\/?$/,
  /^\/_astro\//,
  /^\/favicon/,
  /^\/fonts\//,
];

const isPublic = (path: string) => PUBLIC.some((re) => re.test(path));

/** The longest query parameter value any route reads; longer ones are refused. */
const MAX_QUERY_VALUE = 2000;

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/** A refusal in the form the caller reads: JSON for the API, a small page for people. */
function refusal(path: string, err: HttpError): Response {
  if (path.startsWith('/api/')) return errorResponse(err.status, err.message, err.field, err.extra);
  const page = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>Cagewright: request refused</title></head><body><main><h1>That request could not be used</h1><p${err.field ? ` data-field="${escapeHtml(err.field)}"` : ''}>${escapeHtml(err.message)}</p><p><a href="/">Back to Cagewright</a></p></main></body></html>`;
  return new Response(page, { status: err.status, headers: { 'content-type': 'text/html; charset=utf-8' } });
}

const securityHeaders = defineMiddleware(async (ctx, next) => {
  let res: Response;
  try {
    res = await next();
  } catch (err) {
    // A page that reads a form refuses bad input by throwing (readForm): answer with its status.
    if (err instanceof HttpError) res = refusal(ctx.url.pathname, err);
    else throw err;
  }
  const apply = (h: Headers) => {
    const html = (h.get('content-type') ?? '').toLowerCase().startsWith('text/html');
    setSecurityHeaders(h, { html, signedIn: !!ctx.locals.actor, dev: import.meta.env.DEV });
  };
  try {
    apply(res.headers);
    return res;
  } catch {
    // Some responses (redirects made by Response.redirect) have immutable headers: copy them.
    const copy = new Response(res.body, res);
    apply(copy.headers);
    return copy;
  }
});

/**
 * Query and path parameters are checked once, here, for every route: a NUL character or a lone
 * surrogate (in a name or a value), or a value longer than any route reads, is a 400 naming the
 * parameter before any route or the store sees it. JSON bodies and forms are checked where they
 * are read (readJson, readForm).
 */
const inputGuard = defineMiddleware(async (ctx, next) => {
  try {
    for (const [name, value] of ctx.url.searchParams) {
      refuseUnstorable({ [name]: value });
      if (value.length > MAX_QUERY_VALUE) throw new HttpError(400, `${name}: too long (at most ${MAX_QUERY_VALUE} characters)`, name);
    }
    refuseUnstorable(Object.fromEntries(Object.entries(ctx.params ?? {}).filter(([, v]) => typeof v === 'string')));
  } catch (err) {
    if (err instanceof HttpError) return refusal(ctx.url.pathname, err);
    throw err;
  }
  return next();
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
  return next();
});

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

export const onRequest = sequence(securityHeaders, inputGuard, identity, signInContext);
