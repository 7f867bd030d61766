import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, DEMO } from './client';
import { removeDir, startServer, type RunningServer } from './server';

/**
 * Sign-in throttling against a server of its own (so the suite's shared server is not slowed),
 * behind a "proxy": the server trusts X-Forwarded-For from 127.0.0.1, so each request can
 * come from an address of its choosing (documentation ranges, RFC 5737). The first wait is
 * set explicitly (the default, 30 s) so the test reads on its own; the limits are the product's.
 */
// Longer than a burst of 100 sign-ins takes on a loaded machine, so the wait cannot run out mid-burst.
const DELAY_S = 30;
const ACCOUNT_LIMIT = 5;
const ADDRESS_LIMIT = 20;
let server: RunningServer;

beforeAll(async () => {
  server = await startServer({
    env: { CAGEWRIGHT_SIGNIN_DELAY_S: String(DELAY_S), CAGEWRIGHT_TRUSTED_PROXIES: '127.0.0.1', CAGEWRIGHT_SIGNIN_ADDRESS_FREE: '20' },
  });
}, 180_000);

afterAll(async () => {
  await server?.stop();
  if (server && !process.env.DATABASE_URL) removeDir(server.dataDir);
});

const from = (n: number) => ({ 'x-forwarded-for': `198.51.${Math.floor(n / 250)}.${(n % 250) + 1}` });

async function attempt(email: string, password: string, headers: Record<string, string>) {
  const c = new Client(server.baseUrl);
  const res = await c.signIn(email, password, headers);
  const code = new URL(res.headers.get('location') ?? '/', 'http://x').searchParams.get('code');
  return { c, res, code, signedIn: c.hasSession() };
}

const stats = async (admin: Client) => (await admin.get('/api/admin/stats')).body.counts as Record<string, number>;

describe('sign-in throttle', () => {
  it('parallel correct sign-ins from one address all succeed (a free attempt is never refused for another one’s moment)', async () => {
    const people = [
      DEMO.operator,
      DEMO.operator2,
      DEMO.technician,
      DEMO.dealerAdmin,
      DEMO.operator,
      DEMO.technician,
      DEMO.operator2,
      DEMO.dealerAdmin,
    ];
    const results = await Promise.all(people.map((email) => attempt(email, 'cage-demo-2026', from(7000))));
    expect(results.map((r) => r.code ?? 'signed in')).toEqual(people.map(() => 'signed in'));
    expect(results.every((r) => r.signedIn)).toBe(true);
  });

  it('100 parallel wrong passwords for one account from 100 addresses: at most the limit are checked, every one audited', async () => {
    const admin = new Client(server.baseUrl);
    await admin.signIn(DEMO.instanceAdmin, undefined, from(9000));
    const before = await stats(admin);
    const results = await Promise.all(Array.from({ length: 100 }, (_, i) => attempt(DEMO.trainer, `wrong-${i}`, from(i))));
    // A checked password answers "credentials"; a refused reservation "throttled-<time>".
    const checked = results.filter((r) => !r.code?.startsWith('throttled-'));
    const throttled = results.filter((r) => r.code?.startsWith('throttled-'));
    expect(checked.length).toBeLessThanOrEqual(ACCOUNT_LIMIT);
    expect(checked.length).toBeGreaterThan(0);
    expect(checked.length + throttled.length).toBe(100);
    expect(results.some((r) => r.signedIn)).toBe(false);
    // Throttled answers say when to try again, in the redirect and as Retry-After.
    const retryAfter = Number(throttled[0]!.res.headers.get('retry-after'));
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(DELAY_S + 1); // whole seconds, rounded up
    const after = await stats(admin);
    expect(after.auditLog - before.auditLog).toBe(100); // each failed or throttled attempt audited

    // A burst of 40 with the right password among them, inside the wait: none signs in.
    const burst = await Promise.all(
      Array.from({ length: 40 }, (_, i) => attempt(DEMO.trainer, i === 20 ? 'cage-demo-2026' : `again-${i}`, from(200 + i))),
    );
    expect(burst.some((r) => r.signedIn)).toBe(false);
    expect(burst.every((r) => r.code?.startsWith('throttled-'))).toBe(true);

    // The sign-in page tells when.
    const where = new URL(burst[20]!.res.headers.get('location')!);
    const page = await (await burst[20]!.c.fetch(where.pathname + where.search)).text();
    expect(page).toMatch(/You can try again in \d+ seconds?/);

    // After the wait, the right password signs in; the account starts afresh.
    const until = Math.max(...burst.map((r) => Number(r.code!.slice('throttled-'.length))));
    await new Promise((r) => setTimeout(r, Math.max(0, until * 1000 - Date.now()) + 1000));
    const ok = await attempt(DEMO.trainer, 'cage-demo-2026', from(300));
    expect(ok.signedIn).toBe(true);
    expect((await ok.c.get('/api/me')).body.email).toBe(DEMO.trainer);
  }, 180_000);

  it('limits one address across many accounts; other addresses are not affected', async () => {
    const address = { 'x-forwarded-for': '203.0.113.50' };
    const spray = [];
    for (let i = 0; i < ADDRESS_LIMIT; i++) spray.push(await attempt(`nobody-${i}@spray.example`, 'guess', address));
    expect(spray.map((r) => r.code)).toEqual(Array(ADDRESS_LIMIT).fill('credentials'));
    // The next attempt from that address is refused, even with a real account's right password.
    const next = await attempt(DEMO.technician, 'cage-demo-2026', address);
    expect(next.signedIn).toBe(false);
    expect(next.code).toMatch(/^throttled-\d+$/);
    // The same account from another address signs in.
    const elsewhere = await attempt(DEMO.technician, 'cage-demo-2026', { 'x-forwarded-for': '203.0.113.51' });
    expect(elsewhere.signedIn).toBe(true);
  }, 60_000);

  it('counts successful sign-ins against nobody: many good sign-ins from one address stay free', async () => {
    const address = { 'x-forwarded-for': '203.0.113.60' };
    for (let i = 0; i < ADDRESS_LIMIT + 5; i++) expect((await attempt(DEMO.operator, 'cage-demo-2026', address)).signedIn).toBe(true);
  }, 60_000);
});
