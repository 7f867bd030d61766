// Several worker processes with a PostgreSQL server (node:cluster in scripts/start.mjs); one
// process with the embedded store, whatever CAGEWRIGHT_WORKERS says; a bad count refuses to start.
import { execFileSync } from 'node:child_process';
import { get } from 'node:http';
import { describe, expect, it } from 'vitest';
import { removeDir, startServer, type RunningServer } from './server';

/** The node processes a server's start script has forked. */
function workersOf(s: RunningServer): number[] {
  try {
    return execFileSync('ps', ['-o', 'pid=', '--ppid', String(s.child.pid)], { encoding: 'utf8' })
      .split('\n')
      .map((l) => Number(l.trim()))
      .filter((n) => n > 0);
  } catch {
    return []; // ps exits 1 when there are none
  }
}

const alive = (pid: number) => {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
};

/**
 * The status of one request on a connection of its own: after a worker is killed, fetch's pool
 * may still hold a kept-alive connection to it, and a request sent down that dead connection
 * says nothing about the workers that are left.
 */
const freshStatus = (url: string) =>
  new Promise<number>((resolve, reject) => {
    get(url, { agent: false }, (res) => {
      res.resume();
      resolve(res.statusCode ?? 0);
    }).on('error', reject);
  });

async function until(what: () => boolean, ms = 20_000) {
  const end = Date.now() + ms;
  while (!what()) {
    if (Date.now() > end) throw new Error('timed out');
    await new Promise((r) => setTimeout(r, 100));
  }
}

describe('the embedded store stays one process', () => {
  it('ignores CAGEWRIGHT_WORKERS without a PostgreSQL server, with a note, and serves', async () => {
    const s = await startServer({ env: { DATABASE_URL: '', CAGEWRIGHT_WORKERS: '3' } });
    try {
      expect(workersOf(s)).toEqual([]);
      const health = await (await fetch(`${s.baseUrl}/api/health`)).json();
      expect(health.store).toBe('pglite');
    } finally {
      await s.stop();
      removeDir(s.dataDir);
    }
  }, 180_000);

  it('refuses a count that is not a whole number of 1 or more, naming the variable', async () => {
    for (const bad of ['abc', '0', '-2', '1.5']) {
      await expect(startServer({ env: { DATABASE_URL: '', CAGEWRIGHT_WORKERS: bad } }), bad).rejects.toThrow(
        /CAGEWRIGHT_WORKERS must be a whole number/,
      );
    }
  }, 60_000);
});

describe.skipIf(!process.env.DATABASE_URL)('workers on a PostgreSQL server', () => {
  it('runs the asked number of workers on one port, replaces one that dies, and stops them all on SIGTERM', async () => {
    const s = await startServer({ env: { CAGEWRIGHT_WORKERS: '2' } });
    try {
      const pids = workersOf(s);
      expect(pids).toHaveLength(2);
      // Both answer on the one port (connections are spread over the workers).
      const answers = await Promise.all(Array.from({ length: 20 }, () => fetch(`${s.baseUrl}/api/health`).then((r) => r.status)));
      expect(answers.every((st) => st === 200)).toBe(true);

      process.kill(pids[0]!, 'SIGKILL');
      await until(() => {
        const now = workersOf(s);
        return now.length === 2 && !now.includes(pids[0]!);
      });
      expect(await freshStatus(`${s.baseUrl}/api/health`)).toBe(200);

      const left = workersOf(s);
      const code = await s.stop('SIGTERM');
      expect(code).toBe(0);
      await until(() => left.every((p) => !alive(p)));
    } finally {
      if (s.child.exitCode === null) await s.stop('SIGKILL');
    }
  }, 180_000);
});
