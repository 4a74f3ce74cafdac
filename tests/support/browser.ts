import fs from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type BrowserContextOptions, type Locator, type Page } from 'playwright-core';

/**
 * The system's Chromium for browser tests, from Debian's packages: nothing is downloaded.
 * `chromium-headless-shell` (the same engine without the desktop browser's windowing and
 * compositing, the usual choice for headless testing) runs the browser tests in about three
 * quarters of the time `chromium` takes here, so the tests take it when it is installed and
 * `chromium` otherwise; CHROMIUM_PATH overrides both. The client benchmark asks for the full
 * browser, since it measures what a user's browser does.
 */

export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

const HEADLESS_SHELL = '/usr/lib/chromium/chromium-headless-shell';
const FULL_CHROMIUM = '/usr/bin/chromium';

export type ChromiumKind = 'tests' | 'full';

export function chromiumPath(kind: ChromiumKind = 'tests'): string {
  if (process.env.CHROMIUM_PATH) {
    const file = process.env.CHROMIUM_PATH;
    if (!fs.existsSync(file)) throw new Error(`Chromium not found at CHROMIUM_PATH=${file}`);
    return file;
  }
  if (kind === 'tests' && fs.existsSync(HEADLESS_SHELL)) return HEADLESS_SHELL;
  if (fs.existsSync(FULL_CHROMIUM)) return FULL_CHROMIUM;
  throw new Error(
    `Chromium not found at ${FULL_CHROMIUM}: install Debian's \`chromium\` package (apt-get install chromium${kind === 'tests' ? ' chromium-headless-shell' : ''}) or set CHROMIUM_PATH`,
  );
}

/**
 * The browser for a test file: under vitest's browser tests a connection to the run's shared
 * Chromium (tests/support/browser-server.ts; closing it closes only this file's contexts),
 * elsewhere a Chromium of its own.
 */
export async function launchBrowser(kind: ChromiumKind = 'tests'): Promise<Browser> {
  const shared = kind === 'tests' && process.env.VITEST ? (await import('vitest')).inject('chromiumWsEndpoint') : undefined;
  if (shared) return chromium.connect(shared);
  return chromium.launch({ executablePath: chromiumPath(kind), headless: true, args: CHROMIUM_ARGS });
}

/** The screen sizes we check: the manager's desk, the mechanic's tablet, the driver's phone. */
export const VIEWPORTS = {
  desktop: { viewport: { width: 1280, height: 800 } },
  tablet: { viewport: { width: 1024, height: 768 }, hasTouch: true },
  phone: { viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true, deviceScaleFactor: 2 },
} satisfies Record<string, BrowserContextOptions>;

export type ViewportName = keyof typeof VIEWPORTS;

/** A fresh context (its own cookies and storage) at one of our screen sizes. */
export async function newContext(browser: Browser, size: ViewportName = 'desktop', baseURL?: string): Promise<BrowserContext> {
  return browser.newContext({ ...VIEWPORTS[size], baseURL, locale: 'en-GB', timezoneId: 'Europe/London', reducedMotion: 'reduce' });
}

export const SCREENSHOT_DIR = path.resolve(import.meta.dirname, '../e2e/screenshots');

/**
 * Whether the browser tests save their screenshots (`SCREENSHOTS=1`). They are for people to
 * look at (each role's pages at each screen size) and no test reads them back; encoding some
 * 80 pages as PNG costs about a tenth of the browser tests' time, so a plain run skips it.
 */
export const SCREENSHOTS_WANTED = process.env.SCREENSHOTS === '1';

/** Where a named screenshot goes (the folder is git-ignored). */
export function screenshotPath(name: string): string {
  fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
  return path.join(SCREENSHOT_DIR, `${name}.png`);
}

/**
 * Saves a named screenshot, when screenshots are wanted: of one element, of a page's viewport, or
 * with `fullPage` of the whole page. The app's header (and the phone's bottom menu) stay pinned
 * while scrolling, which in a full-page capture paints them wherever the page happened to be
 * scrolled; for a full page they are laid out in the flow for the capture only, then pinned again.
 */
export async function screenshot(target: Page | Locator, name: string, opts: { fullPage?: boolean } = {}): Promise<void> {
  if (!SCREENSHOTS_WANTED) return;
  if (!('mainFrame' in target) || !opts.fullPage) {
    await target.screenshot({ path: screenshotPath(name) });
    return;
  }
  const style = await target.addStyleTag({ content: '[data-pinned]{position:static !important}' });
  try {
    await target.screenshot({ path: screenshotPath(name), fullPage: true });
  } finally {
    await style.evaluate((el) => (el as Element).remove());
  }
}
