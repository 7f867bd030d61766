// Compression by the app server itself (scripts/http/serve.mjs): pages on the fly, static files
// from the build's precompressed twins, each by Accept-Encoding, with Vary: Accept-Encoding.
// Raw bytes are read with node:http, since fetch would decode them for us.
import { request } from 'node:http';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { Client, machineWithLayout, signedIn } from './client';
import { outDir } from './server';

interface Raw {
  status: number;
  headers: Record<string, string | string[] | undefined>;
  body: Buffer;
}

function raw(path: string, headers: Record<string, string> = {}, method = 'GET'): Promise<Raw> {
  const base = new URL(inject('baseUrl'));
  return new Promise((resolve, reject) => {
    const req = request({ host: base.hostname, port: base.port, path, method, headers }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(chunks) }));
      res.on('error', reject);
    });
    req.on('error', reject);
    req.end();
  });
}

const decode = (r: Raw) => {
  const enc = r.headers['content-encoding'];
  if (enc === 'br') return brotliDecompressSync(r.body);
  if (enc === 'gzip') return gunzipSync(r.body);
  if (enc === undefined) return r.body;
  throw new Error(`unexpected encoding ${enc}`);
};

const varies = (r: Raw) =>
  String(r.headers.vary ?? '')
    .split(',')
    .map((v) => v.trim().toLowerCase())
    .includes('accept-encoding');

let olive: Client;
let sharePath: string;
let editorPath: string;
let scripts: string[];
let styles: string[];

beforeAll(async () => {
  olive = await signedIn('operator');
  const { machineId, layout } = await machineWithLayout(olive);
  editorPath = `/machines/${machineId}/layouts/${layout.id}`;
  const html = await (await olive.fetch(editorPath)).text();
  scripts = [...new Set([...html.matchAll(/"(\/_astro\/[^"]+\.js)"/g)].map((m) => m[1]!))];
  styles = [...new Set([...html.matchAll(/href="(\/_astro\/[^"]+\.css)"/g)].map((m) => m[1]!))];
  const current = (await olive.get(`/api/layouts/${layout.id}`)).body.layout.currentVersion;
  const share = await olive.post('/api/share-links', { layoutId: layout.id, version: current, label: 'compression' });
  expect(share.status, JSON.stringify(share.body)).toBe(201);
  sharePath = share.body.path;
});

describe('pages', () => {
  it('the share page comes back in brotli or gzip as asked, and decodes to the same bytes as the plain one', async () => {
    const plain = await raw(sharePath);
    expect(plain.status).toBe(200);
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(varies(plain)).toBe(true);
    expect(plain.body.toString()).toContain('<html');

    const br = await raw(sharePath, { 'accept-encoding': 'gzip, deflate, br' });
    expect(br.headers['content-encoding']).toBe('br');
    expect(varies(br)).toBe(true);
    expect(br.body.length).toBeLessThan(plain.body.length / 2);
    expect(decode(br).equals(plain.body)).toBe(true);

    const gz = await raw(sharePath, { 'accept-encoding': 'gzip' });
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(decode(gz).equals(plain.body)).toBe(true);
  });

  it('the share page still carries no script', async () => {
    const html = decode(await raw(sharePath, { 'accept-encoding': 'br' })).toString();
    expect(html).not.toMatch(/<script/i);
  });

  it('a signed-in page is compressed too', async () => {
    const cookie = (olive as any).cookieHeader() as string;
    const r = await raw(editorPath, { cookie, 'accept-encoding': 'br;q=0.5, gzip;q=1' });
    expect(r.status).toBe(200);
    expect(r.headers['content-encoding']).toBe('gzip');
    expect(varies(r)).toBe(true);
    expect(decode(r).toString()).toContain('astro-island');
  });

  it('no encoding without Accept-Encoding, nor when only identity is accepted', async () => {
    const cases: Record<string, string>[] = [{}, { 'accept-encoding': 'identity' }, { 'accept-encoding': 'br;q=0, gzip;q=0' }];
    for (const headers of cases) {
      const r = await raw(sharePath, headers);
      expect(r.status).toBe(200);
      expect(r.headers['content-encoding'], JSON.stringify(headers)).toBeUndefined();
    }
  });

  it('API JSON above a kilobyte is compressed when asked', async () => {
    const cookie = (olive as any).cookieHeader() as string;
    const plain = await raw('/api/machines?pageSize=50', { cookie });
    const br = await raw('/api/machines?pageSize=50', { cookie, 'accept-encoding': 'br' });
    expect(br.headers['content-encoding']).toBe('br');
    expect(JSON.parse(decode(br).toString()).total).toBe(JSON.parse(plain.body.toString()).total);
  });
});

describe('scripts and styles', () => {
  it('the editor page names scripts and a style sheet', () => {
    expect(scripts.length).toBeGreaterThan(0);
    expect(styles.length).toBeGreaterThan(0);
  });

  it('each comes back compressed as asked and decodes to the built file', async () => {
    for (const path of [...scripts, ...styles]) {
      const onDisk = readFileSync(join(outDir(), 'client', path));
      const plain = await raw(path);
      expect(plain.status, path).toBe(200);
      expect(plain.headers['content-encoding'], path).toBeUndefined();
      expect(plain.body.equals(onDisk), path).toBe(true);
      if (onDisk.length < 1024) continue; // too small to be worth it
      expect(varies(plain), path).toBe(true);
      for (const [accept, want] of [
        ['br, gzip', 'br'],
        ['gzip', 'gzip'],
      ] as const) {
        const r = await raw(path, { 'accept-encoding': accept });
        expect(r.headers['content-encoding'], `${path} ${accept}`).toBe(want);
        expect(varies(r)).toBe(true);
        expect(r.headers['content-type']).toMatch(path.endsWith('.js') ? /javascript/ : /text\/css/);
        expect(r.headers['cache-control']).toMatch(/immutable/);
        expect(Number(r.headers['content-length'])).toBe(r.body.length);
        expect(decode(r).equals(onDisk), `${path} ${accept}`).toBe(true);
      }
    }
  });

  it('answers a repeat request with 304 and HEAD without a body', async () => {
    const path = scripts.find((p) => readFileSync(join(outDir(), 'client', p)).length >= 1024)!;
    const first = await raw(path, { 'accept-encoding': 'br' });
    const etag = String(first.headers.etag);
    const again = await raw(path, { 'accept-encoding': 'br', 'if-none-match': etag });
    expect(again.status).toBe(304);
    expect(again.body.length).toBe(0);
    // Another encoding is another entity: no 304 for the gzip twin with the brotli tag.
    const other = await raw(path, { 'accept-encoding': 'gzip', 'if-none-match': etag });
    expect(other.status).toBe(200);
    const head = await raw(path, { 'accept-encoding': 'br' }, 'HEAD');
    expect(head.status).toBe(200);
    expect(head.headers['content-encoding']).toBe('br');
    expect(head.body.length).toBe(0);
  });

  it('a path that is not a built file is not served from the precompressed store', async () => {
    const r = await raw('/_astro/../server/entry.mjs', { 'accept-encoding': 'br' });
    expect(r.status).not.toBe(200);
    const twin = await raw(`${scripts[0]}.br`, { 'accept-encoding': 'br' });
    // The twin itself is only ever sent as the encoding of its file, never named directly as JS.
    expect(String(twin.headers['content-type'] ?? '')).not.toMatch(/javascript/);
  });
});
