import { afterAll, beforeAll, expect } from 'vitest';
import type { Browser, BrowserContext, Locator, Page } from 'playwright-core';
import { launchBrowser, newContext, type ViewportName } from '../support/browser';
import { lateBound, startTestServer, type TestServer } from '../support/server';

export const DEMO_PASSWORD = 'reboundry-demo';
export const DEMO = {
  manager: 'manager@reboundry.test',
  mechanic: 'mechanic@reboundry.test',
  driver: 'driver@reboundry.test',
} as const;

/** Fills in the sign-in form on the page and presses Sign in (what follows is the caller's to check). */
export async function submitSignIn(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/** Signs in through the form, as a person would, and waits for the start page. */
export async function signIn(page: Page, baseUrl: string, email: string, password = DEMO_PASSWORD) {
  await page.goto(`${baseUrl}/sign-in`);
  await submitSignIn(page, email, password);
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

/**
 * A page in a fresh browser context (its own cookies and storage) at one of our screen sizes,
 * with the app's address as its base, so `page.goto('/vehicles')` works. Close the context at the end.
 */
export async function freshPage(browser: Browser, baseUrl: string, size: ViewportName = 'desktop'): Promise<{ context: BrowserContext; page: Page }> {
  const context = await newContext(browser, size, baseUrl);
  return { context, page: await context.newPage() };
}

/** A {@link freshPage} signed in as `email` through the form, on that person's start page. */
export async function signedInPage(browser: Browser, baseUrl: string, email: string, size: ViewportName = 'desktop', password = DEMO_PASSWORD) {
  const opened = await freshPage(browser, baseUrl, size);
  await signIn(opened.page, baseUrl, email, password);
  return opened;
}

/** Opens one of the app's pages by its address (below the context's base) and waits for its heading. */
export async function openPage(page: Page, path: string, heading: string) {
  await page.goto(path);
  await expectHeading(page, heading);
}

/** Presses the button that opens a dialog and returns the dialog once it shows (named as the button unless told). */
export async function openDialog(page: Page, button: string, dialog = button): Promise<Locator> {
  await page.getByRole('button', { name: button, exact: true }).click();
  const opened = page.getByRole('dialog', { name: dialog, exact: true });
  await opened.waitFor();
  return opened;
}

/** Types each value into the text field whose label reads exactly so, inside `scope` (a dialog, a form or the page). */
export async function fillFields(scope: Page | Locator, values: Record<string, string>) {
  for (const [label, value] of Object.entries(values)) await scope.getByLabel(label, { exact: true }).fill(value);
}

/** The names of the items in the visible main navigation, in order. */
export async function menuItems(page: Page): Promise<string[]> {
  const nav = page.getByRole('navigation', { name: 'Main' });
  await nav.waitFor();
  return (await nav.getByRole('link').allInnerTexts()).map((t) => t.trim());
}

/**
 * The top level of the visible main navigation, in order: links by name, groups by their button's
 * name with " ▾" after it (so a test can tell a group from a page).
 */
export async function menuEntries(page: Page): Promise<string[]> {
  const nav = page.getByRole('navigation', { name: 'Main' });
  await nav.waitFor();
  return nav.locator(':scope > ul > li > a, :scope > ul > li > button').evaluateAll((els) =>
    els.map((e) => (e.textContent ?? '').trim() + (e.tagName === 'BUTTON' ? ' ▾' : '')),
  );
}

/** The names of the pages in one menu group, after opening it with a click. */
export async function openMenuGroup(page: Page, group: string): Promise<string[]> {
  const nav = page.getByRole('navigation', { name: 'Main' });
  const button = nav.getByRole('button', { name: group, exact: true });
  if ((await button.getAttribute('aria-expanded')) !== 'true') await button.click();
  const list = page.locator(`[id="${await button.getAttribute('aria-controls')}"]`);
  await list.waitFor();
  return (await list.getByRole('link').allInnerTexts()).map((t) => t.trim());
}

/**
 * Follows a main-menu link by its name, as a person would: straight away when it is on show,
 * otherwise by opening the group it sits in first.
 */
export async function goViaMenu(page: Page, name: string) {
  const nav = page.getByRole('navigation', { name: 'Main' });
  await nav.waitFor();
  const link = nav.getByRole('link', { name, exact: true });
  if (!(await link.isVisible())) {
    for (const button of await nav.getByRole('button').all()) {
      await button.click();
      if (await link.isVisible()) break;
      await button.click();
    }
  }
  await link.click();
}

/** Waits for the page's first-level heading to read `text`; on failure, says what it read instead. */
export async function expectHeading(page: Page, text: string) {
  const wanted = page.getByRole('heading', { level: 1, name: text, exact: true });
  try {
    await wanted.waitFor({ timeout: 10_000 });
  } catch {
    const actual = await page.getByRole('heading', { level: 1 }).allInnerTexts();
    expect(actual, `first-level heading on ${page.url()}`).toContain(text);
  }
}

/** Fails with the page's address and heading, which say more than a timeout. */
export async function expectPath(page: Page, pathname: string) {
  await page.waitForURL((url) => url.pathname === pathname, { timeout: 10_000 }).catch(() => undefined);
  expect(new URL(page.url()).pathname, `on ${page.url()}`).toBe(pathname);
}

/**
 * Waits until the page has stopped moving: web fonts loaded, every CSS transition and animation
 * finished, and two frames painted after that (charts and maps draw on the next frame).
 */
export async function settled(page: Page) {
  await page.evaluate(async () => {
    await document.fonts.ready;
    await Promise.all(document.getAnimations().map((a) => a.finished.catch(() => undefined)));
    await new Promise<void>((resolve) => requestAnimationFrame(() => requestAnimationFrame(() => resolve())));
  });
}

/**
 * On the page that replaces a temporary password (one a fleet manager set): fills in the
 * temporary password and the new one twice, and saves.
 */
export async function choosePassword(page: Page, temporary: string, chosen: string) {
  await expectHeading(page, 'Choose a new password');
  const form = page.getByRole('form', { name: 'Choose a new password' });
  await fillFields(form, { 'Temporary password': temporary, 'New password': chosen, 'New password again': chosen });
  await form.getByRole('button', { name: 'Save new password' }).click();
}

/** The file's test server and browser, started together before its tests and closed after them. */
export function serverAndBrowserForFile(opts: Parameters<typeof startTestServer>[0] = {}): { server: TestServer; browser: Browser } {
  let started: [TestServer, Browser] | undefined;
  beforeAll(async () => {
    started = await Promise.all([startTestServer(opts), launchBrowser()]);
  });
  afterAll(async () => {
    await started?.[1].close();
    await started?.[0].stop();
  });
  return { server: lateBound(() => started?.[0], 'the test server'), browser: lateBound(() => started?.[1], 'the browser') };
}
