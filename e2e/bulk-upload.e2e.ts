import { test, expect } from '@playwright/test';
import { signInToUiMotion } from './support';

// The demo animator uploads two files at once into a pack of UI Motion: a CSV of samples and a curve
// document. The upload panel shows its progress bar, then one result per file; the new curves appear as cards.
const SHOTS = process.env.E2E_SCREENSHOT_DIR ?? '.tmp';

const smoothstep = (t: number) => t * t * (3 - 2 * t);
const csv = ['time,value', ...Array.from({ length: 61 }, (_, i) => `${i / 60},${smoothstep(i / 60)}`)].join('\n');
const curveDoc = {
  format: 'tangentry.curve', version: 1, name: 'lantern-sway', units: { time: 's', value: 'deg' }, before: 'clamp', after: 'clamp',
  frameRate: 60, drives: 'rotation', tags: ['uploaded'],
  keys: [
    { time: 0, value: 0, slopeIn: 0, slopeOut: 0, rule: 'manual', slopes: 'joined' },
    { time: 0.5, value: 12, slopeIn: 0, slopeOut: 0, rule: 'manual', slopes: 'joined' },
    { time: 1, value: 0, slopeIn: 0, slopeOut: 0, rule: 'manual', slopes: 'joined' },
  ],
  segments: [{ kind: 'hermite' }, { kind: 'hermite' }],
};

test('an animator uploads two curve files into a pack and sees the results and the new cards', async ({ page, baseURL }) => {
  await signInToUiMotion(page, 'animator@corvid-lantern.test', 'Animator');
  // a pack of its own, so the seeded packs other tests count stay as they are
  const me = await (await page.request.get('/api/auth/me')).json();
  const teamId = me.teams.find((t: { name: string }) => t.name === 'UI Motion').id;
  const name = `Upload drop ${Date.now().toString(36)}`;
  const created = await page.request.post(`/api/teams/${teamId}/packs`, { data: { name }, headers: { Origin: baseURL! } });
  expect(created.status()).toBe(201);
  const slug = (await created.json()).pack.slug as string;

  await page.goto(`/packs/${slug}`);
  await expect(page.getByRole('heading', { name: 'Upload curve files' })).toBeVisible();
  await page.getByLabel('Curve files', { exact: true }).setInputFiles([
    { name: 'dock-settle.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) },
    { name: 'lantern-sway.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(curveDoc)) },
  ]);
  await expect(page.getByRole('list', { name: 'Chosen files' }).getByRole('listitem')).toHaveCount(2);
  await page.getByRole('button', { name: 'Upload 2 files' }).click();

  const results = page.getByRole('list', { name: 'Upload results' });
  await expect(results).toBeVisible();
  await expect(page.getByRole('progressbar', { name: 'Upload progress' })).toHaveAttribute('aria-valuenow', '100');
  await expect(page.getByText('2 of 2 files stored.')).toBeVisible();
  await expect(results).toContainText('dock-settle.csv stored, 1 curve');
  await expect(results).toContainText(/dock-settle · \d+ keys · max error \d\.\d\de-\d+/);
  await expect(results).toContainText('lantern-sway · 3 keys · max error 0 (as in the file)');

  const cards = page.getByRole('list', { name: 'Curves' });
  await expect(cards.getByRole('heading', { level: 3 })).toHaveText(['dock-settle', 'lantern-sway']);
  await page.screenshot({ path: `${SHOTS}/bulk-upload.png`, fullPage: true });

  // a bad file is told in words, beside nothing stored for it
  await page.getByLabel('Curve files', { exact: true }).setInputFiles([{ name: 'broken.csv', mimeType: 'text/csv', buffer: Buffer.from('time,value\n0,0\n0.5,half\n') }]);
  await page.getByRole('button', { name: 'Upload 1 file' }).click();
  await expect(results).toContainText('broken.csv not stored');
  await expect(results).toContainText('line 3');
  await expect(cards.getByRole('heading', { level: 3 })).toHaveCount(2);
});
