import { describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { hostname, tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { spawn, spawnSync } from 'node:child_process';
import { Client, DEMO } from './client';
import { freePort, outDir, removeDir, startServer, TEST_SECRET } from './server';

describe('the store survives a restart', () => {
  it('keeps data written before a stop', async () => {
    const dataDir = mkdtempSync(join(tmpdir(), 'cagewright-restart-'));
    try {
      const first = await startServer({ dataDir });
      const a = new Client(first.baseUrl);
      await a.signIn(DEMO.operator);
      expect((await a.put('/api/me', { unitSystem: 'imperial' })).status).toBe(200);
      expect(await first.stop('SIGTERM')).toBe(0);

      const second = await startServer({ dataDir });
      const b = new Client(second.baseUrl);
      await b.signIn(DEMO.operator);
      expect((await b.get('/api/me')).body.unitSystem).toBe('imperial');
      await second.stop();
    } finally {
      removeDir(dataDir);
    }
  }, 240_000);

  // The data-directory lock guards the embedded store; with a PostgreSQL server several processes
  // share one database by design (two-instances.test.ts).
  it.skipIf(!!process.env.DATABASE_URL)(
    'refuses a second server on the same data directory, naming the holder (embedded store only)',
    async () => {
      const dataDir = mkdtempSync(join(tmpdir(), 'cagewright-owner-'));
      try {
        const first = await startServer({ dataDir });
        await expect(startServer({ dataDir })).rejects.toThrow(/in use by process \d+/);
        const c = new Client(first.baseUrl);
        expect((await c.get('/api/health')).status).toBe(200);
        await first.stop();
      } finally {
        removeDir(dataDir);
      }
    },
    240_000,
  );
});

describe('the data directory has one owner (embedded store)', () => {
  const embedded = !process.env.DATABASE_URL; // server mode: PostgreSQL handles concurrency itself
  const ownerPath = (dir: string) => join(dir, 'cagewright.owner');

  /** The id of a process that ran on this machine and is gone. */
  function deadPid(): number {
    const r = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))']);
    return Number(r.stdout.toString());
  }

  it.runIf(embedded)(
    'refuses an owner file naming another host, even when that process id is free here, and leaves it',
    async () => {
      const dataDir = mkdtempSync(join(tmpdir(), 'cagewright-owner-host-'));
      try {
        const owner = JSON.stringify({ pid: deadPid(), host: 'other-shed.invalid', port: '4399', since: '2026-01-01T00:00:00.000Z' });
        writeFileSync(ownerPath(dataDir), owner);
        await expect(startServer({ dataDir })).rejects.toThrow(/in use by process \d+ on other-shed\.invalid.*another host/);
        expect(readFileSync(ownerPath(dataDir), 'utf8')).toBe(owner);
      } finally {
        removeDir(dataDir);
      }
    },
    240_000,
  );

  it.runIf(embedded)(
    'takes over an owner on this host whose process is gone, and says so',
    async () => {
      const dataDir = mkdtempSync(join(tmpdir(), 'cagewright-owner-stale-'));
      try {
        const pid = deadPid();
        writeFileSync(ownerPath(dataDir), JSON.stringify({ pid, host: hostname(), port: '4399', since: '2026-01-01T00:00:00.000Z' }));
        const server = await startServer({ dataDir });
        try {
          expect(server.output()).toMatch(new RegExp(`took over the data directory .* from process ${pid} on `));
          expect(JSON.parse(readFileSync(ownerPath(dataDir), 'utf8')).pid).toBe(server.child.pid);
          expect((await new Client(server.baseUrl).get('/api/health')).status).toBe(200);
        } finally {
          await server.stop();
        }
        expect(existsSync(ownerPath(dataDir))).toBe(false); // a clean stop gives the directory back
      } finally {
        removeDir(dataDir);
      }
    },
    240_000,
  );

  it.runIf(embedded)(
    '--force-unlock takes over another host’s owner and logs it loudly',
    async () => {
      const dataDir = mkdtempSync(join(tmpdir(), 'cagewright-owner-force-'));
      try {
        writeFileSync(ownerPath(dataDir), JSON.stringify({ pid: 4242, host: 'other-shed.invalid', since: '2026-01-01T00:00:00.000Z' }));
        const server = await startServer({ dataDir, args: ['--force-unlock'] });
        try {
          expect(server.output()).toMatch(/FORCED takeover of the data directory .* from process 4242 on other-shed\.invalid/);
          expect((await new Client(server.baseUrl).get('/api/health')).status).toBe(200);
        } finally {
          await server.stop();
        }
        // the environment variable does the same
        writeFileSync(ownerPath(dataDir), JSON.stringify({ pid: 4243, host: 'other-shed.invalid', since: '2026-01-01T00:00:00.000Z' }));
        const again = await startServer({ dataDir, env: { CAGEWRIGHT_FORCE_UNLOCK: '1' } });
        expect(again.output()).toMatch(/FORCED takeover .* from process 4243/);
        await again.stop();
      } finally {
        removeDir(dataDir);
      }
    },
    240_000,
  );

  it.runIf(embedded)(
    'while the directory is held, no answer names its path or the holder’s process',
    async () => {
      const dataDir = mkdtempSync(join(tmpdir(), 'cagewright-owner-leak-'));
      const first = await startServer({ dataDir });
      // A second server without the start script (the built handler on a bare HTTP server): it
      // keeps running and answering with the store refused.
      const port = await freePort();
      const entry = pathToFileURL(join(outDir(), 'server', 'entry.mjs')).href;
      const bare = `const { handler } = await import(${JSON.stringify(entry)});
        (await import('node:http')).createServer((req, res) => handler(req, res)).listen(Number(process.env.PORT), process.env.HOST);`;
      const second = spawn(process.execPath, ['--input-type=module', '-e', bare], {
        env: {
          ...process.env,
          PORT: String(port),
          HOST: '127.0.0.1',
          CAGEWRIGHT_DATA_DIR: dataDir,
          AUTH_SECRET: TEST_SECRET,
          NODE_ENV: 'production',
          CAGEWRIGHT_STORAGE: 'disk',
        },
        stdio: ['ignore', 'pipe', 'pipe'],
      });
      let log = '';
      second.stdout!.on('data', (b: Buffer) => (log += b.toString()));
      second.stderr!.on('data', (b: Buffer) => (log += b.toString()));
      try {
        const base = `http://127.0.0.1:${port}`;
        let health: Response | null = null;
        for (let i = 0; i < 200 && !health; i++) {
          health = await fetch(`${base}/api/health`).catch(() => null);
          if (!health) await new Promise((r) => setTimeout(r, 100));
        }
        expect(health!.status).toBe(503);
        const bodies = [await health!.text()];
        const signin = await fetch(`${base}/api/auth/csrf`).catch(() => null);
        if (signin) bodies.push(await signin.text());
        // A request with a session cookie reaches the store through the middleware.
        const a = new Client(first.baseUrl);
        await a.signIn(DEMO.operator);
        const withSession = await fetch(`${base}/api/me`, {
          headers: { cookie: (a as unknown as { cookieHeader(): string }).cookieHeader() },
        });
        expect(withSession.status).toBe(503);
        bodies.push(await withSession.text());
        for (const body of bodies) {
          expect(body).not.toContain(dataDir);
          expect(body).not.toContain(String(first.child.pid));
          expect(body).not.toMatch(/process \d+|cagewright\.owner/);
        }
        expect(JSON.parse(bodies[0]!).error.message).toMatch(/in use by another server/);
        // The console of the refused server names the holder, for the person running it.
        expect(log).toMatch(new RegExp(`in use by process ${first.child.pid}`));
        expect((await a.get('/api/health')).status).toBe(200); // the owner is unharmed
      } finally {
        second.kill('SIGKILL');
        await first.stop();
        removeDir(dataDir);
      }
    },
    240_000,
  );
});
