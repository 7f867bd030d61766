import { describe, expect, it } from 'vitest';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Client, DEMO } from './client';
import { removeDir, startServer } from './server';
import { firstMachineAndLayout, writeLoad } from './load';

describe('crash safety', () => {
  it('every acknowledged write survives kill -9 during a write load, and the store opens again', async () => {
    if (process.env.DATABASE_URL) return; // server mode: durability is the PostgreSQL server's
    const dataDir = mkdtempSync(join(tmpdir(), 'cagewright-crash-'));
    try {
      const server = await startServer({ dataDir });
      const c = new Client(server.baseUrl);
      await c.signIn(DEMO.technician);
      const target = await firstMachineAndLayout(c);
      const load = writeLoad(c, target, { writers: 4 });
      await new Promise((r) => setTimeout(r, 1500));
      await server.stop('SIGKILL');
      const acked = await load.stop();
      expect(acked.length).toBeGreaterThan(5);

      const again = await startServer({ dataDir });
      const d = new Client(again.baseUrl);
      await d.signIn(DEMO.technician);
      for (const w of acked) {
        const res = await d.get(`/api/layouts/${w.layoutId}`);
        expect(res.status, `layout ${w.layoutId} after the crash`).toBe(200);
        expect(res.body.current.note).toBe(w.note);
      }
      await again.stop();
    } finally {
      removeDir(dataDir);
    }
  }, 120_000);
});
