import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { decode, encode } from '@auth/core/jwt';
import { Client, DEMO } from './client';
import { databaseFor, removeDir, startServer } from './server';
import { entryNames, NEVER_ARCHIVED } from '../../scripts/lib/backup-archive.mjs';

const COOKIE = 'authjs.session-token';

/**
 * A session cookie for a user id and one of their open session rows, signed with a given secret
 * (what anyone holding the secret and a session id could make).
 */
async function forgedSession(secret: string, uid: string, sid: string): Promise<string> {
  const token = await encode({ token: { uid, sub: uid, sid, role: 'dealer_admin' }, secret, salt: COOKIE, maxAge: 3600 });
  return `${COOKIE}=${token}`;
}

const meWith = async (baseUrl: string, cookie: string) =>
  (await fetch(`${baseUrl}/api/me`, { headers: { cookie }, redirect: 'manual' })).status;

const secretFiles = (names: string[]) => names.filter((n) => NEVER_ARCHIVED.some((s) => n.replace(/^\/+/, '') === s));

/** Every file under a directory that others than the owner could read or write. */
function notPrivate(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    const st = statSync(p);
    if (st.isDirectory()) {
      if ((st.mode & 0o077) !== 0) out.push(`${p}/ ${(st.mode & 0o777).toString(8)}`);
      out.push(...notPrivate(p));
    } else if ((st.mode & 0o777) !== 0o600) out.push(`${p} ${(st.mode & 0o777).toString(8)}`);
  }
  return out;
}

