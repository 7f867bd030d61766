#!/usr/bin/env node
// `npm run instance-admin -- --email <e-mail> --name "<name>"`: adds an instance administrator
// account on the host (an installation upgraded from a single `admin` role has none: its admins
// became dealer administrators). The password comes from CAGEWRIGHT_NEW_PASSWORD or is asked for.
// The instance administrator is an account of its own, member of the installation only.
// - Embedded store: run it while the server is stopped (it takes the data directory's owner file).
// - PostgreSQL server (DATABASE_URL): any time.
import { existsSync, openSync, readFileSync, rmSync, writeSync, closeSync } from 'node:fs';
import { hostname } from 'node:os';
import { join, resolve } from 'node:path';
import { createInterface } from 'node:readline/promises';
import bcrypt from 'bcryptjs';

const args = process.argv.slice(2);
const flag = (name) => {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : undefined;
};
const email = (flag('--email') ?? '').trim().toLowerCase();
const name = (flag('--name') ?? '').trim();
if (!/^[^@\s]+@[^@\s]+\.[^@\s]+$/.test(email) || name.length < 2) {
  console.error('usage: npm run instance-admin -- --email <e-mail> --name "<name>"');
  process.exit(2);
}
let password = process.env.CAGEWRIGHT_NEW_PASSWORD ?? '';
if (!password) {
  const rl = createInterface({ input: process.stdin, output: process.stdout });
  password = (await rl.question('Password for the new instance administrator (12 characters or more): ')).trim();
  rl.close();
}
if (password.length < 12) {
  console.error('the password needs 12 characters or more');
  process.exit(2);
}
const hash = await bcrypt.hash(password, Number(process.env.CAGEWRIGHT_BCRYPT_ROUNDS ?? 10));

async function addAdmin(query) {
  const taken = await query('select 1 from users where lower(email) = $1', [email]);
  if (taken.length) throw new Error(`${email} already has an account; an instance administrator is an account of its own`);
  let [org] = await query(`select id from organisations where kind = 'instance' order by created_at limit 1`);
  if (!org) [org] = await query(`insert into organisations (name, kind) values ('Cagewright installation', 'instance') returning id`);
  const [user] = await query('insert into users (email, name, password_hash) values ($1, $2, $3) returning id', [email, name, hash]);
  await query(`insert into memberships (user_id, org_id, role) values ($1, $2, 'instance_admin')`, [user.id, org.id]);
  await query(`insert into audit_log (org_id, action, entity, entity_id, detail) values ($1, 'create', 'instance-admin', $2, $3)`, [
    org.id,
    user.id,
    JSON.stringify({ email, by: 'host' }),
  ]);
}

try {
  if (process.env.DATABASE_URL) {
    const pg = (await import('pg')).default;
    const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
    await client.connect();
    try {
      await client.query('begin');
      await addAdmin(async (sql, params) => (await client.query(sql, params)).rows);
      await client.query('commit');
    } catch (e) {
      await client.query('rollback');
      throw e;
    } finally {
      await client.end();
    }
  } else {
    const dataDir = resolve(process.env.CAGEWRIGHT_DATA_DIR ?? 'data');
    const ownerFile = join(dataDir, 'cagewright.owner');
    if (existsSync(ownerFile)) {
      let owner = null;
      try {
        owner = JSON.parse(readFileSync(ownerFile, 'utf8'));
      } catch {
        // unreadable: the message says only that the owner file is present
      }
      throw new Error(
        `the data directory is in use (${owner ? `pid ${owner.pid} on ${owner.host}` : 'owner file present'}): stop the server first`,
      );
    }
    if (!existsSync(join(dataDir, 'PG_VERSION'))) throw new Error(`${dataDir} holds no store yet: start the server once first`);
    const fd = openSync(ownerFile, 'wx', 0o600);
    writeSync(
      fd,
      JSON.stringify({ pid: process.pid, host: hostname(), port: null, since: new Date().toISOString(), by: 'instance-admin' }),
    );
    closeSync(fd);
    try {
      const { PGlite } = await import('@electric-sql/pglite');
      const db = await PGlite.create({ dataDir });
      try {
        await db.transaction(async (tx) => addAdmin(async (sql, params) => (await tx.query(sql, params)).rows));
        await db.query('CHECKPOINT');
      } finally {
        await db.close();
      }
    } finally {
      rmSync(ownerFile, { force: true });
    }
  }
  console.log(`instance administrator ${email} added; they sign in at /signin`);
} catch (err) {
  console.error(`instance-admin: ${err.message}`);
  process.exit(1);
}
