import { expect, type Page } from '@playwright/test';

/** The demo accounts' password (embedded default only; server/seed/demo-accounts.ts). */
export const DEMO_PASSWORD = 'tidewright-demo';

/** Fill and send the sign-in form. */
export async function submitSignIn(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto('/sign-in');
  await page.getByLabel('Email').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/** Sign in and wait for the team page the app lands on. */
export async function signInToTeam(page: Page, email: string) {
  await submitSignIn(page, email);
  await expect(page).toHaveURL(/\/team$/);
}

/** Sign in and make "UI Motion" the current team (the switcher labels it with the person's role there). */
export async function signInToUiMotion(page: Page, email: string, uiMotionRole: string) {
  await signInToTeam(page, email);
  await page.getByLabel('Current team').selectOption({ label: `UI Motion · ${uiMotionRole}` });
}

/** Screen centre of a key's dot on the editor canvas. */
export async function centre(page: Page, testId: string) {
  const box = await page.getByTestId(testId).locator('circle.dot').boundingBox();
  if (!box) throw new Error(`${testId} has no box`);
  return { x: box.x + box.width / 2, y: box.y + box.height / 2 };
}

/** A mouse drag in eight steps, as a person moves a key. */
export async function drag(page: Page, from: { x: number; y: number }, to: { x: number; y: number }) {
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  for (let i = 1; i <= 8; i++) await page.mouse.move(from.x + ((to.x - from.x) * i) / 8, from.y + ((to.y - from.y) * i) / 8);
  await page.mouse.up();
}
