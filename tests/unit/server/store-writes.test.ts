import { describe, expect, it } from 'vitest';
import type { PGlite } from '@electric-sql/pglite';
import { countWrites, isPlainRead, storeWriteGeneration } from '~/lib/server/store-writes';

describe('store write generation', () => {
  it('tells plain reads from statements that may write', () => {
    expect(isPlainRead('select "layouts"."id", "layouts"."updated_at" from "layouts" where "layouts"."id" = $1')).toBe(true);
    expect(isPlainRead('  SELECT count(*) FROM organisations')).toBe(true);
    for (const text of [
      'insert into "audit_log" ("action") values ($1)',
      'update "layouts" set "current_version" = $1',
      'delete from "sessions" where "id" = $1',
      'with moved as (update layouts set current_version = 2 returning id) select * from moved',
      "select nextval('seq')",
      'select * from layouts for update',
      'select pg_advisory_lock(1)',
      'begin',
      'CHECKPOINT',
      undefined,
    ]) {
      expect(isPlainRead(text), String(text)).toBe(false);
    }
  });

  it('moves around every write and every transaction, also when they fail, and never for a read', async () => {
    const calls: string[] = [];
    const fake = {
      async query(text: string) {
        calls.push(text);
        if (text.includes('fail')) throw new Error('refused');
        return { rows: [] };
      },
      async exec(text: string) {
        calls.push(text);
        return [];
      },
      async transaction<T>(fn: (tx: unknown) => Promise<T>) {
        return fn({});
      },
    };
    countWrites(fake as unknown as PGlite);
    const g0 = storeWriteGeneration();
    await fake.query('select 1');
    expect(storeWriteGeneration()).toBe(g0);

    let during = -1;
    const slowWrite = fake.query('update layouts set name = $1').then(() => (during = storeWriteGeneration()));
    // Between its start and its end the generation has already moved, so a read noted then is not kept.
    expect(storeWriteGeneration()).toBeGreaterThan(g0);
    await slowWrite;
    expect(during).toBeGreaterThan(g0 + 1);

    const g1 = storeWriteGeneration();
    await expect(fake.query('insert into x values (1) -- fail')).rejects.toThrow('refused');
    expect(storeWriteGeneration()).toBeGreaterThan(g1);

    const g2 = storeWriteGeneration();
    await fake.exec('CHECKPOINT');
    expect(storeWriteGeneration()).toBeGreaterThan(g2);

    const g3 = storeWriteGeneration();
    let inside = -1;
    await fake.transaction(async () => {
      inside = storeWriteGeneration();
    });
    expect(inside).toBeGreaterThan(g3);
    expect(storeWriteGeneration()).toBeGreaterThan(inside);
    expect(calls).toContain('select 1');
  });
});
