import { describe, expect, it } from 'vitest';
import { Client, DEMO_PASSWORD, signedIn } from './client';
import { OTHER } from './matrix-fixtures';

/**
 * Sessions end on the server: an old cookie is refused after sign-out, after a role change and
 * after a password change (401 on the API, a redirect to the sign-in page on pages).
 */
async function as(email: string, password = DEMO_PASSWORD) {
  const c = new Client();
  const res = await c.signIn(email, password);
  if (!c.hasSession()) throw new Error(`sign-in as ${email} failed: ${res.headers.get('location')}`);
  return c;
}

async function expectRefused(c: Client) {
  expect((await c.get('/api/me')).status).toBe(401);
  // Auth.js's own session endpoint agrees: no user.
  const session = await c.copy().get('/api/auth/session');
  expect(session.body?.user).toBeUndefined();
  const page = await c.fetch('/machines');
  expect(page.status).toBe(303);
  expect(page.headers.get('location')).toBe('/signin?next=%2Fmachines');
}

describe('sign-out', () => {
  it('ends the session on the server: the old cookie is refused, other sessions stay', async () => {
    const c = await signedIn('technician');
    const other = await signedIn('technician');
    const kept = c.copy(); // someone kept a copy of the cookie
    expect((await kept.get('/api/me')).status).toBe(200);
    const out = await c.signOut();
    expect(out.status).toBe(302);
    expect(c.hasSession()).toBe(false);
    await expectRefused(kept);
    expect((await other.get('/api/me')).status).toBe(200);
  });
});

describe('role change', () => {
  it('ends every session of that person; they sign in again under the new role', async () => {
    const admin = await as(OTHER.dealer_admin);
    const people = (await admin.get('/api/admin/users')).body.users as { id: string; email: string; orgId: string; role: string }[];
    const mara = people.find((p) => p.email === OTHER.trainer)!;
    const s1 = await as(OTHER.trainer);
    const s2 = await as(OTHER.trainer);
    expect((await s1.get('/api/me')).body.role).toBe('trainer');
    try {
      const res = await admin.put(`/api/admin/users/${mara.id}`, { orgId: mara.orgId, role: 'technician' });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body).toMatchObject({ previous: 'trainer', role: 'technician' });
      await expectRefused(s1);
      await expectRefused(s2);
      const again = await as(OTHER.trainer);
      expect((await again.get('/api/me')).body.role).toBe('technician');
    } finally {
      expect((await admin.put(`/api/admin/users/${mara.id}`, { orgId: mara.orgId, role: 'trainer' })).status).toBe(200);
    }
    // The administrator's own session is untouched.
    expect((await admin.get('/api/me')).status).toBe(200);
  });

  it('refuses bad input by field, another dealer’s people as 404, and one’s own role', async () => {
    const admin = await as(OTHER.dealer_admin);
    const ownAdmin = await signedIn('dealerAdmin');
    const people = (await admin.get('/api/admin/users')).body.users as { id: string; email: string; orgId: string; role: string }[];
    const mara = people.find((p) => p.email === OTHER.trainer)!;
    const self = people.find((p) => p.email === OTHER.dealer_admin)!;
    const s = await as(OTHER.trainer);
    expect((await admin.put(`/api/admin/users/${mara.id}`, { orgId: mara.orgId, role: 'wizard' })).body.error.field).toBe('role');
    expect((await admin.put(`/api/admin/users/${mara.id}`, { orgId: 'x', role: 'operator' })).body.error.field).toBe('orgId');
    expect((await admin.put(`/api/admin/users/${mara.id}`, { orgId: mara.orgId, role: 'operator', extra: 1 })).status).toBe(400);
    expect((await ownAdmin.put(`/api/admin/users/${mara.id}`, { orgId: mara.orgId, role: 'operator' })).status).toBe(404);
    expect((await admin.put(`/api/admin/users/${self.id}`, { orgId: self.orgId, role: 'operator' })).status).toBe(409);
    expect((await s.put(`/api/admin/users/${mara.id}`, { orgId: mara.orgId, role: 'admin' })).status).toBe(403);
    // Nothing changed: the trainer's session is still open and still a trainer.
    expect((await s.get('/api/me')).body.role).toBe('trainer');
  });
});

describe('password change', () => {
  it('checks the current password, then ends every session; the new password works, the old does not', async () => {
    const email = OTHER.technician;
    const s1 = await as(email);
    const s2 = await as(email);
    const newPassword = 'a-fresh-password-for-rowan';
    const missing = await s1.post('/api/me/password', { currentPassword: DEMO_PASSWORD });
    expect(missing.status).toBe(400);
    expect(missing.body.error.field).toBe('newPassword');
    const short = await s1.post('/api/me/password', { currentPassword: DEMO_PASSWORD, newPassword: 'short' });
    expect(short.body.error.field).toBe('newPassword');
    const wrong = await s1.post('/api/me/password', { currentPassword: 'not-it', newPassword });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.field).toBe('currentPassword');
    expect((await s2.get('/api/me')).status).toBe(200); // nothing changed yet

    const ok = await s1.post('/api/me/password', { currentPassword: DEMO_PASSWORD, newPassword });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    await expectRefused(s1);
    await expectRefused(s2);
    const old = new Client();
    await old.signIn(email, DEMO_PASSWORD);
    expect(old.hasSession()).toBe(false);
    const fresh = await as(email, newPassword);
    // Put the fixture's password back for the other suites.
    expect((await fresh.post('/api/me/password', { currentPassword: newPassword, newPassword: DEMO_PASSWORD })).status).toBe(200);
    await as(email);
  });
});

describe('password page', () => {
  const post = (c: Client, fields: Record<string, string>) =>
    c.fetch('/account/password', {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams(fields).toString(),
    });

  it('works without JavaScript: names the problem, then signs out everywhere on success', async () => {
    const email = OTHER.operator;
    const c = await as(email);
    const elsewhere = await as(email);
    expect((await c.fetch('/account/password')).status).toBe(200);
    const wrong = await post(c, { currentPassword: 'nope', newPassword: 'june-fenwick-new-2026', repeatPassword: 'june-fenwick-new-2026' });
    expect(wrong.status).toBe(400);
    expect(await wrong.text()).toMatch(/Current password: that is not your current password/);
    const mismatch = await post(c, {
      currentPassword: DEMO_PASSWORD,
      newPassword: 'june-fenwick-new-2026',
      repeatPassword: 'something-else-2026',
    });
    expect(mismatch.status).toBe(400);
    expect(await mismatch.text()).toMatch(/New password again: type the same new password twice/);
    expect((await elsewhere.get('/api/me')).status).toBe(200);

    const ok = await post(c, {
      currentPassword: DEMO_PASSWORD,
      newPassword: 'june-fenwick-new-2026',
      repeatPassword: 'june-fenwick-new-2026',
    });
    expect(ok.status).toBe(303);
    expect(ok.headers.get('location')).toBe('/signin?notice=password-changed');
    expect(c.hasSession()).toBe(false);
    expect(await (await c.fetch('/signin?notice=password-changed')).text()).toMatch(/signed out everywhere/);
    await expectRefused(elsewhere);
    const fresh = await as(email, 'june-fenwick-new-2026');
    expect((await fresh.post('/api/me/password', { currentPassword: 'june-fenwick-new-2026', newPassword: DEMO_PASSWORD })).status).toBe(
      200,
    );
  });
});
