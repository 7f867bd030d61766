import { expect, type Page } from '@playwright/test';
import { mkdirSync } from 'node:fs';

export const DEMO_PASSWORD = 'cage-demo-2026';
export const DEMO = {
  operator: { email: 'olive@larkspur.example', name: 'Olive' },
  operator2: { email: 'dev@haldane.example', name: 'Dev' },
  technician: { email: 'tomas@kestrel.example', name: 'Tomas' },
  trainer: { email: 'priya@kestrel.example', name: 'Priya' },
  dealerAdmin: { email: 'admin@kestrel.example', name: 'Ada' },
  instanceAdmin: { email: 'noor@cagewright.example', name: 'Noor' },
} as const;

export async function signIn(page: Page, who: keyof typeof DEMO, next = '/') {
  await page.goto(`/signin?next=${encodeURIComponent(next)}`);
  await page.getByLabel('E-mail address').fill(DEMO[who].email);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByTestId('role-label')).toBeVisible();
}

/** Screenshots land in e2e/screenshots/ to be looked at (not committed). */
export async function shot(page: Page, name: string, fullPage = true) {
  mkdirSync('e2e/screenshots', { recursive: true });
  await page.screenshot({ path: `e2e/screenshots/${name}.png`, fullPage });
}
