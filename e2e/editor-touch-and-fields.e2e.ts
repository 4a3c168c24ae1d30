import { test, expect, type Page } from '@playwright/test';

// The scratch editor at /editor (issue 6): a two-finger pinch zooms the canvas about the fingers'
// centre; the key card's numeric fields move a Bézier handle; one click puts a shape on every segment.

const SHOTS = `${import.meta.dirname}/../.tmp`;

async function open(page: Page) {
  await page.goto('/editor');
  await page.evaluate(() => localStorage.clear());
  await page.reload();
  await expect(page.getByTestId('curve-canvas')).toBeVisible();
}

async function keyX(page: Page, i: number): Promise<number> {
  const b = (await page.getByTestId(`key-${i}`).boundingBox())!;
  return b.x + b.width / 2;
}

test('a two-finger pinch on the canvas zooms in about the fingers, and pinching back zooms out', async ({ browser }) => {
  const ctx = await browser.newContext({ hasTouch: true, reducedMotion: 'reduce', viewport: { width: 1440, height: 1000 } });
  const page = await ctx.newPage();
  await open(page);
  const last = (await page.getByTestId(/^key-\d+$/).count()) - 1;
  const span0 = (await keyX(page, last)) - (await keyX(page, 0));
  const box = (await page.getByTestId('curve-canvas').boundingBox())!;
  const cx = box.x + box.width / 2, cy = box.y + box.height / 2;
  // raw touch input through the Chrome DevTools Protocol: two points moving apart from 40 px to 200 px
  const cdp = await ctx.newCDPSession(page);
  const touch = async (type: 'touchStart' | 'touchMove' | 'touchEnd', gap: number) =>
    cdp.send('Input.dispatchTouchEvent', { type, touchPoints: type === 'touchEnd' ? [] : [{ x: cx - gap / 2, y: cy, id: 1 }, { x: cx + gap / 2, y: cy, id: 2 }] });
  await touch('touchStart', 40);
  for (let g = 60; g <= 200; g += 20) await touch('touchMove', g);
  await touch('touchEnd', 200);
  await expect.poll(async () => (await keyX(page, last)) - (await keyX(page, 0))).toBeGreaterThan(span0 * 2);
  await page.screenshot({ path: `${SHOTS}/editor-pinch.png` });
  const zoomed = (await keyX(page, last)) - (await keyX(page, 0));
  await touch('touchStart', 200);
  for (let g = 180; g >= 40; g -= 20) await touch('touchMove', g);
  await touch('touchEnd', 40);
  // the fingers closing to a fifth of their gap zoom out again (how far depends on how many of the moves the
  // gesture sees before the fingers lift, so the check is against the zoomed-in span, not an exact return)
  await expect.poll(async () => (await keyX(page, last)) - (await keyX(page, 0))).toBeLessThan(zoomed / 2);
  await ctx.close();
});

test('the key card moves a Bézier handle by number, refuses one outside its segment, and puts a shape on every segment in one step', async ({ browser }) => {
  const ctx = await browser.newContext({ reducedMotion: 'reduce', viewport: { width: 1440, height: 1000 } });
  const page = await ctx.newPage();
  await open(page);
  await page.getByTestId('key-0').click();
  await page.getByTestId('card-kind').selectOption('bezier');
  const h1Time = page.getByTestId('card-h1-time');
  await expect(h1Time).toBeVisible();
  const before = Number(await h1Time.inputValue());
  await page.getByTestId('card-h1-value').fill('0.75');
  await page.getByTestId('card-h1-value').press('Enter');
  await expect(page.getByTestId('card-h1-value')).toHaveValue('0.75');
  await h1Time.fill('99');
  await h1Time.press('Enter');
  await expect(page.getByRole('alert').filter({ hasText: 'must lie inside its segment' })).toBeVisible();
  // typing a time inside the segment again clears the message
  await h1Time.fill(String(before / 2));
  await h1Time.press('Enter');
  await expect(page.getByRole('alert').filter({ hasText: 'must lie inside its segment' })).toHaveCount(0);
  await expect(h1Time).toHaveValue(String(before / 2));
  await page.screenshot({ path: `${SHOTS}/editor-bezier-fields.png` });

  await page.getByTestId('card-kind').selectOption('shape');
  const kinds: string[] = [];
  const count = (await page.getByTestId(/^key-\d+$/).count()) - 1;
  for (let i = 1; i < count; i++) {
    await page.getByTestId(`key-${i}`).click();
    kinds.push(await page.getByTestId('card-kind').inputValue());
  }
  await page.getByTestId('key-0').click();
  const every = page.getByTestId('shape-every-segment');
  await expect(every).toContainText(/on all \d+ segments/);
  const segments = Number((await every.innerText()).match(/all (\d+) segments/)![1]);
  await every.click();
  for (let i = 1; i < segments; i++) {
    await page.getByTestId(`key-${i}`).click();
    await expect(page.getByTestId('card-kind')).toHaveValue('shape');
  }
  // one undo step takes the whole change back
  expect(segments).toBe(count);
  await page.keyboard.press('Control+z');
  for (let i = 1; i < count; i++) {
    await page.getByTestId(`key-${i}`).click();
    await expect(page.getByTestId('card-kind')).toHaveValue(kinds[i - 1]!);
  }
  expect(kinds.some((k) => k !== 'shape')).toBe(true);
  await ctx.close();
});
