import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

/**
 * Pages are served with a content security policy that allows scripts by hash and file only
 * (src/lib/server/security-headers.ts), so an inline handler such as `onclick="window.print()"`
 * is refused by the browser and its button does nothing. Astro templates must wire buttons
 * through a bundled script instead (components/shell/PrintButton.astro does it for printing).
 */
const root = join(__dirname, '../../../src');
function astroFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return astroFiles(path);
    return name.endsWith('.astro') ? [path] : [];
  });
}

/** Inline handler attributes in an Astro template's markup (the frontmatter is left out). */
export function inlineHandlers(source: string): string[] {
  const markup = source.replace(/^---[\s\S]*?\n---/, '').replace(/<script\b[\s\S]*?<\/script>/g, '');
  return [...markup.matchAll(/<[a-zA-Z][^>]*?\s(on[a-z]+)\s*=\s*["'{]/g)].map((m) => m[1]!);
}

describe('no inline event handlers in Astro templates', () => {
  it('the finder sees one', () => {
    expect(inlineHandlers('---\nconst a = 1;\n---\n<button type="button" onclick="window.print()">Print</button>')).toEqual(['onclick']);
    expect(inlineHandlers('<button data-print>Print</button><script>b.onclick = () => 1;</script>')).toEqual([]);
  });

  it('no page or component has one', () => {
    const found = astroFiles(root).flatMap((f) => inlineHandlers(readFileSync(f, 'utf8')).map((h) => `${relative(root, f)}: ${h}`));
    expect(found).toEqual([]);
  });
});
