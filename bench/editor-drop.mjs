#!/usr/bin/env node
// Drop → findings painted, in Chromium with the CPU throttled 4× (CDP Emulation.setCPUThrottlingRate),
// then the same unthrottled in the same run. A left-hand element is carried with the keyboard onto
// a right half (Space, arrows) and dropped with Space. Marks in the page: `cw-drop-key` at the
// drop's keydown (its event time); when the findings list has changed in the document, a
// requestAnimationFrame callback and then a user-blocking task (`cw-findings-painted`): the rAF
// runs just before the frame that shows the change is painted, the task right after it (ahead
// of tasks the page queued earlier), so that time is the frame in which the finding is painted.
// The first plain setTimeout task after the frame is reported beside it: it also waits for the
// work the editor defers to after the paint. Undo between rounds brings the layout back. Reports the
// median and the maximum of BENCH_ROUNDS (≥ 10) drops at each rate.
//
// Work is counted too, as the load of a shared machine does not change it: the React components
// rendered from the drop's keydown to the painted mark (a minimal stand-in for React's devtools
// hook, installed before the page loads, counts the fibers that did work in each commit). The
// count walks React's whole tree in every commit, so it is taken in drops of its own that are
// not timed: inside the timed drops the walk would add its own time to the figure.
//
// The machines here are shared: wall time also counts time the browser waited for a core, so
// the load average of the run is printed with each figure.
import { mkdtempSync, rmSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium } from '@playwright/test';
import { DEMO_PASSWORD, startServer } from './lib.mjs';

const ROUNDS = Math.max(10, Number(process.env.BENCH_ROUNDS ?? 15));
const report = (figure, value, budget, ok, unit = 'ms') =>
  console.log(JSON.stringify({ bench: 'editor-drop', figure, value, unit, budget, ok, load: loadavg()[0].toFixed(1) }));
const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};
const round1 = (x) => Math.round(x * 10) / 10;

