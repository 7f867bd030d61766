#!/usr/bin/env node
// Scale: a store of 2,000 machines and 100,000 layout versions, then p95 of the list endpoints
// (paginated) under load. The bulk rows are written straight into the store while no server
// runs (one owner at a time), with set-based SQL.
import { existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { PGlite } from '@electric-sql/pglite';
import { cannon, signIn, startServer, summary } from './lib.mjs';

const MACHINES = Number(process.env.BENCH_MACHINES ?? 2000);
// The three demo machines keep their own layouts; the bulk ones make up the rest of the total.
const VERSIONS_PER_LAYOUT = Math.ceil(Number(process.env.BENCH_VERSIONS ?? 100000) / (MACHINES - 3));
const duration = Number(process.env.BENCH_SECONDS ?? 10);
const LONG_HISTORY = Number(process.env.BENCH_LONG_HISTORY ?? 5000);
const report = (figure, value, budget, ok, unit = '') =>
  console.log(JSON.stringify({ bench: 'scale', figure, value, unit, budget, ok, load: loadavg()[0].toFixed(1) }));

// BENCH_SCALE_DIR keeps the bulk store between runs (made on the first): repeat a measurement
// without loading 100,000 versions again.
const keepDir = process.env.BENCH_SCALE_DIR;
const reuse = keepDir && existsSync(join(keepDir, 'PG_VERSION'));
const dir = keepDir ?? mkdtempSync(join(tmpdir(), 'cagewright-bench-scale-'));
if (keepDir) mkdirSync(keepDir, { recursive: true });
try {
  let s;
  if (!reuse) {
    s = await startServer({ dataDir: dir });
    await s.stop();

    const t0 = performance.now();
    const db = await PGlite.create({ dataDir: dir });
    await db.exec(`
    insert into machines (org_id, family_id, drum, vane_control, serial, nickname)
    select case when g % 2 = 0 then (select id from organisations where name = 'Larkspur Farms')
                else (select id from organisations where name = 'Haldane Brothers') end,
           (select family_id from machines order by created_at limit 1), 'full', 'fixed', 'SC-' || g, 'Scale ' || g
    from generate_series(1, ${MACHINES - 3}) g;
    insert into layouts (machine_id, org_id, name, current_version)
    select id, org_id, 'scale plan', ${VERSIONS_PER_LAYOUT} from machines where serial like 'SC-%';
    insert into layout_versions (layout_id, version, body, note)
    select l.id, v.v, (select body from layout_versions order by created_at limit 1), 'bulk ' || v.v
    from layouts l cross join generate_series(1, ${VERSIONS_PER_LAYOUT}) v(v) where l.name = 'scale plan';
  `);
    // One layout with a long history (the history page must not grow with it).
    await db.exec(`
    with big as (select id from layouts where name = 'scale plan' order by id limit 1)
    insert into layout_versions (layout_id, version, body, note)
    select big.id, v.v, (select body from layout_versions order by created_at limit 1), 'long ' || v.v
    from big cross join generate_series(${VERSIONS_PER_LAYOUT + 1}, ${LONG_HISTORY}) v(v);
    update layouts set current_version = ${LONG_HISTORY}, name = 'long history' where id = (select id from layouts where name = 'scale plan' order by id limit 1);
    analyze;
  `);
    await db.query('CHECKPOINT');
    await db.close();
    report('bulk load time', Math.round(performance.now() - t0), '(reference)', true, 'ms');
  }
  const look = await PGlite.create({ dataDir: dir });
  const longLayout = (await look.query(`select id, machine_id from layouts where name = 'long history'`)).rows[0];
  const counts = await look.query(`select (select count(*)::int from machines) m, (select count(*)::int from layout_versions) v`);
  await look.close();
  const { m, v } = counts.rows[0];
  report('store: machines / layout versions', `${m} / ${v}`, '2,000 / 100,000', m >= 2000 && v >= 100000);

  s = await startServer({ dataDir: dir });
  const cookie = await signIn(s.base, 'tomas@kestrel.example');
  const headers = { cookie };
  const page = await (await fetch(`${s.base}/api/machines?page=10&pageSize=50`, { headers })).json();
  const items = page.items ?? page.machines ?? [];
  const machineId = items[0]?.id;
  const layouts = machineId ? await (await fetch(`${s.base}/api/machines/${machineId}/layouts`, { headers })).json() : null;
  const layoutId = layouts?.layouts?.[0]?.id;

  // Page 20 as the list's Next button asks for it: from page 19's last row (keyset cursor).
  const page19 = await (await fetch(`${s.base}/api/machines?page=19&pageSize=50`, { headers })).json();
  const endpoints = [
    [
      'GET /api/machines page 20 of 50 (Next, keyset)',
      page19.next && `/api/machines?page=20&pageSize=50&after=${encodeURIComponent(page19.next)}`,
    ],
    ['GET /api/machines?q=Scale 19&sort=nickname', `/api/machines?q=${encodeURIComponent('Scale 19')}&sort=nickname`],
    ['GET /api/machines/:id/layouts', machineId && `/api/machines/${machineId}/layouts`],
    ['GET /api/layouts/:id/versions', layoutId && `/api/layouts/${layoutId}/versions`],
  ];
  // A few seconds of the list first, not measured: the first seconds after a start also run the
  // start-up housekeeping and warm the code and the store's pages, which the first endpoint
  // measured would otherwise pay for alone.
  await cannon({ url: `${s.base}/api/machines?pageSize=50`, headers, connections: 10, duration: 3 });
  for (const [name, path] of endpoints) {
    if (!path) {
      report(`${name} p95`, 'not measured', '≤ 50 ms', false);
      continue;
    }
    const r = summary(await cannon({ url: s.base + path, headers, connections: 10, duration }));
    report(`${name} p95`, r.p95, '≤ 50 ms', r.errors === 0, 'ms');
    await oneAtATime(name, s.base + path);
  }
  // For reference: the same page opened by its number (a typed URL), which counts past 950 rows.
  const byNumber = summary(await cannon({ url: `${s.base}/api/machines?page=20&pageSize=50`, headers, connections: 10, duration }));
  report('GET /api/machines?page=20&pageSize=50 p95 (by number)', byNumber.p95, '(reference)', byNumber.errors === 0, 'ms');

  // The layout with the long history: its history page (HTML) and the versions API.
  const longPath = longLayout ? `/machines/${longLayout.machine_id}/layouts/${longLayout.id}` : null;
  if (!longPath) {
    report(`history page, ${LONG_HISTORY} versions`, 'not found', '≤ 100 KB', false);
  } else {
    const html = await (await fetch(`${s.base}${longPath}/history`, { headers })).text();
    report(
      `history page HTML, layout with ${LONG_HISTORY} versions`,
      Math.round(Buffer.byteLength(html) / 102.4) / 10,
      '≤ 100 KB',
      true,
      'KB',
    );
    const r = summary(await cannon({ url: `${s.base}${longPath}/history`, headers, connections: 10, duration }));
    report(`history page p95, ${LONG_HISTORY} versions, 10 connections`, r.p95, '≤ 100 ms', r.errors === 0, 'ms');
    await oneAtATime('history page', `${s.base}${longPath}/history`);
  }
  await s.stop();

  // One request's cost: the same URL on one connection, so no request waits for another (at 10
  // connections on one single-threaded store, p95 is about ten times this). Steadier than the p95
  // on a shared machine, and the figure to watch when changing what a request does.
  async function oneAtATime(name, url) {
    const r = await cannon({ url, headers, connections: 1, duration: Math.min(duration, 5) });
    const each = r.requests.total > 0 ? Math.round((r.duration * 1000 * 10) / r.requests.total) / 10 : null;
    report(
      `${name}: one request at a time, mean (${Math.round(r.requests.average)} req/s)`,
      each ?? 'not measured',
      '(figure)',
      true,
      'ms',
    );
  }
} finally {
  if (!keepDir) rmSync(dir, { recursive: true, force: true });
}
