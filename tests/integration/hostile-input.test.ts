import { beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { MATRIX, type Method } from './api-matrix';
import { clientsByRole, loadFixtures, type Fixtures } from './matrix-fixtures';
import { apiRoutes, fill } from './routes';
import type { Client } from './client';

/**
 * Property: for every write route, a hostile body — not JSON at all, JSON of the wrong shape, or
 * a valid body with one field made wrong — always gets a 4xx with a JSON error, never a 5xx,
 * and writes nothing (every table's row count is unchanged, the audit log included).
 */
const RUNS = Number(process.env.HOSTILE_RUNS ?? 20);
const TOO_LONG = 'x'.repeat(20_000);

/** A value of another kind than `v`, so the field can't stay valid. */
function wrongFor(v: unknown): fc.Arbitrary<unknown> {
  const notString = fc.oneof(fc.integer(), fc.boolean(), fc.array(fc.integer(), { maxLength: 3 }), fc.object({ maxDepth: 1 }));
  if (typeof v === 'string') return fc.oneof(notString, fc.constant(TOO_LONG));
  if (typeof v === 'number') return fc.oneof(fc.string(), fc.constant(-1e12), fc.constant(1e12), fc.double({ noNaN: true, min: 0.001, max: 0.999 }), fc.boolean());
  if (typeof v === 'boolean') return fc.oneof(fc.string(), fc.integer());
  if (Array.isArray(v)) return fc.oneof(fc.string(), fc.integer(), fc.object({ maxDepth: 1 }), fc.array(fc.oneof(fc.string(), fc.integer()), { minLength: 1, maxLength: 3 }));
  return fc.oneof(fc.string(), fc.integer(), fc.array(fc.integer(), { maxLength: 3 }));
}

function hostileBodies(valid: unknown): fc.Arbitrary<{ raw: string; why: string }> {
  const notJson = fc.oneof(fc.constant('{'), fc.constant('{"a":'), fc.string().filter((s) => { try { JSON.parse(s); return false; } catch { return true; } }))
    .map((raw) => ({ raw, why: 'not JSON' }));
  const notObject = fc.oneof(fc.string(), fc.integer(), fc.boolean(), fc.constant(null), fc.array(fc.anything({ maxDepth: 1 }), { maxLength: 3 }))
    .map((v) => ({ raw: JSON.stringify(v), why: 'not an object' }));
  const keys = valid && typeof valid === 'object' && !Array.isArray(valid) ? Object.keys(valid) : [];
  const oneFieldWrong = keys.length
    ? fc.constantFrom(...keys).chain((k) =>
        wrongFor((valid as Record<string, unknown>)[k]).map((bad) => ({ raw: JSON.stringify({ ...(valid as object), [k]: bad }), why: `${k} wrong` })),
      )
    : notObject;
  const missingField = keys.length
    ? fc.constantFrom(...keys).map((k) => {
        const copy = { ...(valid as Record<string, unknown>) };
        delete copy[k];
        return { raw: JSON.stringify(copy), why: `${k} missing` };
      })
    : notObject;
  return fc.oneof(notJson, notObject, oneFieldWrong, oneFieldWrong, missingField);
}

/** Fields whose absence is allowed: dropping them leaves a valid body, so skip that case. */
const OPTIONAL_FIELDS = new Set(['note', 'label', 'expiresAt', 'mode', 'version', 'name', 'active', 'orgId', 'notes', 'title', 'baseVersion', 'fingerprint', 'layoutId']);

describe('hostile input on every write route', () => {
  let clients: Awaited<ReturnType<typeof clientsByRole>>;
  let f: Fixtures;
  const writes = apiRoutes()
    .flatMap((r) => r.methods.map((m) => ({ method: m as Method, route: r.route, key: `${m} ${r.route}` })))
    .filter((r) => r.method !== 'GET' && r.method !== 'DELETE')
    .filter((r) => MATRIX[r.key]?.body && !MATRIX[r.key]?.multipart);

  beforeAll(async () => {
    clients = await clientsByRole();
    f = await loadFixtures(clients.own);
  }, 60_000);

  const counts = async () => (await clients.own.instance_admin.get('/api/admin/stats')).body.counts as Record<string, number>;

  it('covers the write routes', () => {
    expect(writes.length).toBeGreaterThan(20);
  });

  for (const w of writes) {
    it(`${w.key}: 4xx with a JSON error, never 5xx, nothing written`, async () => {
      const row = MATRIX[w.key]!;
      const role = row.allowed === 'public' ? 'instance_admin' : row.allowed.includes('dealer_admin') ? 'dealer_admin' : row.allowed[0]!;
      const c: Client = clients.own[role];
      const path = fill(w.route, row.params?.(f)) + (row.query?.(f) ?? '');
      const valid = row.body!(f);
      const before = await counts();
      await fc.assert(
        fc.asyncProperty(
          hostileBodies(valid).filter((b) => !(b.why.endsWith(' missing') && OPTIONAL_FIELDS.has(b.why.split(' ')[0]!))),
          async ({ raw, why }) => {
            const res = await c.fetch(path, { method: w.method, headers: { 'content-type': 'application/json' }, body: raw });
            const text = await res.text();
            const ctx = `${why}: ${raw.slice(0, 120)} → ${res.status} ${text.slice(0, 200)}`;
            expect(res.status, ctx).toBeGreaterThanOrEqual(400);
            expect(res.status, ctx).toBeLessThan(500);
            const body = JSON.parse(text);
            expect(typeof body.error?.message, ctx).toBe('string');
            if (res.status === 400) expect(typeof body.error.field, ctx).toBe('string');
          },
        ),
        { numRuns: RUNS },
      );
      expect(await counts()).toEqual(before);
    }, 120_000);
  }
});
