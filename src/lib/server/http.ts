import type { APIContext } from 'astro';
import { z, type ZodType } from 'zod';
import { can, rolesFor, type Action, type Actor } from './access';
import { findUnstorable, UNSTORABLE_MESSAGE } from '~/lib/domain/text';
import { BodyTooLarge, readCapped } from './body';

/** An error a route maps to a status and a JSON body; `field` names the offending input. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly field?: string,
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const notFound = (what = 'Not found', field?: string) => new HttpError(404, what, field);

/**
 * For `.catch(...)` on a lookup: a 404 from it becomes the error `make` builds (a missing version
 * named as a bad field, say); anything else (a database outage) is passed on untouched, so it is
 * logged and answered as a 500 instead of passing for "not found".
 */
export function whenNotFound(make: () => Error) {
  return (err: unknown): never => {
    if (err instanceof HttpError && err.status === 404) throw make();
    throw err;
  };
}

export function json(data: unknown, status = 200, headers: Record<string, string> = {}): Response {
  return new Response(JSON.stringify(data), {
    status,
    headers: { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store', ...headers },
  });
}

export function errorResponse(status: number, message: string, field?: string, extra?: Record<string, unknown>) {
  return json({ error: { message, ...(field ? { field } : {}), ...extra } }, status);
}

function zodToHttp(error: z.ZodError, prefix?: string): HttpError {
  const issue = error.issues[0];
  const path = [prefix, ...(issue?.path ?? [])].filter((p) => p !== undefined && p !== '').join('.');
  // An issue at the root (the body is not an object at all) names the body itself.
  const field = path || 'body';
  const issues = error.issues
    .slice(0, 20)
    .map((i) => ({ field: [prefix, ...i.path].filter((p) => p !== undefined && p !== '').join('.') || 'body', message: i.message }));
  return new HttpError(400, `${field}: ${issue?.message ?? 'invalid'}`, field, { issues });
}

/** The largest JSON body a route reads (bytes); larger ones are refused while they stream. */
export const MAX_JSON_BYTES = 1_000_000;

/** NUL characters and lone surrogates anywhere in the input (keys included) → 400 naming the field. */
export function refuseUnstorable(value: unknown, prefix?: string) {
  const field = findUnstorable(value, prefix ? [prefix] : []);
  if (field) throw new HttpError(400, `${field}: ${UNSTORABLE_MESSAGE}`, field);
}

const utf8 = new TextDecoder('utf-8', { fatal: true });

/**
 * The JSON body validated by `schema`: 415 for another content type, 413 as soon as more than
 * MAX_JSON_BYTES arrive (the body is counted as it streams, never buffered whole), 400 naming the
 * field for bad UTF-8, bad JSON, characters the store cannot keep, or a schema failure.
 */
export async function readJson<T>(request: Request, schema: ZodType<T>, limit = MAX_JSON_BYTES): Promise<T> {
  const type = request.headers.get('content-type') ?? '';
  if (!type.toLowerCase().includes('application/json')) {
    throw new HttpError(415, 'Send the body as application/json.', 'content-type');
  }
  let bytes: Uint8Array;
  try {
    bytes = await readCapped(request, limit);
  } catch (err) {
    if (err instanceof BodyTooLarge) throw new HttpError(413, `The body is too large (at most ${limit} bytes).`, 'body');
    throw new HttpError(400, 'The body could not be read.', 'body');
  }
  let text: string;
  try {
    text = utf8.decode(bytes);
  } catch {
    throw new HttpError(400, 'The body is not valid UTF-8.', 'body');
  }
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    throw new HttpError(400, 'The body is not valid JSON.', 'body');
  }
  refuseUnstorable(raw);
  const parsed = schema.safeParse(raw);
  if (!parsed.success) throw zodToHttp(parsed.error);
  return parsed.data;
}

/** Query or path parameters validated by `schema` (unstorable characters refused first). */
export function parseParams<T>(value: unknown, schema: ZodType<T>, prefix?: string): T {
  refuseUnstorable(value, prefix);
  const parsed = schema.safeParse(value);
  if (!parsed.success) throw zodToHttp(parsed.error, prefix);
  return parsed.data;
}

