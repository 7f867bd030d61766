import { z } from 'zod';

/**
 * Text the store can keep. PostgreSQL refuses the NUL character in text and JSON, and a lone
 * UTF-16 surrogate (half of a pair, which JSON's `\ud800` escapes can produce) is not a character
 * at all: it would be stored as U+FFFD, silently changing what was typed. Both are refused
 * wherever text comes in (JSON bodies, query and path parameters, forms), with the field named.
 */
// eslint-disable-next-line no-control-regex -- finding NUL is the point
const UNSTORABLE = /\u0000|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

export const UNSTORABLE_MESSAGE = 'contains a character that cannot be stored (a NUL character or half of a surrogate pair)';

/** True when the text holds no NUL character and no lone surrogate. */
export function isStorableText(s: string): boolean {
  return !UNSTORABLE.test(s);
}

/** A zod string that refuses unstorable characters; chain `.trim()`, `.max()` and so on as usual. */
export const storableString = (params?: Parameters<typeof z.string>[0]) =>
  z.string(params).refine(isStorableText, { error: UNSTORABLE_MESSAGE, abort: true });

/** The same characters shown harmlessly (for naming a bad key in an error message). */
// eslint-disable-next-line no-control-regex -- NUL is what gets shown as \0
export const visibleText = (s: string) => s.replace(/\u0000/g, '\\0').replace(/[\uD800-\uDFFF]/g, '\uFFFD');

/**
 * The first string in a parsed value (object keys included) that the store cannot keep, as a
 * field path such as `lines.2.description`; null when every string is fine. The walk is
 * iterative and each entry points at its parent (the path is built only for the culprit), so a
 * deeply nested body costs time in proportion to its size and cannot overflow the stack.
 */
export function findUnstorable(value: unknown, prefix: (string | number)[] = []): string | null {
  interface Entry {
    v: unknown;
    key: string | number | null;
    parent: Entry | null;
  }
  const pathOf = (e: Entry | null, last?: string): string => {
    const keys: (string | number)[] = last === undefined ? [] : [last];
    for (let at = e; at; at = at.parent) if (at.key !== null) keys.push(at.key);
    return [...prefix, ...keys.reverse()].map(String).join('.') || 'body';
  };
  const stack: Entry[] = [{ v: value, key: null, parent: null }];
  while (stack.length) {
    const e = stack.pop()!;
    const v = e.v;
    if (typeof v === 'string') {
      if (!isStorableText(v)) return pathOf(e);
    } else if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) stack.push({ v: v[i], key: i, parent: e });
    } else if (v && typeof v === 'object') {
      const entries = Object.entries(v as Record<string, unknown>);
      for (const [k] of entries) if (!isStorableText(k)) return pathOf(e, visibleText(k));
      for (let i = entries.length - 1; i >= 0; i--) stack.push({ v: entries[i]![1], key: entries[i]![0], parent: e });
    }
  }
  return null;
}
