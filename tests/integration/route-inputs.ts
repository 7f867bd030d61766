import { readFileSync } from 'node:fs';
import type { ZodType } from 'zod';
import type { RouteInput, RouteInputs, WriteMethod } from '~/lib/server/http';
import { findUnstorable } from '~/lib/domain/text';
import { MAX_JSON_BYTES } from '~/lib/server/http';
import { apiRoutes } from './routes';

/**
 * The inputs every write route declares (`export const inputs` in its module, the very schemas it
 * validates with), read from the route modules themselves, for the hostile-input properties.
 */
export const WRITE_METHODS: WriteMethod[] = ['POST', 'PUT', 'PATCH', 'DELETE'];

const modules = import.meta.glob<{ inputs?: RouteInputs }>('../../src/pages/api/**/*.ts');

export interface WriteRoute {
  route: string;
  file: string;
  method: WriteMethod;
  key: string;
}

/** Every write method of every API route file, listed from src/pages/api. */
export function writeRoutes(): WriteRoute[] {
  return apiRoutes().flatMap((r) =>
    r.methods
      .filter((m): m is WriteMethod => (WRITE_METHODS as string[]).includes(m))
      .map((method) => ({ route: r.route, file: r.file, method, key: `${method} ${r.route}` })),
  );
}

/** The declaration of one write route, or why there is none. */
export async function inputsOf(w: WriteRoute): Promise<{ input?: RouteInput; problem?: string }> {
  const load = modules[`../../${w.file.replace(/\\/g, '/')}`];
  if (!load) return { problem: `${w.file} could not be loaded` };
  const input = (await load()).inputs?.[w.method];
  if (!input) return { problem: `${w.key} writes but declares no inputs (export const inputs = routeInputs({ ${w.method}: … }))` };
  // The handler validates with the declared schema itself, not a copy.
  const src = readFileSync(w.file, 'utf8');
  for (const part of ['body', 'query', 'multipart'] as const) {
    if (input[part] && !src.includes(`inputs.${w.method}.${part}`))
      return { problem: `${w.key} declares a ${part} schema its handler does not read (inputs.${w.method}.${part})` };
  }
  if (!input.body && !input.multipart && !src.includes('refuseBody(ctx.request)'))
    return { problem: `${w.key} takes no body but does not refuse one (refuseBody)` };
  return { input };
}

// ---------------------------------------------------------------------------------------------
// Reading a zod schema (zod 4): the object shape behind wrappers, pipes and unions

type Def = {
  type: string;
  shape?: Record<string, ZodType>;
  innerType?: ZodType;
  in?: ZodType;
  out?: ZodType;
  options?: ZodType[];
  getter?: () => ZodType;
  left?: ZodType;
  right?: ZodType;
};
const defOf = (s: ZodType): Def => (s as unknown as { _zod: { def: Def } })._zod.def;

/** The fields of the object a schema reads, for the variant `sample` takes (a union picks the option that accepts it). */
export function objectShape(schema: ZodType, sample?: unknown): Record<string, ZodType> | null {
  const def = defOf(schema);
  switch (def.type) {
    case 'object':
      return def.shape!;
    case 'pipe':
      return objectShape(defOf(def.in!).type === 'transform' ? def.out! : def.in!, sample);
    case 'optional':
    case 'nullable':
    case 'default':
    case 'prefault':
    case 'readonly':
    case 'catch':
    case 'nonoptional':
      return objectShape(def.innerType!, sample);
    case 'lazy':
      return objectShape(def.getter!(), sample);
    case 'union': {
      // The option that takes the sample, else the one whose fields take most of the sample's values (its tag).
      const fits = (o: ZodType) => {
        if (o.safeParse(sample).success) return Infinity;
        const shape = objectShape(o);
        if (!shape || !sample || typeof sample !== 'object') return 0;
        return Object.entries(sample as Record<string, unknown>).filter(([k, v]) => shape[k]?.safeParse(v).success).length;
      };
      const option = [...def.options!].sort((a, b) => fits(b) - fits(a))[0];
      return option ? objectShape(option, sample) : null;
    }
    case 'intersection': {
      const l = objectShape(def.left!, sample);
      const r = objectShape(def.right!, sample);
      return l || r ? { ...l, ...r } : null;
    }
    default:
      return null;
  }
}

/** Required and optional fields of a body, from its schema: a field is optional when its schema takes `undefined`. */
export function fieldsOf(schema: ZodType, sample?: unknown): { required: string[]; optional: string[] } {
  const shape = objectShape(schema, sample) ?? {};
  const required: string[] = [];
  const optional: string[] = [];
  for (const [k, s] of Object.entries(shape)) (s.safeParse(undefined).success ? optional : required).push(k);
  return { required, optional };
}

/** The field the server names for a schema failure: the first issue's path, or `body` at the root (as `readJson` does). */
export function firstIssueField(schema: ZodType, value: unknown): string | null {
  const r = schema.safeParse(value);
  if (r.success) return null;
  const path = (r.error.issues[0]?.path ?? []).filter((p) => p !== undefined && p !== '').map(String);
  return path.join('.') || 'body';
}

/**
 * What `readJson` answers for a raw JSON body under `schema`: the status and the field named, in
 * the order it checks (size, JSON, characters the store cannot keep, the schema). `null` when
 * the body is valid (the route would go on to write).
 */
export function expectedRefusal(schema: ZodType, raw: string): { status: number; field: string } | null {
  if (Buffer.byteLength(raw) > MAX_JSON_BYTES) return { status: 413, field: 'body' };
  let value: unknown;
  try {
    value = JSON.parse(raw);
  } catch {
    return { status: 400, field: 'body' };
  }
  const unstorable = findUnstorable(value);
  if (unstorable) return { status: 400, field: unstorable };
  const field = firstIssueField(schema, value);
  return field ? { status: 400, field } : null;
}

// ---------------------------------------------------------------------------------------------
// Paths into a JSON value

export type Path = (string | number)[];

/** Every node's path below the root (objects' keys and arrays' indices). */
export function nodePaths(v: unknown, path: Path = []): Path[] {
  const here = path.length ? [path] : [];
  if (Array.isArray(v)) return [...here, ...v.flatMap((x, i) => nodePaths(x, [...path, i]))];
  if (v && typeof v === 'object') return [...here, ...Object.entries(v).flatMap(([k, x]) => nodePaths(x, [...path, k]))];
  return here;
}

export function setAt(v: unknown, path: Path, value: unknown): unknown {
  if (!path.length) return value;
  const [head, ...rest] = path;
  const copy: any = Array.isArray(v) ? [...v] : { ...(v as object) };
  copy[head!] = setAt(copy[head!], rest, value);
  return copy;
}

/** The value without the node at `path` (an array's item is spliced out). */
export function deleteAt(v: unknown, path: Path): unknown {
  const [head, ...rest] = path;
  if (Array.isArray(v)) {
    const copy = [...v];
    if (rest.length) copy[head as number] = deleteAt(copy[head as number], rest);
    else copy.splice(head as number, 1);
    return copy;
  }
  const copy: any = { ...(v as object) };
  if (rest.length) copy[head!] = deleteAt(copy[head!], rest);
  else delete copy[head!];
  return copy;
}

/** At most `n` items spread over the list (first and last included), so long layouts stay quick. */
export const spread = <T>(items: T[], n: number) =>
  items.length <= n ? items : Array.from({ length: n }, (_, i) => items[Math.round((i * (items.length - 1)) / (n - 1))]!);