describe('backup and restore', () => {
  // With a PostgreSQL server the installation is backed up with the server's own tools (below).
  it.skipIf(!!process.env.DATABASE_URL)(
    'takes a consistent snapshot while the server runs and restores it with every row (embedded store)',
    async () => {
      const dataDir = mkdtempSync(join(tmpdir(), 'cagewright-backup-'));
      const restored = mkdtempSync(join(tmpdir(), 'cagewright-restored-'));
      const file = join(dataDir, '..', `${dataDir.split('/').pop()}.tar.gz`);
      try {
        const server = await startServer({ dataDir });
        const c = new Client(server.baseUrl);
        await c.signIn(DEMO.operator);
        expect((await c.put('/api/me', { unitSystem: 'imperial' })).status).toBe(200);

        // A signed-in non-admin may not take a backup, nor a dealer's administrator; the script (local token) may.
        expect((await c.post('/api/admin/backup')).status).toBe(403);
        const dealerAdmin = new Client(server.baseUrl);
        await dealerAdmin.signIn(DEMO.dealerAdmin);
        expect((await dealerAdmin.post('/api/admin/backup')).status).toBe(403);
        const admin = new Client(server.baseUrl);
        await admin.signIn(DEMO.instanceAdmin);
        const counts = (await admin.get('/api/admin/stats')).body.counts as Record<string, number>;
        const env = { ...process.env, CAGEWRIGHT_DATA_DIR: dataDir };
        const backup = spawnSync(process.execPath, ['scripts/backup.mjs', '--out', file], { env, encoding: 'utf8' });
        expect(backup.status, backup.stderr).toBe(0);
        expect(backup.stdout).toMatch(/from the running server/);
        await server.stop();

        const restore = spawnSync(process.execPath, ['scripts/restore.mjs', file, '--data-dir', restored], { encoding: 'utf8' });
        expect(restore.status, restore.stderr).toBe(0);
        const restoredCounts = Object.fromEntries([...restore.stdout.matchAll(/^(\w+)\s+(\d+)$/gm)].map((m) => [m[1], Number(m[2])]));
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
    },
    120_000,
  );

  it.skipIf(!!process.env.DATABASE_URL)(
    'never archives the secrets, keeps archives and restored files private, and a restored store refuses sessions made with the old secret (embedded store: the archive holds the data directory)',
    async () => {
      const dataDir = mkdtempSync(join(tmpdir(), 'cagewright-secret-'));
      const restored = mkdtempSync(join(tmpdir(), 'cagewright-secret-restored-'));
      const kept = mkdtempSync(join(tmpdir(), 'cagewright-secret-kept-'));
      const file = join(dataDir, '..', `${dataDir.split('/').pop()}.tar.gz`);
      // No AUTH_SECRET: the server uses (and on first start writes) <data dir>/auth-secret, as `npm start` does.
      const env = { AUTH_SECRET: '' };
      try {
        const server = await startServer({ dataDir, env });
        const oldSecret = readFileSync(join(dataDir, 'auth-secret'), 'utf8').trim();
        const oldToken = readFileSync(join(dataDir, 'backup-token'), 'utf8').trim();
        const ada = new Client(server.baseUrl);
        await ada.signIn(DEMO.dealerAdmin);
        const adaId: string = (await ada.get('/api/me')).body.id;
        const realCookie = (ada as unknown as { cookieHeader(): string }).cookieHeader();
        // The control: whoever holds the secret (and a session id, read here from Ada's own cookie)
        // can make a session the server accepts.
        const realToken = realCookie
          .split('; ')
          .find((c) => c.startsWith(`${COOKIE}=`))!
          .slice(COOKIE.length + 1);
        const sid = String((await decode({ token: realToken, secret: oldSecret, salt: COOKIE }))?.sid);
        const forged = await forgedSession(oldSecret, adaId, sid);
        expect(await meWith(server.baseUrl, forged)).toBe(200);

        // An instance administrator's backup through the API: none of the secrets inside.
        const noor = new Client(server.baseUrl);
        await noor.signIn(DEMO.instanceAdmin);
        const res = await noor.fetch('/api/admin/backup', { method: 'POST' });
        expect(res.status).toBe(200);
        const viaApi = await entryNames(new Uint8Array(await res.arrayBuffer()));
        expect(viaApi.length).toBeGreaterThan(100);
        expect(secretFiles(viaApi)).toEqual([]);

        // The host's script: same rules, and the archive is readable by its owner only.
        const backup = spawnSync(process.execPath, ['scripts/backup.mjs', '--out', file], {
          env: { ...process.env, CAGEWRIGHT_DATA_DIR: dataDir },
          encoding: 'utf8',
        });
        expect(backup.status, backup.stderr).toBe(0);
        expect(secretFiles(await entryNames(readFileSync(file)))).toEqual([]);
        expect(statSync(file).mode & 0o777).toBe(0o600);
        await server.stop();

        // The backup token is renewed at every start: a copy that ever left the host opens nothing.
        const restarted = await startServer({ dataDir, env });
        const stale = await fetch(`${restarted.baseUrl}/api/admin/backup`, {
          method: 'POST',
          headers: { 'x-cagewright-backup-token': oldToken, origin: restarted.baseUrl },
        });
        expect(stale.status).toBe(401);
        await restarted.stop();

        const restore = spawnSync(process.execPath, ['scripts/restore.mjs', file, '--data-dir', restored], { encoding: 'utf8' });
        expect(restore.status, restore.stderr).toBe(0);
        expect(restore.stdout).toMatch(/fresh session secret/);
        expect(notPrivate(restored)).toEqual([]);
        const newSecret = readFileSync(join(restored, 'auth-secret'), 'utf8').trim();
        expect(newSecret).not.toBe(oldSecret);
        expect(newSecret.length).toBeGreaterThanOrEqual(32);

        const again = await startServer({ dataDir: restored, env });
        // Sessions made with the old secret — forged or real — are refused: everyone signs in again.
        expect(await meWith(again.baseUrl, forged)).toBe(401);
        expect(await meWith(again.baseUrl, realCookie)).toBe(401);
        const back = new Client(again.baseUrl);
        await back.signIn(DEMO.dealerAdmin);
        expect((await back.get('/api/me')).status).toBe(200);
        await again.stop();

        // Told to keep it, restore carries the old directory's secret over instead.
        const keep = spawnSync(process.execPath, ['scripts/restore.mjs', file, '--data-dir', kept, '--keep-secret-from', dataDir], {
          encoding: 'utf8',
        });
        expect(keep.status, keep.stderr).toBe(0);
        expect(readFileSync(join(kept, 'auth-secret'), 'utf8').trim()).toBe(oldSecret);
        expect(notPrivate(kept)).toEqual([]);
      } finally {
        removeDir(dataDir);
        removeDir(restored);
        removeDir(kept);
        removeDir(file);
        removeDir(file.replace(/\.tar\.gz$/, '') + '-files.tar.gz');
      }
    },
    400_000,
  );

  it.skipIf(!process.env.DATABASE_URL)(
    'server mode: pg_dump of a running installation restores into a fresh database with every row',
    async () => {
      const bin = readdirSync('/usr/lib/postgresql')
        .sort()
        .map((v) => join('/usr/lib/postgresql', v, 'bin'))
        .pop()!;
      const dataDir = mkdtempSync(join(tmpdir(), 'cagewright-pgdump-'));
      const restoredDir = mkdtempSync(join(tmpdir(), 'cagewright-pgdump-restored-'));
      const dump = join(dataDir, 'installation.dump');
      try {
        const server = await startServer({ dataDir });
        const source = (await databaseFor(dataDir))!;
        const c = new Client(server.baseUrl);
        await c.signIn(DEMO.operator);
        expect((await c.put('/api/me', { unitSystem: 'imperial' })).status).toBe(200);
        const admin = new Client(server.baseUrl);
        await admin.signIn(DEMO.instanceAdmin);
        // A snapshot while the server runs (pg_dump reads one consistent snapshot).
        const dumped = spawnSync(join(bin, 'pg_dump'), ['-Fc', '-f', dump, source], { encoding: 'utf8' });
        expect(dumped.status, dumped.stderr).toBe(0);
        const counts = (await admin.get('/api/admin/stats')).body.counts as Record<string, number>;
        await server.stop();

        const target = (await databaseFor(restoredDir))!;
        const restored = spawnSync(join(bin, 'pg_restore'), ['--no-owner', '-d', target, dump], { encoding: 'utf8' });
        expect(restored.status, restored.stderr).toBe(0);
        const again = await startServer({ dataDir: restoredDir, env: { DATABASE_URL: target } });
        const a2 = new Client(again.baseUrl);
        await a2.signIn(DEMO.instanceAdmin);
        const after = (await a2.get('/api/admin/stats')).body.counts as Record<string, number>;
        // Every table has every row; the sign-ins above add audit rows and session rows of their own.
        for (const [table, n] of Object.entries(counts)) {
          if (table === 'auditLog' || table === 'sessions') expect(after[table], table).toBeGreaterThanOrEqual(n);
          else expect(after[table], table).toBe(n);
        }
        const d = new Client(again.baseUrl);
        await d.signIn(DEMO.operator);
        expect((await d.get('/api/me')).body.unitSystem).toBe('imperial');
        await again.stop();
      } finally {
        removeDir(dataDir);
        removeDir(restoredDir);
      }
    },
    180_000,
  );
});
