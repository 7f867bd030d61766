import { encode } from '@auth/core/jwt';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { sessionRef } from '~/lib/server/auth/session';

const NAME = 'authjs.session-token';
const request = (cookie: string) => new Request('http://127.0.0.1/api/me', { headers: { cookie } });

const sessionUserId = async (r: Request) => (await sessionRef(r))?.uid ?? null;

describe('session cookie', () => {
  beforeEach(() => {
    process.env.AUTH_SECRET = 'unit-test-secret-0123456789abcdef0123456789';
  });
  afterEach(() => {
    vi.useRealTimers();
  });

  it('reads the user id from a token made by Auth.js, and again from the cache', async () => {
    const token = await encode({ token: { uid: 'user-1', sid: 's-user-1' }, secret: process.env.AUTH_SECRET!, salt: NAME, maxAge: 3600 });
    expect(await sessionUserId(request(`other=1; ${NAME}=${token}`))).toBe('user-1');
    expect(await sessionUserId(request(`${NAME}=${token}`))).toBe('user-1');
  });

  it('carries the session id, and refuses a token without one (made before sessions were recorded)', async () => {
    const token = await encode({ token: { uid: 'user-6', sid: 'session-6' }, secret: process.env.AUTH_SECRET!, salt: NAME, maxAge: 3600 });
    expect(await sessionRef(request(`${NAME}=${token}`))).toEqual({ uid: 'user-6', sid: 'session-6' });
    const old = await encode({ token: { uid: 'user-7' }, secret: process.env.AUTH_SECRET!, salt: NAME, maxAge: 3600 });
    expect(await sessionRef(request(`${NAME}=${old}`))).toBeNull();
  });

  it('refuses a tampered token, a token under another secret, and no cookie', async () => {
    const token = await encode({ token: { uid: 'user-2', sid: 's-user-2' }, secret: process.env.AUTH_SECRET!, salt: NAME, maxAge: 3600 });
    const tampered = token.slice(0, -4) + (token.endsWith('AAAA') ? 'BBBB' : 'AAAA');
    expect(await sessionUserId(request(`${NAME}=${tampered}`))).toBeNull();
    expect(await sessionUserId(request('theme=dark'))).toBeNull();
    const foreign = await encode({
      token: { uid: 'user-3', sid: 's-user-3' },
      secret: 'another-secret-0123456789abcdef0123456789',
      salt: NAME,
      maxAge: 3600,
    });
    expect(await sessionUserId(request(`${NAME}=${foreign}`))).toBeNull();
  });

  it('stops accepting a remembered token once it has expired', async () => {
    const token = await encode({ token: { uid: 'user-4', sid: 's-user-4' }, secret: process.env.AUTH_SECRET!, salt: NAME, maxAge: 60 });
    expect(await sessionUserId(request(`${NAME}=${token}`))).toBe('user-4');
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(Date.now() + 61_000);
    expect(await sessionUserId(request(`${NAME}=${token}`))).toBeNull();
  });

  it('forgets remembered tokens when the secret changes', async () => {
    const token = await encode({ token: { uid: 'user-5', sid: 's-user-5' }, secret: process.env.AUTH_SECRET!, salt: NAME, maxAge: 3600 });
    expect(await sessionUserId(request(`${NAME}=${token}`))).toBe('user-5');
    process.env.AUTH_SECRET = 'rotated-secret-0123456789abcdef0123456789ab';
    expect(await sessionUserId(request(`${NAME}=${token}`))).toBeNull();
  });
});
