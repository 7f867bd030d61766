import { PGlite } from '@electric-sql/pglite';
import { drizzle as drizzlePglite, type PgliteDatabase } from 'drizzle-orm/pglite';
import { migrate as migratePglite } from 'drizzle-orm/pglite/migrator';
import { drizzle as drizzlePg } from 'drizzle-orm/node-postgres';
import { migrate as migratePg } from 'drizzle-orm/node-postgres/migrator';
import { sql } from 'drizzle-orm';
import pg from 'pg';
import { resolve } from 'node:path';
import * as schema from '~/db/schema';
import { lockDataDir } from './data-dir-lock';
import { seedDemo } from './seed';
import { countWrites } from './store-writes';

export { storeWriteGeneration } from './store-writes';

export type Db = PgliteDatabase<typeof schema>;

export interface Store {
  db: Db;
  mode: 'pglite' | 'postgres';
  close: () => Promise<void>;
  /** A consistent gzipped tarball of the embedded store (PGlite only). */
  dump?: () => Promise<Blob>;
}

const MIGRATIONS = resolve(process.env.CAGEWRIGHT_MIGRATIONS_DIR ?? 'drizzle');

export function dataDir(): string {
  return resolve(process.env.CAGEWRIGHT_DATA_DIR ?? 'data');
}

async function openStore(): Promise<Store> {
  const url = process.env.DATABASE_URL;
  if (url) {
    const pool = new pg.Pool({ connectionString: url, max: Number(process.env.CAGEWRIGHT_PG_POOL ?? 10) });
    const db = drizzlePg(pool, { schema }) as unknown as Db;
    await migratePg(db as never, { migrationsFolder: MIGRATIONS });
    return { db, mode: 'postgres', close: () => pool.end() };
  }
  const dir = dataDir();
  const release = lockDataDir(dir);
  try {
    const client = await PGlite.create({ dataDir: dir });
    countWrites(client);
    const db = drizzlePglite(client, { schema });
    await migratePglite(db, { migrationsFolder: MIGRATIONS });
    return {
      db,
      mode: 'pglite',
      dump: async () => {
        await client.query('CHECKPOINT');
        return client.dumpDataDir('gzip');
      },
      close: async () => {
        await client.query('CHECKPOINT');
        await client.close();
        release();
      },
    };
  } catch (err) {
    release();
    throw err;
  }
}

// One store per process: the server is the single owner of the data directory.
const holder = globalThis as unknown as { __cagewrightStore?: Promise<Store> };

function installShutdown(store: Promise<Store>) {
  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    try {
      await (await store).close();
    } catch (err) {
      console.error(`cagewright: error while closing the store on ${signal}:`, err);
    }
    process.exit(0);
  };
  process.once('SIGTERM', () => void stop('SIGTERM'));
  process.once('SIGINT', () => void stop('SIGINT'));
}

export function store(): Promise<Store> {
  if (!holder.__cagewrightStore) {
    // The start script may still be bringing up local fakes the seed needs (object storage).
    const bootReady = (globalThis as { __cagewrightBootReady?: Promise<unknown> }).__cagewrightBootReady ?? Promise.resolve();
    const opening = bootReady.then(openStore).then(async (s) => {
      if (process.env.CAGEWRIGHT_SEED !== 'off') {
        const [{ n }] = (await s.db.execute(sql`select count(*)::int as n from organisations`)).rows as { n: number }[];
        if (n === 0) {
          await seedDemo(s.db);
          if (process.env.CAGEWRIGHT_TEST_FIXTURES === '1') await (await import('./test-fixtures')).seedTestFixtures(s.db);
        }
      }
      // Sends a stopped server left half-done, and photo objects no row names (services/maintenance.ts).
      // A failure here is logged, never a reason to refuse to serve.
      await (
        await import('./services/maintenance')
      )
        .startMaintenance(s)
        .catch((err) => console.error('cagewright: start-up housekeeping failed:', err instanceof Error ? err.message : err));
      return s;
    });
    holder.__cagewrightStore = opening;
    opening.catch(() => {
      holder.__cagewrightStore = undefined;
    });
    installShutdown(opening);
  }
  return holder.__cagewrightStore;
}

export async function getDb(): Promise<Db> {
  return (await store()).db;
}
