import { test, expect, type Browser, type Page } from '@playwright/test';
import { centre, drag, signInToUiMotion } from './support';

// The editor on a library curve (/packs/:pack/curves/:curve, issue 6 item 8): opened from a curve card,
// a dragged key saved with the Save button and found as drawn after a reload, unsaved edits kept as a
// draft over a reload, the in-app leaving warning, a stale save between two browsers answered with the
// conflict message (Reload / Overwrite), and a viewer's read-only editor without Save.
// Demo accounts of the embedded default (server/seed/demo-accounts.ts); packs from server/seed/demo-packs.ts.

const SHOTS = `${import.meta.dirname}/../.tmp`;

function watch(page: Page) {
  page.on('console', (m) => { if (m.type() === 'error' && !m.text().startsWith('Failed to load resource')) console.log(`[browser error] ${m.text()}`); });
  page.on('pageerror', (e) => console.log(`[page error] ${e.message}`));
  // a reload with unsaved edits asks the browser's beforeunload question: answer "leave"
  page.on('dialog', (d) => void d.accept());
}

/** Signs in and picks "UI Motion" in the top bar's team switcher. */
async function signIn(page: Page, email: string, uiMotionRole: string) {
  watch(page);
  await signInToUiMotion(page, email, uiMotionRole);
}

/** From the pack page, through the curve card's link. */
async function openCurve(page: Page, pack: string, curve: string, verb = 'Edit') {
  await page.goto(`/packs/${pack}`);
  await page.getByRole('link', { name: `${verb} in the editor: ${curve}` }).click();
  await expect(page).toHaveURL(new RegExp(`/packs/${pack}/curves/[0-9a-f-]{36}$`));
  await expect(page.getByTestId('curve-canvas')).toBeVisible();
  await expect(page.getByRole('heading', { level: 1 })).toContainText(curve);
}



const nameOf = async (page: Page, testId: string) => (await page.getByTestId(testId).getAttribute('aria-label')) ?? '';

test('an animator opens a curve from its pack, drags a key, saves, and after a reload finds the curve as drawn', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 1000 });
  await signIn(page, 'animator@corvid-lantern.test', 'Animator');
  await openCurve(page, 'menu-transitions', 'button-press-scale');
  // the squash key of button-press-scale sits at (0.08 s, 0.86) in the seed
  await expect(page.getByTestId('key-1')).toHaveAccessibleName('Key 2, time 0.08 s, value 0.86 scale');
  await expect(page.getByTestId('save-button')).toBeDisabled();
  await expect(page.getByTestId('save-status')).toHaveText('revision 1, no unsaved edits');

  const key = await centre(page, 'key-1');
  await drag(page, key, { x: key.x + 50, y: key.y + 40 });
  const drawn = await nameOf(page, 'key-1');
  expect(drawn).not.toBe('Key 2, time 0.08 s, value 0.86 scale');
  await expect(page.getByTestId('save-status')).toHaveText(/unsaved edits/);

  // leaving through a link with unsaved edits is stopped and asked
  await page.getByRole('link', { name: 'menu-transitions', exact: true }).click();
  const ask = page.getByRole('alertdialog', { name: 'Unsaved edits' });
  await expect(ask).toBeVisible();
  await ask.getByRole('button', { name: 'Stay here' }).click();
  await expect(page).toHaveURL(/\/curves\//);

  await page.getByTestId('save-button').click();
  await expect(page.getByTestId('save-status')).toHaveText(/^saved revision 2 at/);
  await page.screenshot({ path: `${SHOTS}/editor-library-saved.png` });
  await page.reload();
  await expect(page.getByTestId('key-1')).toHaveAccessibleName(drawn);
  await expect(page.getByTestId('save-status')).toHaveText('revision 2, no unsaved edits');
  await expect(page.getByTestId('draft-note')).toHaveCount(0);

  // unsaved edits survive a reload (a draft of revision 2 in this browser), then Ctrl+S saves them
  const k = page.getByTestId('key-1');
  await k.focus();
  await page.keyboard.press('ArrowUp');
  const nudged = await nameOf(page, 'key-1');
  expect(nudged).not.toBe(drawn);
  await page.waitForTimeout(400); // the draft is written 200 ms after the edit settles
  await page.reload();
  await expect(page.getByTestId('draft-note')).toBeVisible();
  await expect(page.getByTestId('key-1')).toHaveAccessibleName(nudged);
  await expect(page.getByTestId('save-status')).toHaveText(/unsaved edits/);
  await page.getByTestId('key-1').focus();
  await page.keyboard.press('Control+s');
  await expect(page.getByTestId('save-status')).toHaveText(/^saved revision 3 at/);
  // the library's own copy (the pack page's card) has the new revision
  await page.getByRole('link', { name: 'menu-transitions', exact: true }).click();
  await expect(page).toHaveURL(/\/packs\/menu-transitions$/);
  await expect(page.getByRole('article').filter({ hasText: 'button-press-scale' })).toContainText(/revision\s*3/);
});

async function animatorPage(browser: Browser) {
  const context = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
  const page = await context.newPage();
  await signIn(page, 'animator@corvid-lantern.test', 'Animator');
  await openCurve(page, 'menu-transitions', 'panel-slide-in');
  return { context, page };
}

