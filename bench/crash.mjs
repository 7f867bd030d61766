#!/usr/bin/env node
// Crash: a write load against the built server, SIGKILL in the middle of it, a restart on the
// same store, and a check that every acknowledged write is there. (The integration suite runs
// the same scenario with a small load as a test.)
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { signIn, startServer } from './lib.mjs';

const WRITERS = Number(process.env.BENCH_WRITERS ?? 16);
const LOAD_MS = Number(process.env.BENCH_LOAD_MS ?? 4000);
const report = (figure, value, budget, ok, unit = '') => console.log(JSON.stringify({ bench: 'crash', figure, value, unit, budget, ok }));

const dir = mkdtempSync(join(tmpdir(), 'cagewright-bench-crash-'));
try {
  const s = await startServer({ dataDir: dir });
  const cookie = await signIn(s.base, 'tomas@kestrel.example');
  const headers = { cookie, origin: s.base, 'content-type': 'application/json' };
  const home = await (await fetch(`${s.base}/`, { headers })).text();
  const machineId = home.match(/\/machines\/([0-9a-f-]{36})/)[1];
  const first = (await (await fetch(`${s.base}/api/machines/${machineId}/layouts`, { headers })).json()).layouts[0];
  const body = (await (await fetch(`${s.base}/api/layouts/${first.id}`, { headers })).json()).current.body;

  const acked = [];
  let running = true;
  let n = 0;
  const loops = Array.from({ length: WRITERS }, async (_, w) => {
    while (running) {
      const note = `crash ${w}-${n++}`;
      try {
        const res = await fetch(`${s.base}/api/machines/${machineId}/layouts`, {
          method: 'POST',
          headers,
          body: JSON.stringify({ name: note, body, note }),
        });
        if (res.status === 201) acked.push({ id: (await res.json()).layout.id, note });
      } catch {
        return;
      }
    }
  });
  await new Promise((r) => setTimeout(r, LOAD_MS));
  await s.stop('SIGKILL');
  running = false;
  await Promise.all(loops);
  report('writes acknowledged before SIGKILL', acked.length, '(reference)', acked.length > 0);

  const t0 = performance.now();
  const again = await startServer({ dataDir: dir });
  report('restart after SIGKILL to first 200', Math.round(again.firstOkMs), '(reference)', true, 'ms');
  const cookie2 = await signIn(again.base, 'tomas@kestrel.example');
  let missing = 0;
  for (const a of acked) {
    const res = await fetch(`${again.base}/api/layouts/${a.id}`, { headers: { cookie: cookie2 } });
    if (res.status !== 200 || (await res.json()).current.note !== a.note) missing++;
  }
  report('acknowledged writes missing after restart', missing, '0', missing === 0);
  void t0;
  await again.stop();
} finally {
  rmSync(dir, { recursive: true, force: true });
}
