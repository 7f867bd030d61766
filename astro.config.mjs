// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwind from '@astrojs/tailwind';
import auth from 'auth-astro';
import precompress from './scripts/http/precompress.mjs';

// Hosts the server answers for. Astro ignores the Host header unless it is listed here,
// and Auth.js callbacks need it; add a production host through CAGEWRIGHT_HOSTS at build time.
const extraHosts = (process.env.CAGEWRIGHT_HOSTS ?? '')
  .split(',')
  .map((h) => h.trim())
  .filter(Boolean)
  .map((hostname) => ({ hostname }));

export default defineConfig({
  output: 'server',
  // Middleware mode: scripts/start.mjs serves the handler (pages and endpoints) behind its own
  // static files (scripts/http/serve.mjs), without a look on disk for every request.
  adapter: node({ mode: 'middleware' }),
  // Separate build folders let several builds (tests, benchmarks) coexist.
  outDir: process.env.CAGEWRIGHT_OUT_DIR ?? './dist',
  server: { host: '127.0.0.1', port: 4321 },
  // precompress: .br/.gz twins of the client files, sent by scripts/http/serve.mjs.
  integrations: [react(), tailwind({ applyBaseStyles: false }), auth(), precompress()],
  security: {
    checkOrigin: true,
    allowedDomains: [{ hostname: 'localhost' }, { hostname: '127.0.0.1' }, ...extraHosts],
  },
  // Astro hashes every script it renders inline (the island bootstrap and hydration scripts) and
  // sends the hashes in the page's Content-Security-Policy header, so pages need no
  // 'unsafe-inline' for scripts; src/lib/server/security-headers.ts adds the other directives.
  experimental: { csp: true },
  vite: {
    ssr: { external: ['@electric-sql/pglite', 'pg', 'nodemailer', 'smtp-server', 's3rver'] },
  },
});
