import type { PGlite } from '@electric-sql/pglite';

/**
 * A number that moves whenever the embedded store may have changed: before and after every
 * statement that is not a plain SELECT and around every transaction. Readers that keep a result
 * in memory note it before their query and use the result only while it has not moved (see
 * `layoutWithCurrent`). Only the embedded store counts: it has one owner, this process, so every
 * write passes here. With a PostgreSQL server other processes write too, and nothing is kept.
 */
let writeGeneration = 0;
export function storeWriteGeneration(): number {
  return writeGeneration;
}

/** A plain read: starts with SELECT and names nothing that writes. */
const PLAIN_READ = /^\s*select\b/i;
const WRITES = /\b(insert|update|delete|merge|nextval|setval|lock|into|pg_advisory\w*|set_config)\b/i;
export const isPlainRead = (text: unknown): boolean => typeof text === 'string' && PLAIN_READ.test(text) && !WRITES.test(text);

export function countWrites(client: PGlite) {
  const around =
    <A extends unknown[], R>(fn: (...args: A) => Promise<R>, writes: (...args: A) => boolean) =>
    async (...args: A): Promise<R> => {
      if (!writes(...args)) return fn(...args);
      writeGeneration++;
      try {
        return await fn(...args);
      } finally {
        writeGeneration++;
      }
    };
  const c = client as unknown as Record<'query' | 'exec' | 'transaction', (...args: unknown[]) => Promise<unknown>>;
  for (const name of ['query', 'exec'] as const) c[name] = around(c[name].bind(client), (text) => !isPlainRead(text));
  c.transaction = around(c.transaction.bind(client), () => true);
}
