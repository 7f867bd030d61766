import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import sharp from 'sharp';
import { Client, DEMO } from './client';
import { removeDir, startServer, type RunningServer } from './server';
import { hugePng, withJpegComment, withPngText } from './fixtures/images';

/**
 * Upload validation: a picture's size in pixels is checked from its header before anything is
 * decoded; the per-line cap holds under parallel uploads; nothing but the picture (and its colour
 * profile) survives storage. The server keeps photos on disk here so files can be counted, and
 * has a 4-megapixel limit (CAGEWRIGHT_MAX_PHOTO_PIXELS) so the limit is a setting, not a constant.
 */
const MAX_PIXELS = 4_000_000;
const PER_LINE = 12;

function filesUnder(dir: string): string[] {
  let names: string[] = [];
  try {
    names = readdirSync(dir);
  } catch {
    return [];
  }
  return names.flatMap((n) => (statSync(join(dir, n)).isDirectory() ? filesUnder(join(dir, n)) : [join(dir, n)]));
}

function form(bytes: Uint8Array, name: string): FormData {
  const f = new FormData();
  f.set('photo', new File([bytes as BlobPart], name));
  return f;
}

describe('photo uploads: pixel limit, parallel cap, metadata', () => {
  let server: RunningServer;
  let tech: Client;
  let machineId: string;
  let uploads: string;

  beforeAll(async () => {
    server = await startServer({ env: { CAGEWRIGHT_STORAGE: 'disk', CAGEWRIGHT_MAX_PHOTO_PIXELS: String(MAX_PIXELS) } });
    uploads = join(server.dataDir, 'uploads');
    tech = new Client(server.baseUrl);
    await tech.signIn(DEMO.technician);
    const machines = (await tech.get('/api/machines?pageSize=100')).body.items as { id: string; nickname: string }[];
    machineId = machines.find((m) => m.nickname === 'Bean Runner')!.id;
  }, 120_000);

  afterAll(async () => {
    await server?.stop();
    if (server) removeDir(server.dataDir);
  });

  const newLine = async () => {
    const insp = (await tech.post(`/api/machines/${machineId}/inspections`, {})).body;
    return { inspectionId: insp.id as string, itemId: insp.items[0].id as string };
  };
  const upload = async (line: { inspectionId: string; itemId: string }, bytes: Uint8Array, name = 'p.png') => {
    const res = await tech.fetch(`/api/inspections/${line.inspectionId}/items/${line.itemId}/photos`, {
      method: 'POST',
      body: form(bytes, name),
    });
    return { status: res.status, body: await res.json() };
  };
  const photosOn = async (line: { inspectionId: string; itemId: string }) =>
    ((await tech.get(`/api/inspections/${line.inspectionId}`)).body.items as { id: string; photos?: unknown[] }[]).find(
      (i) => i.id === line.itemId,
    )!.photos?.length ?? 0;

  it('refuses a 31 KB PNG that declares 16000 × 16000 pixels at once (413 naming the photo), storing nothing', async () => {
    const line = await newLine();
    const bomb = hugePng(16000, 16000);
    expect(bomb.byteLength).toBeLessThan(40_000);
    const files = filesUnder(uploads).length;
    const started = Date.now();
    const r = await upload(line, bomb, 'bomb.png');
    const ms = Date.now() - started;
    expect(r.status, JSON.stringify(r.body)).toBe(413);
    expect(r.body.error).toMatchObject({ field: 'photo', width: 16000, height: 16000, maxPixels: MAX_PIXELS });
    // Decoding it took seconds of CPU; reading its header takes milliseconds (generous bound for a shared machine).
    expect(ms).toBeLessThan(1500);
    expect(filesUnder(uploads).length).toBe(files);
    expect(await photosOn(line)).toBe(0);
  });

  it('the limit is width × height against the setting: one pixel over is refused, exactly at it is kept', async () => {
    const line = await newLine();
    const over = await upload(line, hugePng(2001, 2000));
    expect(over.status).toBe(413);
    expect(over.body.error.field).toBe('photo');
    const at = await upload(line, hugePng(2000, 2000));
    expect(at.status, JSON.stringify(at.body)).toBe(201);
    expect(at.body).toMatchObject({ width: 2000, height: 2000 });
    expect(await photosOn(line)).toBe(1);
  });

  it(`30 uploads in parallel to one line store exactly ${PER_LINE}; the rest get 409 and leave no file`, async () => {
    const line = await newLine();
    const files = filesUnder(uploads).length;
    const png = new Uint8Array(
      await sharp({ create: { width: 40, height: 30, channels: 3, background: '#4a6a5a' } })
        .png()
        .toBuffer(),
    );
    const results = await Promise.all(Array.from({ length: 30 }, () => upload(line, png)));
    const statuses = results.map((r) => r.status);
    expect(statuses.filter((s) => s === 201).length, statuses.join(',')).toBe(PER_LINE);
    expect(statuses.filter((s) => s === 409).length, statuses.join(',')).toBe(30 - PER_LINE);
    for (const r of results.filter((x) => x.status === 409)) expect(r.body.error.field).toBe('photo');
    expect(await photosOn(line)).toBe(PER_LINE);
    // Each stored photo is an original and a thumbnail, each with its type file on disk.
    expect(filesUnder(uploads).length).toBe(files + PER_LINE * 4);
  }, 60_000);

  it('drops a PNG tEXt chunk and a JPEG comment: the stored bytes carry neither', async () => {
    const line = await newLine();
    const base = await sharp({ create: { width: 48, height: 32, channels: 3, background: '#7a6a5a' } })
      .png()
      .toBuffer();
    const png = withPngText(base, 'Comment', 'farm-secret-png-note');
    expect(Buffer.from(png).includes('farm-secret-png-note')).toBe(true);
    expect((await sharp(png).metadata()).comments).toEqual([{ keyword: 'Comment', text: 'farm-secret-png-note' }]);
    const up = await upload(line, png, 'noted.png');
    expect(up.status, JSON.stringify(up.body)).toBe(201);
    const stored = Buffer.from(await (await tech.fetch(up.body.url)).arrayBuffer());
    expect(stored.includes('farm-secret-png-note')).toBe(false);
    expect(stored.includes('tEXt')).toBe(false);
    expect((await sharp(stored).metadata()).comments).toBeUndefined();
    // Same picture: PNG is lossless.
    expect((await sharp(stored).raw().toBuffer()).equals(await sharp(base).raw().toBuffer())).toBe(true);

    const jpeg = withJpegComment(
      await sharp({ create: { width: 48, height: 32, channels: 3, background: '#5a6a7a' } })
        .jpeg()
        .toBuffer(),
      'farm-secret-jpeg-note',
    );
    expect(Buffer.from(jpeg).includes('farm-secret-jpeg-note')).toBe(true);
    const up2 = await upload(line, jpeg, 'noted.jpg');
    expect(up2.status, JSON.stringify(up2.body)).toBe(201);
    const stored2 = Buffer.from(await (await tech.fetch(up2.body.url)).arrayBuffer());
    expect(stored2.includes('farm-secret-jpeg-note')).toBe(false);
    // No COM segment (0xFFFE) before the image data starts (start of scan, 0xFFDA).
    const sos = stored2.indexOf(Buffer.from([0xff, 0xda]));
    expect(stored2.subarray(0, sos).includes(Buffer.from([0xff, 0xfe]))).toBe(false);
    expect((await sharp(stored2).metadata()).format).toBe('jpeg');
  });
});
