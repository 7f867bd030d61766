import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

/** Files under a folder, recursively. */
function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = join(dir, name);
    return statSync(p).isDirectory() ? walk(p) : [p];
  });
}

/** '/api/machines/[id]' style route of a file under src/pages. */
export function routeOf(file: string): string {
  const rel = relative('src/pages', file)
    .replace(/\\/g, '/')
    .replace(/\.(ts|astro)$/, '');
  const path = '/' + rel.replace(/(^|\/)index$/, '');
  return path === '/' ? '/' : path.replace(/\/$/, '');
}

export interface ApiRoute {
  route: string;
  file: string;
  methods: string[];
}

/** Every API route file and the methods it exports, read from src/pages/api itself. */
export function apiRoutes(): ApiRoute[] {
  return walk('src/pages/api')
    .filter((f) => /\.(ts|js)$/.test(f))
    .map((file) => {
      const src = readFileSync(file, 'utf8');
      const methods = [...src.matchAll(/export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g)].map((m) => m[1]!);
      return { route: routeOf(file), file, methods: [...new Set(methods)].sort() };
    })
    .sort((a, b) => a.route.localeCompare(b.route));
}

/** Every page route (Astro pages), read from src/pages. */
export function pageRoutes(): string[] {
  return walk('src/pages')
    .filter((f) => f.endsWith('.astro'))
    .map(routeOf)
    .sort();
}

/** Fills each [param] with a value (a uuid by default). */
export function fill(route: string, values: Record<string, string> = {}, fallback = '00000000-0000-4000-8000-000000000000') {
  return route.replace(/\[(\.\.\.)?([^\]]+)\]/g, (_, _rest, name: string) => values[name] ?? fallback);
}
