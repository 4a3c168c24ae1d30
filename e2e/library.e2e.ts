import { test, expect, type Page } from '@playwright/test';
import { signInToUiMotion } from './support';
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';

// Demo accounts of the embedded default (server/seed/demo-accounts.ts); packs seeded from the brief (server/seed/demo-packs.ts).
const SHOTS = process.env.E2E_SCREENSHOT_DIR ?? '.tmp';

/** Signs in and picks "UI Motion" in the top bar's team switcher (the animator is a viewer in Gameplay Feel). */

const cardNames = (page: Page) => page.getByRole('list', { name: 'Curves' }).getByRole('heading', { level: 3 }).allTextContents();

test('an animator opens a pack, sees its curve cards, filters them and reorders with the keyboard', async ({ page }) => {
  await signInToUiMotion(page, 'animator@corvid-lantern.test', 'Animator');
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Library' }).click();
  await expect(page).toHaveURL(/\/packs$/);
  const packs = page.getByRole('list', { name: 'Packs' });
  await expect(packs.getByRole('link', { name: 'Menu transitions' })).toBeVisible();
  await expect(packs.getByRole('link', { name: 'Audio fades' })).toBeVisible();
  await page.screenshot({ path: `${SHOTS}/library-packs.png`, fullPage: true });

  await packs.getByRole('link', { name: 'Menu transitions' }).click();
  await expect(page).toHaveURL(/\/packs\/menu-transitions$/);
  const curves = page.getByRole('list', { name: 'Curves' });
  await expect(curves.getByRole('article')).toHaveCount(4);
  // each card has its sparkline, an SVG path drawn from the curve
  await expect(curves.getByRole('img', { name: /^panel-slide-in:/ })).toBeVisible();
  expect(await curves.locator('svg path').first().getAttribute('d')).toMatch(/^M[\d.]+ [\d.]+L/);
  expect(await cardNames(page)).toEqual(['panel-slide-in', 'button-press-scale', 'tab-fade', 'toast-drop']);
  await page.screenshot({ path: `${SHOTS}/library-pack.png`, fullPage: true });

  await page.getByLabel('Segment kind').selectOption('bezier');
  expect(await cardNames(page)).toEqual(['tab-fade']);
  await page.getByLabel('Segment kind').selectOption('');
  await page.getByLabel('Drives').selectOption('scale');
  expect(await cardNames(page)).toEqual(['button-press-scale']);
  await page.getByLabel('Drives').selectOption('');

  const later = page.getByRole('button', { name: 'Move later: panel-slide-in' });
  await later.focus();
  await page.keyboard.press('Enter');
  await expect.poll(() => cardNames(page)).toEqual(['button-press-scale', 'panel-slide-in', 'tab-fade', 'toast-drop']);
  await page.reload();
  await expect.poll(() => cardNames(page)).toEqual(['button-press-scale', 'panel-slide-in', 'tab-fade', 'toast-drop']);
  await page.getByRole('button', { name: 'Move earlier: panel-slide-in' }).click();
  await expect.poll(() => cardNames(page)).toEqual(['panel-slide-in', 'button-press-scale', 'tab-fade', 'toast-drop']);
});