test('two browsers edit the same curve: the stale save gets the conflict message, Overwrite and Reload both work', async ({ browser }) => {
  const a = await animatorPage(browser);
  const b = await animatorPage(browser);
  const start = await nameOf(a.page, 'key-1');
  expect(await nameOf(b.page, 'key-1')).toBe(start);

  await a.page.getByTestId('key-1').focus();
  await a.page.keyboard.press('ArrowUp');
  await a.page.getByTestId('save-button').click();
  await expect(a.page.getByTestId('save-status')).toHaveText(/^saved revision 2 at/);

  // B still holds revision 1
  await b.page.getByTestId('key-1').focus();
  await b.page.keyboard.press('ArrowDown');
  const mine = await nameOf(b.page, 'key-1');
  await b.page.getByTestId('save-button').click();
  const conflict = b.page.getByTestId('save-conflict');
  await expect(conflict).toBeVisible();
  await expect(conflict).toContainText('someone else saved this curve since you opened it (it is now at revision 2)');
  await expect(conflict.getByRole('button', { name: 'Reload their curve' })).toBeVisible();
  await b.page.screenshot({ path: `${SHOTS}/editor-library-conflict.png` });
  await conflict.getByRole('button', { name: 'Overwrite with mine' }).click();
  await expect(b.page.getByTestId('save-status')).toHaveText(/^saved revision 3 at/);
  await expect(conflict).toHaveCount(0);

  // now A is stale: it reloads B's curve instead
  await a.page.getByTestId('key-1').focus();
  await a.page.keyboard.press('ArrowRight');
  await a.page.getByTestId('save-button').click();
  await expect(a.page.getByTestId('save-conflict')).toContainText('revision 3');
  await a.page.getByRole('button', { name: 'Reload their curve' }).click();
  await expect(a.page.getByTestId('key-1')).toHaveAccessibleName(mine);
  await expect(a.page.getByTestId('save-status')).toHaveText('revision 3, no unsaved edits');
  await a.context.close();
  await b.context.close();
});

test('a viewer gets the curve read only: no Save, keys do not move', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 1000 });
  await signIn(page, 'viewer@corvid-lantern.test', 'Viewer');
  await openCurve(page, 'audio-fades', 'crossfade-in', 'View');
  await expect(page.getByTestId('read-only-note')).toBeVisible();
  await expect(page.getByTestId('save-button')).toHaveCount(0);
  const before = await nameOf(page, 'key-1');
  const key = await centre(page, 'key-1');
  await drag(page, key, { x: key.x + 50, y: key.y + 40 });
  await page.getByTestId('key-1').focus();
  await page.keyboard.press('ArrowUp');
  await expect(page.getByTestId('key-1')).toHaveAccessibleName(before);
  await expect(page.getByTestId('card-time')).toBeDisabled();
});

test('import and export: samples fitted within a tolerance, a pasted CSS easing, a download in a baker format', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 1000 });
  watch(page);
  await page.goto('/editor');
  await page.evaluate(() => localStorage.clear());
  await page.reload();
  await expect(page.getByTestId('curve-canvas')).toBeVisible();
  await page.getByText('Import and export').click();

  // 61 samples of (1 − cos πt)/2 (d3-ease sinInOut's formula, REFERENCES.md)
  const rows = Array.from({ length: 61 }, (_, i) => `${i / 60},${(1 - Math.cos(Math.PI * (i / 60))) / 2}`);
  await page.getByLabel('Samples', { exact: true }).fill(['time,value', ...rows].join('\n'));
  await page.getByLabel('Fit tolerance').fill('0.0001');
  await page.getByRole('button', { name: 'Fit keys' }).click();
  const fit = page.getByTestId('samples-fit');
  await expect(fit).toContainText(/61 samples → \d+ keys · max error \d\.\d\de-\d+/);
  await expect(fit).toContainText('within tolerance');
  const keys = Number((await fit.textContent())!.match(/→ (\d+) keys/)![1]);
  await fit.getByRole('button', { name: 'Use these keys' }).click();
  await expect(page.getByTestId(`key-${keys - 1}`)).toHaveAccessibleName(/time 1 s, value 1 /);
  await expect(page.getByTestId(`key-${keys}`)).toHaveCount(0);

  // a broken sample line is named
  await page.getByLabel('Samples', { exact: true }).fill('time,value\n0,0\n0.5,half\n');
  await page.getByRole('button', { name: 'Fit keys' }).click();
  await expect(page.getByRole('alert').filter({ hasText: 'line 3' })).toContainText('value "half" is not a number');

  await page.getByLabel('CSS easing').fill('cubic-bezier(0.42, 0, 0.58, 1)');
  await page.getByRole('button', { name: 'Use this easing' }).click();
  await expect(page.getByTestId('key-1')).toHaveAccessibleName(/^Key 2, time 1 s, value 1 /);
  await expect(page.getByTestId('key-2')).toHaveCount(0);
  // one undoable step: the fitted keys come back
  await page.getByTestId('cmd-undo').click();
  await expect(page.getByTestId(`key-${keys - 1}`)).toBeVisible();

  await page.getByLabel('Export target').selectOption('Console');
  await page.getByLabel('Export format').selectOption('glb');
  const downloading = page.waitForEvent('download');
  await page.getByRole('button', { name: 'Download' }).click();
  const file = await downloading;
  expect(file.suggestedFilename()).toMatch(/\.console\.glb$/);
  await expect(page.getByTestId('export-note')).toContainText(/entries, \d+ B table, max error/);
  await page.getByLabel('Export format').selectOption('css');
  await page.getByRole('button', { name: 'Download' }).click();
  await expect(page.getByTestId('export-note')).toContainText('CSS linear() needs a target profile with the linear kernel');
  await page.screenshot({ path: `${SHOTS}/editor-import-export.png` });
});
