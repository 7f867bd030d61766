import { spawnSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoCatalog, sedgeS6, tamarackM4 } from '~/lib/domain/demo-catalog';
import { starterLayout } from '~/lib/domain/starter';
import { Client, DEMO_PASSWORD, signedIn } from './client';
import { firstLayoutOf, machineByNickname, uniq } from './fleet-helpers';
import { databaseFor, removeDir, startServer, type RunningServer } from './server';

// Classroom decks against the real server and the seeded demo: Priya (trainer) and Tomas
// (technician) of Kestrel Valley Implement build decks; operators and the admin may not.

let priya: Client;
let tomas: Client;
let olive: Client;
let ada: Client;
let wheatVersionId: string;

const NO_UUID = '00000000-0000-4000-8000-000000000000';

/** Version 1 of the machine's seeded layout: the one the demo deck shows. Other suites add layouts and versions. */
async function versionIdOf(c: Client, nickname: string) {
  const machine = await machineByNickname(c, nickname);
  const list = await c.get(`/api/machines/${machine.id}/layouts`);
  expect(list.status).toBe(200);
  const layouts = list.body.layouts as { id: string; createdAt: string }[];
  const seeded = [...layouts].sort((x, y) => x.createdAt.localeCompare(y.createdAt))[0]!;
  const res = await c.get(`/api/layouts/${seeded.id}/versions/1`);
  expect(res.status).toBe(200);
  return res.body.id as string;
}

async function newDeck(c: Client, title = uniq('Deck')) {
  const res = await c.post('/api/decks', { title });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.deck as { id: string; title: string; orgId: string };
}

async function slidesOf(c: Client, deckId: string) {
  const res = await c.get(`/api/decks/${deckId}`);
  expect(res.status).toBe(200);
  return res.body.slides as { id: string; position: number; title: string; notes: string; notesHtml: string; source: any; layout: any }[];
}

beforeAll(async () => {
  [priya, tomas, olive, ada] = await Promise.all([
    signedIn('trainer'),
    signedIn('technician'),
    signedIn('operator'),
    signedIn('dealerAdmin'),
  ]);
  wheatVersionId = await versionIdOf(priya, 'North Quarter');
});

describe('the demo deck', () => {
  it('is seeded for the dealer: "Small grains vs pulses" with a customer’s wheat layout and samples', async () => {
    const list = await priya.get('/api/decks');
    expect(list.status).toBe(200);
    const demo = list.body.decks.find((d: any) => d.title === 'Small grains vs pulses');
    expect(demo).toMatchObject({ slideCount: 4, createdByName: 'Priya Nand' });
    const slides = await slidesOf(tomas, demo.id);
    expect(slides.map((s) => s.position)).toEqual([1, 2, 3, 4]);
    expect(slides[0]!.source).toMatchObject({
      kind: 'version',
      layoutVersionId: wheatVersionId,
      machineNickname: 'North Quarter',
      orgName: 'Larkspur Farms',
    });
    expect(slides.slice(1).map((s) => s.source.kind)).toEqual(['sample', 'sample', 'sample']);
    expect(slides[2]!.layout.crop).toBe('field-peas');
    expect(slides[3]!.layout.familyId).toBe('sedge-s6');
    expect(slides[0]!.notesHtml).toContain('<strong>Fine-wire elements in the threshing zone</strong>');
  });
});

