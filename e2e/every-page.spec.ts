import { test, expect, type Page } from '@playwright/test';
import AxeBuilder from '@axe-core/playwright';
import { createHash } from 'node:crypto';
import { shot, signIn, type DEMO } from './helpers';
import { demoIds, pageUrls, type DemoIds } from './pages';

/**
 * Every page from src/pages (see ./pages.ts), signed out and as each role: it fits a phone
 * (no sideways scrolling of the page at 390 CSS px; a drawing scrolls in its own box and says
 * so), and axe-core finds no serious or critical accessibility violation at phone and desktop
 * widths. Pages a role may not open are checked as they show (the refusal page).
 *
 * Every page is opened and measured at 390 px for every role. axe-core's findings are a function
 * of the document and the viewport, so a document already checked at the same viewport (the
 * sign-in page that every protected page sends a signed-out visitor to, a refusal shown the same
 * way on several pages) is not checked a second time: its findings are reported again under the
 * new route. The key is a hash of the viewport and the whole document's markup after hydration,
 * with the values of hidden inputs blanked (a CSRF token, the sign-in form's return path: axe
 * never looks at a hidden input). Each role's line in the output says how many runs that saved.
 */

type Who = keyof typeof DEMO | 'signed out';
const WHO: Who[] = ['signed out', 'operator', 'technician', 'trainer', 'dealerAdmin', 'instanceAdmin'];

const VIEWPORTS = { phone: { width: 390, height: 844 }, desktop: { width: 1440, height: 900 } } as const;

// The role tests only read pages (the setup makes two share links) and depend neither on each
// other nor on any other spec: with more than one worker (`npm test` gives this file two, in a
// run of its own) they run side by side.
test.describe.configure({ mode: 'parallel' });

let ids: DemoIds;
test.beforeAll(async ({ browser }) => {
  ids = await demoIds(browser);
});

/** Findings by document (see above); one map per worker, kept across the role tests. */
const checked = new Map<string, string[]>();

async function documentKey(page: Page): Promise<string> {
  const { html, mode, vw, vh } = await page.evaluate(() => {
    const copy = document.documentElement.cloneNode(true) as HTMLElement;
    for (const input of copy.querySelectorAll('input[type="hidden" i]')) input.setAttribute('value', '');
    return { html: copy.outerHTML, mode: document.compatMode, vw: window.innerWidth, vh: window.innerHeight };
  });
  return createHash('sha256').update(`${vw}x${vh} ${mode}\n${html}`).digest('hex');
}

async function axeProblems(page: Page): Promise<string[]> {
  // Legacy mode runs axe.run in the page itself; the default runs it frame by frame and then once
  // more in a new blank page (for cross-origin frames). Same findings when the page has no frame.
  const result = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'best-practice'])
    .setLegacyMode(page.frames().length === 1)
    .analyze();
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map(
      (v) =>
        `${v.impact} ${v.id}: ${v.help} — ${v.nodes
          .slice(0, 3)
          .map((n) => n.target.join(' '))
          .join(' | ')}`,
    );
}

interface Tally {
  runs: number;
  skipped: number;
  ms: Record<'open' | 'hydrate' | 'axe' | 'shots', number>;
}

/** axe's findings on the page as it is now, from the map when the same document was checked at this viewport. */
async function axeOnce(page: Page, tally: Tally): Promise<string[]> {
  const key = await documentKey(page);
  const seen = checked.get(key);
  if (seen) {
    tally.skipped++;
    return seen;
  }
  const t0 = Date.now();
  const found = await axeProblems(page);
  tally.ms.axe += Date.now() - t0;
  tally.runs++;
  checked.set(key, found);
  return found;
}

