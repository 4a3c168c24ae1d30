import { test, expect, type Page } from '@playwright/test';
import { signInToTeam } from './support';

// Demo accounts of the embedded default (server/seed/demo-accounts.ts); target profiles seeded from the brief.
const SHOTS = process.env.E2E_SCREENSHOT_DIR ?? '.tmp';


test('an engineer sees the demo targets, is told which field is wrong, and adds a profile', async ({ page }) => {
  await signInToTeam(page, 'engineer@corvid-lantern.test');
  await page.getByRole('navigation', { name: 'Team' }).getByRole('link', { name: 'Target profiles' }).click();
  await expect(page).toHaveURL(/\/team\/profiles$/);
  const table = page.getByRole('table', { name: 'Target profiles' });
  for (const name of ['Console', 'Handheld', 'Mobile', 'Web']) await expect(table.getByRole('rowheader', { name })).toBeVisible();
  // BRIEF.md demo scenario: Console tolerance 5e-4, in scientific notation with 3 significant figures
  await expect(table.getByRole('row', { name: /Console/ })).toContainText('5.00e-4 abs');

  await page.getByRole('button', { name: 'New target profile' }).click();
  await page.getByLabel('Name').fill('Handheld (tight)');
  await page.getByLabel('Tolerance', { exact: true }).fill('-2');
  await page.getByRole('button', { name: 'Add profile' }).click();
  await expect(page.locator('#profile-tolerance-value-error')).toContainText('tolerance.value');
  await page.getByLabel('Tolerance', { exact: true }).fill('1e-4');
  await page.getByLabel('Encoding').selectOption('f16');
  await page.getByRole('button', { name: 'Add profile' }).click();
  await expect(table.getByRole('rowheader', { name: 'Handheld (tight)' })).toBeVisible();
  await expect(table.getByRole('row', { name: /Handheld \(tight\)/ })).toContainText('f16');
  await page.screenshot({ path: `${SHOTS}/profiles-engineer.png`, fullPage: true });
});

test('a viewer reads the target profiles but gets no editing controls', async ({ page }) => {
  await signInToTeam(page, 'viewer@corvid-lantern.test');
  await page.goto('/team/profiles');
  await expect(page.getByRole('rowheader', { name: 'Console' })).toBeVisible();
  await expect(page.getByRole('button', { name: 'New target profile' })).toHaveCount(0);
  await expect(page.getByRole('button', { name: /^Edit / })).toHaveCount(0);
  await expect(page.getByText(/Engineers and admins of .* edit target profiles/)).toBeVisible();
});