describe('building a deck', () => {
  it('creates, renames, adds three kinds of slide, reorders, edits and removes them', async () => {
    const deck = await newDeck(priya, 'Pulses, week 1');
    expect(deck.title).toBe('Pulses, week 1');
    const renamed = await priya.patch(`/api/decks/${deck.id}`, { title: '  Pulses, week 2  ' });
    expect(renamed.status).toBe(200);
    expect(renamed.body.deck.title).toBe('Pulses, week 2');

    const a = await priya.post(`/api/decks/${deck.id}/slides`, {
      title: 'Wheat on North Quarter',
      notes: '**Fine** up front',
      layoutVersionId: wheatVersionId,
    });
    expect(a.status, JSON.stringify(a.body)).toBe(201);
    expect(a.body.slide).toMatchObject({
      position: 1,
      title: 'Wheat on North Quarter',
      source: { kind: 'version', layoutVersionId: wheatVersionId },
    });
    expect(a.body.slide.layout.crop).toBe('wheat');
    expect(a.body.slide.notesHtml).toContain('<strong>Fine</strong>');

    const b = await tomas.post(`/api/decks/${deck.id}/slides`, {
      title: 'Corn start on the split cage',
      starter: { familyId: 'sedge-s6', crop: 'corn' },
    });
    expect(b.status, JSON.stringify(b.body)).toBe(201);
    expect(b.body.slide).toMatchObject({ position: 2, source: { kind: 'sample' } });
    expect(b.body.slide.layout).toEqual(starterLayout(sedgeS6, 'corn', demoCatalog));

    const sample = { ...starterLayout(tamarackM4, 'field-peas', demoCatalog), vaneSetting: 'slow' as const };
    const c = await priya.post(`/api/decks/${deck.id}/slides`, { title: 'Peas, slow vanes', sampleLayout: sample });
    expect(c.status, JSON.stringify(c.body)).toBe(201);
    expect(c.body.slide.layout).toEqual(sample);

    const ids = [a.body.slide.id, b.body.slide.id, c.body.slide.id];
    const reordered = await priya.put(`/api/decks/${deck.id}/slides`, { order: [ids[2], ids[0], ids[1]] });
    expect(reordered.status, JSON.stringify(reordered.body)).toBe(200);
    expect(reordered.body.slides.map((s: any) => [s.id, s.position])).toEqual([
      [ids[2], 1],
      [ids[0], 2],
      [ids[1], 3],
    ]);

    const edited = await priya.patch(`/api/decks/${deck.id}/slides/${ids[1]}`, {
      title: 'Corn on the split cage',
      notes: '- husks hide kernels',
    });
    expect(edited.status).toBe(200);
    expect(edited.body.slide).toMatchObject({ title: 'Corn on the split cage', notes: '- husks hide kernels', position: 3 });
    expect(edited.body.slide.notesHtml).toMatch(/<li>husks hide kernels<\/li>/);

    const swapped = await priya.patch(`/api/decks/${deck.id}/slides/${ids[1]}`, { layoutVersionId: wheatVersionId });
    expect(swapped.status).toBe(200);
    expect(swapped.body.slide.source).toMatchObject({ kind: 'version', layoutVersionId: wheatVersionId });
    expect(swapped.body.slide.title).toBe('Corn on the split cage');

    const gone = await priya.delete(`/api/decks/${deck.id}/slides/${ids[2]}`);
    expect(gone.status).toBe(200);
    const left = await slidesOf(priya, deck.id);
    expect(left.map((s) => [s.id, s.position])).toEqual([
      [ids[0], 1],
      [ids[1], 2],
    ]);
    expect((await priya.get(`/api/decks/${deck.id}/slides/${ids[2]}`)).status).toBe(404);

    const listed = (await tomas.get('/api/decks')).body.decks.find((d: any) => d.id === deck.id);
    expect(listed).toMatchObject({ title: 'Pulses, week 2', slideCount: 2 });

    expect((await priya.delete(`/api/decks/${deck.id}`)).status).toBe(200);
    expect((await priya.get(`/api/decks/${deck.id}`)).status).toBe(404);
  });

  it('renders its pages for the trainer and refuses them to other roles', async () => {
    const deck = await newDeck(priya);
    await priya.post(`/api/decks/${deck.id}/slides`, { title: 'Wheat', layoutVersionId: wheatVersionId });
    for (const path of ['/classroom', `/classroom/${deck.id}`, `/classroom/${deck.id}/present`, `/classroom/${deck.id}/presenter`]) {
      const ok = await priya.fetch(path);
      expect(ok.status, path).toBe(200);
      const denied = await olive.fetch(path);
      expect(denied.status, path).toBe(403);
    }
    expect((await priya.fetch(`/classroom/${NO_UUID}`)).status).toBe(404);
    expect((await priya.fetch('/classroom/not-a-deck/present')).status).toBe(404);
  });
});

