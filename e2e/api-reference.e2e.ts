import { test, expect } from '@playwright/test';
import { signInToUiMotion } from './support';

// Demo accounts of the embedded default (server/seed/demo-accounts.ts): the engineer is in both demo teams.
const SHOTS = process.env.E2E_SCREENSHOT_DIR ?? '.tmp';

test('an engineer opens the API reference: curl examples carry their own team id and the token placeholder', async ({ page, context }) => {
  await context.grantPermissions(['clipboard-read', 'clipboard-write']);
  await signInToUiMotion(page, 'engineer@corvid-lantern.test', 'Engineer');
  await page.getByRole('navigation', { name: 'Team' }).getByRole('link', { name: 'Build-server API' }).click();
  await expect(page).toHaveURL(/\/api-reference$/);
  await expect(page.getByRole('heading', { name: 'UI Motion: build-server API' })).toBeVisible();

  // the person's own team, as the API itself says (their session on /api/v1/whoami)
  const whoami = await (await page.request.get('/api/v1/whoami')).json();
  const uiMotion = whoami.teams.find((t: { slug: string }) => t.slug === 'ui-motion').id as string;
  await expect(page.getByTestId('team-id')).toHaveText(uiMotion);

  // every endpoint of the served document is listed
  const doc = await (await page.request.get('/api/v1/openapi.json')).json();
  const operations = Object.values(doc.paths as Record<string, Record<string, { operationId: string }>>).flatMap((ops) => Object.values(ops).map((o) => o.operationId));
  for (const id of operations) await expect(page.getByTestId(`endpoint-${id}`)).toBeVisible();

  const curl = page.getByTestId('curl-listPacks');
  await expect(curl).toContainText(`/api/v1/teams/${uiMotion}/packs`);
  await expect(curl).toContainText('Authorization: Bearer $TANGENTRY_TOKEN');
  await expect(page.getByTestId('curl-downloadArtifact')).toContainText(`/api/v1/teams/${uiMotion}/packs/`);
  await expect(page.getByTestId('curl-getOpenApi')).not.toContainText('TANGENTRY_TOKEN');

  // the URL in the example is a real one: the same request with the session answers the team's packs
  const url = /"(http[^"]+)"/.exec((await curl.textContent()) ?? '')![1]!;
  const res = await page.request.get(url);
  expect(res.status()).toBe(200);
  expect((await res.json()).packs.length).toBeGreaterThan(0);

  // copying puts the exact command on the clipboard
  await page.getByTestId('endpoint-listPacks').getByRole('button', { name: 'Copy' }).click();
  await expect(page.getByTestId('endpoint-listPacks').getByRole('button', { name: 'Copied' })).toBeVisible();
  expect(await page.evaluate(() => navigator.clipboard.readText())).toBe(await curl.textContent());

  // the problem codes a problem detail's `type` points at, and the way to a token
  await expect(page.locator('#problem-rate_limited')).toContainText('Retry-After');
  await expect(page.getByRole('link', { name: 'Service tokens' }).last()).toHaveAttribute('href', '/team/tokens');
  await page.screenshot({ path: `${SHOTS}/api-reference.png`, fullPage: true });
});
