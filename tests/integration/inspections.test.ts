import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readdirSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { request } from 'node:http';
import sharp from 'sharp';
import fc from 'fast-check';
import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import { Client, DEMO } from './client';
import { removeDir, startServer, type RunningServer } from './server';
import { startFakeS3 } from '../../scripts/fakes/s3.mjs';

const MAX = 8 * 1024 * 1024;
// The SDK's notice about future Node versions is noise here.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED = 'true';

/** A small real PNG: a gradient, so its bytes are not trivially uniform. */
async function smallPng(): Promise<Uint8Array> {
  const w = 64;
  const h = 48;
  const raw = Buffer.alloc(w * h * 3);
  for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) raw.set([x * 4, y * 5, (x + y) * 2], (y * w + x) * 3);
  return new Uint8Array(
    await sharp(raw, { raw: { width: w, height: h, channels: 3 } })
      .png()
      .toBuffer(),
  );
}

/** The decoded pixels of an image (RGB), to compare what was stored with what was sent. */
async function pixels(bytes: Uint8Array | Buffer): Promise<Buffer> {
  return sharp(bytes).removeAlpha().raw().toBuffer();
}

async function smallJpeg(width = 900, height = 600): Promise<Uint8Array> {
  return new Uint8Array(
    await sharp({ create: { width, height, channels: 3, background: '#6b7b8d' } })
      .jpeg({ quality: 70 })
      .toBuffer(),
  );
}

function form(bytes: Uint8Array | string, name: string, type: string): FormData {
  const f = new FormData();
  f.set('photo', new File([bytes as BlobPart], name, { type }));
  return f;
}

async function upload(c: Client, inspectionId: string, itemId: string, body: FormData | Uint8Array, headers: Record<string, string> = {}) {
  const res = await c.fetch(`/api/inspections/${inspectionId}/items/${itemId}/photos`, { method: 'POST', body: body as BodyInit, headers });
  const text = await res.text();
  let json: any = null;
  try {
    json = JSON.parse(text);
  } catch {
    json = text;
  }
  return { status: res.status, body: json };
}

/** Sends headers announcing twice the limit and a few bytes, then waits for the status. */
function declaredTooLarge(c: Client, path: string): Promise<number> {
  const url = new URL(c.baseUrl + path);
  return new Promise((resolve, reject) => {
    const req = request(
      {
        host: url.hostname,
        port: url.port,
        path: url.pathname,
        method: 'POST',
        headers: {
          origin: c.baseUrl,
          cookie: (c as unknown as { cookieHeader(): string }).cookieHeader(),
          'content-type': 'multipart/form-data; boundary=xyz',
          'content-length': String(MAX * 2),
        },
      },
      (res) => {
        res.resume();
        resolve(res.statusCode ?? 0);
        req.destroy();
      },
    );
    req.on('error', (err) => (req.destroyed ? undefined : reject(err)));
    req.write('--xyz\r\n');
  });
}

/** Files under a folder, recursively (the disk backend's objects and their type files). */
function filesUnder(dir: string): string[] {
  let out: string[] = [];
  let names: string[] = [];
  try {
    names = readdirSync(dir);
  } catch {
    return [];
  }
  for (const n of names) {
    const p = join(dir, n);
    out = statSync(p).isDirectory() ? out.concat(filesUnder(p)) : out.concat(p);
  }
  return out;
}

const round1 = (n: number) => Math.round(n * 10) / 10;

