import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Client } from './client';
import { removeDir, startServer } from './server';

/** An upgraded installation has no instance administrator: the host adds one with a script. */
describe('npm run instance-admin', () => {
  // The script opens the embedded store's data directory itself; with a PostgreSQL server the same
  // SQL runs against that server.
  it.skipIf(!!process.env.DATABASE_URL)(
    'adds an instance administrator on the host, refuses while the server runs, and never reuses an account (embedded store only)',
    async () => {
      const dataDir = mkdtempSync(join(tmpdir(), 'cagewright-instance-admin-'));
      const run = (...extra: string[]) =>
        spawnSync(process.execPath, ['scripts/instance-admin.mjs', ...extra], {
          env: {
            ...process.env,
            CAGEWRIGHT_DATA_DIR: dataDir,
            CAGEWRIGHT_NEW_PASSWORD: 'a-long-enough-password',
            CAGEWRIGHT_BCRYPT_ROUNDS: '4',
          },
          encoding: 'utf8',
        });
      try {
        let server = await startServer({ dataDir });
        const busy = run('--email', 'host.admin@example.org', '--name', 'Host Admin');
        expect(busy.status).toBe(1);
        expect(busy.stderr).toMatch(/stop the server first/);
        await server.stop();

        expect(run('--email', 'not-an-address', '--name', 'X').status).toBe(2);
        expect(run('--email', 'admin@kestrel.example', '--name', 'Someone').stderr).toMatch(/already has an account/);
        const ok = run('--email', 'host.admin@example.org', '--name', 'Host Admin');
        expect(ok.status, ok.stderr).toBe(0);

        server = await startServer({ dataDir });
        const c = new Client(server.baseUrl);
        await c.signIn('host.admin@example.org', 'a-long-enough-password');
        expect((await c.get('/api/me')).body).toMatchObject({ role: 'instance_admin', homeOrgKind: 'instance' });
        expect((await c.get('/api/admin/stats')).body.scope).toBe('instance');
        await server.stop();
      } finally {
        removeDir(dataDir);
      }
    },
    400_000,
  );
});
