import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Client, DEMO } from './client';
import { removeDir, startServer } from './server';

describe('backup and restore', () => {
  it('takes a consistent snapshot while the server runs and restores it with every row', async () => {
    if (process.env.DATABASE_URL) return; // server mode backs up with pg_dump
    const dataDir = mkdtempSync(join(tmpdir(), 'cagewright-backup-'));
    const restored = mkdtempSync(join(tmpdir(), 'cagewright-restored-'));
    const file = join(dataDir, '..', `${dataDir.split('/').pop()}.tar.gz`);
    try {
      const server = await startServer({ dataDir });
      const c = new Client(server.baseUrl);
      await c.signIn(DEMO.operator);
      expect((await c.put('/api/me', { unitSystem: 'imperial' })).status).toBe(200);

      // A signed-in non-admin may not take a backup; the script (local token) may.
      expect((await c.post('/api/admin/backup')).status).toBe(403);
      const admin = new Client(server.baseUrl);
      await admin.signIn(DEMO.admin);
      const counts = (await admin.get('/api/admin/stats')).body.counts as Record<string, number>;
      const env = { ...process.env, CAGEWRIGHT_DATA_DIR: dataDir };
      const backup = spawnSync(process.execPath, ['scripts/backup.mjs', '--out', file], { env, encoding: 'utf8' });
      expect(backup.status, backup.stderr).toBe(0);
      expect(backup.stdout).toMatch(/from the running server/);
      await server.stop();

      const restore = spawnSync(process.execPath, ['scripts/restore.mjs', file, '--data-dir', restored], { encoding: 'utf8' });
      expect(restore.status, restore.stderr).toBe(0);
      const restoredCounts = Object.fromEntries(
        [...restore.stdout.matchAll(/^(\w+)\s+(\d+)$/gm)].map((m) => [m[1], Number(m[2])]),
      );
      expect(restoredCounts.users).toBe(counts.users);
      expect(restoredCounts.machines).toBe(counts.machines);
      expect(restoredCounts.layout_versions).toBe(counts.layoutVersions);
      expect(restoredCounts.audit_log).toBe(counts.auditLog);

      const again = await startServer({ dataDir: restored });
      const d = new Client(again.baseUrl);
      await d.signIn(DEMO.operator);
      expect((await d.get('/api/me')).body.unitSystem).toBe('imperial');
      // The demo inspection's photos come back with the files archive.
      const inspections = (await d.get('/api/inspections')).body.items;
      const detail = (await d.get(`/api/inspections/${inspections[0].id}`)).body;
      const photo = detail.items.flatMap((i: { photos?: { url: string }[] }) => i.photos ?? [])[0];
      const image = await d.fetch(photo.url);
      expect(image.status).toBe(200);
      expect(image.headers.get('content-type')).toMatch(/^image\//);
      await again.stop();
    } finally {
      removeDir(dataDir);
      removeDir(restored);
      removeDir(file);
      removeDir(file.replace(/\.tar\.gz$/, '') + '-files.tar.gz');
    }
  }, 120_000);
});