const dir = mkdtempSync(join(tmpdir(), 'cagewright-bench-drop-'));
const server = await startServer({ dataDir: dir });
const browser = await chromium.launch({
  executablePath: process.env.CAGEWRIGHT_CHROMIUM ?? '/usr/bin/chromium',
  args: [
    '--no-sandbox',
    '--disable-gpu',
    '--disable-quic',
    '--disable-background-networking',
    '--disable-component-update',
    '--disable-sync',
    '--no-first-run',
  ],
});
try {
  const page = await browser.newPage({ viewport: { width: 1440, height: 900 }, baseURL: server.base });
  await page.addInitScript(() => {
    const counter = (window.__cwRenders = { on: false, rendered: 0, commits: 0 });
    const named = (f) => typeof f.type === 'function' || (f.type && typeof f.type === 'object');
    // A fiber did work in this commit when it is new or carries React's PerformedWork flag (1);
    // a subtree React bailed out of keeps its old child fibers and is not walked.
    const walk = (f) => {
      for (; f; f = f.sibling) {
        const a = f.alternate;
        if (named(f) && (!a || f.flags & 1)) counter.rendered++;
        if (!a || a.child !== f.child) walk(f.child);
      }
    };
    window.__REACT_DEVTOOLS_GLOBAL_HOOK__ = {
      supportsFiber: true,
      isDisabled: false,
      renderers: new Map(),
      inject: () => 1,
      checkDCE() {},
      onScheduleFiberRoot() {},
      onPostCommitFiberRoot() {},
      onCommitFiberUnmount() {},
      onCommitFiberRoot(_id, root) {
        if (!counter.on) return;
        counter.commits++;
        walk(root.current.child);
      },
    };
  });
  await page.goto('/signin');
  await page.getByLabel('E-mail address').fill('olive@larkspur.example');
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => !u.pathname.startsWith('/signin'));
  const machines = await (await page.request.get('/api/machines?q=North')).json();
  const machineId = machines.items[0].id;
  const layouts = await (await page.request.get(`/api/machines/${machineId}/layouts`)).json();
  await page.goto(`/machines/${machineId}/layouts/${layouts.layouts[0].id}`);
  await page.waitForSelector('astro-island:not([ssr]) [data-testid="cage-editor"]');
  const item = page.locator('[data-testid="palette"] [data-part="CW-WW-L-04"]');
  await item.waitFor();

  const cdp = await page.context().newCDPSession(page);

  // dnd-kit's live region, read in the page.
  await page.evaluate(() => {
    window.liveText = () => document.querySelector('[id^="DndLiveRegion"]')?.textContent ?? '';
  });
  /** A slot's place words in the editor's own phrasing: its label up to the first colon, as in a sentence. */
  const placeWordsOf = async (key) => {
    const label = await page.locator(`[data-testid="diagram-pane"] [data-place="${key}"]`).getAttribute('aria-label');
    if (!label) throw new Error(`no slot ${key} in the drawing`);
    const head = label.split(':')[0].trim();
    return head.charAt(0).toLowerCase() + head.slice(1);
  };

  await page.evaluate(() => {
    const w = window;
    w.__drops = [];
    w.__armed = false;
    document.addEventListener(
      'keydown',
      (e) => {
        if (!w.__armed || e.code !== 'Space') return;
        w.__armed = false;
        performance.mark('cw-drop-key', { startTime: e.timeStamp });
        Object.assign(w.__cwRenders, { on: !!w.__cwCount, rendered: 0, commits: 0 });
        const list = document.querySelector('[data-testid="findings"]');
        const obs = new MutationObserver(() => {
          obs.disconnect();
          const dom = performance.mark('cw-findings-dom');
          requestAnimationFrame(() => {
            // The frame's style, layout and paint run right after this callback, in the same
            // task; a task posted now runs after them. A user-blocking task (scheduler.postTask)
            // runs first among the tasks waiting, so it marks the painted frame itself; a plain
            // setTimeout waits behind whatever the page queued before (work deferred to after the
            // frame), and that later mark is reported beside it.
            let painted = null;
            let counted = null;
            const markPainted = () => {
              painted = performance.mark('cw-findings-painted');
              counted = { rendered: w.__cwRenders.rendered, commits: w.__cwRenders.commits };
              w.__cwRenders.on = false;
            };
            if (window.scheduler?.postTask) window.scheduler.postTask(markPainted, { priority: 'user-blocking' });
            else setTimeout(markPainted, 0);
            setTimeout(() => {
              if (!painted) markPainted();
              performance.mark('cw-first-plain-task');
              const a = performance.measure('cw drop → findings in the document', 'cw-drop-key', 'cw-findings-dom');
              const b = performance.measure('cw drop → findings painted', 'cw-drop-key', 'cw-findings-painted');
              const c = performance.measure('cw drop → first plain task after the frame', 'cw-drop-key', 'cw-first-plain-task');
              w.__drops.push({
                dom: a.duration,
                painted: b.duration,
                plainTask: c.duration,
                domAt: dom.startTime,
                paintedAt: painted.startTime,
                ...counted,
              });
            }, 0);
          });
        });
        obs.observe(list, { subtree: true, childList: true, characterData: true });
      },
      true,
    );
  });

  const step = (what) => process.env.BENCH_DEBUG && console.error(what);
  let done = 0;
  async function drops(rate, { rounds = ROUNDS, count = false } = {}) {
    await cdp.send('Emulation.setCPUThrottlingRate', { rate });
    await page.evaluate((on) => (window.__cwCount = on), count);
    const dom = [];
    const painted = [];
    const plainTask = [];
    const rendered = [];
    const commits = [];
    for (let i = 0; i < rounds; i++) {
      step(`rate ${rate} round ${i}`);
      // Pick the part up. The pick-up is not measured; after the previous round's undo the palette
      // may still re-render once (its hint follows the frame) and take the focus with it, so a key
      // press that started no carry is tried again, up to five times.
      for (let attempt = 1; ; attempt++) {
        await item.focus();
        await page.keyboard.press('Space');
        const picked = await page
          .waitForFunction(() => /Picked up/.test(window.liveText()), undefined, { timeout: 3_000 })
          .then(() => true)
          .catch(() => false);
        if (picked) break;
        if (attempt === 5)
          throw new Error(`no pick-up after 5 tries; the live region says: ${await page.evaluate(() => window.liveText())}`);
        step(`pick-up attempt ${attempt} started no carry`);
        await page.keyboard.press('Escape');
        await page.waitForTimeout(200);
      }
      await page.waitForTimeout(100); // the sensor starts listening for keys on the next task
      // Each step waits for its announcement (the sensor listens for keys a moment after pick-up):
      // "Over <the slot's place words>, …", the words read from the slot's own label in the
      // drawing (text before its first colon), so a change of phrasing does not stall the bench.
      for (const [k, key] of [
        ['ArrowRight', 'element:1:left'],
        ['ArrowRight', 'element:2:left'],
        ['ArrowRight', 'element:3:left'],
        ['ArrowDown', 'element:3:right'],
      ]) {
        const words = await placeWordsOf(key);
        await page.keyboard.press(k);
        await page
          .waitForFunction((w) => window.liveText().includes(`Over ${w},`), words, { timeout: 30_000 })
          .catch(async (err) => {
            throw new Error(`no "Over ${words}," after ${k}; the live region says: ${await page.evaluate(() => window.liveText())}`, {
              cause: err,
            });
          });
      }
      await page.waitForTimeout(150); // let the carry settle, so only the drop is measured
      await page.evaluate(() => (window.__armed = true));
      await page.keyboard.press('Space');
      done++;
      await page.waitForFunction((n) => window.__drops.length === n, done);
      if ((await page.locator('[data-testid="findings"] [data-code="FIT_HAND_MISMATCH"]').count()) !== 1)
        throw new Error('the hand finding did not show after the drop');
      const d = await page.evaluate((n) => window.__drops[n], done - 1);
      dom.push(d.dom);
      painted.push(d.painted);
      plainTask.push(d.plainTask);
      rendered.push(d.rendered);
      commits.push(d.commits);
      await page.locator('[data-command="undo"]').click();
      await page.waitForFunction(() => !document.querySelector('[data-testid="findings"] [data-code="FIT_HAND_MISMATCH"]'));
    }
    await cdp.send('Emulation.setCPUThrottlingRate', { rate: 1 });
    return { dom, painted, plainTask, rendered, commits };
  }

  const slow = await drops(4);
  const note = `(${ROUNDS} drops; ${cpus().length} cores)`;
  report(`drop → findings painted, median, CPU 4× slower ${note}`, round1(median(slow.painted)), '≤ 33 ms', true);
  report('drop → findings painted, max, CPU 4× slower', round1(Math.max(...slow.painted)), '(figure)', true);
  report('drop → findings in the document, median, CPU 4× slower', round1(median(slow.dom)), '(figure)', true);
  report(
    'drop → first plain task after the frame (incl. work deferred past the paint), median, CPU 4× slower',
    round1(median(slow.plainTask)),
    '(figure)',
    true,
  );
  const fast = await drops(1);
  const counted = await drops(1, { rounds: 3, count: true });
  report(
    'components rendered, drop key → painted frame, median of 3 untimed drops (React commits)',
    `${median(counted.rendered)} (${median(counted.commits)})`,
    '(count)',
    true,
    '',
  );
  report(`drop → findings painted, median, unthrottled ${note}`, round1(median(fast.painted)), '≤ 16 ms', true);
  report('drop → findings painted, max, unthrottled', round1(Math.max(...fast.painted)), '(figure)', true);
  report('drop → first plain task after the frame, median, unthrottled', round1(median(fast.plainTask)), '(figure)', true);
} finally {
  await browser.close();
  await server.stop();
  rmSync(dir, { recursive: true, force: true });
}
