// Serves the built app (Astro's handler, middleware mode) through our own HTTP server, so that the
// client address the app sees is decided here and cannot be chosen by the client:
//
// - the address is the TCP peer's (the socket's remote address);
// - only when that peer is one of `CAGEWRIGHT_TRUSTED_PROXIES` (comma-separated addresses of
//   reverse proxies in front of this server) is `X-Forwarded-For` read, from the right, and
//   the nearest address that is not itself a trusted proxy is taken.
//
// The decided address replaces any `X-Forwarded-For` the request carried, which is where Astro
// reads `context.clientAddress` from (the sign-in throttle counts by it).
import http from 'node:http';
import https from 'node:https';
import { readFileSync } from 'node:fs';

const bare = (a) => {
  const s = String(a ?? '')
    .trim()
    .toLowerCase();
  const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/.exec(s);
  return mapped ? mapped[1] : s;
};

export function trustedProxies(env = process.env) {
  return new Set((env.CAGEWRIGHT_TRUSTED_PROXIES ?? '').split(',').map(bare).filter(Boolean));
}

/** The client address for a request from `peer` carrying `forwardedFor` (header value or undefined). */
export function clientAddress(peer, forwardedFor, trusted) {
  const from = bare(peer);
  if (!trusted.has(from) || !forwardedFor) return from;
  const hops = String(forwardedFor).split(',').map(bare).filter(Boolean);
  for (let i = hops.length - 1; i >= 0; i--) if (!trusted.has(hops[i])) return hops[i];
  return hops[0] ?? from;
}

export function serveApp(handler, { host, port, env = process.env }) {
  const trusted = trustedProxies(env);
  const listener = (req, res) => {
    req.headers['x-forwarded-for'] = clientAddress(req.socket.remoteAddress, req.headers['x-forwarded-for'], trusted);
    handler(req, res);
  };
  const server =
    env.SERVER_CERT_PATH && env.SERVER_KEY_PATH
      ? https.createServer({ key: readFileSync(env.SERVER_KEY_PATH), cert: readFileSync(env.SERVER_CERT_PATH) }, listener)
      : http.createServer(listener);
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(Number(port), host, () => resolve(server));
  });
}
