import { AsyncLocalStorage } from 'node:async_hooks';

/**
 * The client address of the request being served, for code that only sees a bare Request
 * (Auth.js's `authorize`). The middleware runs the Auth.js routes inside `withClientAddress`.
 *
 * Where the address comes from: `scripts/start.mjs` serves the app through its own HTTP server,
 * which takes the TCP peer's address and, only when that peer is listed in
 * `CAGEWRIGHT_TRUSTED_PROXIES`, the nearest untrusted entry of `X-Forwarded-For`; it then
 * writes that one address into `X-Forwarded-For`, which is where Astro reads
 * `context.clientAddress` from. A client can therefore not choose its own address.
 */
const current = new AsyncLocalStorage<string | null>();

export function withClientAddress<T>(address: string | null, fn: () => T): T {
  return current.run(address, fn);
}

export function currentClientAddress(): string | null {
  return current.getStore() ?? null;
}
