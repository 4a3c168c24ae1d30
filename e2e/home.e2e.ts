import { test, expect } from '@playwright/test';

// The foundation's promise: the home page comes up in chromium with the shipped
// IBM Plex fonts applied, shows the live service status, and nothing it loads
// leaves this machine (no CDN fonts or scripts).
test('home page: shipped IBM Plex font, live status, no request leaves loopback', async ({ page, baseURL }) => {
  const requested: string[] = [];
  page.on('request', (req) => requested.push(req.url()));

  await page.goto('/');
  await expect(page.getByRole('heading', { name: 'Service status' })).toBeVisible();
  await expect(page.getByTestId('service-database')).toHaveText(/up/);
  await expect(page.getByTestId('service-storage')).toHaveText(/up/);
  await expect(page.getByTestId('service-mail')).toHaveText(/up/);
  await page.evaluate(() => document.fonts.ready);

  // the body's computed family starts with IBM Plex Sans, and that face really loaded from our own origin
  const family = await page.evaluate(() => getComputedStyle(document.body).fontFamily);
  expect(family.split(',')[0]!.replace(/["']/g, '').trim()).toBe('IBM Plex Sans');
  const loadedFaces = await page.evaluate(() =>
    [...document.fonts].filter((f) => f.status === 'loaded').map((f) => f.family.replace(/["']/g, '')),
  );
  expect(loadedFaces).toContain('IBM Plex Sans');
  expect(await page.evaluate(() => document.fonts.check('16px "IBM Plex Sans"'))).toBe(true);
  const fontFiles = requested.filter((u) => /\.(woff2?|ttf)(\?|$)/.test(u));
  expect(fontFiles.length).toBeGreaterThan(0);

  const origin = new URL(baseURL!).origin;
  for (const url of requested) {
    const u = new URL(url);
    if (u.protocol === 'data:' || u.protocol === 'blob:') continue;
    expect(['127.0.0.1', 'localhost', '[::1]'], `request to ${url} left loopback`).toContain(u.hostname);
    expect(u.origin).toBe(origin);
  }
});

test('unknown routes show the not-found page', async ({ page }) => {
  await page.goto('/no/such/place');
  await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
  await expect(page.locator('body')).toContainText(/not found|no page/i);
});
