import { expect, test, type Page } from '@playwright/test';
import { shot, signIn } from './helpers';

/**
 * Under the Content-Security-Policy (scripts by hash, no 'unsafe-inline'): every island that
 * hydrates on load does hydrate, and the browser reports no violation on the pages that carry
 * islands. One report is expected and left out: zod tries `new Function("")` once to see whether
 * it may compile its parsers, is refused (the policy has no 'unsafe-eval'), and parses without.
 */
const isZodEvalProbe = (text: string) => /^script-src(-elem)? eval$/.test(text) || /evaluate a string as JavaScript/.test(text);
async function watchViolations(page: Page) {
  await page.addInitScript(() => {
    (window as unknown as { __csp: string[] }).__csp = [];
    document.addEventListener('securitypolicyviolation', (e) =>
      (window as unknown as { __csp: string[] }).__csp.push(`${e.violatedDirective} ${e.blockedURI}`),
    );
  });
  const console: string[] = [];
  page.on('console', (m) => {
    if (/Content Security Policy/i.test(m.text()) && !isZodEvalProbe(m.text())) console.push(m.text());
  });
  return console;
}

async function expectHydrated(page: Page, path: string, consoleViolations: string[]) {
  const res = await page.goto(path);
  expect(res?.status(), path).toBe(200);
  expect(res?.headers()['content-security-policy'], path).not.toContain("'unsafe-inline' 'sha");
  const scriptSrc = (res?.headers()['content-security-policy'] ?? '').split(';').find((d) => d.trim().startsWith('script-src'))!;
  expect(scriptSrc).not.toContain('unsafe-inline');
  const onLoad = page.locator('astro-island[client="load"]');
  expect(await onLoad.count(), `${path}: islands`).toBeGreaterThan(0);
  // Astro removes the `ssr` attribute once an island has hydrated.
  await expect(page.locator('astro-island[client="load"][ssr]'), `${path}: islands still waiting to hydrate`).toHaveCount(0);
  const reported = await page.evaluate(() => (window as unknown as { __csp: string[] }).__csp);
  expect(
    reported.filter((v) => !isZodEvalProbe(v)),
    `${path}: violations`,
  ).toEqual([]);
  expect(consoleViolations, `${path}: console`).toEqual([]);
}

test('islands hydrate under the CSP on the admin, fleet, editor and inspection pages', async ({ page }) => {
  const violations = await watchViolations(page);
  // The catalog's forms are the instance administrator's; the fleet is a dealer's.
  await signIn(page, 'instanceAdmin');
  await expectHydrated(page, '/admin/catalog', violations);
  await expectHydrated(page, '/admin/catalog/parts/new', violations);
  await page.context().clearCookies();
  await signIn(page, 'dealerAdmin');
  await expectHydrated(page, '/machines', violations);
  const machines = (await (await page.request.get('/api/machines?pageSize=100')).json()).items as { id: string }[];
  let editor = '';
  for (const m of machines) {
    const layouts = (await (await page.request.get(`/api/machines/${m.id}/layouts`)).json()).layouts as { id: string }[] | undefined;
    if (layouts?.length) {
      editor = `/machines/${m.id}/layouts/${layouts[0]!.id}`;
      break;
    }
  }
  expect(editor).not.toBe('');
  await expectHydrated(page, editor, violations);
  await shot(page, 'csp-editor-hydrated');
  const inspections = (await (await page.request.get('/api/inspections?pageSize=5')).json()).items as { id: string }[];
  await expectHydrated(page, `/inspections/${inspections[0]!.id}`, violations);
});

test('islands hydrate under the CSP in the classroom', async ({ page }) => {
  const violations = await watchViolations(page);
  await signIn(page, 'trainer');
  await expectHydrated(page, '/classroom', violations);
  const decks = (await (await page.request.get('/api/decks')).json()).decks as { id: string; slideCount: number }[];
  const deck = decks.find((d) => d.slideCount > 0)!;
  await expectHydrated(page, `/classroom/${deck.id}`, violations);
  await expectHydrated(page, `/classroom/${deck.id}/present`, violations);
  await shot(page, 'csp-classroom-present', false);
});

test('Print buttons print under the CSP (a bundled handler, not an inline one)', async ({ page }) => {
  const violations = await watchViolations(page);
  await page.addInitScript(() => {
    (window as unknown as { printed: number }).printed = 0;
    window.print = () => void (window as unknown as { printed: number }).printed++;
  });
  await signIn(page, 'dealerAdmin');
  const machines = (await (await page.request.get('/api/machines?pageSize=5')).json()).items as { id: string }[];
  await page.goto(`/machines/${machines[0]!.id}/card`);
  await page.getByRole('button', { name: 'Print the card' }).click();
  await expect.poll(() => page.evaluate(() => (window as unknown as { printed: number }).printed)).toBe(1);
  const inspections = (await (await page.request.get('/api/inspections?pageSize=5')).json()).items as { id: string }[];
  await page.goto(`/inspections/${inspections[0]!.id}/report`);
  await page.getByRole('button', { name: 'Print' }).click();
  await expect.poll(() => page.evaluate(() => (window as unknown as { printed: number }).printed)).toBe(1);
  expect(violations).toEqual([]);
});
