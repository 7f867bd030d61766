import { describe, expect, inject, it } from 'vitest';
import pg from 'pg';
import { Client, DEMO } from './client';
import { databaseFor } from './server';

// `npm test` runs this suite twice: on the embedded store, then with DATABASE_URL on a PostgreSQL
// server. This proves the second run really talks to that server instead of passing on PGlite.
describe('the integration server uses the store this run names', () => {
  it('/api/health reports the store mode', async () => {
    const res = await new Client().get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body.store).toBe(process.env.DATABASE_URL ? 'postgres' : 'pglite');
  });

  it.skipIf(!process.env.DATABASE_URL)(
    'a write through the API lands in the PostgreSQL database of the suite server (server mode only)',
    async () => {
      const c = new Client();
      await c.signIn(DEMO.operator);
      const stamp = new Date(Date.now() - 1000);
      expect((await c.put('/api/me', { unitSystem: 'imperial' })).status).toBe(200);
      const direct = new pg.Client({ connectionString: await databaseFor(inject('dataDir')) });
      await direct.connect();
      try {
        const r = await direct.query<{ unit_system: string }>('select unit_system from users where email = $1', [DEMO.operator]);
        expect(r.rows[0]?.unit_system).toBe('imperial');
        const audited = await direct.query<{ n: number }>('select count(*)::int as n from audit_log where at >= $1', [stamp]);
        expect(audited.rows[0]!.n).toBeGreaterThan(0);
      } finally {
        await direct.end();
        await c.put('/api/me', { unitSystem: 'metric' });
      }
    },
  );
});
