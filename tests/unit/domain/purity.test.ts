import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { describe, expect, it } from 'vitest';

// The domain runs unchanged on the server, in the browser island and in tests, so it may import
// only zod and its own files, and touch no host globals. The same holds for every pure folder:
// the classroom's comparison and crop-path models build on the domain alone.
const srcRoot = join(__dirname, '../../../src');
const lib = join(srcRoot, 'lib');
const PURE = ['domain', 'classroom'].map((d) => join(lib, d));

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = join(dir, name);
    return statSync(p).isDirectory() ? files(p) : /\.(ts|tsx|js|mjs)$/.test(name) ? [p] : [];
  });
}

const IMPORT =
  /(?:^|[\s;])(?:import|export)\s[^;]*?from\s*['"]([^'"]+)['"]|import\s*\(\s*['"]([^'"]+)['"]\s*\)|^\s*import\s*['"]([^'"]+)['"]|require\s*\(\s*['"]([^'"]+)['"]\s*\)/gm;
const GLOBALS = /\b(window|document|localStorage|sessionStorage|navigator|process|Buffer|require|__dirname|fetch)\s*[.(]/;

// `~/` is src/ (the import alias); anything else is relative to the importing file.
const insidePure = (file: string, spec: string) => {
  const target = spec.startsWith('~/') ? join(srcRoot, spec.slice(2)) : resolve(dirname(file), spec);
  return PURE.some((root) => target === root || target.startsWith(root + sep));
};

describe('the pure folders (src/lib/domain, src/lib/classroom) are pure', () => {
  const all = PURE.flatMap(files);
  it('has files to check', () => {
    expect(all.length).toBeGreaterThan(10);
    expect(all.some((f) => f.includes(`${sep}classroom${sep}`))).toBe(true);
  });
  for (const file of all) {
    const name = relative(lib, file);
    const src = readFileSync(file, 'utf8');
    it(`${name} imports only zod and files of the pure folders`, () => {
      const specs = [...src.matchAll(IMPORT)].map((m) => m[1] ?? m[2] ?? m[3] ?? m[4]);
      const bad = specs.filter((s) => s !== 'zod' && !(/^(\.\.?|~)\//.test(s!) && insidePure(file, s!)));
      expect(bad).toEqual([]);
    });
    it(`${name} uses no host globals`, () => {
      const code = src.replace(/\/\*[\s\S]*?\*\//g, '').replace(/\/\/.*$/gm, '');
      expect(code.match(GLOBALS)?.[0] ?? null).toBeNull();
    });
  }
  it('the import pattern catches what it should', () => {
    const sample = `import x from 'react';\nexport { y } from "node:fs";\nconst z = await import('astro');\nimport './side-effect';`;
    const specs = [...sample.matchAll(IMPORT)].map((m) => m[1] ?? m[2] ?? m[3] ?? m[4]);
    expect(specs).toEqual(['react', 'node:fs', 'astro', './side-effect']);
  });
  it('an aliased import counts as inside only when it lands in a pure folder', () => {
    const file = join(lib, 'domain', 'rules', 'x.ts');
    expect(insidePure(file, '~/lib/domain/units')).toBe(true);
    expect(insidePure(file, '~/lib/classroom/compare')).toBe(true);
    expect(insidePure(file, '~/lib/server/db')).toBe(false);
    expect(insidePure(file, '~/lib/domain-extra/x')).toBe(false);
    expect(insidePure(file, '../units')).toBe(true);
  });
});
