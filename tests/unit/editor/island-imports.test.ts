import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

// What the editor island sends to the browser is every module it reaches through imports that
// stay in the built code. zod is for the server, the forms and the tests: the editor needs the
// value lists and limits only (src/lib/domain/values.ts), and zod would add about 25 KB (gzip)
// to the editor page (bench/js-size.mjs, budget 160 KB).
const srcRoot = join(__dirname, '../../../src');

// import/export … from 'x', import 'x', import('x'). `import type` and `export type` are erased;
// `import { type A } from 'x'` is kept as `import 'x'` (verbatimModuleSyntax), so it counts.
const IMPORT =
  /(?:^|[\s;])(import|export)\s+(type\s+)?[^;'"]*?from\s*['"]([^'"]+)['"]|import\s*\(\s*['"]([^'"]+)['"]\s*\)|^\s*import\s*['"]([^'"]+)['"]/gm;

function resolveFile(from: string, spec: string): string | null {
  const base = spec.startsWith('~/') ? join(srcRoot, spec.slice(2)) : resolve(dirname(from), spec);
  for (const c of [base, `${base}.ts`, `${base}.tsx`, join(base, 'index.ts'), join(base, 'index.tsx')])
    if (/\.(ts|tsx)$/.test(c) && existsSync(c)) return c;
  return null;
}

/** Every source file and package reached from `entry` by imports that stay in the built code. */
function reach(entry: string): { files: Set<string>; packages: Set<string> } {
  const files = new Set<string>();
  const packages = new Set<string>();
  const todo = [entry];
  while (todo.length) {
    const file = todo.pop()!;
    if (files.has(file)) continue;
    files.add(file);
    const code = readFileSync(file, 'utf8').replace(/\/\*[\s\S]*?\*\//g, '');
    for (const m of code.matchAll(IMPORT)) {
      if (m[2]) continue; // import type / export type: erased
      const spec = m[3] ?? m[4] ?? m[5]!;
      if (spec.startsWith('.') || spec.startsWith('~/')) {
        const target = resolveFile(file, spec);
        if (target) todo.push(target);
      } else packages.add(spec.startsWith('@') ? spec.split('/').slice(0, 2).join('/') : spec.split('/')[0]!);
    }
  }
  return { files, packages };
}

const editor = join(srcRoot, 'components/editor/EditorIsland.tsx');

describe('the editor island does not send zod to the browser', () => {
  const { files, packages } = reach(editor);
  const names = [...files].map((f) => relative(srcRoot, f));

  it('the walk reaches the editor, the drawing, the rules and the crop programs', () => {
    for (const f of [
      'components/editor/EditorApp.tsx',
      'components/cage/CageDiagram.tsx',
      'lib/domain/rules/index.ts',
      'lib/domain/places.ts',
      'lib/domain/crops.ts',
      'lib/domain/vocabulary.ts',
    ])
      expect(names).toContain(f);
    expect(packages).toContain('react');
    expect(packages).toContain('@dnd-kit/core');
  });

  it('no module it reaches imports zod', () => {
    const withZod = names.filter((f) => /from\s*['"]zod['"/]/.test(readFileSync(join(srcRoot, f), 'utf8')));
    expect(withZod).toEqual([]);
    expect(packages.has('zod')).toBe(false);
  });

  it('the walk would see zod through the schemas, and type-only imports are not followed', () => {
    expect(reach(join(srcRoot, 'lib/domain/schemas.ts')).packages.has('zod')).toBe(true);
    expect(reach(join(srcRoot, 'lib/domain/crop-schemas.ts')).packages.has('zod')).toBe(true);
    const sample = `import type { A } from 'zod';\nimport { type B } from 'kept';\nexport type { C } from 'gone';\nimport x from 'react';`;
    const kept = [...sample.matchAll(IMPORT)].filter((m) => !m[2]).map((m) => m[3] ?? m[4] ?? m[5]);
    expect(kept).toEqual(['kept', 'react']);
  });
});