for (const who of WHO) {
  test(`every page, ${who}: fits 390 px and has no serious or critical axe violation`, async ({ page }) => {
    test.setTimeout(600_000);
    if (who !== 'signed out') await signIn(page, who);
    const problems: string[] = [];
    const tally: Tally = { runs: 0, skipped: 0, ms: { open: 0, hydrate: 0, axe: 0, shots: 0 } };
    const pages = pageUrls(ids);
    for (const { route, url } of pages) {
      // Signing out is a form that posts; the page itself is checked like any other.
      await page.setViewportSize(VIEWPORTS.phone);
      let t0 = Date.now();
      const res = await page.goto(url);
      expect(res, url).toBeTruthy();
      await page.waitForLoadState('load');
      tally.ms.open += Date.now() - t0;
      // Islands hydrate (those shown only when scrolled to may stay as drawn on the server).
      // Astro takes the `ssr` mark off an island once it has hydrated; no mark, no wait.
      t0 = Date.now();
      const pending = page.locator('astro-island[ssr]:not([client="visible"])');
      if ((await pending.count()) > 0) {
        const hydrated = await pending
          .first()
          .waitFor({ state: 'detached', timeout: 15_000 })
          .then(() => true)
          .catch(() => false);
        if (!hydrated) console.log(`[${who}] ${route}: an island had not hydrated after 15 s; checked as it stands`);
      }
      tally.ms.hydrate += Date.now() - t0;
      const w = await page.evaluate(() => ({ sw: document.documentElement.scrollWidth, cw: document.documentElement.clientWidth }));
      if (w.sw > w.cw) problems.push(`${route}: the page scrolls sideways at 390 px (${w.sw} > ${w.cw})`);
      for (const p of await axeOnce(page, tally)) {
        problems.push(`${route} at 390 px: ${p}`);
        console.log(`[${who}] ${route} at 390 px: ${p}`);
      }
      t0 = Date.now();
      if (who === 'technician') await shot(page, `page-390${route.replace(/[/[\]]+/g, '-')}`, false);
      tally.ms.shots += Date.now() - t0;
      await page.setViewportSize(VIEWPORTS.desktop);
      for (const p of await axeOnce(page, tally)) problems.push(`${route} at 1440 px: ${p}`);
      t0 = Date.now();
      if (who === 'technician') await shot(page, `page-1440${route.replace(/[/[\]]+/g, '-')}`, false);
      tally.ms.shots += Date.now() - t0;
    }
    const s = (ms: number) => (ms / 1000).toFixed(1);
    console.log(
      `[${who}] ${pages.length} pages at 390 and 1440 px: ${tally.runs} axe runs, ${tally.skipped} skipped as a document ` +
        `already checked at that width; seconds opening ${s(tally.ms.open)}, hydrating ${s(tally.ms.hydrate)}, ` +
        `in axe ${s(tally.ms.axe)}, screenshots ${s(tally.ms.shots)}`,
    );
    for (const p of problems) console.log(`[${who}] ${p}`);
    expect(problems).toEqual([]);
  });
}

test('the top navigation collapses into a menu on a phone', async ({ page }) => {
  await signIn(page, 'technician');
  await page.setViewportSize({ width: 390, height: 844 });
  await page.goto('/machines');
  const menu = page.getByTestId('site-menu');
  await expect(menu).toBeVisible();
  const nav = page.getByRole('navigation', { name: 'Main' });
  await expect(nav).toHaveCount(0);
  await menu.getByText('Menu').click();
  await expect(nav).toHaveCount(1);
  await expect(nav.getByRole('link', { name: 'Machines' })).toHaveAttribute('aria-current', 'page');
  await shot(page, 'nav-menu-390', false);
  await nav.getByRole('link', { name: 'Inspections' }).click();
  await expect(page).toHaveURL(/\/inspections$/);
  await page.setViewportSize({ width: 1440, height: 900 });
  await expect(page.getByTestId('site-menu')).toBeHidden();
  await expect(page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Machines' })).toBeVisible();
});

test('the share page shows every column of the parts list on a phone', async ({ page }) => {
  await page.setViewportSize({ width: 390, height: 844 });
  await page.goto(`/share/${ids.shareToken}`);
  const table = page.getByTestId('parts-table');
  await expect(table).toBeVisible();
  const heads = await table.locator('thead th').allInnerTexts();
  expect(heads).toContain('Weight each');
  const cells = await table
    .locator('tbody tr')
    .first()
    .locator('td')
    .evaluateAll((tds) =>
      tds.map((td) => {
        const r = td.getBoundingClientRect();
        return {
          label: td.getAttribute('data-label'),
          left: r.left,
          right: r.right,
          h: r.height,
          before: getComputedStyle(td, '::before').content,
        };
      }),
    );
  expect(cells.map((c) => c.label)).toEqual(['Part number', 'Part', 'Hand', 'Qty', 'Weight each', 'Unit price', 'Where']);
  for (const c of cells) {
    expect(c.h, c.label!).toBeGreaterThan(0);
    expect(c.left, c.label!).toBeGreaterThanOrEqual(0);
    expect(c.right, c.label!).toBeLessThanOrEqual(390);
    expect(c.before).toContain(c.label!);
  }
  await shot(page, 'share-390');
  await page.setViewportSize({ width: 1440, height: 900 });
  await shot(page, 'share-1440');
});
