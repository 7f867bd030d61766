import { test, expect } from '@playwright/test';
import { DEMO, DEMO_PASSWORD, shot, signIn } from './helpers';

const ROLE_TEXT = {
  operator: 'Operator',
  technician: 'Service technician',
  trainer: 'Trainer',
  dealerAdmin: 'Dealer administrator',
  instanceAdmin: 'Instance administrator',
} as const;

for (const role of ['operator', 'technician', 'trainer', 'dealerAdmin', 'instanceAdmin'] as const) {
  test(`${role} signs in on our page and lands on a home page for the role`, async ({ page }) => {
    await signIn(page, role);
    await expect(page).toHaveURL(/\/$/);
    await expect(page.getByTestId('home-heading')).toContainText(DEMO[role].name);
    await expect(page.getByTestId('role-label')).toHaveText(ROLE_TEXT[role]);
    const nav = page.getByRole('navigation', { name: 'Main' });
    if (role === 'instanceAdmin') {
      await expect(nav.getByRole('link', { name: 'Catalog' })).toBeVisible();
      await expect(nav.getByRole('link', { name: 'Backup' })).toBeVisible();
      await expect(nav.getByRole('link', { name: 'Machines' })).toHaveCount(0);
    } else await expect(nav.getByRole('link', { name: 'Backup' })).toHaveCount(0);
    if (role === 'dealerAdmin') {
      await expect(nav.getByRole('link', { name: 'Price list' })).toBeVisible();
      await expect(nav.getByRole('link', { name: 'Mailbox' })).toBeVisible();
    }
    if (!role.endsWith('Admin')) await expect(nav.getByRole('link', { name: 'Mailbox' })).toHaveCount(0);
    if (role === 'trainer') await expect(nav.getByRole('link', { name: 'Classroom' })).toBeVisible();
    if (role === 'operator') await expect(nav.getByRole('link', { name: 'Crop change' })).toBeVisible();
    await shot(page, `home-${role}`);
  });
}

test('a wrong password shows a clear message and sets no session', async ({ page, context }) => {
  await page.goto('/signin');
  await page.getByLabel('E-mail address').fill(DEMO.operator.email);
  await page.getByLabel('Password').fill('not-the-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('alert')).toContainText('do not match an account');
  const cookies = await context.cookies();
  expect(cookies.some((c) => c.name.includes('session-token'))).toBe(false);
  await shot(page, 'signin-wrong-password');
});

test('an over-long e-mail address is refused with a message, no stack trace', async ({ page }) => {
  await page.goto('/signin');
  await page.getByLabel('E-mail address').evaluate((el) => el.removeAttribute('maxlength'));
  await page.getByLabel('E-mail address').fill('a'.repeat(300) + '@example.com');
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('alert')).toContainText('valid e-mail address');
  await expect(page.locator('body')).not.toContainText('Error:');
});

test('signed-out visitors are sent to sign in, then back where they were going', async ({ page }) => {
  await page.goto('/machines');
  await expect(page).toHaveURL(/\/signin\?next=%2Fmachines/);
  await page.getByLabel('E-mail address').fill(DEMO.technician.email);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  // Back on the machines list (its table may add its paging and sort to the address once it loads).
  await expect(page).toHaveURL(/\/machines(\?.*)?$/);
});

test('sign out ends the session, also for a copy of the old cookie', async ({ page, context, browser }) => {
  await signIn(page, 'operator');
  const kept = await context.cookies();
  await page.getByRole('link', { name: 'Sign out' }).click();
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page).toHaveURL(/\/signin/);
  const cookies = await context.cookies();
  expect(cookies.some((c) => c.name.includes('session-token'))).toBe(false);
  await page.goto('/');
  await expect(page).toHaveURL(/\/signin/);
  // Someone who kept the cookie from before is signed out too: the server ended the session.
  const other = await browser.newContext();
  await other.addCookies(kept);
  const again = await other.newPage();
  await again.goto('/machines');
  await expect(again).toHaveURL(/\/signin\?next=%2Fmachines/);
  await other.close();
});

test('too many failed attempts: the page says when to try again', async ({ page }) => {
  const email = 'nobody-here@e2e.example'; // an address without an account, so no real user waits
  for (let i = 0; i < 6; i++) {
    await page.goto('/signin');
    await page.getByLabel('E-mail address').fill(email);
    await page.getByLabel('Password').fill(`guess-${i}`);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page.getByRole('alert')).toBeVisible();
  }
  await expect(page.getByRole('alert')).toContainText(/You can try again in \d+ seconds/);
  await expect(page.getByRole('alert')).toContainText('not locked');
  await shot(page, 'signin-throttled');
});