describe('who may', () => {
  it('refuses the signed-out (401) and other roles (403) on every deck route', async () => {
    const deck = await newDeck(priya);
    const slide = (await priya.post(`/api/decks/${deck.id}/slides`, { title: 'S', starter: { familyId: 'tamarack-m4', crop: 'wheat' } }))
      .body.slide;
    const routes: [string, string, unknown?][] = [
      ['GET', '/api/decks'],
      ['POST', '/api/decks', { title: 'x' }],
      ['GET', `/api/decks/${deck.id}`],
      ['PATCH', `/api/decks/${deck.id}`, { title: 'x' }],
      ['DELETE', `/api/decks/${deck.id}`],
      ['GET', `/api/decks/${deck.id}/slides`],
      ['POST', `/api/decks/${deck.id}/slides`, { title: 'x', starter: { familyId: 'tamarack-m4', crop: 'oats' } }],
      ['PUT', `/api/decks/${deck.id}/slides`, { order: [slide.id] }],
      ['GET', `/api/decks/${deck.id}/slides/${slide.id}`],
      ['PATCH', `/api/decks/${deck.id}/slides/${slide.id}`, { title: 'x' }],
      ['DELETE', `/api/decks/${deck.id}/slides/${slide.id}`],
      ['GET', `/api/decks/${deck.id}/share`],
      ['POST', `/api/decks/${deck.id}/share`, {}],
      ['DELETE', `/api/decks/${deck.id}/share`],
    ];
    for (const [method, path, body] of routes) {
      expect((await new Client().json(method, path, body)).status, `${method} ${path} signed out`).toBe(401);
      for (const who of [olive, ada]) {
        const res = await who.json(method, path, body);
        expect(res.status, `${method} ${path}`).toBe(403);
        expect(res.body.error.message).toMatch(/trainer/);
      }
    }
    // Nothing of that went through.
    const after = await slidesOf(priya, deck.id);
    expect(after.map((s) => s.title)).toEqual(['S']);
    expect((await priya.get(`/api/decks/${deck.id}`)).body.deck.title).toBe(deck.title);
    expect((await priya.get(`/api/decks/${deck.id}/share`)).body.links).toEqual([]);
  });
});

