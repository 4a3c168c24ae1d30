import { test, expect, type Page } from '@playwright/test';
import { submitSignIn } from './support';

// Demo accounts of the embedded default (server/seed/demo-accounts.ts); the e2e app runs with TANGENTRY_EMBEDDED=true.
const SHOTS = process.env.E2E_SCREENSHOT_DIR ?? '.tmp';


// The demo roles and what each should see in its first team ("Gameplay Feel" sorts first) and in UI Motion.
const ROLES = [
  { role: 'admin', gameplay: 'Admin', ui: 'Admin', tokens: true },
  { role: 'lead', gameplay: 'Lead', ui: 'Lead', tokens: false },
  { role: 'animator', gameplay: 'Viewer', ui: 'Animator', tokens: false },
  { role: 'engineer', gameplay: 'Engineer', ui: 'Engineer', tokens: false },
  { role: 'viewer', gameplay: null, ui: 'Viewer', tokens: false },
] as const;

test('the sign-in page lists the demo accounts of the embedded default', async ({ page }) => {
  await page.goto('/sign-in');
  await expect(page.getByRole('heading', { name: 'Demo accounts (embedded default)' })).toBeVisible();
  for (const r of ROLES) await expect(page.getByText(`${r.role}@corvid-lantern.test`)).toBeVisible();
  await page.getByRole('button', { name: 'Use lead@corvid-lantern.test' }).click();
  await expect(page.getByLabel('Email')).toHaveValue('lead@corvid-lantern.test');
  await page.screenshot({ path: `${SHOTS}/accounts-sign-in.png`, fullPage: true });
});

for (const r of ROLES) {
  test(`${r.role} signs in and sees the ${r.role} view`, async ({ page }) => {
    await submitSignIn(page, `${r.role}@corvid-lantern.test`);
    await expect(page).toHaveURL(/\/team$/);
    const myRole = page.getByTestId('my-role');
    if (r.gameplay) await expect(myRole).toContainText(`You are ${r.gameplay} in Gameplay Feel`);
    // the team switcher in the top bar: UI Motion
    const switcher = page.getByLabel('Current team');
    await switcher.selectOption({ label: `UI Motion · ${r.ui}` });
    await expect(myRole).toContainText(`You are ${r.ui} in UI Motion`);
    await expect(page.getByRole('navigation', { name: 'Team' }).getByRole('link', { name: 'Service tokens' })).toHaveCount(r.tokens ? 1 : 0);
    await expect(page.getByRole('heading', { name: 'Invite someone' })).toHaveCount(r.tokens ? 1 : 0);
    await expect(page.getByTestId('member-viewer@corvid-lantern.test')).toBeVisible();
    if (r.role === 'admin' || r.role === 'animator') await page.screenshot({ path: `${SHOTS}/accounts-team-${r.role}.png`, fullPage: true });
  });
}

test('a wrong password shows a clear message and signs nobody in', async ({ page }) => {
  await submitSignIn(page, 'lead@corvid-lantern.test', 'not-the-password');
  await expect(page.getByRole('alert')).toHaveText('That e-mail and password do not match an account.');
  await expect(page).toHaveURL(/\/sign-in$/);
  await expect(page.getByRole('banner').getByRole('link', { name: 'Sign in' })).toBeVisible();
  await page.screenshot({ path: `${SHOTS}/accounts-wrong-password.png`, fullPage: true });
});

test('sign out ends the session', async ({ page }) => {
  await submitSignIn(page, 'engineer@corvid-lantern.test');
  await expect(page.getByTestId('my-role')).toBeVisible();
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page).toHaveURL(/\/sign-in$/);
  await page.goto('/team');
  await expect(page.getByRole('heading', { name: 'Sign in to continue' })).toBeVisible();
  expect((await page.request.get('/api/auth/me')).status()).toBe(401);
});

test('admin creates a service token (shown once) and invites someone, whose mail appears in the outbox', async ({ page }) => {
  await submitSignIn(page, 'admin@corvid-lantern.test');
  await page.getByLabel('Current team').selectOption({ label: 'UI Motion · Admin' });
  await page.getByLabel('E-mail').fill('new-animator@corvid-lantern.test');
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByText('Invitation sent to new-animator@corvid-lantern.test.')).toBeVisible();

  await page.getByRole('link', { name: 'Service tokens' }).click();
  await page.getByLabel('Name').fill('nightly build farm');
  await page.getByLabel('Only these packs (optional)').fill('jump-arcs, Bad Slug');
  await page.getByRole('button', { name: 'Create token' }).click();
  await expect(page.getByText(/lower-case letters, digits and hyphens/)).toBeVisible();
  await page.getByLabel('Only these packs (optional)').fill('jump-arcs, camera-moves');
  await page.getByRole('button', { name: 'Create token' }).click();
  await expect(page.getByTestId('token-secret')).toHaveText(/^tgt_/);
  await page.screenshot({ path: `${SHOTS}/accounts-tokens.png`, fullPage: true });

  await page.getByRole('link', { name: 'Outbox' }).click();
  const invite = page.getByRole('link', { name: /\/invite\/inv_/ }).first();
  await expect(invite).toBeVisible();
  await page.screenshot({ path: `${SHOTS}/accounts-outbox.png`, fullPage: true });
  await page.getByRole('button', { name: 'Sign out' }).click();
  await invite.waitFor({ state: 'detached' }).catch(() => undefined);
});
