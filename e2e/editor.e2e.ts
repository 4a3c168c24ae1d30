import { test, expect, type Page } from '@playwright/test';
import { centre, drag } from './support';

// The scratch curve editor at /editor (issue 6): direct manipulation with the mouse, the key card,
// the target strip, keyboard nudging, undo, the browser-local document surviving a reload, and
// the WCAG 2.3.1 flash caution on the demo studio's muzzle-flash brightness curve.
// Screenshots go to .tmp/ beside the other e2e artifacts.

const SHOTS = `${import.meta.dirname}/../.tmp`;

async function openFresh(page: Page) {
  // script errors are printed (a failing bake worker would show here); resource statuses are not (signed out, /api/me is 401)
  page.on('console', (m) => { if (m.type() === 'error' && !m.text().startsWith('Failed to load resource')) console.log(`[browser error] ${m.text()}`); });
  page.on('pageerror', (e) => console.log(`[page error] ${e.message}`));
  await page.goto('/editor');
  await page.evaluate(() => localStorage.clear());
  await page.reload();
  await expect(page.getByTestId('curve-canvas')).toBeVisible();
  // every demo target has baked once (in a Web Worker; a loaded machine may take a while)
  for (const name of ['Console', 'Handheld', 'Mobile', 'Web']) {
    await expect(page.getByTestId(`target-${name}`)).not.toHaveAttribute('aria-busy', 'true', { timeout: 30_000 });
  }
}



test('drag a key: the key card and the target strip follow; undo returns; a reload keeps the edit', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 1000 });
  await openFresh(page);
  const before = await page.getByTestId('error-Console').textContent();
  const key = await centre(page, 'key-1');
  // Escape during a drag puts the key back and leaves nothing to undo
  await page.mouse.move(key.x, key.y);
  await page.mouse.down();
  await page.mouse.move(key.x - 60, key.y + 40, { steps: 5 });
  await expect(page.getByTestId('key-1')).not.toHaveAccessibleName(/time 0\.3 s, value 1\.06/);
  await page.keyboard.press('Escape');
  await page.mouse.up();
  await expect(page.getByTestId('key-1')).toHaveAccessibleName('Key 2, time 0.3 s, value 1.06 progress');
  await expect(page.getByTestId('cmd-undo')).toBeDisabled();
  // the middle key of panel-slide-in sits at (0.3 s, 1.06); drag it left and down
  await drag(page, key, { x: key.x - 120, y: key.y + 90 });
  const card = page.getByTestId('key-card');
  await expect(card).toBeVisible();
  const time = Number(await page.getByTestId('card-time').inputValue());
  const value = Number(await page.getByTestId('card-value').inputValue());
  expect(time).toBeLessThan(0.3);
  expect(value).toBeLessThan(1.06);
  // frame snapping is on: the dragged time is a whole frame at 60 fps
  expect(Math.abs(time * 60 - Math.round(time * 60))).toBeLessThan(1e-6);
  await expect(page.getByTestId('key-1')).toHaveAccessibleName(new RegExp(`^Key 2, time ${time} s, value ${value} progress$`));
  await expect(page.getByTestId('target-Console')).not.toHaveAttribute('aria-busy', 'true');
  await expect(page.getByTestId('error-Console')).not.toHaveText(before ?? '');
  await page.screenshot({ path: `${SHOTS}/editor-drag.png` });

  // undo is one step for the whole drag
  await page.keyboard.press('Control+z');
  await expect(page.getByTestId('card-time')).toHaveValue('0.3');
  await expect(page.getByTestId('card-value')).toHaveValue('1.06');
  await page.keyboard.press('Control+Shift+z');
  await expect(page.getByTestId('card-time')).toHaveValue(String(time));

  // kept in this browser: a reload shows the edited key
  await expect(page.getByTestId('save-status')).toHaveText(/kept at/);
  await page.reload();
  await expect(page.getByTestId('key-1')).toHaveAccessibleName(new RegExp(`time ${time} s, value ${value} progress`));
});

