import { closeSync, linkSync, mkdirSync, openSync, readFileSync, readlinkSync, rmSync, writeSync } from 'node:fs';
import { hostname } from 'node:os';
import { join } from 'node:path';
import { createHash, randomBytes } from 'node:crypto';

/**
 * PGlite on the Node file system takes no lock of its own, and two processes writing one
 * directory corrupt it. The server takes an owner file and never hands a directory over while
 * its owner could still be alive:
 *
 * - The owner file is created whole and at once: written under a temporary name, then hard-linked
 *   to `cagewright.owner`, which fails if the name exists. A reader never sees half an owner.
 * - An existing owner is taken over only when it is provably gone: the same machine (host name,
 *   and the kernel's boot id where the owner recorded one), the same process namespace, and its
 *   process id is not running (or runs a later process: the recorded start time differs).
 *   Another host name, another boot, another container, an unreadable file: it could be alive,
 *   so the start is refused.
 * - `CAGEWRIGHT_FORCE_UNLOCK=1` (`npm run serve -- --force-unlock`) takes over any owner that is
 *   not provably running right here, and says so on the console. For a person who checked that
 *   no other server uses the directory (after a power cut, or a move between machines).
 * - Two servers taking over one stale owner at the same time: each first claims
 *   `cagewright.owner.takeover-<hash of the stale owner>` with the same create-once link; only
 *   the one that got it replaces the owner file, after reading it again.
 */
export const OWNER_FILE = 'cagewright.owner';

export interface OwnerInfo {
  pid: number;
  host: string;
  /** The kernel's boot id (Linux), so a reboot or another machine with the same name shows. */
  bootId?: string | null;
  /** The process id namespace (Linux), so a container sharing a host name shows. */
  pidNamespace?: string | null;
  /** The process's start time in clock ticks since boot (Linux), so a reused process id shows. */
  startTicks?: string | null;
  port?: string | null;
  since?: string;
  nonce?: string;
}

/** Refused: the directory's owner could be alive. `message` is for the console only. */
export class DataDirInUseError extends Error {
  /** Words safe to show to anyone (no path, no process id). */
  readonly publicMessage = 'The data directory is in use by another server process.';
  constructor(
    message: string,
    readonly holder: Partial<OwnerInfo> | null,
  ) {
    super(message);
  }
}

const readText = (path: string): string | null => {
  try {
    return readFileSync(path, 'utf8').trim();
  } catch {
    return null;
  }
};

/** The start time of a process (field 22 of /proc/<pid>/stat), or null where unknown. */
function startTicksOf(pid: number): string | null {
  const stat = readText(`/proc/${pid}/stat`);
  if (!stat) return null;
  // The command name (field 2) may hold spaces and parentheses: count from the last ')'.
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  return fields[19] ?? null;
}

function pidNamespace(): string | null {
  try {
    return readlinkSync('/proc/self/ns/pid');
  } catch {
    return null;
  }
}

/** Who this process is, as the owner file records it. */
export function currentOwner(): OwnerInfo {
  return {
    pid: process.pid,
    host: hostname(),
    bootId: readText('/proc/sys/kernel/random/boot_id'),
    pidNamespace: pidNamespace(),
    startTicks: startTicksOf(process.pid),
    port: process.env.PORT ?? null,
    since: new Date().toISOString(),
    nonce: randomBytes(8).toString('hex'),
  };
}

