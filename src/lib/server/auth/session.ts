import { decode } from '@auth/core/jwt';

/**
 * Reads the signed-in user's id and session id straight from Auth.js's session cookie. Going through the full
 * Auth.js session endpoint on every request would rebuild a request and re-encrypt a rolling
 * token each time; decoding is all the middleware needs. Sessions therefore last their
 * `maxAge` from sign-in (see auth.config.ts). Whether the session is still open (not signed
 * out, not ended by a password, role or membership change) is not decided here: the actor load
 * in access.ts checks the session row on every request.
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

/**
 * Tokens decoded lately, by cookie name and token: decrypting one (key derivation, AES, HMAC)
 * costs more than the rest of a small request. A token decodes to the same user until it
 * expires, so a hit is checked against the expiry only; the session row, the user's role and
 * memberships are still read from the store on every request (access.ts). Oldest entries go first past the cap.
 */
const DECODED_CAP = 1000;
export interface SessionRef {
  uid: string;
  sid: string;
}

const decoded = new Map<string, SessionRef & { expiresAt: number }>();
let decodedWith: string | undefined;

function remember(key: string, ref: SessionRef, exp: unknown) {
  if (typeof exp !== 'number') return;
  if (decoded.size >= DECODED_CAP) decoded.delete(decoded.keys().next().value!);
  decoded.set(key, { ...ref, expiresAt: exp * 1000 });
}

/** The user and session a request's cookie names, or null (no cookie, bad, expired, no session id). */
export async function sessionRef(request: Request): Promise<SessionRef | null> {
  const header = request.headers.get('cookie');
  const secret = process.env.AUTH_SECRET;
  if (!header || !secret) return null;
  if (secret !== decodedWith) {
    decoded.clear();
    decodedWith = secret;
  }
  for (const name of COOKIE_NAMES) {
    const token = readCookie(header, name);
    if (!token) continue;
    const key = `${name}\u0000${token}`;
    const known = decoded.get(key);
    if (known) {
      if (Date.now() < known.expiresAt) return { uid: known.uid, sid: known.sid };
      decoded.delete(key);
      return null; // expired
    }
    try {
      const payload = await decode({ token, secret, salt: name });
      // Tokens from before session rows existed carry no sid: they are refused.
      if (payload && typeof payload.uid === 'string' && typeof payload.sid === 'string') {
        const ref = { uid: payload.uid, sid: payload.sid };
        remember(key, ref, payload.exp);
        return ref;
      }
    } catch {
      return null; // tampered, expired or made with another secret
    }
  }
  return null;
}
