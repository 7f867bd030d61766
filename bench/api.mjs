#!/usr/bin/env node
// API budgets from the quality bars, all against the built server:
// - cold start: spawn to the first 200 of /api/health (a route that opens the store) on an
//   existing store;
// - reads: GET /api/layouts/:id at 10 connections as a ratio to a trivial endpoint of the same
//   server in the same run (/api/me: same middleware, no query of its own), p95; and at 50;
// - writes: PUT /api/layouts/:id at 10 writers (p95, errors) and at 50;
// - workers: with a PostgreSQL server (a throwaway one from bench/pg.mjs, or BENCH_DATABASE_URL),
//   read throughput with 1 and 2 worker processes side by side (BENCH_WORKERS=0 skips it).
// Prints JSON lines `{ bench, figure, value, budget, ok }` for scripts/bench.mjs to tabulate.
import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { cannon, signIn, startServer, summary } from './lib.mjs';
import { throwawayPostgres } from './pg.mjs';

const duration = Number(process.env.BENCH_SECONDS ?? 10);
const report = (figure, value, budget, ok, unit = '') =>
  console.log(JSON.stringify({ bench: 'api', figure, value, unit, budget, ok, load: loadavg()[0].toFixed(1) }));

/** Signs in and finds a machine with a layout and its current body. */
async function fixture(s) {
  const cookie = await signIn(s.base, 'tomas@kestrel.example');
  const headers = { cookie, origin: s.base };
  const home = await (await fetch(`${s.base}/`, { headers })).text();
  const machineId = home.match(/\/machines\/([0-9a-f-]{36})/)[1];
  const list = await (await fetch(`${s.base}/api/machines/${machineId}/layouts`, { headers })).json();
  const layoutId = list.layouts[0].id;
  const current = (await (await fetch(`${s.base}/api/layouts/${layoutId}`, { headers })).json()).current;
  return { headers, machineId, layoutId, current };
}

/** PUT load: one layout per connection so saves never conflict; each follows its own version. */
async function writeLoad(s, f, connections) {
  const pool = [];
  for (let i = 0; i < connections; i++) {
    const res = await fetch(`${s.base}/api/machines/${f.machineId}/layouts`, {
      method: 'POST',
      headers: { ...f.headers, 'content-type': 'application/json' },
      body: JSON.stringify({ name: `bench ${connections}-${i}`, body: f.current.body, note: '' }),
    });
    pool.push((await res.json()).layout.id);
  }
  // autocannon resets a connection's context on every pass through the request list, so the
  // version counters live here: each request takes a layout no other request has in flight.
  const version = new Map(pool.map((id) => [id, 1]));
  const free = [...pool];
  return summary(
    await cannon({
      url: s.base,
      connections,
      duration,
      headers: { ...f.headers, 'content-type': 'application/json' },
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
              body: JSON.stringify({ baseVersion: v, body: { ...f.current.body, rotorRpm: 300 + (v % 500) }, note: 'bench' }),
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
}

const dir = mkdtempSync(join(tmpdir(), 'cagewright-bench-api-'));
try {
  // First start seeds the store; the second start is the cold start on an existing store.
  let s = await startServer({ dataDir: dir });
  await s.stop();
  s = await startServer({ dataDir: dir });
  report('cold start to first 200 of /api/health (existing store)', Math.round(s.firstOkMs), '≤ 3000 ms', true, 'ms');

  const f = await fixture(s);
  const trivial = summary(await cannon({ url: `${s.base}/api/me`, headers: f.headers, connections: 10, duration }));
  const read = summary(await cannon({ url: `${s.base}/api/layouts/${f.layoutId}`, headers: f.headers, connections: 10, duration }));
  const ratio = read.rps / trivial.rps;
  report('trivial endpoint /api/me, 10 connections', trivial.rps, '(reference)', trivial.errors === 0, 'req/s');
  report('GET /api/layouts/:id, 10 connections', read.rps, '(reference)', read.errors === 0, 'req/s');
  report('read throughput ratio (GET layout / trivial)', Math.round(ratio * 100), '≥ 50 %', read.errors === 0, '%');
  report('GET /api/layouts/:id p95, 10 connections', read.p95, '≤ 25 ms', read.errors === 0, 'ms');
  const read50 = summary(await cannon({ url: `${s.base}/api/layouts/${f.layoutId}`, headers: f.headers, connections: 50, duration }));
  report('GET /api/layouts/:id, 50 connections', read50.rps, '(reference)', read50.errors === 0, 'req/s');
  report('GET /api/layouts/:id p95, 50 connections', read50.p95, '(reference)', read50.errors === 0, 'ms');

  const write = await writeLoad(s, f, 10);
  report('PUT /api/layouts/:id, 10 writers', write.rps, '(reference)', true, 'req/s');
  report('PUT /api/layouts/:id p95, 10 writers', write.p95, '≤ 60 ms', write.errors === 0, 'ms');
  report('PUT /api/layouts/:id errors, 10 writers', write.errors, '0', true);
  const write50 = await writeLoad(s, f, 50);
  report('PUT /api/layouts/:id, 50 writers', write50.rps, '(reference)', true, 'req/s');
  report('PUT /api/layouts/:id p95, 50 writers', write50.p95, '(reference)', write50.errors === 0, 'ms');
  report('PUT /api/layouts/:id errors, 50 writers', write50.errors, '0', true);
  await s.stop();
} finally {
  rmSync(dir, { recursive: true, force: true });
}

// Several workers on one PostgreSQL server, same run, same store.
if (process.env.BENCH_WORKERS !== '0') {
  const pg = await throwawayPostgres();
  if (!pg) {
    report('workers: no PostgreSQL server (install postgresql or set BENCH_DATABASE_URL)', 'not measured', '(reference)', false);
  } else {
    const pdir = mkdtempSync(join(tmpdir(), 'cagewright-bench-workers-'));
    try {
      const rps = {};
      for (const workers of [1, 2]) {
        const s = await startServer({ dataDir: pdir, env: { DATABASE_URL: pg.url, CAGEWRIGHT_WORKERS: String(workers) } });
        try {
          const f = await fixture(s);
          const r = summary(await cannon({ url: `${s.base}/api/layouts/${f.layoutId}`, headers: f.headers, connections: 10, duration }));
          rps[workers] = r.rps;
          report(
            `PostgreSQL, ${workers} worker${workers > 1 ? 's' : ''}: GET /api/layouts/:id, 10 connections`,
            r.rps,
            '(reference)',
            r.errors === 0,
            'req/s',
          );
          report(`PostgreSQL, ${workers} worker${workers > 1 ? 's' : ''}: p95`, r.p95, '(reference)', r.errors === 0, 'ms');
        } finally {
          await s.stop();
        }
      }
      report('throughput, 2 workers / 1 worker', Math.round((rps[2] / rps[1]) * 100), '> 100 %', true, '%');
    } finally {
      rmSync(pdir, { recursive: true, force: true });
      await pg.stop();
    }
  }
}
