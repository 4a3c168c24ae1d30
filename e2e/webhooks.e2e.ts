import { test, expect } from '@playwright/test';
import { submitSignIn } from './support';

const SHOTS = process.env.E2E_SCREENSHOT_DIR ?? '.tmp';

// The e2e server runs with the default target policy: https:// to public addresses only.
test('the demo admin registers a webhook, sees its secret once, and sends a test ping', async ({ page }) => {
  await submitSignIn(page, 'admin@corvid-lantern.test');
  await page.getByLabel('Current team').selectOption({ label: 'UI Motion · Admin' });
  await page.getByRole('navigation', { name: 'Team' }).getByRole('link', { name: 'Webhooks' }).click();
  await expect(page).toHaveURL(/\/team\/webhooks$/);
  await expect(page.getByText(/https:\/\/ only, to a public address/)).toBeVisible();

  // the server's policy answers beside the field
  await page.getByLabel('Receiver URL').fill('http://127.0.0.1:9/hooks');
  await page.getByRole('button', { name: 'Register webhook' }).click();
  await expect(page.getByText(/URL must use https:\/\//)).toBeVisible();
  // the shared schema answers before sending
  await page.getByLabel('Receiver URL').fill('builds dot example');
  await page.getByRole('button', { name: 'Register webhook' }).click();
  await expect(page.getByText(/URL must be an absolute http:\/\/ or https:\/\/ address/)).toBeVisible();

  await page.getByLabel('Receiver URL').fill('https://builds.corvid-lantern.test/hooks/tangentry');
  await page.getByLabel('Description (optional)').fill('Tidewright build farm');
  await page.getByLabel(/Changes requested/).uncheck();
  await page.getByRole('button', { name: 'Register webhook' }).click();
  const secret = page.getByTestId('webhook-secret');
  await expect(secret).toHaveText(/^whsec_[A-Za-z0-9_-]{43}$/);
  const value = await secret.textContent();
  await expect(page.getByRole('button', { name: 'Copy secret' })).toBeVisible();
  const row = page.getByTestId('webhook-row').filter({ hasText: 'Tidewright build farm' });
  await expect(row).toContainText('https://builds.corvid-lantern.test/hooks/tangentry');
  await expect(row).toContainText('Version proposed, Version approved, Channel moved (release)');
  await page.screenshot({ path: `${SHOTS}/webhooks-secret.png`, fullPage: true });

  // shown once: gone after "I have copied it", and not on the page after a reload
  await page.getByRole('button', { name: 'I have copied it' }).click();
  await expect(secret).toHaveCount(0);
  await page.reload();
  await expect(row).toBeVisible();
  expect(await page.content()).not.toContain(value!);

  // a test ping makes a delivery row, its state in words (the .test name does not resolve: it is retried)
  await row.getByRole('button', { name: /Send a test ping/ }).click();
  const deliveries = page.getByRole('region', { name: 'Deliveries of Tidewright build farm' });
  await expect(deliveries.getByRole('cell', { name: 'ping', exact: true })).toBeVisible();
  await expect(deliveries.getByText(/^(queued|retrying|failed|delivered)$/).first()).toBeVisible();
  await expect(deliveries.getByRole('button', { name: /^Redeliver ping/ })).toBeVisible();
  await page.screenshot({ path: `${SHOTS}/webhooks-deliveries.png`, fullPage: true });
});