test('drag a slope handle: the key turns manual and its slopes change together', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 1000 });
  await openFresh(page);
  await page.getByTestId('key-1').click();
  await expect(page.getByTestId('card-rule')).toHaveValue('zero');
  const h = await page.getByTestId('handle-1-in').locator('rect').last().boundingBox();
  expect(h).not.toBeNull();
  const from = { x: h!.x + h!.width / 2, y: h!.y + h!.height / 2 };
  // pull the in-handle down: the slope arriving at the key becomes positive (rising into the key)
  await drag(page, from, { x: from.x, y: from.y + 40 });
  await expect(page.getByTestId('card-rule')).toHaveValue('manual');
  const slopeIn = Number(await page.getByTestId('card-slope-in').inputValue());
  const slopeOut = Number(await page.getByTestId('card-slope-out').inputValue());
  expect(slopeIn).toBeGreaterThan(0);
  expect(slopeOut).toBe(slopeIn); // joined: both sides turn together
  await page.screenshot({ path: `${SHOTS}/editor-handle.png` });
});

test('keyboard: keys are focusable with names, arrows nudge by a frame and a value step, Delete removes, the help sheet lists shortcuts', async ({ page }) => {
  await openFresh(page);
  const k = page.getByTestId('key-1');
  await k.focus();
  await expect(k).toHaveAccessibleName('Key 2, time 0.3 s, value 1.06 progress');
  await page.keyboard.press('ArrowRight');
  await expect(k).toHaveAccessibleName(`Key 2, time ${+(0.3 + 1 / 60).toFixed(4)} s, value 1.06 progress`);
  await page.keyboard.press('ArrowUp');
  // value step of a 0…1.06 curve is 0.01 (see store/snap.ts)
  await expect(k).toHaveAccessibleName(`Key 2, time ${+(0.3 + 1 / 60).toFixed(4)} s, value 1.07 progress`);
  await page.keyboard.press('Control+z');
  await expect(k).toHaveAccessibleName(`Key 2, time ${+(0.3 + 1 / 60).toFixed(4)} s, value 1.06 progress`);
  await page.keyboard.press('Delete');
  await expect(page.getByTestId('key-2')).toHaveCount(0);
  await expect(page.getByTestId('key-1')).toHaveAccessibleName(/^Key 2, time 0\.45 s/);
  await page.keyboard.press('?');
  const sheet = page.getByTestId('help-sheet');
  await expect(sheet).toBeVisible();
  await expect(sheet).toContainText('Undo');
  await expect(sheet).toContainText('Ctrl+Shift+Z');
  await expect(sheet).toContainText('One frame later');
  await page.screenshot({ path: `${SHOTS}/editor-help.png` });
});

test('the muzzle-flash brightness example shows the WCAG 2.3.1 flash caution and does not play by itself', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 1000 });
  await openFresh(page);
  await expect(page.getByTestId('flash-caution')).toHaveCount(0);
  await page.getByTestId('example-menu').selectOption('hit-flashes/muzzle-flash');
  const caution = page.getByTestId('flash-caution');
  await expect(caution).toBeVisible();
  await expect(caution).toContainText('WCAG 2.3.1');
  await expect(caution).toContainText('8 times within one second');
  await expect(page.getByTestId('preview-play')).toHaveText('Play');
  // the table overlay: dots at the entries and the band of the error envelope
  await page.getByTestId('target-Console').getByRole('button', { name: 'show on canvas' }).click();
  await expect(page.getByTestId('table-overlay')).toBeVisible();
  await page.screenshot({ path: `${SHOTS}/editor-flash.png` });
});

test('reduced motion: the preview waits for Play', async ({ browser }) => {
  const ctx = await browser.newContext({ reducedMotion: 'reduce' });
  const page = await ctx.newPage();
  await openFresh(page);
  await expect(page.getByText('Reduced motion is on')).toBeVisible();
  await expect(page.getByTestId('preview-play')).toHaveText('Play');
  await ctx.close();
});