test('an animator is told which pack field is wrong, then creates and archives a pack', async ({ page }) => {
  await signInToUiMotion(page, 'animator@corvid-lantern.test', 'Animator');
  await page.goto('/packs');
  await page.getByRole('button', { name: 'New pack' }).click();
  await page.getByLabel('Name').fill('Loading screens');
  await page.getByLabel('Frame rate (fps)').fill('-5');
  await page.getByRole('button', { name: 'Create pack' }).click();
  await expect(page.locator('#pack-new-frame-rate-error')).toContainText('frameRate');
  await page.getByLabel('Frame rate (fps)').fill('30');
  await page.getByRole('textbox', { name: 'Tags' }).fill('ui, loading');
  await page.getByRole('button', { name: 'Create pack' }).click();
  await expect(page).toHaveURL(/\/packs\/loading-screens$/);
  await expect(page.getByRole('heading', { level: 1, name: 'Loading screens' })).toBeVisible();
  await page.getByRole('button', { name: 'Archive pack' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Loading screens (archived)' })).toBeVisible();
  await page.goto('/packs');
  await expect(page.getByRole('list', { name: 'Packs' }).getByRole('link', { name: 'Loading screens' })).toHaveCount(0);
});

test('a viewer reads the library without editing controls', async ({ page }) => {
  await signInToUiMotion(page, 'viewer@corvid-lantern.test', 'Viewer');
  await page.goto('/packs/audio-fades');
  await expect(page.getByRole('list', { name: 'Curves' }).getByRole('article')).toHaveCount(3);
  await expect(page.getByRole('button', { name: /Move later/ })).toHaveCount(0);
  await expect(page.getByRole('button', { name: 'Archive pack' })).toHaveCount(0);
});

test('an animator proposes a version and sees its bake per target and its downloads with SHA-256', async ({ page }) => {
  await page.setViewportSize({ width: 1280, height: 1500 }); // the whole grid and the pack strip on screen
  await signInToUiMotion(page, 'animator@corvid-lantern.test', 'Animator');
  await page.goto('/packs/menu-transitions');
  await expect(page.getByRole('list', { name: 'Curves' }).getByRole('article')).toHaveCount(4);
  await page.getByRole('button', { name: 'Propose v1' }).click();
  await expect(page.locator('#propose-changelog-error')).toContainText('changelog');
  await page.getByLabel('Changelog').fill('First cut of the pause menu motion.');
  await page.getByRole('button', { name: 'Propose v1' }).click();
  await expect(page).toHaveURL(/\/packs\/menu-transitions\/versions\/1$/);
  await expect(page.getByRole('heading', { level: 1, name: 'menu-transitions v1' })).toBeVisible();
  const bake = page.getByRole('table', { name: 'Bake per target' });
  for (const target of ['Console', 'Handheld', 'Mobile', 'Web']) await expect(bake.getByRole('rowheader', { name: target })).toBeVisible();
  const artifacts = page.getByRole('table', { name: 'Artifacts' });
  await expect(artifacts.getByRole('row')).toHaveCount(23); // header + source + 4 × (JSON, binary, C99 header, TS module, glTF) + Web CSS
  await page.screenshot({ path: `${SHOTS}/library-version.png`, fullPage: true });

  const row = artifacts.getByRole('row', { name: /Console.*binary pack/ });
  const shaPrefix = (await row.locator('td').nth(2).textContent())!.replace('…', '');
  const fullSha = await row.locator('td').nth(2).locator('span').getAttribute('title');
  expect(fullSha!.startsWith(shaPrefix)).toBe(true);
  const [download] = await Promise.all([page.waitForEvent('download'), row.getByRole('link', { name: /Download/ }).click()]);
  expect(download.suggestedFilename()).toBe('menu-transitions-v1-console.tgpk');
  const bytes = readFileSync((await download.path())!);
  expect(createHash('sha256').update(bytes).digest('hex')).toBe(fullSha);

  await page.getByRole('link', { name: 'menu-transitions', exact: true }).click();
  await expect(page.getByRole('list', { name: 'Versions' }).getByRole('link', { name: 'v1' })).toBeVisible();
  await expect(page.getByRole('button', { name: 'Propose v2' })).toBeVisible();
});

test('a lead compares v2 with v1 (a changed curve with its max deviation), requests changes, then approves', async ({ page, baseURL }) => {
  await signInToUiMotion(page, 'lead@corvid-lantern.test', 'Lead');
  await page.goto('/packs/audio-fades');
  await page.getByLabel('Changelog').fill('Audio fades as first mixed.');
  await page.getByRole('button', { name: 'Propose v1' }).click();
  await expect(page).toHaveURL(/\/packs\/audio-fades\/versions\/1$/);

  // change one curve through the API (the curve editor is a separate page): music-fade-out ends at 0.2 instead of 0
  const me = await (await page.request.get('/api/auth/me')).json();
  const teamId = me.teams.find((t: { name: string }) => t.name === 'UI Motion').id;
  const pack = await (await page.request.get(`/api/teams/${teamId}/packs/audio-fades`)).json();
  const curve = pack.curves.find((c: { name: string }) => c.name === 'music-fade-out');
  const document = { ...curve.document, keys: curve.document.keys.map((k: { value: number }, i: number) => (i === 1 ? { ...k, value: 0.2 } : k)) };
  const saved = await page.request.put(`/api/teams/${teamId}/packs/audio-fades/curves/${curve.id}`, { data: { document, revision: curve.revision }, headers: { Origin: baseURL! } });
  expect(saved.status()).toBe(200);

  await page.getByRole('link', { name: 'audio-fades', exact: true }).click();
  await page.getByLabel('Changelog').fill('Music fade-out stops at 20 %.');
  await page.getByRole('button', { name: 'Propose v2' }).click();
  await expect(page).toHaveURL(/\/packs\/audio-fades\/versions\/2$/);
  await expect(page.getByText('Compared with v1: 0 added, 0 removed, 1 changed, 2 unchanged.')).toBeVisible();
  const changed = page.getByRole('list', { name: 'Changed curves' });
  // the end key moved from 0 to 0.2 and the sine in-out shape holds its end value: the largest deviation is 0.2 at t = 2 s
  await expect(changed).toContainText('max deviation 2.00e-1 gain at t = 2.000 s');
  await expect(changed.getByRole('img', { name: 'music-fade-out: v1 dashed, v2 solid' })).toBeVisible();

  await page.getByLabel('Request changes').check();
  await page.getByRole('button', { name: 'Send review' }).click();
  await expect(page.locator('#review-comment-error')).toContainText('comment');
  await page.getByLabel('Review comment').fill('Keep the fade going to silence.');
  await page.getByRole('button', { name: 'Send review' }).click();
  await expect(page.getByRole('list', { name: 'Reviews' })).toContainText('requested changes: Keep the fade going to silence.');
  await page.getByLabel('Approve').check();
  await page.getByRole('button', { name: 'Send review' }).click();
  await expect(page.getByText('State: approved')).toBeVisible();
  await page.screenshot({ path: `${SHOTS}/library-review.png`, fullPage: true });

  // release v2 on shipping, approve v1, then roll shipping back to v1: both moves are kept
  await page.getByRole('link', { name: 'audio-fades', exact: true }).click();
  const release = page.getByRole('form', { name: 'Release' });
  await release.getByLabel('Channel').fill('shipping');
  await release.getByLabel('Approved version').selectOption('2');
  await release.getByRole('button', { name: 'Release' }).click();
  await expect(page.getByRole('list', { name: 'Channels' })).toContainText('shipping → v2');
  await page.goto('/packs/audio-fades/versions/1');
  // any two versions: v1 against the later v2
  await page.getByLabel('Compare with').selectOption('2');
  await expect(page.getByText('Compared with v2: 0 added, 0 removed, 1 changed, 2 unchanged.')).toBeVisible();
  await page.getByRole('button', { name: 'Send review' }).click();
  await expect(page.getByText('State: approved')).toBeVisible();
  await page.getByRole('link', { name: 'audio-fades', exact: true }).click();
  await release.getByLabel('Approved version').selectOption('1');
  await release.getByRole('button', { name: 'Release' }).click();
  await expect(page.getByRole('list', { name: 'Channels' })).toContainText('shipping → v1');
  await expect(page.getByRole('list', { name: 'Releases of shipping' }).getByRole('listitem')).toHaveCount(2);
  await expect(page.getByRole('list', { name: 'Releases of shipping' }).getByRole('listitem').first()).toContainText('v2 → v1 by Tamsin Okafor');
  await page.screenshot({ path: `${SHOTS}/library-channels.png`, fullPage: true });
});

test('drag with the pointer: a card dropped on another takes its place; dropped on a pack it moves there', async ({ page }) => {
  await page.setViewportSize({ width: 1280, height: 1500 }); // the whole grid and the pack strip on screen
  await signInToUiMotion(page, 'animator@corvid-lantern.test', 'Animator');
  await page.goto('/packs/menu-transitions');
  await expect(page.getByRole('list', { name: 'Curves' }).getByRole('article')).toHaveCount(4);
  const before = await cardNames(page);
  const last = before[before.length - 1]!;
  const drag = async (from: string, to: import('@playwright/test').Locator) => {
    const grip = page.getByRole('button', { name: `Drag to reorder or move: ${from}` });
    const a = (await grip.boundingBox())!;
    const b = (await to.boundingBox())!;
    await page.mouse.move(a.x + a.width / 2, a.y + a.height / 2);
    await page.mouse.down();
    await page.mouse.move(a.x + a.width / 2 + 10, a.y + a.height / 2 + 10, { steps: 3 });
    await page.mouse.move(b.x + b.width / 2, b.y + b.height / 2, { steps: 12 });
    await page.mouse.up();
  };
  await drag(last, page.getByRole('list', { name: 'Curves' }).getByRole('article').first());
  await expect.poll(() => cardNames(page)).toEqual([last, ...before.slice(0, -1)]);
  await page.reload();
  await expect.poll(() => cardNames(page)).toEqual([last, ...before.slice(0, -1)]);

  await drag(last, page.locator('[data-pack-drop="audio-fades"]'));
  await expect.poll(() => cardNames(page)).toEqual(before.slice(0, -1));
  await page.goto('/packs/audio-fades');
  await expect.poll(() => cardNames(page)).toContain(last);
});
