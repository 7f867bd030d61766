import { describe, expect, it } from 'vitest';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Client, DEMO } from './client';
import { removeDir, startServer } from './server';
import { firstMachineAndLayout, writeLoad } from './load';

// Runs in both store modes: with DATABASE_URL the app server is killed and restarted on the same
// database (server.ts maps the data directory to it), so an acknowledged write must be in
// PostgreSQL before the answer left the server.
describe(`crash safety (${process.env.DATABASE_URL ? 'PostgreSQL server' : 'embedded PGlite'})`, () => {
  it('every acknowledged create and save survives kill -9 during a write load, and the store opens again', async () => {
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
      // Every answer before the kill was a 201: a 5xx (or a 409 on a writer's own layout) is a fault.
      expect(load.unexpected).toEqual([]);
      expect(acked.length).toBeGreaterThan(5);
      const savedTrails = load.trails.filter((t) => t.lastAcked > 0);
      expect(savedTrails.length).toBeGreaterThan(0);

      const again = await startServer({ dataDir });
      const d = new Client(again.baseUrl);
      await d.signIn(DEMO.technician);
      for (const w of acked) {
        const res = await d.get(`/api/layouts/${w.layoutId}`);
        expect(res.status, `layout ${w.layoutId} after the crash`).toBe(200);
        if (!load.trails.some((t) => t.layoutId === w.layoutId)) expect(res.body.current.note).toBe(w.note);
      }
      // A writer's own layout holds its last acknowledged save, or a later one it sent whose
      // answer the kill cut off; never an older one.
      for (const t of load.trails) {
        const res = await d.get(`/api/layouts/${t.layoutId}`);
        const at = t.sent.indexOf(res.body.current.note);
        expect(at, `layout ${t.layoutId}: current note ${res.body.current.note}`).toBeGreaterThanOrEqual(t.lastAcked);
      }
      await again.stop();
    } finally {
      removeDir(dataDir);
    }
  }, 120_000);
});
