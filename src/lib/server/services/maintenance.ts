/**
 * Housekeeping the server does by itself, at start and then now and again:
 * - parts requests left `sending` by a stopped server go back to draft with the reason
 *   (`recoverStuckSends`);
 * - photo objects that no row names (the process died between storing a photo and writing its
 *   row, or a removal after the row's deletion failed) are removed from the object store.
 * Both talk to the database in short transactions and to the object store outside them.
 */
import { inArray, or } from 'drizzle-orm';
import { inspections, photos } from '~/db/schema';
import type { Db, Store } from '~/lib/server/db';
import { envMs } from '~/lib/server/deadline';
import { storage, type ObjectStorage } from '~/lib/server/storage';
import { recoverStuckSends } from './parts-requests';

/** An object younger than this may belong to an upload whose row is still being written. */
export const ORPHAN_GRACE_MS = 60 * 60 * 1000;
export const ORPHAN_SWEEP_EVERY_MS = 6 * 60 * 60 * 1000;
export const RECOVER_EVERY_MS = 60 * 1000;

const PHOTO_KEY = /^inspections\/([0-9a-f-]{36})\/[0-9a-f-]{36}(?:-thumb)?\.[a-z]+$/;
const BATCH = 500;

/**
 * Removes photo objects older than `graceMs` that no photo row names. Only keys of inspections
 * this store knows are judged: an object of an inspection it has never heard of may belong to
 * another installation sharing the bucket, and is left alone.
 */
export async function sweepOrphanPhotos(db: Db, store: ObjectStorage, opts: { graceMs?: number; now?: Date } = {}) {
  const graceMs = opts.graceMs ?? envMs('CAGEWRIGHT_ORPHAN_GRACE_MS', ORPHAN_GRACE_MS);
  const cutoff = (opts.now ?? new Date()).getTime() - graceMs;
  let seen = 0;
  const removed: string[] = [];
  let batch: { key: string; inspectionId: string }[] = [];
  const judge = async () => {
    if (!batch.length) return;
    const keys = batch.map((b) => b.key);
    const ids = [...new Set(batch.map((b) => b.inspectionId))];
    const [named, known] = await Promise.all([
      db
        .select({ a: photos.storageKey, b: photos.thumbKey })
        .from(photos)
        .where(or(inArray(photos.storageKey, keys), inArray(photos.thumbKey, keys))),
      db.select({ id: inspections.id }).from(inspections).where(inArray(inspections.id, ids)),
    ]);
    const inUse = new Set(named.flatMap((r) => [r.a, r.b]).filter(Boolean));
    const ours = new Set(known.map((r) => r.id));
    for (const b of batch) {
      if (inUse.has(b.key) || !ours.has(b.inspectionId)) continue;
      await store.delete(b.key);
      removed.push(b.key);
    }
    batch = [];
  };
  for await (const o of store.list('inspections/')) {
    seen++;
    const m = PHOTO_KEY.exec(o.key);
    if (!m || o.lastModified.getTime() > cutoff) continue;
    batch.push({ key: o.key, inspectionId: m[1]! });
    if (batch.length >= BATCH) await judge();
  }
  await judge();
  if (removed.length) console.log(`cagewright: removed ${removed.length} photo object(s) no inspection names (${store.where}).`);
  return { seen, removed };
}

const holder = globalThis as unknown as { __cagewrightMaintenance?: NodeJS.Timeout[] };

/**
 * Runs at store opening: stuck sends are recovered before the first request is served (with the
 * embedded store, every `sending` request is stuck: no other process uses it); the orphan sweep
 * runs in the background, since the object store may be slow. Then both repeat on timers that
 * never keep the process alive.
 */
export async function startMaintenance(s: Store) {
  const recovered = await recoverStuckSends(s.db, s.mode === 'pglite' ? { olderThanMs: 0 } : {});
  if (recovered) console.log(`cagewright: ${recovered} parts request(s) left sending by a stopped server are drafts again.`);
  const sweep = () =>
    sweepOrphanPhotos(s.db, storage()).catch((err) =>
      console.error('cagewright: the photo orphan sweep failed:', err instanceof Error ? err.message : err),
    );
  void sweep();
  if (holder.__cagewrightMaintenance) return;
  const recover = () =>
    recoverStuckSends(s.db).catch((err) =>
      console.error('cagewright: recovering stuck sends failed:', err instanceof Error ? err.message : err),
    );
  holder.__cagewrightMaintenance = [
    setInterval(recover, envMs('CAGEWRIGHT_RECOVER_EVERY_MS', RECOVER_EVERY_MS)).unref(),
    setInterval(sweep, envMs('CAGEWRIGHT_ORPHAN_SWEEP_MS', ORPHAN_SWEEP_EVERY_MS)).unref(),
  ];
}
