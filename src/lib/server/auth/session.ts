import { decode } from '@auth/core/jwt';

/**
 * Reads the signed-in user's id straight from Auth.js's session cookie. Going through the full
 * Auth.js session endpoint on every request would rebuild a request and re-encrypt a rolling
 * token each time; decoding is all the middleware needs. Sessions therefore last their
 * `maxAge` from sign-in (see auth.config.ts).
 */
const COOKIE_NAMES = ['__Secure-authjs.session-token', 'authjs.session-token'];

function readCookie(header: string, name: string): string | null {
  // Large tokens are split into name.0, name.1, …
  const parts = new Map<string, string>();
  for (const piece of header.split(';')) {
    const i = piece.indexOf('=');
    if (i < 0) continue;
    parts.set(piece.slice(0, i).trim(), piece.slice(i + 1).trim());
  }
  const whole = parts.get(name);
  if (whole) return whole;
  let joined = '';
  for (let k = 0; parts.has(`${name}.${k}`); k++) joined += parts.get(`${name}.${k}`);
  return joined || null;
}

export async function sessionUserId(request: Request): Promise<string | null> {
  const header = request.headers.get('cookie');
  const secret = process.env.AUTH_SECRET;
  if (!header || !secret) return null;
  for (const name of COOKIE_NAMES) {
    const token = readCookie(header, name);
    if (!token) continue;
    try {
      const payload = await decode({ token, secret, salt: name });
      if (payload && typeof payload.uid === 'string') return payload.uid;
    } catch {
      return null; // tampered, expired or made with another secret
    }
  }
  return null;
}
