import { gzipSync } from 'node:zlib';
import { beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn } from './client';
import { machineByNickname, newLayout, saveChanged, uniq, type MachineItem } from './fleet-helpers';

let olive: Client;
let dev: Client;
let tomas: Client;
let priya: Client;
let northQuarter: MachineItem;
let layoutId: string;

beforeAll(async () => {
  [olive, dev, tomas, priya] = await Promise.all([
    signedIn('operator'),
    signedIn('operator2'),
    signedIn('technician'),
    signedIn('trainer'),
  ]);
  northQuarter = await machineByNickname(olive, 'North Quarter');
  const { layout } = await newLayout(olive, northQuarter.id, uniq('Canola, shared'), 'canola');
  layoutId = layout.id;
  await saveChanged(olive, layoutId, (b) => (b.rotorRpm = 640), 'a touch slower');
});

async function share(c: Client, body: Record<string, unknown> = {}) {
  return c.post('/api/share-links', { layoutId, version: 1, label: 'for the shop', ...body });
}

async function linksOf(c: Client) {
  const res = await c.get(`/api/share-links?layoutId=${layoutId}`);
  expect(res.status).toBe(200);
  return res.body.links as any[];
}

describe('creating and listing share links', () => {
  it('creates a link with a long random token; the store keeps only its hash', async () => {
    const res = await share(olive, { label: 'Shop wall' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const { token, path, url, link } = res.body;
    // 43 base64url characters = 256 bits (≥ 128 required).
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(path).toBe(`/share/${token}`);
    expect(url.endsWith(path)).toBe(true);
    expect(link).toMatchObject({ label: 'Shop wall', version: 1, status: 'active', layoutId });
    expect(JSON.stringify(link)).not.toContain(token);
    expect(link).not.toHaveProperty('tokenHash');
    const second = await share(olive);
    expect(second.body.token).not.toBe(token);
    const list = await linksOf(olive);
    expect(list.map((l) => l.id)).toEqual(expect.arrayContaining([link.id, second.body.link.id]));
    expect(JSON.stringify(list)).not.toContain(token);
    expect(JSON.stringify(list)).not.toMatch(/tokenHash|token_hash/);
    // The dealer's technician sees the farm's links; the other farm sees none of them.
    expect((await linksOf(tomas)).map((l) => l.id)).toContain(link.id);
    expect(await linksOf(dev)).toEqual([]);
  });

  it('refuses the signed-out, a trainer and another farm', async () => {
    const before = (await linksOf(olive)).length;
    expect((await share(new Client())).status).toBe(401);
    expect((await new Client().get('/api/share-links')).status).toBe(401);
    expect((await share(priya)).status).toBe(403);
    const foreign = await share(dev);
    expect(foreign.status).toBe(404);
    expect(foreign.body.error.field).toBe('layoutId');
    expect((await linksOf(olive)).length).toBe(before);
  });

  it('names the bad field and writes nothing', async () => {
    const before = (await linksOf(olive)).length;
    const cases: [Record<string, unknown>, string][] = [
      [{ version: 99 }, 'version'],
      [{ version: 0 }, 'version'],
      [{ layoutId: 'nope' }, 'layoutId'],
      [{ label: 'x'.repeat(300) }, 'label'],
      [{ expiresAt: 'next tuesday' }, 'expiresAt'],
      [{ expiresAt: '2020-01-01T00:00:00Z' }, 'expiresAt'],
    ];
    for (const [body, field] of cases) {
      const res = await share(olive, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.field).toBe(field);
      expect(res.body.error.message).toContain(field);
    }
    expect((await olive.get('/api/share-links?status=sometimes')).body.error.field).toBe('status');
    expect((await linksOf(olive)).length).toBe(before);
  });
});

describe('the shared page', () => {
  it('opens without a session, read-only, server-rendered, not indexed, with almost no script', async () => {
    const { body } = await share(olive, { label: 'Read me' });
    const anon = new Client();
    const res = await anon.fetch(body.path);
    expect(res.status).toBe(200);
    expect(res.headers.get('x-robots-tag')).toMatch(/noindex/);
    expect(res.headers.get('cache-control')).toBe('no-store');
    const html = await res.text();
    expect(html).toContain('<meta name="robots" content="noindex, nofollow"');
    expect(html).toContain('Canola, shared');
    expect(html).toContain('North Quarter');
    expect(html).toContain('“Read me”');
    // The diagram is drawn on the server: slots carry their place keys.
    expect(html).toMatch(/<svg[^>]*>/);
    expect(html).toContain('data-place="element:1:left"');
    // Settings with the tip speed, findings, parts list and the safety cautions.
    expect(html).toContain('Rotor tip speed');
    expect(html).toMatch(/\d+\.\d m\/s/);
    expect(html).toContain('Findings');
    expect(html).toContain('Parts list');
    expect(html).toMatch(/CW-[A-Z]{2}-[LR]-04/);
    expect(html).toContain('Safety before you work on the cage');
    expect(html).toContain('operator’s manual');
    // No inline handler (the page's policy would refuse it): the page says how to print.
    expect(html).not.toMatch(/\son[a-z]+=/i);
    expect(html).toContain('Print command');
    // No islands: no script files, no hydration.
    expect(html).not.toMatch(/<script[^>]+src=/);
    expect(html).not.toContain('astro-island');
    const inline = [...html.matchAll(/<script\b[^>]*>([\s\S]*?)<\/script>/g)].map((m) => m[1]!).join('');
    expect(gzipSync(inline).length).toBeLessThan(15 * 1024);
  });

  it('explains the drawing with its key: every element pattern and every finding mark', async () => {
    const { body } = await share(olive);
    const html = await (await new Client().fetch(body.path)).text();
    const legend = html.slice(html.indexOf('data-testid="cage-legend"'));
    expect(legend.length).toBeLessThan(html.length);
    expect(legend).toContain('Key to the drawing');
    for (const words of ['solid outline', 'dashed outline', 'dotted outline', 'two rasp bars in line']) expect(legend).toContain(words);
    // The key's pattern swatches carry ids of their own, never those of the drawings above it.
    const ids = [...html.matchAll(/<pattern id="([^"]+)"/g)].map((m) => m[1]);
    expect(new Set(ids).size).toBe(ids.length);
  });

  it('shows the version it was made from, not later saves', async () => {
    const v1 = await share(olive, { version: 1 });
    const v2 = await share(olive, { version: 2 });
    const h1 = await (await new Client().fetch(v1.body.path)).text();
    const h2 = await (await new Client().fetch(v2.body.path)).text();
    expect(h1).toContain('Version 1,');
    expect(h2).toContain('Version 2,');
    expect(h2).toContain('640 rpm');
    expect(h1).not.toContain('640 rpm');
  });

  it('switches units by a plain link (no script needed)', async () => {
    const { body } = await share(olive);
    const html = await (await new Client().fetch(`${body.path}?units=imperial`)).text();
    expect(html).toMatch(/\d+ ft\/min/);
    expect(html).toContain('Show in millimetres');
  });

  it('answers 404 to an unknown or malformed token', async () => {
    const made = 'A'.repeat(43);
    for (const path of [`/share/${made}`, '/share/short', `/share/${'x'.repeat(200)}`]) {
      const res = await new Client().fetch(path);
      expect(res.status, path).toBe(404);
      expect(await res.text()).toContain('Link not found');
    }
  });

  it('answers 404 once revoked; revoking is for writers of the same organisations', async () => {
    const { body } = await share(olive, { label: 'to revoke' });
    expect((await new Client().fetch(body.path)).status).toBe(200);
    expect((await new Client().delete(`/api/share-links/${body.link.id}`)).status).toBe(401);
    expect((await priya.delete(`/api/share-links/${body.link.id}`)).status).toBe(403);
    expect((await dev.delete(`/api/share-links/${body.link.id}`)).status).toBe(404);
    expect((await olive.delete('/api/share-links/not-a-uuid')).status).toBe(404);
    expect((await new Client().fetch(body.path)).status).toBe(200);
    const revoked = await tomas.delete(`/api/share-links/${body.link.id}`);
    expect(revoked.status).toBe(200);
    expect(revoked.body.status).toBe('revoked');
    const res = await new Client().fetch(body.path);
    expect(res.status).toBe(404);
    expect(await res.text()).not.toContain('to revoke');
    const listed = (await linksOf(olive)).find((l) => l.id === body.link.id);
    expect(listed.status).toBe('revoked');
    // Revoking twice is harmless.
    expect((await olive.delete(`/api/share-links/${body.link.id}`)).status).toBe(200);
    expect((await olive.get(`/api/share-links?layoutId=${layoutId}&status=active`)).body.links.map((l: any) => l.id)).not.toContain(
      body.link.id,
    );
  });

  it('answers 410 once expired', async () => {
    const expiresAt = new Date(Date.now() + 2500).toISOString();
    const { body, status } = await share(olive, { label: 'brief', expiresAt });
    expect(status).toBe(201);
    expect(new Date(body.link.expiresAt).toISOString()).toBe(expiresAt);
    // Before expiry it opens (the server may be slow: accept the 410 only if the time passed).
    const first = await new Client().fetch(body.path);
    if (Date.now() < Date.parse(expiresAt) - 200) expect(first.status).toBe(200);
    // Wait for the expiry to pass on the clock, then the link is gone.
    while (Date.now() <= Date.parse(expiresAt) + 50) await new Promise((r) => setTimeout(r, 100));
    const res = await new Client().fetch(body.path);
    expect(res.status).toBe(410);
    expect(await res.text()).toContain('This link has expired');
    const listed = (await linksOf(olive)).find((l) => l.id === body.link.id);
    expect(listed.status).toBe('expired');
  });
});

describe('no write through a share token', () => {
  it('refuses every other method on the shared page and changes nothing', async () => {
    const { body } = await share(olive);
    const anon = new Client();
    const versionsBefore = (await olive.get(`/api/layouts/${layoutId}/versions`)).body.versions.length;
    for (const method of ['POST', 'PUT', 'PATCH', 'DELETE']) {
      const res = await anon.fetch(body.path, { method, headers: { 'content-type': 'application/json' }, body: '{"rotorRpm":999}' });
      expect(res.status, method).toBe(405);
      expect(res.headers.get('allow')).toBe('GET, HEAD');
    }
    expect((await olive.get(`/api/layouts/${layoutId}/versions`)).body.versions.length).toBe(versionsBefore);
    expect((await new Client().fetch(body.path)).status).toBe(200);
  });

  it('does not accept the token as a credential on any API route', async () => {
    const { body } = await share(olive);
    const token = body.token as string;
    const current = (await olive.get(`/api/layouts/${layoutId}`)).body;
    const attempts: [string, string, unknown][] = [
      ['PUT', `/api/layouts/${layoutId}`, { baseVersion: current.layout.currentVersion, body: current.current.body, note: 'via token' }],
      ['POST', `/api/layouts/${layoutId}/restore`, { version: 1 }],
      ['POST', '/api/share-links', { layoutId, version: 1 }],
      ['DELETE', `/api/share-links/${body.link.id}`, undefined],
      ['GET', `/api/layouts/${layoutId}`, undefined],
      ['PUT', `/api/machines/${northQuarter.id}`, { nickname: 'via token' }],
    ];
    for (const [method, path, payload] of attempts) {
      for (const headers of [
        { authorization: `Bearer ${token}` },
        { cookie: `share=${token}; token=${token}` },
        { 'x-share-token': token },
      ] as Record<string, string>[]) {
        const sep = path.includes('?') ? '&' : '?';
        const res = await fetch(`${anonBase()}${path}${sep}token=${token}`, {
          method,
          headers: { ...headers, origin: anonBase(), ...(payload ? { 'content-type': 'application/json' } : {}) },
          body: payload ? JSON.stringify(payload) : undefined,
        });
        expect(res.status, `${method} ${path} ${Object.keys(headers)[0]}`).toBe(401);
      }
    }
    const after = (await olive.get(`/api/layouts/${layoutId}`)).body;
    expect(after.layout.currentVersion).toBe(current.layout.currentVersion);
    expect((await machineByNickname(olive, 'North Quarter')).nickname).toBe('North Quarter');
    expect((await new Client().fetch(body.path)).status).toBe(200);
  });
});

function anonBase() {
  return new Client().baseUrl;
}
