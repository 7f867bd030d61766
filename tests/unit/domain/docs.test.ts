import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { findingCodeSchema, layoutSchema } from '~/lib/domain';
import { check } from './helpers';

const doc = readFileSync(join(__dirname, '../../../docs/layout-format.md'), 'utf8');

describe('docs/layout-format.md', () => {
  it('its example is a valid layout that the rules pass', () => {
    const block = doc.match(/## Example[\s\S]*?```json\n([\s\S]*?)```/)?.[1];
    expect(block).toBeTruthy();
    const layout = layoutSchema.parse(JSON.parse(block!));
    expect(check(layout)).toEqual([]);
  });
  it('lists every finding code', () => {
    for (const code of findingCodeSchema.options) expect(doc).toContain(`\`${code}\``);
  });
});
