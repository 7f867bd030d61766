import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createConnection, createServer, type Server, type Socket } from 'node:net';
import pg from 'pg';
import sharp from 'sharp';
import { ListObjectsV2Command, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { Client, DEMO } from './client';
import { mailbox, ownMachine } from './planner-helpers';
import { databaseFor, removeDir, startServer, type RunningServer } from './server';
import { startFakeS3 } from '../../scripts/fakes/s3.mjs';
import { startFakeSmtp as startFakeSmtpUntyped } from '../../scripts/fakes/smtp.mjs';

// The fake's parameter type is inferred from its `= {}` default, which leaves out `dataDir`.
const startFakeSmtp = startFakeSmtpUntyped as (o: { dataDir: string; setEnv?: boolean }) => ReturnType<typeof startFakeSmtpUntyped>;

process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED = 'true';

/**
 * A TCP relay in front of a real service that can be switched to "hang": from then on it accepts
 * every connection and never answers (a plain net.Server that reads nothing and writes nothing),
 * and the connections it was relaying are cut, so clients must open new ones; or to "refuse":
 * every connection is closed as soon as it is accepted.
 */
async function switchableRelay(targetPort: number) {
  let hanging = false;
  let refusing = false;
  const open = new Set<Socket>();
  const server: Server = createServer((client) => {
    open.add(client);
    client.on('close', () => open.delete(client));
    client.on('error', () => {});
    if (refusing) {
      client.destroy();
      return;
    }
    if (hanging) {
      client.pause(); // accept, read nothing, answer nothing
      return;
    }
    const upstream = createConnection(targetPort, '127.0.0.1');
    open.add(upstream);
    upstream.on('close', () => open.delete(upstream));
    upstream.on('error', () => client.destroy());
    client.on('close', () => upstream.destroy());
    upstream.on('close', () => client.destroy());
    client.pipe(upstream);
    upstream.pipe(client);
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  const port = (server.address() as { port: number }).port;
  const cutAll = () => {
    for (const s of open) s.destroy();
  };
  return {
    port,
    hang() {
      hanging = true;
      refusing = false;
      cutAll();
    },
    /** Hang up on every new connection at once. */
    refuse() {
      refusing = true;
      cutAll();
    },
    pass() {
      hanging = false;
      refusing = false;
      cutAll();
    },
    close: () => {
      cutAll();
      return new Promise<void>((r) => server.close(() => r()));
    },
  };
}

async function jpeg(): Promise<Uint8Array> {
  return new Uint8Array(
    await sharp({ create: { width: 120, height: 80, channels: 3, background: '#5d6f83' } })
      .jpeg({ quality: 70 })
      .toBuffer(),
  );
}

function photoForm(bytes: Uint8Array): FormData {
  const f = new FormData();
  f.set('photo', new File([bytes as BlobPart], 'wear.jpg', { type: 'image/jpeg' }));
  return f;
}

const timed = async <T>(work: () => Promise<T>) => {
  const t0 = Date.now();
  const value = await work();
  return { value, ms: Date.now() - t0 };
};

const S3_DEADLINE = 6_000;
const SMTP_DEADLINE = 6_000;

describe('a slow or hanging service never freezes the store', () => {
  let dir: string;
  let server: RunningServer;
  let s3: Awaited<ReturnType<typeof startFakeS3>>;
  let smtp: Awaited<ReturnType<typeof startFakeSmtp>>;
  let s3Relay: Awaited<ReturnType<typeof switchableRelay>>;
  let smtpRelay: Awaited<ReturnType<typeof switchableRelay>>;
  let bucket: S3Client;
  let env: Record<string, string>;
  let tech: Client;
  let olive: Client;
  let admin: Client;

  const objectKeys = async () => {
    const out = await bucket.send(new ListObjectsV2Command({ Bucket: s3.bucket, Prefix: 'inspections/' }));
    return (out.Contents ?? []).map((o) => o.Key!);
  };

  const signIn = async () => {
    tech = new Client(server.baseUrl);
    olive = new Client(server.baseUrl);
    admin = new Client(server.baseUrl);
    await Promise.all([tech.signIn(DEMO.technician), olive.signIn(DEMO.operator), admin.signIn(DEMO.dealerAdmin)]);
  };

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'cagewright-slow-'));
    s3 = await startFakeS3({ dataDir: join(dir, 'fake-s3'), setEnv: false });
    smtp = await startFakeSmtp({ dataDir: join(dir, 'fake-smtp'), setEnv: false });
    s3Relay = await switchableRelay(Number(new URL(s3.endpoint).port));
    smtpRelay = await switchableRelay(smtp.port);
    bucket = new S3Client({
      endpoint: s3.endpoint,
      region: 'us-east-1',
      forcePathStyle: true,
      credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
    });
    env = {
      S3_ENDPOINT: `http://127.0.0.1:${s3Relay.port}`,
      S3_BUCKET: s3.bucket,
      S3_ACCESS_KEY_ID: 'S3RVER',
      S3_SECRET_ACCESS_KEY: 'S3RVER',
      S3_REGION: 'us-east-1',
      S3_CONNECT_TIMEOUT_MS: '2000',
      S3_TIMEOUT_MS: String(S3_DEADLINE),
      SMTP_URL: `smtp://127.0.0.1:${smtpRelay.port}`,
      CAGEWRIGHT_MAILBOX_DIR: smtp.mailboxDir,
      // Longer than the whole-message deadline, so only that deadline can end a silent server.
      SMTP_CONNECT_TIMEOUT_MS: '60000',
      SMTP_TIMEOUT_MS: String(SMTP_DEADLINE),
      // Objects are judged at start with no grace, so the test need not wait an hour.
      CAGEWRIGHT_ORPHAN_GRACE_MS: '1',
    };
    server = await startServer({ dataDir: join(dir, 'data'), env });
    await signIn();
  }, 240_000);

  afterAll(async () => {
    await server?.stop();
    await Promise.allSettled([s3Relay?.close(), smtpRelay?.close(), s3?.stop(), smtp?.stop()]);
    removeDir(dir);
  });

  it('an upload to an object store that never answers: reads keep answering meanwhile, the upload ends with a clear 503, nothing is kept', async () => {
    const machines = (await tech.get('/api/machines?pageSize=100')).body.items as { id: string; nickname: string }[];
    const machineId = machines.find((m) => m.nickname === 'Bean Runner')!.id;
    const insp = (await tech.post(`/api/machines/${machineId}/inspections`, {})).body;
    const item = insp.items[0];
    const layouts = (await tech.get(`/api/machines/${machines[0]!.id}/layouts`)).body.layouts as { id: string }[] | undefined;
    const keysBefore = await objectKeys();
    const photo = await jpeg();

    s3Relay.hang();
    let settledAt = 0;
    const upload = timed(() =>
      tech.fetch(`/api/inspections/${insp.id}/items/${item.id}/photos`, { method: 'POST', body: photoForm(photo) as BodyInit }),
    ).then((r) => {
      settledAt = Date.now();
      return r;
    });
    await new Promise((r) => setTimeout(r, 500)); // the upload is now waiting on the store

    // Reads that need the database: they answer while the upload hangs, not after it.
    const reads: number[] = [];
    for (let i = 0; i < 3; i++) {
      const me = await timed(() => olive.get('/api/me'));
      expect(me.value.status).toBe(200);
      const detail = await timed(() => tech.get(`/api/inspections/${insp.id}`));
      expect(detail.value.status).toBe(200);
      reads.push(me.ms, detail.ms);
      if (layouts?.length) {
        const layout = await timed(() => tech.get(`/api/layouts/${layouts[0]!.id}`));
        expect(layout.value.status).toBe(200);
        reads.push(layout.ms);
      }
    }
    const readsDone = Date.now();
    expect(settledAt, 'the reads finished while the upload was still waiting').toBe(0);
    expect(Math.max(...reads)).toBeLessThan(S3_DEADLINE);

    const { value: res, ms } = await upload;
    expect(settledAt).toBeGreaterThan(readsDone);
    expect(res.status).toBe(503);
    const body = await res.json();
    expect(body.error.field).toBe('photo');
    expect(body.error.message).toMatch(/photo store did not answer in time, so nothing was saved/);
    expect(ms).toBeGreaterThanOrEqual(S3_DEADLINE - 500);
    expect(ms).toBeLessThan(S3_DEADLINE + 20_000); // the deadline, plus a loaded machine's slack

    s3Relay.pass();
    expect((await tech.get(`/api/inspections/${insp.id}`)).body.photoCount).toBe(0);
    // Nothing half-written: no object from the failed upload is left (removed in the background).
    for (let i = 0; i < 40 && (await objectKeys()).length !== keysBefore.length; i++) await new Promise((r) => setTimeout(r, 250));
    expect((await objectKeys()).sort()).toEqual(keysBefore.sort());

    // The store is back: the same upload goes through, row after objects.
    const again = await tech.fetch(`/api/inspections/${insp.id}/items/${item.id}/photos`, {
      method: 'POST',
      body: photoForm(photo) as BodyInit,
    });
    expect(again.status).toBe(201);
    expect((await objectKeys()).length).toBe(keysBefore.length + 2);
  }, 120_000);

  it('a photo read from a store that never answers ends with a 503, and other requests go on', async () => {
    const list = (await olive.get('/api/inspections')).body.items as { id: string }[];
    let url: string | undefined;
    for (const i of list) {
      const d = (await olive.get(`/api/inspections/${i.id}`)).body;
      url = d.items?.flatMap((it: { photos?: { url: string }[] }) => it.photos ?? [])[0]?.url;
      if (url) break;
    }
    expect(url, 'the demo inspection has photos').toBeTruthy();
    s3Relay.hang();
    try {
      const read = timed(() => olive.fetch(url!));
      await new Promise((r) => setTimeout(r, 300));
      expect((await olive.get('/api/me')).status).toBe(200);
      const { value: res, ms } = await read;
      expect(res.status).toBe(503);
      expect((await res.json()).error.message).toMatch(/did not answer in time/);
      expect(ms).toBeLessThan(S3_DEADLINE + 20_000);
    } finally {
      s3Relay.pass();
    }
  }, 120_000);

  describe('parts requests go out through an outbox', () => {
    let id: string;
    let machineId: string;

    beforeAll(async () => {
      ({ machineId } = await ownMachine(olive, 'Outbox test machine'));
      const made = await olive.post('/api/parts-requests', {
        from: 'manual',
        machineId,
        lines: [{ partNumber: 'CW-RB-L-04', quantity: 2 }],
      });
      expect(made.status, JSON.stringify(made.body)).toBe(201);
      id = made.body.id;
    }, 120_000);

    it('while the mail server is silent the request is "sending": the desk cannot act on it, others go on; after the deadline it is a draft again with the reason', async () => {
      const mails = (await mailbox(admin)).total;
      smtpRelay.hang();
      let settled = false;
      const submit = timed(() => olive.post(`/api/parts-requests/${id}/submit`)).finally(() => (settled = true));
      let status = '';
      for (let i = 0; i < 50 && status !== 'sending'; i++) {
        status = (await olive.get(`/api/parts-requests/${id}`)).body.status;
        if (status !== 'sending') await new Promise((r) => setTimeout(r, 100));
      }
      expect(status).toBe('sending');
      const seen = await olive.get(`/api/parts-requests/${id}`);
      expect(seen.body.can).toEqual({ edit: false, submit: false, delete: false, advance: false });
      // The parts desk sees nothing to act on yet, and cannot acknowledge it.
      const incoming = await tech.get('/api/parts-requests?scope=incoming');
      expect(incoming.body.items.map((r: { id: string }) => r.id)).not.toContain(id);
      const ack = await tech.post(`/api/parts-requests/${id}/status`, { status: 'acknowledged' });
      expect(ack.status).toBe(409);
      expect(ack.body.error.message).toMatch(/still being sent/);
      // The owner cannot send it twice meanwhile.
      expect((await olive.post(`/api/parts-requests/${id}/submit`)).status).toBe(409);
      expect((await olive.get('/api/me')).status).toBe(200);
      expect(settled, 'everything above answered while the send was waiting').toBe(false);

      const { value: res, ms } = await submit;
      expect(res.status).toBe(504);
      expect(res.body.error.message).toMatch(/mail server did not answer in time.*draft again/);
      expect(res.body.error).toMatchObject({ status: 'draft' });
      expect(ms).toBeGreaterThanOrEqual(SMTP_DEADLINE - 500);
      expect(ms).toBeLessThan(SMTP_DEADLINE + 20_000);

      const after = await olive.get(`/api/parts-requests/${id}`);
      expect(after.body).toMatchObject({ status: 'draft', sentAt: null });
      expect(after.body.sendError).toMatch(/mail server did not answer in time/);
      expect(after.body.can).toMatchObject({ edit: true, submit: true });
      const page = await (await olive.fetch(`/parts-requests/${id}`)).text();
      expect(page).toContain('data-testid="request-send-error"');
      expect(page).toMatch(/mail server did not answer in time/);
      smtpRelay.pass();
      expect((await mailbox(admin)).total).toBe(mails);
    }, 120_000);

    it('a mail server that hangs up at once: a draft again with that reason (502)', async () => {
      smtpRelay.refuse();
      try {
        const res = await olive.post(`/api/parts-requests/${id}/submit`);
        expect(res.status).toBe(502);
        expect(res.body.error.message).toMatch(/could not be reached or refused the message.*draft again/);
        const after = await olive.get(`/api/parts-requests/${id}`);
        expect(after.body.status).toBe('draft');
        expect(after.body.sendError).toMatch(/could not be reached or refused/);
      } finally {
        smtpRelay.pass();
      }
    }, 60_000);

    it('the owner sends it again once the mail server answers: sent, the reason cleared, the desk can acknowledge', async () => {
      const mails = (await mailbox(admin)).total;
      const res = await olive.post(`/api/parts-requests/${id}/submit`);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body).toMatchObject({ status: 'sent', sendError: null });
      expect((await mailbox(admin)).total).toBe(mails + 1);
      expect((await tech.post(`/api/parts-requests/${id}/status`, { status: 'acknowledged' })).status).toBe(200);
    }, 60_000);

    it('a request left "sending" by a server that died is a draft again at the next start; a photo object no row names is removed, others kept', async () => {
      const made = await olive.post('/api/parts-requests', {
        from: 'manual',
        machineId,
        lines: [{ partNumber: 'CW-RB-R-04', quantity: 1 }],
      });
      const stuckId = made.body.id as string;
      smtpRelay.hang();
      void olive.post(`/api/parts-requests/${stuckId}/submit`).catch(() => {});
      let status = '';
      for (let i = 0; i < 50 && status !== 'sending'; i++) {
        status = (await olive.get(`/api/parts-requests/${stuckId}`)).body.status;
        if (status !== 'sending') await new Promise((r) => setTimeout(r, 100));
      }
      expect(status).toBe('sending');

      // Objects the store has no row for: one of a known inspection (a crash between the
      // object and its row), one of an inspection this store never heard of (another
      // installation sharing the bucket: not ours to judge).
      const insp = (await tech.get('/api/inspections')).body.items[0] as { id: string };
      const orphan = `inspections/${insp.id}/00000000-0000-4000-8000-00000000abcd.jpg`;
      const foreign = `inspections/11111111-1111-4111-8111-111111111111/22222222-2222-4222-8222-222222222222.jpg`;
      for (const Key of [orphan, foreign])
        await bucket.send(new PutObjectCommand({ Bucket: s3.bucket, Key, Body: await jpeg(), ContentType: 'image/jpeg' }));
      const kept = (await objectKeys()).filter((k) => k !== orphan);

      expect(await server.stop('SIGKILL')).toBe(null);
      smtpRelay.pass();
      if (process.env.DATABASE_URL) {
        // Another instance may be sending right now, so with a PostgreSQL server only requests
        // sending for longer than a mail deadline are taken back: age this one.
        const db = new pg.Client({ connectionString: await databaseFor(server.dataDir) });
        await db.connect();
        await db.query(`update parts_requests set sending_since = now() - interval '1 hour' where id = $1`, [stuckId]);
        await db.end();
      }
      server = await startServer({ dataDir: server.dataDir, env });
      await signIn();

      const back = await olive.get(`/api/parts-requests/${stuckId}`);
      expect(back.body.status).toBe('draft');
      expect(back.body.sendError).toMatch(/server stopped while this request was being sent/);
      expect(back.body.can.submit).toBe(true);

      let keys = await objectKeys();
      for (let i = 0; i < 80 && keys.includes(orphan); i++) {
        await new Promise((r) => setTimeout(r, 250));
        keys = await objectKeys();
      }
      expect(keys).not.toContain(orphan);
      expect(keys.sort()).toEqual(kept.sort());
      expect(keys).toContain(foreign);
    }, 240_000);
  });
});