describe('inspections with photos in an S3-compatible bucket', () => {
  let s3: { endpoint: string; bucket: string; stop: () => Promise<void> };
  let s3Dir: string;
  let server: RunningServer;
  let bucket: S3Client;
  let tech: Client;
  let olive: Client;
  let dev: Client;
  let admin: Client;
  let larkspurMachine: string;
  let haldaneMachine: string;

  const objectCount = async () => {
    const out = await bucket.send(new ListObjectsV2Command({ Bucket: s3.bucket, Prefix: 'inspections/' }));
    return out.KeyCount ?? 0;
  };
  const photoRows = async (c: Client, inspectionId: string) => (await c.get(`/api/inspections/${inspectionId}`)).body.photoCount as number;

  beforeAll(async () => {
    s3Dir = mkdtempSync(join(tmpdir(), 'cagewright-s3-'));
    s3 = await startFakeS3({ dataDir: s3Dir, setEnv: false });
    const env = {
      S3_ENDPOINT: s3.endpoint,
      S3_BUCKET: s3.bucket,
      S3_ACCESS_KEY_ID: 'S3RVER',
      S3_SECRET_ACCESS_KEY: 'S3RVER',
      S3_REGION: 'us-east-1',
    };
    server = await startServer({ env });
    bucket = new S3Client({
      endpoint: s3.endpoint,
      region: 'us-east-1',
      forcePathStyle: true,
      credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
    });
    tech = new Client(server.baseUrl);
    await tech.signIn(DEMO.technician);
    olive = new Client(server.baseUrl);
    await olive.signIn(DEMO.operator);
    dev = new Client(server.baseUrl);
    await dev.signIn(DEMO.operator2);
    admin = new Client(server.baseUrl);
    await admin.signIn(DEMO.dealerAdmin);
    const machines = (await tech.get('/api/machines?pageSize=100')).body.items as { id: string; orgName: string; nickname: string }[];
    larkspurMachine = machines.find((m) => m.orgName === 'Larkspur Farms')!.id;
    haldaneMachine = machines.find((m) => m.nickname === 'Bean Runner')!.id;
  }, 120_000);

  afterAll(async () => {
    await server?.stop();
    await s3?.stop();
    if (server) removeDir(server.dataDir);
    removeDir(s3Dir);
  });

  it('seeds a finished demo inspection with photos in the bucket and two elements flagged', async () => {
    const list = await olive.get('/api/inspections');
    expect(list.status).toBe(200);
    const demo = list.body.items.find((i: any) => i.machineId === larkspurMachine);
    expect(demo).toMatchObject({ status: 'finished', replace: 2 });
    expect(demo.photoCount).toBeGreaterThanOrEqual(2);
    const detail = (await olive.get(`/api/inspections/${demo.id}`)).body;
    const flagged = detail.items.filter((i: any) => i.severity === 'replace');
    expect(flagged.map((i: any) => i.kind)).toEqual(['element', 'element']);
    expect(detail.partsRequest.lines.map((l: any) => l.partNumber).sort()).toEqual(flagged.map((i: any) => i.partNumber).sort());
    expect(await objectCount()).toBe(detail.photoCount * 2); // each photo and its thumbnail
    const photo = detail.items.flatMap((i: any) => i.photos)[0];
    const res = await olive.fetch(photo.url);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('image/jpeg');
  });

  it('builds the checklist from what is installed: every element, the bar rows, and the survey last', async () => {
    const res = await tech.post(`/api/machines/${haldaneMachine}/inspections`, { title: 'Before soybeans' });
    expect(res.status).toBe(201);
    const insp = res.body;
    expect(insp).toMatchObject({
      status: 'open',
      title: 'Before soybeans',
      startedByName: 'Tomas Reyes',
      machine: { id: haldaneMachine, nickname: 'Bean Runner' },
    });
    const kinds = insp.items.map((i: any) => i.kind);
    expect(kinds.filter((k: string) => k === 'element')).toHaveLength(8); // four positions, both sides
    expect(kinds.at(-1)).toBe('survey');
    expect(kinds).toContain('row');
    const survey = insp.items.at(-1);
    expect(survey.measurements.setClearanceMm).toBeGreaterThan(0);
    expect(survey.measurements.toleranceMm).toBeGreaterThan(0);
  });

  it('uploads a real PNG and a real JPEG and reads each back (re-encoded: the PNG pixel for pixel), with a thumbnail', async () => {
    const insp = (await tech.post(`/api/machines/${haldaneMachine}/inspections`, {})).body;
    const item = insp.items[0];
    const before = await objectCount();
    const png = await smallPng();
    // The name and the claimed type lie; the content decides.
    const up = await upload(tech, insp.id, item.id, form(png, 'IMG_0001.HEIC', 'application/octet-stream'));
    expect(up.status).toBe(201);
    expect(up.body).toMatchObject({ itemId: item.id, contentType: 'image/png', width: 64, height: 48 });
    expect(await objectCount()).toBe(before + 2);

    const got = await tech.fetch(up.body.url);
    expect(got.status).toBe(200);
    expect(got.headers.get('content-type')).toBe('image/png');
    expect(got.headers.get('x-content-type-options')).toBe('nosniff');
    const storedPng = new Uint8Array(await got.arrayBuffer());
    expect(up.body.bytes).toBe(storedPng.byteLength);
    // Every photo is re-encoded (so no metadata block survives); PNG is lossless, so the pixels are the same.
    expect((await pixels(storedPng)).equals(await pixels(png))).toBe(true);

    const jpeg = await smallJpeg();
    const up2 = await upload(tech, insp.id, item.id, form(jpeg, 'worn.jpg', 'image/jpeg'));
    expect(up2.status).toBe(201);
    const got2 = await tech.fetch(up2.body.url);
    expect(got2.headers.get('content-type')).toBe('image/jpeg');
    const storedJpeg = await sharp(Buffer.from(await got2.arrayBuffer())).metadata();
    expect([storedJpeg.format, storedJpeg.width, storedJpeg.height]).toEqual(['jpeg', 900, 600]);

    const thumb = await tech.fetch(up2.body.thumbUrl);
    expect(thumb.status).toBe(200);
    expect(thumb.headers.get('content-type')).toBe('image/jpeg');
    const meta = await sharp(Buffer.from(await thumb.arrayBuffer())).metadata();
    expect(Math.max(meta.width!, meta.height!)).toBe(480);

    const detail = (await tech.get(`/api/inspections/${insp.id}`)).body;
    expect(detail.items[0].photos.map((p: any) => p.id)).toEqual([up.body.id, up2.body.id]);
    // The farm's operator sees the photo too.
    expect((await dev.fetch(up.body.url)).status).toBe(200);
  });

  it('drops a phone photo’s location and device metadata and stores it upright', async () => {
    const insp = (await tech.post(`/api/machines/${haldaneMachine}/inspections`, {})).body;
    const item = insp.items[2];
    // 90 × 60 pixels, stored turned (orientation 6: shown a quarter turn clockwise), with GPS.
    const phone = await sharp({ create: { width: 90, height: 60, channels: 3, background: '#6b7b8d' } })
      .jpeg()
      .withExif({
        IFD0: { Make: 'InventedCam', Model: 'Field 1' },
        IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '52/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '106/1 40/1 0/1' },
      })
      .withMetadata({ orientation: 6 })
      .toBuffer();
    expect((await sharp(phone).metadata()).exif).toBeDefined();
    const up = await upload(tech, insp.id, item.id, form(new Uint8Array(phone), 'IMG_2041.jpg', 'image/jpeg'));
    expect(up.status).toBe(201);
    expect(up.body).toMatchObject({ contentType: 'image/jpeg', width: 60, height: 90 });
    const stored = Buffer.from(await (await tech.fetch(up.body.url)).arrayBuffer());
    const meta = await sharp(stored).metadata();
    expect([meta.width, meta.height, meta.exif, meta.xmp, meta.orientation]).toEqual([60, 90, undefined, undefined, undefined]);
    expect(stored.toString('latin1')).not.toContain('InventedCam');
    expect(up.body.bytes).toBe(stored.byteLength);
  });

  it('refuses a text file named .jpg (415), an image-looking fake (415) and an oversize file (413), storing nothing', async () => {
    const insp = (await tech.post(`/api/machines/${haldaneMachine}/inspections`, {})).body;
    const item = insp.items[1];
    const objects = await objectCount();
    const rows = await photoRows(tech, insp.id);

    const text = await upload(tech, insp.id, item.id, form('these are notes, not a picture\n', 'photo.jpg', 'image/jpeg'));
    expect(text.status).toBe(415);
    expect(text.body.error.field).toBe('photo');

    const fakeJpeg = new Uint8Array(4096);
    fakeJpeg.set([0xff, 0xd8, 0xff, 0xe0]);
    expect((await upload(tech, insp.id, item.id, form(fakeJpeg, 'fake.jpg', 'image/jpeg'))).status).toBe(415);

    const svg = '<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>';
    expect((await upload(tech, insp.id, item.id, form(svg, 'x.png', 'image/png'))).status).toBe(415);

    const big = new Uint8Array(MAX + 1);
    big.set(await smallJpeg(32, 32));
    const over = await upload(tech, insp.id, item.id, form(big, 'huge.jpg', 'image/jpeg'));
    expect(over.status).toBe(413);
    expect(over.body.error.message).toMatch(/8 MB/);

    // A body declared larger than the limit is refused before it is read: the answer comes
    // while the client has sent only a few bytes of it.
    const declared = await declaredTooLarge(tech, `/api/inspections/${insp.id}/items/${item.id}/photos`);
    expect(declared).toBe(413);

    const wrongEnvelope = await tech.fetch(`/api/inspections/${insp.id}/items/${item.id}/photos`, {
      method: 'POST',
      headers: { 'content-type': 'image/jpeg' },
      body: (await smallJpeg(16, 16)) as BodyInit,
    });
    expect(wrongEnvelope.status).toBe(415);

    const noField = new FormData();
    noField.set('picture', new File([(await smallPng()) as BlobPart], 'a.png'));
    const missing = await upload(tech, insp.id, item.id, noField);
    expect(missing.status).toBe(400);
    expect(missing.body.error.field).toBe('photo');

    expect(await objectCount()).toBe(objects);
    expect(await photoRows(tech, insp.id)).toBe(rows);
  });

  it('hides another organisation’s inspection, its lines and its photos (404), and refuses the signed-out (401)', async () => {
    const insp = (await dev.post(`/api/machines/${haldaneMachine}/inspections`, {})).body;
    const item = insp.items[0];
    const photo = (await upload(dev, insp.id, item.id, form(await smallPng(), 'a.png', 'image/png'))).body;
    const objects = await objectCount();

    expect((await olive.get(`/api/inspections/${insp.id}`)).status).toBe(404);
    expect((await olive.patch(`/api/inspections/${insp.id}`, { items: [{ id: item.id, severity: 'replace' }] })).status).toBe(404);
    expect((await olive.post(`/api/inspections/${insp.id}`, { action: 'finish' })).status).toBe(404);
    expect((await upload(olive, insp.id, item.id, form(await smallPng(), 'a.png', 'image/png'))).status).toBe(404);
    expect((await olive.fetch(photo.url)).status).toBe(404);
    expect((await olive.fetch(photo.thumbUrl)).status).toBe(404);
    expect((await olive.delete(photo.url)).status).toBe(404);
    expect((await olive.get(`/api/machines/${haldaneMachine}/inspections`)).status).toBe(404);
    expect((await olive.post(`/api/machines/${haldaneMachine}/inspections`, {})).status).toBe(404);
    expect((await olive.get('/api/inspections')).body.items.every((i: any) => i.machineId !== haldaneMachine)).toBe(true);
    // A bad id is simply not found.
    expect((await olive.get('/api/inspections/not-a-uuid')).status).toBe(404);
    expect((await olive.get('/api/photos/00000000-0000-4000-8000-000000000000')).status).toBe(404);

    const anon = new Client(server.baseUrl);
    expect((await anon.get(`/api/inspections/${insp.id}`)).status).toBe(401);
    expect((await anon.get('/api/inspections')).status).toBe(401);
    expect((await anon.fetch(photo.url)).status).toBe(401);
    expect((await upload(anon, insp.id, item.id, form(await smallPng(), 'a.png', 'image/png'))).status).toBe(401);
    expect((await anon.post(`/api/machines/${haldaneMachine}/inspections`, {})).status).toBe(401);

    // The trainer (dealer staff) may look but not write.
    const trainer = new Client(server.baseUrl);
    await trainer.signIn(DEMO.trainer);
    expect((await trainer.get(`/api/inspections/${insp.id}`)).status).toBe(200);
    expect((await trainer.post(`/api/machines/${haldaneMachine}/inspections`, {})).status).toBe(403);
    expect((await upload(trainer, insp.id, item.id, form(await smallPng(), 'a.png', 'image/png'))).status).toBe(403);
    expect(await objectCount()).toBe(objects);

    // The owner removes the photo: row and both objects go.
    expect((await dev.delete(photo.url)).status).toBe(200);
    expect(await objectCount()).toBe(objects - 2);
    expect((await dev.fetch(photo.url)).status).toBe(404);
  });

  it('records findings, checks them against the line, and refuses what does not apply (400 naming the field)', async () => {
    const insp = (await tech.post(`/api/machines/${haldaneMachine}/inspections`, {})).body;
    const el = insp.items.find((i: any) => i.kind === 'element');
    const row = insp.items.find((i: any) => i.kind === 'row');
    const survey = insp.items.find((i: any) => i.kind === 'survey');

    const ok = await tech.patch(`/api/inspections/${insp.id}`, {
      items: [
        { id: el.id, conditions: ['wires-missing', 'edge-wear'], measurements: { wearMm: 7.2 }, note: 'Front wires gone' },
        // Left and right 1.2 tolerances apart, each within a tolerance of the set clearance: uneven side to side only.
        {
          id: survey.id,
          measurements: {
            'clearance:1:left:front': round1(survey.measurements.setClearanceMm - 0.6 * survey.measurements.toleranceMm),
            'clearance:1:right:front': round1(survey.measurements.setClearanceMm + 0.6 * survey.measurements.toleranceMm),
          },
        },
      ],
    });
    expect(ok.status).toBe(200);
    const saved = ok.body.items.find((i: any) => i.id === el.id);
    expect(saved).toMatchObject({
      conditions: ['wires-missing', 'edge-wear'],
      measurements: { wearMm: 7.2 },
      note: 'Front wires gone',
      severity: 'ok',
      suggested: 'replace',
    });
    expect(ok.body.survey.uneven).toBe(true);
    expect(ok.body.survey.findings[0]).toMatchObject({ kind: 'side-to-side', position: 1, where: 'front' });

    const cleared = await tech.patch(`/api/inspections/${insp.id}`, { items: [{ id: el.id, measurements: { wearMm: null } }] });
    expect(cleared.body.items.find((i: any) => i.id === el.id).measurements).toEqual({});

    const bad = [
      [{ items: [{ id: row.id, conditions: ['wires-missing'] }] }, 'items.0.conditions.0'],
      [{ items: [{ id: el.id, conditions: ['rusty'] }] }, 'items.0.conditions.0'],
      [{ items: [{ id: el.id, measurements: { 'clearance:1:left:front': 3 } }] }, 'items.0.measurements.clearance:1:left:front'],
      [{ items: [{ id: survey.id, measurements: { 'clearance:9:left:front': 3 } }] }, 'items.0.measurements.clearance:9:left:front'],
      [{ items: [{ id: el.id, measurements: { wearMm: 80 } }] }, 'items.0.measurements.wearMm'],
      [{ items: [{ id: el.id, measurements: { wearMm: -1 } }] }, 'items.0.measurements.wearMm'],
      [{ items: [{ id: el.id, severity: 'scrap' }] }, 'items.0.severity'],
      [{ items: [{ id: el.id, note: 'x'.repeat(2001) }] }, 'items.0.note'],
      [{ items: [{ id: el.id, note: 'nul \u0000 inside' }] }, 'items.0.note'],
      [{ items: [{ id: el.id }, { id: el.id }] }, 'items.1.id'],
    ] as const;
    for (const [body, field] of bad) {
      const res = await tech.patch(`/api/inspections/${insp.id}`, body);
      expect(res.status, JSON.stringify(body).slice(0, 80)).toBe(400);
      expect(res.body.error.field).toBe(field);
    }
    // A line of another inspection is not one of these lines.
    const other = (await tech.post(`/api/machines/${haldaneMachine}/inspections`, {})).body;
    const foreign = await tech.patch(`/api/inspections/${insp.id}`, { items: [{ id: other.items[0].id, severity: 'replace' }] });
    expect(foreign.status).toBe(404);
    expect(foreign.body.error.field).toBe('items.0.id');
    // Nothing of the refused updates was written.
    const after = (await tech.get(`/api/inspections/${insp.id}`)).body.items.find((i: any) => i.id === el.id);
    expect(after).toMatchObject({ conditions: ['wires-missing', 'edge-wear'], severity: 'ok', note: 'Front wires gone', measurements: {} });
    expect((await tech.post(`/api/inspections/${insp.id}`, { action: 'reopen' })).body.error.field).toBe('action');
  });

  it('answers random bodies with a 4xx naming what is wrong, never a 5xx, and changes nothing when it refuses', async () => {
    const insp = (await tech.post(`/api/machines/${haldaneMachine}/inspections`, {})).body;
    const ids = insp.items.map((i: any) => i.id) as string[];
    const state = async () =>
      JSON.stringify(
        (await tech.get(`/api/inspections/${insp.id}`)).body.items.map((i: any) => [i.conditions, i.severity, i.measurements, i.note]),
      );
    const item = fc.record(
      {
        id: fc.oneof(fc.constantFrom(...ids), fc.uuid(), fc.string()),
        conditions: fc.oneof(fc.array(fc.constantFrom('bent-bars', 'wires-missing', 'plate-warped', 'rust', '')), fc.anything()),
        severity: fc.oneof(fc.constantFrom('ok', 'watch', 'replace', 'scrap'), fc.anything()),
        measurements: fc.oneof(
          fc.dictionary(
            fc.constantFrom('wearMm', 'clearance:1:left:front', 'clearance:9:left:front', 'x'),
            fc.oneof(fc.double(), fc.constant(null), fc.string()),
          ),
          fc.anything(),
        ),
        note: fc.oneof(fc.string({ maxLength: 20 }), fc.anything()),
      },
      { requiredKeys: ['id'] },
    );
    const body = fc.oneof(
      fc.anything(),
      fc.record(
        { items: fc.array(item, { maxLength: 3 }), title: fc.oneof(fc.string({ maxLength: 10 }), fc.anything()) },
        { requiredKeys: [] },
      ),
    );
    await fc.assert(
      fc.asyncProperty(body, async (b) => {
        const before = await state();
        const res = await tech.patch(`/api/inspections/${insp.id}`, b);
        expect(res.status, JSON.stringify(b)?.slice(0, 200)).toBeLessThan(500);
        if (res.status !== 200) {
          expect([400, 404, 413, 415]).toContain(res.status);
          expect(typeof res.body.error.message).toBe('string');
          expect(await state()).toBe(before);
        }
      }),
      { numRuns: 60 },
    );
    // Random bytes as a photo are never stored.
    const objects = await objectCount();
    await fc.assert(
      fc.asyncProperty(fc.uint8Array({ minLength: 1, maxLength: 2048 }), fc.string({ maxLength: 12 }), async (bytes, name) => {
        const res = await upload(tech, insp.id, ids[0]!, form(bytes, `${name}.jpg`, 'image/jpeg'));
        expect(res.status).toBe(415);
      }),
      { numRuns: 30 },
    );
    expect(await objectCount()).toBe(objects);
    expect(await photoRows(tech, insp.id)).toBe(0);
  }, 120_000);

  it('finishes: flagged elements become a draft parts request of the same part number and hand; then it is closed', async () => {
    const insp = (await tech.post(`/api/machines/${haldaneMachine}/inspections`, {})).body;
    const left = insp.items.find((i: any) => i.placeKey === 'element:1:left');
    const right = insp.items.find((i: any) => i.placeKey === 'element:2:right');
    const watch = insp.items.find((i: any) => i.placeKey === 'element:3:left');
    await tech.patch(`/api/inspections/${insp.id}`, {
      items: [
        { id: left.id, conditions: ['bent-bars'], severity: 'replace' },
        { id: right.id, conditions: ['weld-cracked'], severity: 'replace' },
        { id: watch.id, conditions: ['bolts-loose'], severity: 'watch' },
      ],
    });
    const done = await tech.post(`/api/inspections/${insp.id}`, { action: 'finish' });
    expect(done.status).toBe(200);
    expect(done.body.status).toBe('finished');
    expect(done.body.counts).toMatchObject({ replace: 2, watch: 1 });
    expect(done.body.added).toEqual([
      expect.objectContaining({ partNumber: left.partNumber, hand: 'left', quantity: 1 }),
      expect.objectContaining({ partNumber: right.partNumber, hand: 'right', quantity: 1 }),
    ]);
    expect(done.body.partsRequest).toMatchObject({ id: done.body.partsRequestId, status: 'draft' });
    const lines = done.body.partsRequest.lines as any[];
    expect(lines.find((l) => l.partNumber === left.partNumber)).toMatchObject({ hand: 'left' });
    expect(lines.every((l) => l.unitPriceCents > 0)).toBe(true);

    // The farm sees the request's link on the inspection as well.
    expect((await dev.get(`/api/inspections/${insp.id}`)).body.partsRequest.id).toBe(done.body.partsRequestId);

    // A second finished inspection adds to the same draft.
    const again = (await tech.post(`/api/machines/${haldaneMachine}/inspections`, {})).body;
    const l2 = again.items.find((i: any) => i.placeKey === 'element:1:left');
    await tech.patch(`/api/inspections/${again.id}`, { items: [{ id: l2.id, severity: 'replace' }] });
    const done2 = (await tech.post(`/api/inspections/${again.id}`, { action: 'finish' })).body;
    expect(done2.partsRequestId).toBe(done.body.partsRequestId);
    expect(done2.partsRequest.lines.find((l: any) => l.partNumber === left.partNumber).quantity).toBe(2);

    // Closed: no more changes, photos or finishing.
    expect((await tech.patch(`/api/inspections/${insp.id}`, { items: [{ id: left.id, severity: 'ok' }] })).status).toBe(409);
    expect((await upload(tech, insp.id, left.id, form(await smallPng(), 'a.png', 'image/png'))).status).toBe(409);
    expect((await tech.post(`/api/inspections/${insp.id}`, { action: 'finish' })).status).toBe(409);

    const history = await tech.get(`/api/machines/${haldaneMachine}/inspections`);
    expect(history.status).toBe(200);
    expect(history.body.machine.nickname).toBe('Bean Runner');
    expect(history.body.items.find((i: any) => i.id === insp.id)).toMatchObject({ status: 'finished', replace: 2, watch: 1 });
  });

  it('an uneven clearance survey marked serviceable finishes only as a conscious choice (409 naming acceptUnevenSurvey, nothing changed)', async () => {
    const insp = (await tech.post(`/api/machines/${haldaneMachine}/inspections`, {})).body;
    const survey = insp.items.find((i: any) => i.kind === 'survey');
    const el = insp.items.find((i: any) => i.placeKey === 'element:1:left');
    // Left 20 mm against right 26 mm at the front of position 1: past the tolerance, so uneven.
    await tech.patch(`/api/inspections/${insp.id}`, {
      items: [
        { id: survey.id, severity: 'ok', measurements: { 'clearance:1:left:front': 20, 'clearance:1:right:front': 26 } },
        { id: el.id, severity: 'replace' },
      ],
    });
    const before = (await admin.get('/api/admin/stats')).body;
    const refused = await tech.post(`/api/inspections/${insp.id}`, { action: 'finish' });
    expect(refused.status).toBe(409);
    expect(JSON.stringify(refused.body)).toContain('acceptUnevenSurvey');
    expect((await tech.get(`/api/inspections/${insp.id}`)).body.status).toBe('open');
    expect((await admin.get('/api/admin/stats')).body).toEqual(before);
    // A wrong type for the choice is named.
    const bad = await tech.post(`/api/inspections/${insp.id}`, { action: 'finish', acceptUnevenSurvey: 'yes' });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body)).toContain('acceptUnevenSurvey');

    // Marked to watch, it finishes without more ado; here: accepted as it is.
    const done = await tech.post(`/api/inspections/${insp.id}`, { action: 'finish', acceptUnevenSurvey: true });
    expect(done.status).toBe(200);
    expect(done.body.status).toBe('finished');
    expect(done.body.survey.uneven).toBe(true);
    expect(done.body.items.find((i: any) => i.kind === 'survey').severity).toBe('ok');

    // An uneven survey marked "watch" needs no extra choice.
    const again = (await tech.post(`/api/machines/${haldaneMachine}/inspections`, {})).body;
    const s2 = again.items.find((i: any) => i.kind === 'survey');
    await tech.patch(`/api/inspections/${again.id}`, {
      items: [{ id: s2.id, severity: 'watch', measurements: { 'clearance:1:left:front': 20, 'clearance:1:right:front': 26 } }],
    });
    expect((await tech.post(`/api/inspections/${again.id}`, { action: 'finish' })).status).toBe(200);
  });

  it('will not start a checklist for a machine with nothing recorded as installed (409)', async () => {
    const created = await dev.post('/api/machines', {
      familyId: 'tamarack-m4',
      drum: 'full',
      vaneControl: 'fixed',
      serial: 'HB-0001-T',
      nickname: 'Spare',
    });
    expect(created.status).toBe(201);
    const res = await dev.post(`/api/machines/${created.body.machine.id}/inspections`, {});
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/installed/);
  });
});

