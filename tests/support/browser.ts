import fs from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type BrowserContextOptions, type Page } from 'playwright-core';

/**
 * Launches the system's Chromium (Debian's `chromium` package) for browser tests. Nothing is
 * downloaded: the binary comes from CHROMIUM_PATH or /usr/bin/chromium.
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

export function chromiumPath(): string {
  const file = process.env.CHROMIUM_PATH || '/usr/bin/chromium';
  if (!fs.existsSync(file)) {
    throw new Error(
      `Chromium not found at ${file}: install Debian's \`chromium\` package (apt-get install chromium) or set CHROMIUM_PATH`,
    );
  }
  return file;
}

/**
 * The browser for a test file: under vitest's browser tests a connection to the run's shared
 * Chromium (tests/support/browser-server.ts; closing it closes only this file's contexts),
 * elsewhere a Chromium of its own.
 */
export async function launchBrowser(): Promise<Browser> {
  const shared = process.env.VITEST ? (await import('vitest')).inject('chromiumWsEndpoint') : undefined;
  if (shared) return chromium.connect(shared);
  return chromium.launch({ executablePath: chromiumPath(), headless: true, args: CHROMIUM_ARGS });
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

/** Where a named screenshot goes (the folder is git-ignored). */
export function screenshotPath(name: string): string {
  fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
  return path.join(SCREENSHOT_DIR, `${name}.png`);
}

/**
 * A screenshot of the whole page. The app's header (and the phone's bottom menu) stay pinned while
 * scrolling, which in a full-page capture paints them wherever the page happened to be scrolled;
 * here they are laid out in the flow for the capture only, then pinned again.
 */
export async function fullPageScreenshot(page: Page, name: string): Promise<void> {
  const style = await page.addStyleTag({ content: '[data-pinned]{position:static !important}' });
  try {
    await page.screenshot({ path: screenshotPath(name), fullPage: true });
  } finally {
    await style.evaluate((el) => (el as Element).remove());
  }
}
