import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { aliasFor, rewrite } from '../../../scripts/dev/to-alias-imports.mjs';

// The import rewrite the lead runs once over the merged tree: only climbs into src/ become ~/.
const root = resolve(__dirname, '../../..');
const at = (p: string) => join(root, p);

describe('to-alias-imports', () => {
  it('aliases a climb that lands in src/, keeping suffixes and extensions', () => {
    expect(aliasFor(at('src/components/editor/X.tsx'), '../../lib/domain/rules')).toBe('~/lib/domain/rules');
    expect(aliasFor(at('src/pages/a/b.astro'), '../../layouts/AppShell.astro')).toBe('~/layouts/AppShell.astro');
    expect(aliasFor(at('tests/unit/x.test.ts'), '../../src/lib/domain')).toBe('~/lib/domain');
    expect(aliasFor(at('src/pages/x.astro'), '../styles/global.css?url')).toBe('~/styles/global.css?url');
  });

  it('leaves climbs that end outside src/ relative', () => {
    expect(aliasFor(at('src/pages/api/admin/backup.ts'), '../../../../scripts/lib/backup-archive.mjs')).toBeNull();
    expect(aliasFor(at('src/lib/server/auth/csrf.ts'), '../../../../auth.config')).toBeNull();
    expect(aliasFor(at('tests/unit/server/x.test.ts'), '../../integration/client')).toBeNull();
    expect(aliasFor(at('src/lib/x.ts'), '../')).toBeNull(); // src/ itself has no ~/ form
  });

  it('rewrites every kind of import and nothing that is only a path', () => {
    const file = at('tests/unit/server/x.test.ts');
    const before = [
      "import { a } from '../../../src/lib/domain/a';",
      'import type { B } from "../../../src/lib/domain/b";',
      "export * from '../../../src/lib/c';",
      "import '../../../src/styles/global.css';",
      "const d = await import('../../../src/lib/server/db');",
      "vi.mock('../../../src/lib/server/mail', () => ({}));",
      "import {\n  e,\n  f,\n} from '../../../src/lib/e';",
      "import { g } from './g';",
      "import { h } from '../../integration/client';",
      "const url = new URL('../../../src/lib/domain/diff.ts', import.meta.url);",
      "readFileSync('../../../src/x.ts');",
    ].join('\n');
    const { text, changed } = rewrite(file, before);
    expect(changed).toBe(7);
    expect(text.split('\n')).toEqual([
      "import { a } from '~/lib/domain/a';",
      'import type { B } from "~/lib/domain/b";',
      "export * from '~/lib/c';",
      "import '~/styles/global.css';",
      "const d = await import('~/lib/server/db');",
      "vi.mock('~/lib/server/mail', () => ({}));",
      'import {',
      '  e,',
      '  f,',
      "} from '~/lib/e';",
      "import { g } from './g';",
      "import { h } from '../../integration/client';",
      "const url = new URL('../../../src/lib/domain/diff.ts', import.meta.url);",
      "readFileSync('../../../src/x.ts');",
    ]);
    // A second run finds nothing left to do.
    expect(rewrite(file, text)).toEqual({ text, changed: 0 });
  });
});