describe('bad input', () => {
  it('answers 404 for a layout version the trainer cannot see, writing nothing', async () => {
    const deck = await newDeck(priya);
    const res = await priya.post(`/api/decks/${deck.id}/slides`, { title: 'Ghost', layoutVersionId: NO_UUID });
    expect(res.status).toBe(404);
    expect(res.body.error.field).toBe('layoutVersionId');
    const existing = (await priya.post(`/api/decks/${deck.id}/slides`, { title: 'Real', layoutVersionId: wheatVersionId })).body.slide;
    const swap = await priya.patch(`/api/decks/${deck.id}/slides/${existing.id}`, { title: 'Renamed', layoutVersionId: NO_UUID });
    expect(swap.status).toBe(404);
    const slides = await slidesOf(priya, deck.id);
    expect(slides.map((s) => [s.title, s.source.layoutVersionId])).toEqual([['Real', wheatVersionId]]);
  });

  it('names the field of every bad body and writes nothing', async () => {
    const deck = await newDeck(priya);
    const unknownPart = structuredClone(starterLayout(tamarackM4, 'wheat', demoCatalog));
    unknownPart.elements[2]!.partNumber = 'CW-ZZ-L-99';
    const cases: [unknown, string][] = [
      [{ title: 'No source' }, 'layoutVersionId'],
      [{ title: 'Two', layoutVersionId: wheatVersionId, starter: { familyId: 'tamarack-m4', crop: 'wheat' } }, 'starter'],
      [{ title: '', starter: { familyId: 'tamarack-m4', crop: 'wheat' } }, 'title'],
      [{ title: 'x'.repeat(161), starter: { familyId: 'tamarack-m4', crop: 'wheat' } }, 'title'],
      [{ title: 'Bad id', layoutVersionId: 'nope' }, 'layoutVersionId'],
      [{ title: 'Bad crop', starter: { familyId: 'tamarack-m4', crop: 'quinoa' } }, 'starter.crop'],
      [{ title: 'No family', starter: { familyId: 'no-such-family', crop: 'wheat' } }, 'starter.familyId'],
      [{ title: 'Unknown part', sampleLayout: unknownPart }, 'sampleLayout.elements.2.partNumber'],
      [
        { title: 'Foreign family', sampleLayout: { ...starterLayout(tamarackM4, 'wheat', demoCatalog), familyId: 'larch-x9' } },
        'sampleLayout.familyId',
      ],
      [{ title: 'Not a layout', sampleLayout: { format: 'x' } }, 'sampleLayout.format'],
      [{ title: 'Long notes', notes: 'n'.repeat(10_001), starter: { familyId: 'tamarack-m4', crop: 'wheat' } }, 'notes'],
    ];
    for (const [body, field] of cases) {
      const res = await priya.post(`/api/decks/${deck.id}/slides`, body);
      expect(res.status, JSON.stringify(body).slice(0, 200)).toBe(400);
      expect(res.body.error.field, JSON.stringify(body).slice(0, 200)).toBe(field);
    }
    const wrongType = await priya.fetch(`/api/decks/${deck.id}/slides`, {
      method: 'POST',
      headers: { 'content-type': 'text/plain' },
      body: 'x',
    });
    expect(wrongType.status).toBe(415);
    const broken = await priya.fetch(`/api/decks/${deck.id}/slides`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: '{',
    });
    expect(broken.status).toBe(400);
    expect((await priya.post('/api/decks', { title: '   ' })).body.error.field).toBe('title');
    expect((await priya.patch(`/api/decks/${deck.id}`, { title: '' })).status).toBe(400);
    expect(await slidesOf(priya, deck.id)).toEqual([]);
  });

  it('refuses a reorder that does not name every slide exactly once', async () => {
    const deck = await newDeck(priya);
    const add = async (title: string) =>
      (await priya.post(`/api/decks/${deck.id}/slides`, { title, starter: { familyId: 'tamarack-m4', crop: 'wheat' } })).body.slide
        .id as string;
    const [x, y] = [await add('X'), await add('Y')];
    for (const [order, field] of [
      [[x], 'order'],
      [[x, x], 'order.1'],
      [[x, y, NO_UUID], 'order.2'],
      [['nope'], 'order.0'],
    ] as const) {
      const res = await priya.put(`/api/decks/${deck.id}/slides`, { order });
      expect(res.status, JSON.stringify(order)).toBe(400);
      expect(res.body.error.field).toBe(field);
    }
    expect((await slidesOf(priya, deck.id)).map((s) => s.title)).toEqual(['X', 'Y']);
  });

  it('treats unknown and malformed ids as not found', async () => {
    const deck = await newDeck(priya);
    expect((await priya.get(`/api/decks/${NO_UUID}`)).status).toBe(404);
    expect((await priya.get('/api/decks/not-a-uuid')).status).toBe(404);
    expect((await priya.patch(`/api/decks/${deck.id}/slides/${NO_UUID}`, { title: 'x' })).status).toBe(404);
    expect((await priya.delete(`/api/decks/${deck.id}/slides/not-a-uuid`)).status).toBe(404);
    expect((await priya.delete(`/api/decks/${deck.id}/share?link=not-a-uuid`)).status).toBe(404);
    expect((await priya.delete(`/api/decks/${deck.id}/share?link=${NO_UUID}`)).status).toBe(404);
    // A slide of another deck is not found through this one.
    const other = await newDeck(priya);
    const s = (
      await priya.post(`/api/decks/${other.id}/slides`, { title: 'Elsewhere', starter: { familyId: 'tamarack-m4', crop: 'oats' } })
    ).body.slide;
    expect((await priya.patch(`/api/decks/${deck.id}/slides/${s.id}`, { title: 'Stolen' })).status).toBe(404);
    expect((await slidesOf(priya, other.id))[0]!.title).toBe('Elsewhere');
  });
});

