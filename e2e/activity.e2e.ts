import { test, expect, type Page } from '@playwright/test';
import { signInToUiMotion } from './support';

// A lead comments on a proposed version, pinned to one curve at a time; the demo animator who proposed it
// sees the notice in the top bar and the comment on the version page; the team's activity table lists it.

const key = (time: number, value: number) => ({ time, value, slopeIn: 0, slopeOut: 0, rule: 'manual', slopes: 'joined' });
const doc = (name: string) => ({
  format: 'tangentry.curve', version: 1, name, units: { time: 's', value: 'progress' }, before: 'clamp', after: 'clamp', frameRate: 60,
  drives: 'position', tags: [], keys: [key(0, 0), key(0.8, 1)], segments: [{ kind: 'linear' }],
});

/** Writes through the API as the signed-in person (same cookies; the Origin a browser sends). */
async function api(page: Page, baseURL: string, method: 'get' | 'post', path: string, data?: object) {
  const res = await page.request[method](path, { headers: { Origin: new URL(baseURL).origin }, ...(data ? { data } : {}) });
  expect(res.ok(), `${method} ${path}: ${res.status()} ${await res.text()}`).toBe(true);
  return res.json();
}

test('a lead pins a comment to a curve at a time; the animator sees the notice and the comment; the activity table lists it', async ({ browser, baseURL }) => {
  const slug = `notes-${Date.now().toString(36)}`;
  const animatorCtx = await browser.newContext();
  const animator = await animatorCtx.newPage();
  await signInToUiMotion(animator, 'animator@corvid-lantern.test', 'Animator');
  const me = await api(animator, baseURL!, 'get', '/api/auth/me');
  const team = (me.teams as { id: string; name: string }[]).find((t) => t.name === 'UI Motion')!.id;
  await api(animator, baseURL!, 'post', `/api/teams/${team}/packs`, { name: `Notes ${slug}`, slug });
  await api(animator, baseURL!, 'post', `/api/teams/${team}/packs/${slug}/curves`, { document: doc('dock-slide') });
  await api(animator, baseURL!, 'post', `/api/teams/${team}/packs/${slug}/versions`, { changelog: 'first cut of the dock slide' });
  // the bake runs in the background: wait until v1 exists
  await expect.poll(async () => (await animator.request.get(`/api/teams/${team}/packs/${slug}/versions/1`)).status(), { timeout: 30_000 }).toBe(200);

  const leadCtx = await browser.newContext();
  const lead = await leadCtx.newPage();
  await signInToUiMotion(lead, 'lead@corvid-lantern.test', 'Lead');
  await lead.goto(`/packs/${slug}/versions/1`);
  const comments = lead.getByRole('region', { name: 'Comments' });
  await expect(comments.getByText('No comments yet.')).toBeVisible();
  await comments.getByLabel('Comment', { exact: true }).fill('The slide settles too early here.');
  await comments.getByLabel('About').selectOption('dock-slide');
  // outside the curve's domain (0–0.8 s): told beside the field, nothing posted
  await comments.getByLabel('At time (s)').fill('2');
  await comments.getByRole('button', { name: 'Post comment' }).click();
  await expect(lead.locator('#comment-time-error')).toContainText('time');
  await comments.getByLabel('At time (s)').fill('0.6');
  await comments.getByRole('button', { name: 'Post comment' }).click();
  const onCurve = comments.getByRole('list', { name: 'Comments on dock-slide' });
  await expect(onCurve).toContainText('t = 0.600 s');
  await expect(onCurve).toContainText('The slide settles too early here.');
  await leadCtx.close();

  // the animator's top bar counts the notice; opening it shows the words and leads to the version
  await animator.goto('/');
  const notices = animator.getByRole('button', { name: /Notices/ });
  await expect(notices).toContainText(/[1-9]/, { timeout: 15_000 });
  await notices.click();
  const panel = animator.getByRole('region', { name: 'Your notices' });
  const notice = panel.getByRole('link', { name: new RegExp(`Tamsin Okafor commented on v1 of ${slug} at dock-slide, t = 0.6 s`) });
  await expect(notice).toBeVisible();
  await notice.click();
  await expect(animator).toHaveURL(new RegExp(`/packs/${slug}/versions/1#comments$`));
  await expect(animator.getByRole('list', { name: 'Comments on dock-slide' })).toContainText('The slide settles too early here.');
  // opening the panel marked it read
  await expect.poll(async () => (await api(animator, baseURL!, 'get', '/api/me/notifications')).notices.find((n: { link: string }) => n.link.includes(slug))?.readAt ?? null).not.toBeNull();

  // the team's activity table, filtered to the pack, says it in words
  await animator.goto('/team/activity');
  await animator.getByLabel('Pack').selectOption(slug);
  const table = animator.getByRole('table', { name: 'Team activity' });
  await expect(table).toContainText(`commented on v1 of ${slug} at dock-slide, t = 0.6 s`);
  await expect(table.getByRole('row').filter({ hasText: 'commented on v1' })).toContainText('Tamsin Okafor');
  await expect(table).toContainText(`proposed v1 of ${slug}`);
  await expect(table).toContainText(`created the pack ${slug}`);
  await animatorCtx.close();
});