describe('inspections with photos on disk (CAGEWRIGHT_STORAGE=disk)', () => {
  let server: RunningServer;
  beforeAll(async () => {
    server = await startServer({ env: { CAGEWRIGHT_STORAGE: 'disk' } });
  }, 120_000);
  afterAll(async () => {
    await server?.stop();
    if (server) removeDir(server.dataDir);
  });

  it('keeps photos under <data dir>/uploads, reads them back, and leaves no file for a refused upload', async () => {
    const uploads = join(server.dataDir, 'uploads');
    expect(readdirSync(server.dataDir)).not.toContain('s3'); // no fake bucket started
    const seeded = filesUnder(uploads).length;
    expect(seeded).toBeGreaterThan(0); // the demo photos

    const tech = new Client(server.baseUrl);
    await tech.signIn(DEMO.technician);
    const machine = ((await tech.get('/api/machines?pageSize=100')).body.items as any[])[0];
    const insp = (await tech.post(`/api/machines/${machine.id}/inspections`, {})).body;
    const item = insp.items[0];
    const png = await smallPng();
    const up = await upload(tech, insp.id, item.id, form(png, 'p.png', 'image/png'));
    expect(up.status).toBe(201);
    expect((await pixels(new Uint8Array(await (await tech.fetch(up.body.url)).arrayBuffer()))).equals(await pixels(png))).toBe(true);
    const after = filesUnder(uploads).length;
    expect(after).toBe(seeded + 4); // photo and thumbnail, each with its type file

    expect((await upload(tech, insp.id, item.id, form('plain text', 'photo.jpg', 'image/jpeg'))).status).toBe(415);
    const big = new Uint8Array(MAX + 10);
    big.set(png);
    expect((await upload(tech, insp.id, item.id, form(big, 'big.png', 'image/png'))).status).toBe(413);
    expect(filesUnder(uploads).length).toBe(after);
    expect(filesUnder(uploads).some((f) => f.endsWith('.part'))).toBe(false);
  });
});