describe('talking points', () => {
  const hostile = [
    '<script>alert("x1")</script>',
    '',
    'Click [here](javascript:alert("x2")) or <img src=x onerror="alert(\'x3\')">',
    '',
    '<a href="javascript:alert(1)" onclick="alert(2)">raw link</a>',
  ].join('\n');

  it('are rendered without any way to run script, in the API and on every page that shows them', async () => {
    const deck = await newDeck(priya, 'Hostile notes');
    const res = await priya.post(`/api/decks/${deck.id}/slides`, {
      title: 'Sneaky',
      notes: hostile,
      starter: { familyId: 'tamarack-m4', crop: 'wheat' },
    });
    expect(res.status).toBe(201);
    const html: string = res.body.slide.notesHtml;
    expect(res.body.slide.notes).toBe(hostile); // the source is kept as written
    const tags = html.match(/<[a-z][^>]*>/gi) ?? [];
    expect(
      tags.every((t) => /^<(p|strong|em|a|ul|ol|li|code|br)\b/i.test(t)),
      tags.join(' '),
    ).toBe(true);
    expect(
      tags.some((t) => /\son\w+=|javascript:/i.test(t)),
      tags.join(' '),
    ).toBe(false);
    expect(html).toContain('&lt;script&gt;');
    expect(html).toContain('Click here or');

    const link = (await priya.post(`/api/decks/${deck.id}/share`, {})).body;
    const pages = [`/classroom/${deck.id}`, `/classroom/${deck.id}/present`, `/classroom/${deck.id}/presenter`];
    for (const path of pages) {
      const body = await (await priya.fetch(path)).text();
      expect(body, path).not.toContain('<script>alert("x1")');
      expect(body, path).not.toMatch(/<img src=x onerror/);
    }
    const shared = await (await new Client().fetch(link.path)).text();
    expect(shared).toContain('&lt;script&gt;alert(&quot;x1&quot;)&lt;/script&gt;');
    expect(shared).not.toContain('<script>alert("x1")');
    expect(shared).not.toMatch(/<img src=x onerror|href="javascript:/);
  });
});

describe('sharing a deck', () => {
  it('opens read-only without sign-in, lists the link without its token, and closes when revoked', async () => {
    const deck = await newDeck(priya, 'Shared class');
    await priya.post(`/api/decks/${deck.id}/slides`, {
      title: 'Wheat on North Quarter',
      notes: 'Look at **position 1**',
      layoutVersionId: wheatVersionId,
    });
    await priya.post(`/api/decks/${deck.id}/slides`, { title: 'Lentils, split cage', starter: { familyId: 'sedge-s6', crop: 'lentils' } });
    const made = await priya.post(`/api/decks/${deck.id}/share`, {
      label: 'Spring class',
      expiresAt: new Date(Date.now() + 7 * 86_400_000).toISOString(),
    });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    expect(made.body.token).toMatch(/^[A-Za-z0-9_-]{43}$/); // 256 random bits
    expect(made.body.path).toBe(`/share/deck/${made.body.token}`);
    expect(made.body.link).toMatchObject({ label: 'Spring class', status: 'active', deckId: deck.id });
    expect(JSON.stringify(made.body.link)).not.toContain(made.body.token);

    const anon = new Client();
    const page = await anon.fetch(made.body.path);
    expect(page.status).toBe(200);
    expect(page.headers.get('x-robots-tag')).toMatch(/noindex/);
    const html = await page.text();
    expect(html).toContain('Shared class');
    expect(html).toContain('Wheat on North Quarter');
    expect(html).toContain('Lentils, split cage');
    expect(html).toContain('<strong>position 1</strong>');
    expect(html).toContain('data-testid="cage-diagram"');
    expect(html).not.toContain('<astro-island'); // rendered on the server, no script to load
    expect(
      (await anon.fetch(made.body.path, { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: 'x=1' }))
        .status,
    ).toBe(405);
    // A deck link is not a layout link.
    expect((await anon.fetch(`/share/${made.body.token}`)).status).toBe(404);

    const listed = await tomas.get(`/api/decks/${deck.id}/share`);
    expect(listed.body.links).toHaveLength(1);
    expect(listed.body.links[0]).toMatchObject({ label: 'Spring class', status: 'active' });
    expect(JSON.stringify(listed.body)).not.toContain(made.body.token);

    const second = (await priya.post(`/api/decks/${deck.id}/share`, {})).body;
    const revokeOne = await priya.delete(`/api/decks/${deck.id}/share?link=${made.body.link.id}`);
    expect(revokeOne.body.revoked).toEqual([made.body.link.id]);
    expect((await anon.fetch(made.body.path)).status).toBe(404);
    expect((await anon.fetch(second.path)).status).toBe(200);
    const revokeAll = await priya.delete(`/api/decks/${deck.id}/share`);
    expect(revokeAll.body.revoked).toEqual([second.link.id]);
    expect((await anon.fetch(second.path)).status).toBe(404);
    const statuses = (await priya.get(`/api/decks/${deck.id}/share`)).body.links.map((l: any) => l.status);
    expect(statuses).toEqual(['revoked', 'revoked']);
  });

  it('refuses a past expiry and a malformed one, and unknown tokens are simply not found', async () => {
    const deck = await newDeck(priya);
    const past = await priya.post(`/api/decks/${deck.id}/share`, { expiresAt: '2020-01-01T00:00:00Z' });
    expect(past.status).toBe(400);
    expect(past.body.error.field).toBe('expiresAt');
    const bad = await priya.post(`/api/decks/${deck.id}/share`, { expiresAt: 'next week' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('expiresAt');
    expect((await priya.get(`/api/decks/${deck.id}/share`)).body.links).toEqual([]);
    const anon = new Client();
    expect((await anon.fetch(`/share/deck/${'A'.repeat(43)}`)).status).toBe(404);
    expect((await anon.fetch('/share/deck/short')).status).toBe(404);
  });

  it('does not open a layout link as a deck', async () => {
    const machine = await machineByNickname(tomas, 'North Quarter');
    const layout = await firstLayoutOf(tomas, machine.id);
    const shared = await tomas.post('/api/share-links', { layoutId: layout.id, version: 1 });
    expect(shared.status, JSON.stringify(shared.body)).toBe(201);
    expect((await new Client().fetch(`/share/deck/${shared.body.token}`)).status).toBe(404);
  });

  it('closes with the deck when the deck is deleted', async () => {
    const deck = await newDeck(priya);
    const link = (await priya.post(`/api/decks/${deck.id}/share`, {})).body;
    expect((await new Client().fetch(link.path)).status).toBe(200);
    await priya.delete(`/api/decks/${deck.id}`);
    expect((await new Client().fetch(link.path)).status).toBe(404);
  });
});

describe('comparing layouts in class', () => {
  it('shows two layouts side by side with each difference listed', async () => {
    const res = await priya.fetch('/classroom/compare?a=starter:tamarack-m4:wheat&b=starter:tamarack-m4:field-peas');
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html).toContain('data-testid="diff-table"');
    expect(html).toContain('Rotor speed (rpm)');
    expect(html).toContain('Position 1, left');
    expect(html.match(/Δ CHANGED/g)?.length ?? 0).toBeGreaterThanOrEqual(8); // 4 elements × 2 diagrams at least
    const slides = await slidesOf(
      priya,
      (await priya.get('/api/decks')).body.decks.find((d: any) => d.title === 'Small grains vs pulses').id,
    );
    const bySlide = await priya.fetch(`/classroom/compare?a=slide:${slides[1]!.id}&b=slide:${slides[2]!.id}`);
    expect(bySlide.status).toBe(200);
    expect(await bySlide.text()).toContain('What goes wrong: the wheat cage left in for peas');
    expect((await priya.fetch(`/classroom/compare?a=version:${NO_UUID}&b=starter:tamarack-m4:wheat`)).status).toBe(404);
    expect((await priya.fetch('/classroom/compare?a=rubbish&b=starter:tamarack-m4:wheat')).status).toBe(400);
    expect((await olive.fetch('/classroom/compare?a=starter:tamarack-m4:wheat&b=starter:tamarack-m4:oats')).status).toBe(403);
  });
});

// The second dealer is written straight into the store (the embedded one, or in server mode the
// server's database for that data directory) before its server opens it.
describe('another dealer’s rows', () => {
  let server: RunningServer | null = null;
  let ids: {
    otherVersionId: string;
    otherDeckId: string;
    otherTrainer: string;
    expiredToken: string;
    revokedToken: string;
    liveToken: string;
  };
  let ourTrainer: Client;
  let theirTrainer: Client;

  beforeAll(async () => {
    const dataDir = mkdtempSync(join(tmpdir(), 'cagewright-decks-'));
    const prep = spawnSync('npx', ['tsx', 'tests/integration/fixtures/second-dealer.ts', dataDir], {
      encoding: 'utf8',
      env: { ...process.env, CAGEWRIGHT_BCRYPT_ROUNDS: '4', FIXTURE_DATABASE_URL: (await databaseFor(dataDir)) ?? '' },
    });
    if (prep.status !== 0) throw new Error(`fixture failed: ${prep.stderr}`);
    ids = JSON.parse(prep.stdout.trim().split('\n').pop()!);
    server = await startServer({ dataDir });
    ourTrainer = new Client(server.baseUrl);
    await ourTrainer.signIn('priya@kestrel.example', DEMO_PASSWORD);
    theirTrainer = new Client(server.baseUrl);
    await theirTrainer.signIn(ids.otherTrainer, DEMO_PASSWORD);
    expect(ourTrainer.hasSession() && theirTrainer.hasSession()).toBe(true);
  }, 120_000);

  afterAll(async () => {
    if (server) {
      await server.stop();
      removeDir(server.dataDir);
    }
  });

  it('refuses a slide pointing at another organisation’s layout with 404 and writes nothing', async () => {
    const mine = (await ourTrainer.post('/api/decks', { title: 'Ours' })).body.deck;
    const res = await ourTrainer.post(`/api/decks/${mine.id}/slides`, { title: 'Theirs', layoutVersionId: ids.otherVersionId });
    expect(res.status).toBe(404);
    expect(res.body.error.field).toBe('layoutVersionId');
    expect((await ourTrainer.get(`/api/decks/${mine.id}`)).body.slides).toEqual([]);
    expect((await ourTrainer.get('/api/decks')).body.decks.find((d: any) => d.id === mine.id).slideCount).toBe(0);
    expect((await ourTrainer.fetch(`/classroom/compare?a=version:${ids.otherVersionId}&b=starter:tamarack-m4:wheat`)).status).toBe(404);
  });

  it('hides each dealer’s decks from the other', async () => {
    const theirs = await theirTrainer.get('/api/decks');
    expect(theirs.body.decks.map((d: any) => d.title)).toEqual(['Barley basics']);
    const ours = await ourTrainer.get('/api/decks');
    expect(ours.body.decks.map((d: any) => d.title)).not.toContain('Barley basics');
    expect((await ourTrainer.get(`/api/decks/${ids.otherDeckId}`)).status).toBe(404);
    expect((await ourTrainer.patch(`/api/decks/${ids.otherDeckId}`, { title: 'Taken' })).status).toBe(404);
    expect((await ourTrainer.post(`/api/decks/${ids.otherDeckId}/share`, {})).status).toBe(404);
    expect((await ourTrainer.fetch(`/classroom/${ids.otherDeckId}/present`)).status).toBe(404);
    const demo = ours.body.decks.find((d: any) => d.title === 'Small grains vs pulses');
    const wheatOnNorthQuarter = (await ourTrainer.get(`/api/decks/${demo.id}`)).body.slides[0].source.layoutVersionId;
    const back = await theirTrainer.post(`/api/decks/${ids.otherDeckId}/slides`, {
      title: 'Borrowed',
      layoutVersionId: wheatOnNorthQuarter,
    });
    expect(back.status).toBe(404);
    expect((await theirTrainer.get(`/api/decks/${ids.otherDeckId}`)).body.deck.title).toBe('Barley basics');
  });

  it('answers 410 for an expired deck link and 404 for a revoked one', async () => {
    const anon = new Client(server!.baseUrl);
    const expired = await anon.fetch(`/share/deck/${ids.expiredToken}`);
    expect(expired.status).toBe(410);
    expect(await expired.text()).toContain('This link has expired');
    expect((await anon.fetch(`/share/deck/${ids.revokedToken}`)).status).toBe(404);
    const live = await anon.fetch(`/share/deck/${ids.liveToken}`);
    expect(live.status).toBe(200);
    expect(await live.text()).toContain('Barley on Hilltop');
  });
});
