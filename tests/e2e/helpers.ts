import { expect } from 'vitest';
import type { Page } from 'playwright-core';

export const DEMO_PASSWORD = 'reboundry-demo';
export const DEMO = {
  manager: 'manager@reboundry.test',
  mechanic: 'mechanic@reboundry.test',
  driver: 'driver@reboundry.test',
} as const;

/** Signs in through the form, as a person would, and waits for the start page. */
export async function signIn(page: Page, baseUrl: string, email: string, password = DEMO_PASSWORD) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

/** The names of the items in the visible main navigation, in order. */
export async function menuItems(page: Page): Promise<string[]> {
  const nav = page.getByRole('navigation', { name: 'Main' });
  await nav.waitFor();
  return (await nav.getByRole('link').allInnerTexts()).map((t) => t.trim());
}

/** The visible text of the page's first-level heading. */
export async function heading(page: Page): Promise<string> {
  const h = page.getByRole('heading', { level: 1 });
  await h.first().waitFor();
  return (await h.first().innerText()).trim();
}

/** Fails with the page's address and heading, which say more than a timeout. */
export async function expectPath(page: Page, pathname: string) {
  await page.waitForURL((url) => url.pathname === pathname, { timeout: 10_000 }).catch(() => undefined);
  expect(new URL(page.url()).pathname, `on ${page.url()}`).toBe(pathname);
}
