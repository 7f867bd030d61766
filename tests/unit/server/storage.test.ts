import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { diskStorage } from '~/lib/server/storage/disk';
import { s3Storage } from '~/lib/server/storage/s3';
import { storageFromEnv } from '~/lib/server/storage';
import { assertKey, readAll, type ObjectStorage } from '~/lib/server/storage/types';
import { sniffImageType } from '~/lib/server/image-sniff';
import { startFakeS3 } from '../../../scripts/fakes/s3.mjs';

process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED = 'true';

const bytes = (...b: number[]) => new Uint8Array(b);

/** The same contract for both backends. */
function contract(name: string, make: () => ObjectStorage) {
  describe(`${name} storage`, () => {
    it('gives back exactly the bytes and type it was given', async () => {
      const s = make();
      const data = new Uint8Array(70_000).map((_, i) => (i * 31) % 256);
      await s.put('inspections/a1/p1.png', data, 'image/png');
      const got = await s.get('inspections/a1/p1.png');
      expect(got?.contentType).toBe('image/png');
      expect(got?.size).toBe(data.byteLength);
      expect(await readAll(got!)).toEqual(data);
    });

    it('overwrites under the same key', async () => {
      const s = make();
      await s.put('inspections/a1/p2.jpg', bytes(1, 2, 3), 'image/jpeg');
      await s.put('inspections/a1/p2.jpg', bytes(9), 'image/webp');
      const got = await s.get('inspections/a1/p2.jpg');
      expect(got?.contentType).toBe('image/webp');
      expect(await readAll(got!)).toEqual(bytes(9));
    });

    it('answers null for a missing key and deletes quietly', async () => {
      const s = make();
      expect(await s.get('inspections/none/x.jpg')).toBeNull();
      await s.put('inspections/a1/p3.jpg', bytes(1), 'image/jpeg');
      await s.delete('inspections/a1/p3.jpg');
      expect(await s.get('inspections/a1/p3.jpg')).toBeNull();
      await expect(s.delete('inspections/a1/p3.jpg')).resolves.toBeUndefined();
    });

    it('lists the objects under a prefix with when they were written', async () => {
      const s = make();
      const before = Date.now() - 60_000;
      await s.put('inspections/l1/a.jpg', bytes(1), 'image/jpeg');
      await s.put('inspections/l1/b-thumb.jpg', bytes(2), 'image/jpeg');
      await s.put('other/l1/c.jpg', bytes(3), 'image/jpeg');
      const listed: { key: string; lastModified: Date }[] = [];
      for await (const o of s.list('inspections/l1/')) listed.push(o);
      expect(listed.map((o) => o.key).sort()).toEqual(['inspections/l1/a.jpg', 'inspections/l1/b-thumb.jpg']);
      for (const o of listed) expect(o.lastModified.getTime()).toBeGreaterThan(before);
    });

    it('refuses keys that could leave its folder', async () => {
      const s = make();
      for (const key of ['../etc/passwd', 'a/../../b', '/abs', 'a//b', '', 'A/b', 'a/b c', '..', 'a/./b']) {
        await expect(s.put(key, bytes(1), 'image/png'), key).rejects.toThrow(/refusing the key/);
      }
    });
  });
}

const diskRoot = mkdtempSync(join(tmpdir(), 'cagewright-disk-'));
contract('disk', () => diskStorage(diskRoot));

describe('disk storage files', () => {
  it('keeps the type beside the object and leaves no temporary files', async () => {
    const s = diskStorage(diskRoot);
    await s.put('inspections/b2/p.jpg', bytes(0xff, 0xd8, 0xff), 'image/jpeg');
    const dir = join(diskRoot, 'inspections', 'b2');
    expect(readdirSync(dir).sort()).toEqual(['p.jpg', 'p.jpg.type']);
    await s.delete('inspections/b2/p.jpg');
    expect(readdirSync(dir)).toEqual([]);
  });
});

let fake: { endpoint: string; bucket: string; stop: () => Promise<void> };
const s3Dir = mkdtempSync(join(tmpdir(), 'cagewright-s3unit-'));
beforeAll(async () => {
  fake = await startFakeS3({ dataDir: s3Dir, setEnv: false });
});
afterAll(async () => {
  await fake?.stop();
  rmSync(s3Dir, { recursive: true, force: true });
  rmSync(diskRoot, { recursive: true, force: true });
});
contract('s3 (local fake)', () =>
  s3Storage({ endpoint: fake.endpoint, bucket: fake.bucket, region: 'us-east-1', accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' }),
);

describe('choosing a backend', () => {
  it('uses S3 when an endpoint and a bucket are given, disk when told so or when none is', () => {
    const s3env = { S3_ENDPOINT: 'http://127.0.0.1:9', S3_BUCKET: 'b' } as NodeJS.ProcessEnv;
    expect(storageFromEnv(s3env).kind).toBe('s3');
    expect(storageFromEnv({ ...s3env, CAGEWRIGHT_STORAGE: 'disk', CAGEWRIGHT_DATA_DIR: '/tmp/x' } as NodeJS.ProcessEnv).kind).toBe('disk');
    expect(storageFromEnv({ S3_BUCKET: 'b' } as NodeJS.ProcessEnv).kind).toBe('disk');
  });

  it('the fake created its bucket under <data dir>/s3', () => {
    expect(existsSync(join(s3Dir, 's3', fake.bucket))).toBe(true);
  });
});

describe('sniffImageType (signatures: JPEG ISO/IEC 10918-1, PNG ISO/IEC 15948, WebP RIFF container)', () => {
  it('knows the three photo formats by their first bytes', () => {
    expect(sniffImageType(bytes(0xff, 0xd8, 0xff, 0xe0, 0, 0))).toBe('image/jpeg');
    expect(sniffImageType(bytes(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0))).toBe('image/png');
    expect(sniffImageType(new TextEncoder().encode('RIFF\u0000\u0000\u0000\u0000WEBPVP8 '))).toBe('image/webp');
  });

  it('refuses everything else, whatever it is called', () => {
    expect(sniffImageType(new TextEncoder().encode('hello, I am a .jpg'))).toBeNull();
    expect(sniffImageType(new TextEncoder().encode('GIF89a'))).toBeNull();
    expect(sniffImageType(new TextEncoder().encode('<svg xmlns="http://www.w3.org/2000/svg"/>'))).toBeNull();
    expect(sniffImageType(new TextEncoder().encode('RIFF\u0000\u0000\u0000\u0000WAVEfmt '))).toBeNull();
    expect(sniffImageType(bytes(0xff, 0xd8))).toBeNull(); // cut short
    expect(sniffImageType(bytes(0x89, 0x50, 0x4e, 0x47))).toBeNull();
    expect(sniffImageType(new Uint8Array())).toBeNull();
  });

  it('checks keys on their own', () => {
    expect(() => assertKey('inspections/0f/1a-thumb.jpg')).not.toThrow();
    expect(() => assertKey('inspections/../x')).toThrow();
  });
});