function running(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

export type OwnerVerdict =
  | { stale: true; why: string }
  | { stale: false; why: string; /** provably this very process, running now on this machine */ provablyRunning: boolean };

/**
 * Whether an owner recorded in the file is provably gone, judged from this process. Pure but
 * for `isRunning` and `startTicksOfPid`, which tests replace.
 */
export function judgeOwner(
  holder: Partial<OwnerInfo> | null,
  me: OwnerInfo,
  isRunning: (pid: number) => boolean = running,
  startTicksOfPid: (pid: number) => string | null = startTicksOf,
): OwnerVerdict {
  if (!holder || typeof holder.pid !== 'number' || !Number.isInteger(holder.pid) || holder.pid <= 0 || typeof holder.host !== 'string')
    return { stale: false, why: 'the owner file cannot be read, so its owner may be alive', provablyRunning: false };
  if (holder.host !== me.host) return { stale: false, why: `it is held from another host (${holder.host})`, provablyRunning: false };
  if (holder.bootId && me.bootId && holder.bootId !== me.bootId)
    return {
      stale: false,
      why: 'it is held from another boot of this machine, or another machine of the same name',
      provablyRunning: false,
    };
  if (holder.pidNamespace && me.pidNamespace && holder.pidNamespace !== me.pidNamespace)
    return { stale: false, why: 'it is held from another container or process namespace', provablyRunning: false };
  if (!isRunning(holder.pid)) return { stale: true, why: `process ${holder.pid} is no longer running` };
  if (holder.startTicks) {
    const now = startTicksOfPid(holder.pid);
    if (now && now !== holder.startTicks) return { stale: true, why: `process id ${holder.pid} now belongs to a later process` };
    if (now && holder.pid === me.pid) return { stale: true, why: 'it was left by this very process' };
    return { stale: false, why: `process ${holder.pid} is running`, provablyRunning: !!now };
  }
  return { stale: false, why: `process ${holder.pid} is running`, provablyRunning: false };
}

const describe = (h: Partial<OwnerInfo> | null) =>
  h ? `process ${h.pid ?? '?'} on ${h.host ?? '?'}${h.port ? ` (port ${h.port})` : ''}, since ${h.since ?? '?'}` : 'an unknown holder';

function parseOwner(text: string | null): Partial<OwnerInfo> | null {
  if (!text) return null;
  try {
    const v = JSON.parse(text) as unknown;
    return v && typeof v === 'object' ? (v as Partial<OwnerInfo>) : null;
  } catch {
    return null;
  }
}

/** Creates `path` with `content` only if no file has that name, all at once. */
function createOnce(dir: string, path: string, content: string): boolean {
  const tmp = join(dir, `.cagewright.owner.${process.pid}.${randomBytes(6).toString('hex')}.tmp`);
  const fd = openSync(tmp, 'wx', 0o600);
  try {
    writeSync(fd, content);
  } finally {
    closeSync(fd);
  }
  try {
    linkSync(tmp, path);
    return true;
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'EEXIST') return false;
    throw err;
  } finally {
    rmSync(tmp, { force: true });
  }
}

export interface LockOptions {
  /** Take over an owner that is not provably running here (CAGEWRIGHT_FORCE_UNLOCK=1). */
  force?: boolean;
  log?: (line: string) => void;
  /** For tests: who this process is, and how to see other processes. */
  me?: OwnerInfo;
  isRunning?: (pid: number) => boolean;
}

export const forceUnlockRequested = (env: NodeJS.ProcessEnv = process.env) =>
  env.CAGEWRIGHT_FORCE_UNLOCK === '1' || env.CAGEWRIGHT_FORCE_UNLOCK === 'true';

/** Takes the directory or throws DataDirInUseError; returns the release function. */
export function lockDataDir(dir: string, opts: LockOptions = {}): () => void {
  const log = opts.log ?? ((line: string) => console.warn(line));
  const force = opts.force ?? forceUnlockRequested();
  mkdirSync(dir, { recursive: true });
  const path = join(dir, OWNER_FILE);
  const me = opts.me ?? currentOwner();
  const content = JSON.stringify(me);
  const release = () => {
    // Only our own owner file: never one another server wrote after a forced takeover.
    if (parseOwner(readText(path))?.nonce === me.nonce) rmSync(path, { force: true });
  };

  for (let attempt = 0; attempt < 3; attempt++) {
    if (createOnce(dir, path, content)) return release;
    const text = readText(path);
    if (text === null) continue; // removed meanwhile: try again
    const holder = parseOwner(text);
    const verdict = judgeOwner(holder, me, opts.isRunning);
    if (!verdict.stale && (!force || verdict.provablyRunning)) {
      throw new DataDirInUseError(
        `The data directory ${dir} is in use by ${describe(holder)}: ${verdict.why}. ` +
          'Stop that server first; two processes writing one directory would corrupt it.' +
          (verdict.provablyRunning
            ? ''
            : ' If you are sure no server uses this directory, start once with --force-unlock (CAGEWRIGHT_FORCE_UNLOCK=1).'),
        holder,
      );
    }
    // Only one taker per stale owner: the one that creates its takeover file.
    const takeover = join(dir, `${OWNER_FILE}.takeover-${createHash('sha256').update(text).digest('hex').slice(0, 16)}`);
    let claimed = createOnce(dir, takeover, content);
    if (!claimed && force) {
      // A takeover file left by a taker that died mid-way; the person asked to force.
      rmSync(takeover, { force: true });
      claimed = createOnce(dir, takeover, content);
    }
    if (!claimed) {
      throw new DataDirInUseError(`Another server is taking over the data directory ${dir} right now (from ${describe(holder)}).`, holder);
    }
    try {
      if (readText(path) !== text) continue; // replaced meanwhile: judge the new owner
      rmSync(path, { force: true });
      if (createOnce(dir, path, content)) {
        log(
          verdict.stale
            ? `cagewright: took over the data directory ${dir} from ${describe(holder)}: ${verdict.why}.`
            : `cagewright: FORCED takeover of the data directory ${dir} from ${describe(holder)} (${verdict.why}), as --force-unlock asked.`,
        );
        return release;
      }
    } finally {
      rmSync(takeover, { force: true });
    }
  }
  throw new DataDirInUseError(`Could not take ownership of the data directory ${dir}; another server is starting on it.`, null);
}
