/**
 * Sign-in throttling: after a few failures for one address the next attempts wait, with the
 * wait doubling. Keyed by the address as typed, whether or not an account exists, so the
 * throttle itself reveals nothing. Kept in process memory: a restart forgives.
 */
const FREE_FAILURES = 5;
const BASE_DELAY_MS = 30_000;
const MAX_DELAY_MS = 15 * 60_000;
const FORGET_AFTER_MS = 60 * 60_000;

interface Entry {
  failures: number;
  lockedUntil: number;
  lastFailure: number;
}

const entries = new Map<string, Entry>();

function keyOf(email: string) {
  return email.trim().toLowerCase();
}

/** Milliseconds the caller must still wait, or 0. */
export function waitFor(email: string, now = Date.now()): number {
  const e = entries.get(keyOf(email));
  if (!e) return 0;
  if (now - e.lastFailure > FORGET_AFTER_MS) {
    entries.delete(keyOf(email));
    return 0;
  }
  return Math.max(0, e.lockedUntil - now);
}

export function recordFailure(email: string, now = Date.now()) {
  const k = keyOf(email);
  const e = entries.get(k) ?? { failures: 0, lockedUntil: 0, lastFailure: now };
  e.failures += 1;
  e.lastFailure = now;
  if (e.failures >= FREE_FAILURES) {
    const delay = Math.min(MAX_DELAY_MS, BASE_DELAY_MS * 2 ** (e.failures - FREE_FAILURES));
    e.lockedUntil = now + delay;
  }
  entries.set(k, e);
  if (entries.size > 10_000) {
    for (const [key, v] of entries) if (now - v.lastFailure > FORGET_AFTER_MS) entries.delete(key);
  }
}

export function recordSuccess(email: string) {
  entries.delete(keyOf(email));
}
