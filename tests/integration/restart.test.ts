import { describe, expect, it } from 'vitest';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Client, DEMO } from './client';
import { removeDir, startServer } from './server';

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
  }, 60_000);

  it('refuses a second server on the same data directory, naming the holder', async () => {
    if (process.env.DATABASE_URL) return; // server mode: PostgreSQL handles concurrency itself
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
  }, 60_000);
});