test('box selection, copy and paste at the playhead, double-click adds a key, the key card refuses a bad time', async ({ browser }) => {
  const ctx = await browser.newContext({ reducedMotion: 'reduce', viewport: { width: 1440, height: 1000 } });
  const page = await ctx.newPage();
  await openFresh(page);
  const k0 = await centre(page, 'key-0');
  const k1 = await centre(page, 'key-1');
  // a box around the first two keys, started on empty canvas
  await drag(page, { x: k0.x - 20, y: k1.y - 25 }, { x: k1.x + 20, y: k0.y + 20 });
  await expect(page.getByTestId('key-0')).toHaveAttribute('aria-pressed', 'true');
  await expect(page.getByTestId('key-1')).toHaveAttribute('aria-pressed', 'true');
  await expect(page.getByTestId('key-2')).toHaveAttribute('aria-pressed', 'false');
  await expect(page.getByTestId('key-card')).toContainText('2 keys selected');
  await page.getByTestId('cmd-copy').click();
  await page.getByLabel('Scrub the preview time').fill('0.45');
  await page.getByTestId('cmd-paste').click();
  // the clip (0 s and 0.3 s) lands at 0.45 s, replacing the key there, and at 0.75 s
  await expect(page.getByTestId('key-3')).toHaveAccessibleName('Key 4, time 0.75 s, value 1.06 progress');
  await expect(page.getByTestId('key-2')).toHaveAccessibleName('Key 3, time 0.45 s, value 0 progress');
  await page.keyboard.press('Control+z');
  await expect(page.getByTestId('key-3')).toHaveCount(0);

  // double-click on the curve between the first two keys adds a key on it
  const at = await page.evaluate(([x0, x1]) => {
    const path = document.querySelector('[data-testid=curve-path]') as SVGPathElement;
    const svg = path.ownerSVGElement!;
    const m = svg.getScreenCTM()!;
    const target = (x0 + x1) / 2;
    let lo = 0, hi = path.getTotalLength();
    for (let i = 0; i < 40; i++) {
      const mid = (lo + hi) / 2;
      const p = path.getPointAtLength(mid).matrixTransform(m);
      if (p.x < target) lo = mid; else hi = mid;
    }
    const p = path.getPointAtLength(lo).matrixTransform(m);
    return { x: p.x, y: p.y };
  }, [k0.x, k1.x]);
  await page.mouse.dblclick(at.x, at.y);
  await expect(page.getByTestId('key-3')).toHaveCount(1);
  await expect(page.getByTestId('key-card')).toContainText('Key 2');
  const added = Number(await page.getByTestId('card-time').inputValue());
  expect(added).toBeGreaterThan(0.1);
  expect(added).toBeLessThan(0.2);

  // the key card: a time past the next key is refused, the message beside the field, the curve unchanged
  await page.getByTestId('card-time').fill('5');
  await page.getByTestId('card-time').press('Enter');
  await expect(page.getByTestId('key-card').getByRole('alert')).toContainText("time must not be after the next key's time");
  await expect(page.getByTestId('key-1')).toHaveAccessibleName(new RegExp(`time ${added} s`));
  await page.screenshot({ path: `${SHOTS}/editor-card-error.png` });
  await ctx.close();
});

test("signed in, the target strip uses the team's own target profiles instead of the demo targets", async ({ page }) => {
  // demo account of the embedded default (see e2e/accounts.e2e.ts and server/seed/demo-accounts.ts)
  await page.goto('/sign-in');
  await page.getByLabel('Email').fill('animator@corvid-lantern.test');
  await page.getByLabel('Password').fill('tidewright-demo');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(/\/team$/);
  await page.getByRole('link', { name: 'Editor' }).click();
  await expect(page.getByText(/target profiles of /)).toBeVisible();
  await expect(page.getByText('demo targets')).toHaveCount(0);
  // the seeded team profiles are the brief's four targets
  await expect(page.getByTestId('target-Console')).not.toHaveAttribute('aria-busy', 'true', { timeout: 30_000 });
  await expect(page.getByTestId('verdict-Console')).toHaveText(/pass|near|over/);
});

test('shapes: the palette puts an elastic shape on a segment, then it converts to hermite keys within a tolerance', async ({ browser }) => {
  const ctx = await browser.newContext({ reducedMotion: 'reduce', viewport: { width: 1440, height: 1000 } });
  const page = await ctx.newPage();
  await openFresh(page);
  await page.getByTestId('example-menu').selectOption('menu-transitions/button-press-scale');
  await page.getByTestId('key-1').click();
  await expect(page.getByTestId('card-kind')).toHaveValue('shape');
  await expect(page.getByTestId('shape-back')).toHaveAttribute('aria-pressed', 'true');
  await page.getByTestId('shape-elastic').click();
  await expect(page.getByTestId('shape-elastic')).toHaveAttribute('aria-pressed', 'true');
  await page.screenshot({ path: `${SHOTS}/editor-shapes.png` });
  await page.getByTestId('convert-tolerance').fill('0.0005');
  await page.getByTestId('convert-to-keys').click();
  await expect(page.getByTestId('convert-note')).toContainText(/took \d+ keys \(\d+ added\), largest error/);
  await expect(page.getByTestId('card-kind')).toHaveValue('hermite');
  await expect(page.getByTestId('key-3')).toHaveCount(1); // keys were added inside the segment
  await ctx.close();
});
