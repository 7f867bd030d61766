import { afterEach, describe, expect, it, vi } from 'vitest';
import { answer, ApiError, getJson, sendJson } from '~/components/shared/api';
import { fetchApi } from '~/components/editor/store/api';
import { starterLayout } from '~/lib/domain/starter';
import { demoCatalog, tamarackM4 } from '~/lib/domain/demo-catalog';

const jsonAnswer = (status: number, body: unknown) =>
  new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });

afterEach(() => vi.unstubAllGlobals());

/** The ApiError an answer is refused with (fails the test when it is not refused). */
async function refusal(res: Response): Promise<ApiError> {
  try {
    await answer(res);
  } catch (err) {
    expect(err).toBeInstanceOf(ApiError);
    return err as ApiError;
  }
  throw new Error('the answer was not refused');
}

describe('the islands’ fetch helpers', () => {
  it('give the body of a 2xx answer', async () => {
    expect(await answer<{ a: number }>(jsonAnswer(200, { a: 1 }))).toEqual({ a: 1 });
    expect(await answer(new Response(null, { status: 204 }))).toBeNull();
  });

  it('turn a refusal into ApiError with the server’s message, the field and the whole error object', async () => {
    const err = await refusal(jsonAnswer(409, { error: { message: 'Saved by someone else.', field: 'baseVersion', currentVersion: 3 } }));
    expect(err.message).toBe('Saved by someone else.');
    expect(err.status).toBe(409);
    expect(err.field).toBe('baseVersion');
    expect(err.detail).toMatchObject({ currentVersion: 3 });
  });

  it('say what the server answered when a refusal is not JSON or has no message', async () => {
    for (const res of [
      new Response('<html>gateway</html>', { status: 502 }),
      jsonAnswer(500, { error: 'plain' }),
      jsonAnswer(400, [1, 2]),
    ]) {
      const err = await refusal(res);
      expect(err.message).toBe(`The server answered ${res.status}.`);
      expect(err.field).toBeUndefined();
    }
  });

  it('send JSON with the session cookie and ask for JSON back', async () => {
    const fetch = vi.fn(async () => jsonAnswer(201, { ok: true }));
    vi.stubGlobal('fetch', fetch);
    await sendJson('POST', '/api/x', { a: 1 });
    await getJson('/api/y');
    const [[url, init], [url2, init2]] = fetch.mock.calls as unknown as [string, RequestInit][];
    expect(url).toBe('/api/x');
    expect(init).toMatchObject({ method: 'POST', credentials: 'same-origin', body: '{"a":1}' });
    expect(init.headers).toMatchObject({ 'content-type': 'application/json', accept: 'application/json' });
    expect(url2).toBe('/api/y');
    expect(init2).toMatchObject({ credentials: 'same-origin', headers: { accept: 'application/json' } });
  });
});

describe('the editor’s calls through them', () => {
  const body = starterLayout(tamarackM4, 'wheat', demoCatalog);
  const saved = { id: 'v2', layoutId: 'l1', version: 2, body, note: 'mine', createdBy: 'u1', createdAt: '2026-01-02T03:04:05.000Z' };

  it('a save answers the new version', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => jsonAnswer(201, { version: saved })),
    );
    expect(await fetchApi.saveVersion('l1', { baseVersion: 1, body, note: 'mine' })).toEqual({ ok: true, version: saved });
  });

  it('a 409 carries the newer version; another refusal its message; no server, the offline words', async () => {
    const newer = { ...saved, version: 3, createdByName: 'Someone Else' };
    vi.stubGlobal(
      'fetch',
      vi.fn(async () =>
        jsonAnswer(409, { error: { message: 'Saved by someone else.', field: 'baseVersion', currentVersion: 3, current: newer } }),
      ),
    );
    expect(await fetchApi.saveVersion('l1', { baseVersion: 1, body, note: '' })).toEqual({ ok: false, conflict: newer });
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => jsonAnswer(400, { error: { message: 'body.familyId: this machine is of family x', field: 'body.familyId' } })),
    );
    expect(await fetchApi.saveVersion('l1', { baseVersion: 1, body, note: '' })).toEqual({
      ok: false,
      error: 'body.familyId: this machine is of family x',
    });
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => Promise.reject(new TypeError('Failed to fetch'))),
    );
    expect(await fetchApi.saveVersion('l1', { baseVersion: 1, body, note: '' })).toEqual({
      ok: false,
      error: 'Could not reach the server. Your changes are still here; try again.',
    });
  });

  it('save-as answers the new layout’s id; units answer whether they were kept', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => jsonAnswer(201, { layout: { id: 'l9' }, version: saved })),
    );
    expect(await fetchApi.createLayout('m1', { name: 'Copy', body, note: '' })).toEqual({ ok: true, layoutId: 'l9' });
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => jsonAnswer(200, { unitSystem: 'imperial' })),
    );
    expect(await fetchApi.saveUnits('imperial')).toBe(true);
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => jsonAnswer(401, { error: { message: 'Sign in first.' } })),
    );
    expect(await fetchApi.saveUnits('imperial')).toBe(false);
  });
});

describe('the islands read answers through the typed helpers', () => {
  it('no island file uses any, or reads a raw fetch answer with res.json()', async () => {
    const { readdirSync, readFileSync, statSync } = await import('node:fs');
    const { join, relative } = await import('node:path');
    const root = join(__dirname, '../../../src/components');
    const files = (dir: string): string[] =>
      readdirSync(dir).flatMap((n) => {
        const p = join(dir, n);
        return statSync(p).isDirectory() ? files(p) : /\.(ts|tsx)$/.test(n) ? [p] : [];
      });
    const bad = files(root).flatMap((f) => {
      const code = readFileSync(f, 'utf8')
        .replace(/\/\*[\s\S]*?\*\//g, '')
        .replace(/\/\/.*$/gm, '');
      const hits = [/:\s*any\b/, /\bas any\b/, /<any>/, /\bany\[\]/, /\.json\(\)/].filter((re) => re.test(code));
      return hits.map((re) => `${relative(root, f)}: ${re}`);
    });
    expect(bad).toEqual([]);
  });
});
