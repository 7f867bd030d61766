import { closeSync, mkdirSync, openSync, readFileSync, rmSync, writeSync } from 'node:fs';
import { hostname } from 'node:os';
import { join } from 'node:path';

/**
 * PGlite on the Node file system takes no lock of its own, and two processes writing one
 * directory corrupt it. We take an owner file with O_EXCL and refuse while its holder lives.
 */
const OWNER_FILE = 'cagewright.owner';

export class DataDirInUseError extends Error {}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

export function lockDataDir(dir: string): () => void {
  mkdirSync(dir, { recursive: true });
  const path = join(dir, OWNER_FILE);
  for (let attempt = 0; attempt < 2; attempt++) {
    try {
      const fd = openSync(path, 'wx');
      writeSync(fd, JSON.stringify({ pid: process.pid, host: hostname(), port: process.env.PORT ?? null, since: new Date().toISOString() }));
      closeSync(fd);
      return () => rmSync(path, { force: true });
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
      let holder: { pid?: number; host?: string; since?: string } = {};
      try {
        holder = JSON.parse(readFileSync(path, 'utf8'));
      } catch {
        /* unreadable owner file: treat as stale */
      }
      if (holder.pid && holder.pid !== process.pid && alive(holder.pid) && holder.host === hostname()) {
        throw new DataDirInUseError(
          `The data directory ${dir} is in use by process ${holder.pid} on ${holder.host} (since ${holder.since}). ` +
            'Stop that server first; two processes writing one directory would corrupt it.',
        );
      }
      rmSync(path, { force: true }); // stale owner (process gone): take over
    }
  }
  throw new DataDirInUseError(`Could not take ownership of ${dir}`);
}
