#!/usr/bin/env node
// API budgets from the quality bars: read throughput of GET /api/layouts/:id as a ratio to a
// trivial endpoint of the same server in the same run (/api/me: same middleware, no query of
// its own), write p95 of PUT /api/layouts/:id, and cold start to first 200 on an existing store.
// Prints JSON lines `{ bench, figure, value, budget, ok }` for scripts/bench.mjs to tabulate.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { cannon, signIn, startServer, summary } from './lib.mjs';

const duration = Number(process.env.BENCH_SECONDS ?? 10);
const report = (figure, value, budget, ok, unit = '') =>
  console.log(JSON.stringify({ bench: 'api', figure, value, unit, budget, ok }));

const dir = mkdtempSync(join(tmpdir(), 'cagewright-bench-api-'));
try {
  // First start seeds the store; the second start is the cold start on an existing store.
  let s = await startServer({ dataDir: dir });
  await s.stop();
  s = await startServer({ dataDir: dir });
  report('cold start to first 200 (existing store)', Math.round(s.firstOkMs), '≤ 3000 ms', s.firstOkMs <= 3000, 'ms');

  const cookie = await signIn(s.base, 'tomas@kestrel.example');
  const headers = { cookie, origin: s.base };
  const home = await (await fetch(`${s.base}/`, { headers })).text();
  const machineId = home.match(/\/machines\/([0-9a-f-]{36})/)[1];
  const list = await (await fetch(`${s.base}/api/machines/${machineId}/layouts`, { headers })).json();
  const layoutId = list.layouts[0].id;
  const current = (await (await fetch(`${s.base}/api/layouts/${layoutId}`, { headers })).json()).current;

  const trivial = summary(await cannon({ url: `${s.base}/api/me`, headers, duration }));
  const read = summary(await cannon({ url: `${s.base}/api/layouts/${layoutId}`, headers, duration }));
  const ratio = read.rps / trivial.rps;
  report('trivial endpoint /api/me', trivial.rps, '(reference)', true, 'req/s');
  report('GET /api/layouts/:id', read.rps, '(reference)', read.errors === 0, 'req/s');
  report('read throughput ratio', Math.round(ratio * 100), '≥ 50 %', ratio >= 0.5, '%');
  report('GET /api/layouts/:id p95', read.p95, '≤ 25 ms', read.p95 <= 25, 'ms');

  // Writes: one layout per connection so saves never conflict; each connection follows its
  // own version counter.
  const connections = 50;
  const pool = [];
  for (let i = 0; i < connections; i++) {
    const res = await fetch(`${s.base}/api/machines/${machineId}/layouts`, {
      method: 'POST',
      headers: { ...headers, 'content-type': 'application/json' },
      body: JSON.stringify({ name: `bench ${i}`, body: current.body, note: '' }),
    });
    pool.push((await res.json()).layout.id);
  }
  // autocannon resets a connection's context on every pass through the request list, so the
  // version counters live here: each request takes a layout no other request has in flight.
  const version = new Map(pool.map((id) => [id, 1]));
  const free = [...pool];
  const write = summary(
    await cannon({
      url: s.base,
      connections,
      duration,
      headers: { ...headers, 'content-type': 'application/json' },
      requests: [
        {
          method: 'PUT',
          setupRequest: (req, context) => {
            const id = free.shift();
            context.layoutId = id;
            const v = version.get(id);
            return {
              ...req,
              path: `/api/layouts/${id}`,
              body: JSON.stringify({ baseVersion: v, body: { ...current.body, rotorRpm: 300 + (v % 500) }, note: 'bench' }),
            };
          },
          onResponse: (status, _body, context) => {
            const id = context.layoutId;
            if (status === 201) version.set(id, version.get(id) + 1);
            free.push(id);
          },
        },
      ],
    }),
  );
  report('PUT /api/layouts/:id', write.rps, '(reference)', true, 'req/s');
  report('PUT /api/layouts/:id p95', write.p95, '≤ 60 ms', write.p95 <= 60, 'ms');
  report('PUT /api/layouts/:id errors', write.errors, '0', write.errors === 0);
  await s.stop();
} finally {
  rmSync(dir, { recursive: true, force: true });
}
