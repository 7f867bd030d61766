import { test, expect } from '@playwright/test';
import { signIn } from './helpers';

/** The operator's home counts their draft parts requests (and a new draft adds one). */
test('the operator’s home counts their drafts', async ({ page }) => {
  await signIn(page, 'operator');
  const list = async () => {
    const body = await (await page.request.get('/api/parts-requests?status=draft')).json();
    return ((body.items ?? body.requests ?? body) as { status: string }[]).filter((r) => r.status === 'draft').length;
  };
  const before = await list();
  await page.goto('/');
  await expect(page.getByTestId('home-drafts')).toHaveText(String(before));

  const machines = (await (await page.request.get('/api/machines')).json()).items as { id: string }[];
  const layouts = (await (await page.request.get(`/api/machines/${machines[0]!.id}/layouts`)).json()).layouts as { id: string }[];
  const layout = await (await page.request.get(`/api/layouts/${layouts[0]!.id}`)).json();
  const partNumber = layout.current.body.elements[0].partNumber as string;
  const made = await page.request.post('/api/parts-requests', {
    data: { from: 'manual', machineId: machines[0]!.id, lines: [{ partNumber, quantity: 1 }] },
  });
  expect(made.status()).toBe(201);
  await page.reload();
  await expect(page.getByTestId('home-drafts')).toHaveText(String(before + 1));
  await expect(page.getByTestId('home-drafts').getByRole('link')).toHaveAttribute('href', '/parts-requests');
});