/** The methods that write. */
export type WriteMethod = 'POST' | 'PUT' | 'PATCH' | 'DELETE';

/**
 * What a write handler reads besides its path parameters: the zod schema of its JSON body
 * (`readJson`), of its query string, or of its multipart form. `{}` means the path alone: such a
 * handler refuses any body (`refuseBody`). Every API route module exports its declarations as
 * `inputs` and validates with exactly these schemas, so the hostile-input properties read the
 * required and optional fields of each route from here (a write route without one fails them).
 */
export interface RouteInput {
  body?: ZodType;
  query?: ZodType;
  multipart?: ZodType;
}
export type RouteInputs = Partial<Record<WriteMethod, RouteInput>>;

/** Declares a route module's inputs, keeping each schema's own type for the handler. */
export const routeInputs = <T extends RouteInputs>(inputs: T): T => inputs;

/** A handler that reads nothing but its path refuses a body (400 naming the body), reading at most one byte of it. */
export async function refuseBody(request: Request): Promise<void> {
  try {
    await readCapped(request, 0);
  } catch (err) {
    if (err instanceof BodyTooLarge) throw new HttpError(400, 'body: this request takes no body.', 'body');
    throw new HttpError(400, 'The body could not be read.', 'body');
  }
}

/** Query parameters of a write route validated by `schema`. */
export function readQuery<T>(url: URL, schema: ZodType<T>): T {
  return parseParams(Object.fromEntries(url.searchParams), schema);
}

/**
 * Ids in the query (like ids in the path): a malformed one is simply not found, a 404 naming the
 * parameter; characters the store cannot keep are still a 400.
 */
export function readIdQuery<T>(url: URL, schema: ZodType<T>): T {
  const value = Object.fromEntries(url.searchParams);
  refuseUnstorable(value);
  const parsed = schema.safeParse(value);
  if (!parsed.success) throw notFound('Not found', zodToHttp(parsed.error).field);
  return parsed.data;
}

/** A multipart form's fields validated by `schema` (400 naming the field). */
export function parseForm<T>(form: FormData, schema: ZodType<T>): T {
  const fields: Record<string, FormDataEntryValue> = {};
  for (const [k, v] of form) if (!(k in fields)) fields[k] = v;
  const parsed = schema.safeParse(fields);
  if (!parsed.success) throw zodToHttp(parsed.error);
  return parsed.data;
}

/** The signed-in actor (401 otherwise), allowed to take `action` when one is named (403 otherwise; see `access.ts`). */
export function requireActor(ctx: Pick<APIContext, 'locals'>, action?: Action): Actor {
  const actor = ctx.locals.actor;
  if (!actor) throw new HttpError(401, 'Sign in first.');
  if (action && !can(actor, action)) throw new HttpError(403, `This needs one of these roles: ${rolesFor(action).join(', ')}.`);
  return actor;
}

/** The uuid schema routes use for ids in the path; a bad id is simply not found. */
export const idParam = z.uuid();

export function parseId(value: string | undefined, field = 'id'): string {
  const parsed = idParam.safeParse(value);
  if (!parsed.success) throw new HttpError(404, 'Not found', field);
  return parsed.data;
}

type Handler = (ctx: APIContext) => Promise<Response | unknown>;

/**
 * Wraps a route handler: HttpError → its status with a JSON body, anything else → 500 with a
 * plain message (details go to the server log, never to the client).
 */
export function route(handler: Handler) {
  return async (ctx: APIContext): Promise<Response> => {
    try {
      const out = await handler(ctx);
      return out instanceof Response ? out : json(out);
    } catch (err) {
      if (err instanceof HttpError) return errorResponse(err.status, err.message, err.field, err.extra);
      console.error(`cagewright: ${ctx.request.method} ${new URL(ctx.request.url).pathname} failed:`, err);
      return errorResponse(500, 'Something went wrong on the server. The change was not saved.');
    }
  };
}
