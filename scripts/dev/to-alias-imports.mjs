#!/usr/bin/env node
// Rewrites relative imports that climb out of their folder (`../`) and land inside `src/` into
// `~/` imports (`~` is `src/`: tsconfig paths for Astro, tsx and Playwright; vitest's alias).
//
//   node scripts/dev/to-alias-imports.mjs          rewrite in place, print what changed
//   node scripts/dev/to-alias-imports.mjs --check  change nothing; exit 1 if anything would change
//
// Looks at src, tests, e2e and bench. Specifiers of static and dynamic imports, re-exports,
// `require()` and vitest's `vi.mock()` family are rewritten; paths handed to `new URL()`,
// `readFileSync()` or `import.meta.glob()` are file paths, not imports, and stay as they are.
// Imports of the same folder or below (`./x`) stay relative, and so does anything outside
// `src/` (test helpers, scripts/lib). Plain-Node scripts under bench/ (.mjs/.js) stay relative too:
// Node alone does not know the alias. A second run changes nothing.
import { readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
const SRC = join(root, 'src');
const FOLDERS = ['src', 'tests', 'e2e', 'bench'];
const SOURCE = /\.(ts|tsx|mts|cts|js|mjs|cjs|jsx|astro)$/;
const PLAIN_NODE = /\.(js|mjs|cjs)$/;
const SKIP_DIRS = new Set(['node_modules', 'dist', '.astro', 'screenshots']);
// The script's own test holds climbing imports on purpose, as the text it rewrites.
const SKIP_FILES = new Set(['to-alias-imports.test.ts']);

// The text before a specifier that makes it an import: `from`, `import` (side effect or
// dynamic), `export * from`, `require(`, `vi.mock(` and its kin. Group 3 is the specifier.
const SPECIFIER =
  /(\bfrom\s*|\bimport\s*\(\s*|(?:^|[;\s])import\s*|\brequire\s*\(\s*|\bvi\s*\.\s*(?:mock|doMock|unmock|doUnmock|importActual|importMock)\s*(?:<[^>()]*>)?\s*\(\s*)(['"])(\.\.\/[^'"\n]*)\2/g;

function filesIn(dir) {
  let names;
  try {
    names = readdirSync(dir);
  } catch {
    return []; // a folder this tree does not have
  }
  return names.flatMap((name) => {
    if (SKIP_DIRS.has(name) || SKIP_FILES.has(name) || name.startsWith('dist-')) return [];
    const p = join(dir, name);
    if (statSync(p).isDirectory()) return filesIn(p);
    return SOURCE.test(name) ? [p] : [];
  });
}

/** The `~/` form of a `../` specifier written in `file`, or null when it should stay relative. */
export function aliasFor(file, spec) {
  const q = spec.search(/[?#]/);
  const path = q < 0 ? spec : spec.slice(0, q);
  const suffix = q < 0 ? '' : spec.slice(q);
  const target = resolve(dirname(file), path);
  if (!target.startsWith(SRC + sep)) return null; // outside src/, or src/ itself
  const rel = relative(SRC, target).split(sep).join('/');
  return `~/${rel}${path.endsWith('/') ? '/' : ''}${suffix}`;
}

/** The file's text with its climbing imports into src/ aliased, and how many were. */
export function rewrite(file, text) {
  let n = 0;
  const out = text.replace(SPECIFIER, (whole, lead, quote, spec) => {
    const alias = aliasFor(file, spec);
    if (!alias) return whole;
    n++;
    return `${lead}${quote}${alias}${quote}`;
  });
  return { text: out, changed: n };
}

function main() {
  const check = process.argv.includes('--check');
  let files = 0;
  let imports = 0;
  for (const folder of FOLDERS) {
    for (const file of filesIn(join(root, folder))) {
      if (folder === 'bench' && PLAIN_NODE.test(file)) continue;
      const before = readFileSync(file, 'utf8');
      const { text, changed } = rewrite(file, before);
      if (!changed) continue;
      files++;
      imports += changed;
      const name = relative(root, file);
      if (check) console.log(`${name}: ${changed} import(s) to alias`);
      else {
        writeFileSync(file, text);
        console.log(`${name}: ${changed}`);
      }
    }
  }
  console.log(`${check ? 'would rewrite' : 'rewrote'} ${imports} import(s) in ${files} file(s)`);
  if (check && imports > 0) process.exitCode = 1;
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) main();
