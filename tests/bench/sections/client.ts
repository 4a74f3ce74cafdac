/**
 * The web client over a slow phone link: the built client served by the real app (demo fleet),
 * loaded in Debian's chromium through playwright-core with the browser's cache off and the link
 * emulated by the DevTools protocol (1.6 Mbit/s down, 750 kbit/s up, 150 ms latency).
 *
 * Figures: script bytes transferred (as sent on the wire, i.e. compressed when the server
 * compresses) for the sign-in page and for the manager's start page (the due list), and the time
 * from starting the navigation to a visible sign-in form. Targets: sign-in ≤ 150 kB of script,
 * manager's start page ≤ 300 kB, sign-in form visible in under 3 s.
 */
import { execFileSync } from 'node:child_process';
import path from 'node:path';
import type { BrowserContext, CDPSession, Page } from 'playwright-core';
import type { BenchSection } from '../registry';
import { launchBrowser, newContext } from '../../support/browser';
import { startTestServer } from '../../support/server';
import { DEMO, DEMO_PASSWORD } from '../../e2e/helpers';

const SLOW_LINK = { offline: false, latency: 150, downloadThroughput: 1_600_000 / 8, uploadThroughput: 750_000 / 8 };

/** Counts bytes on the wire per resource type while the page loads. */
async function watchTransfers(page: Page, slow: boolean): Promise<{ cdp: CDPSession; bytes: () => Record<string, number> }> {
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Network.enable');
  await cdp.send('Network.setCacheDisabled', { cacheDisabled: true });
  if (slow) await cdp.send('Network.emulateNetworkConditions', SLOW_LINK);
  const typeOf = new Map<string, string>();
  const totals: Record<string, number> = {};
  cdp.on('Network.responseReceived', (e) => typeOf.set(e.requestId, e.type));
  cdp.on('Network.loadingFinished', (e) => {
    const type = typeOf.get(e.requestId) ?? 'Other';
    totals[type] = (totals[type] ?? 0) + e.encodedDataLength;
  });
  return { cdp, bytes: () => ({ ...totals }) };
}

async function signInForm(page: Page) {
  await page.getByLabel('E-mail').waitFor({ state: 'visible', timeout: 60_000 });
  await page.getByRole('button', { name: 'Sign in' }).waitFor({ state: 'visible', timeout: 60_000 });
}

export const clientSection: BenchSection = {
  key: 'client',
  name: 'Web client on an emulated phone link (1.6 Mbit/s, 150 ms), cold cache, Debian chromium',
  async run() {
    const root = path.resolve(import.meta.dirname, '../../..');
    execFileSync(path.join(root, 'node_modules/.bin/vite'), ['build', '--logLevel', 'error'], { cwd: root, stdio: 'inherit' });
    const server = await startTestServer();
    const browser = await launchBrowser('full');
    const contexts: BrowserContext[] = [];
    try {
      // Sign-in page: a first visit on the slow link.
      const ctxA = await newContext(browser, 'phone', server.url);
      contexts.push(ctxA);
      const pageA = await ctxA.newPage();
      const a = await watchTransfers(pageA, true);
      const t0 = performance.now();
      await pageA.goto('/sign-in', { waitUntil: 'commit' });
      await signInForm(pageA);
      const formS = (performance.now() - t0) / 1000;
      await pageA.waitForLoadState('networkidle');
      const signIn = a.bytes();

      // Manager's start page, opened afresh (cold cache) by someone signed in.
      const ctxB = await newContext(browser, 'desktop', server.url);
      contexts.push(ctxB);
      const setup = await ctxB.newPage();
      await setup.goto('/sign-in');
      await setup.getByLabel('E-mail').fill(DEMO.manager);
      await setup.getByLabel('Password').fill(DEMO_PASSWORD);
      await setup.getByRole('button', { name: 'Sign in' }).click();
      await setup.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
      const landingPath = new URL(setup.url()).pathname;
      await setup.close();
      const pageB = await ctxB.newPage();
      const b = await watchTransfers(pageB, true);
      const t1 = performance.now();
      await pageB.goto(landingPath, { waitUntil: 'commit' });
      await pageB.getByRole('heading', { level: 1 }).first().waitFor({ state: 'visible', timeout: 60_000 });
      const landingS = (performance.now() - t1) / 1000;
      await pageB.waitForLoadState('networkidle');
      const landing = b.bytes();

      const kB = (n: number | undefined) => (n ?? 0) / 1000;
      const all = (t: Record<string, number>) => Object.values(t).reduce((s, v) => s + v, 0);
      return {
        rows: [
          { label: 'sign-in page: script transferred', value: kB(signIn.Script), unit: 'kB', note: `target ≤ 150 kB; all resources ${kB(all(signIn)).toFixed(0)} kB` },
          { label: 'sign-in form visible', value: formS, unit: 's', note: 'target < 3 s, from the start of the navigation' },
          { label: `manager's start page (${landingPath}): script`, value: kB(landing.Script), unit: 'kB', note: `target ≤ 300 kB; all resources ${kB(all(landing)).toFixed(0)} kB` },
          { label: "manager's start page: heading visible", value: landingS, unit: 's', note: 'signed in, cold cache' },
        ],
        metrics: {
          clientSignInScriptKb: kB(signIn.Script),
          clientSignInAllKb: kB(all(signIn)),
          clientSignInFormS: formS,
          clientLandingScriptKb: kB(landing.Script),
          clientLandingAllKb: kB(all(landing)),
          clientLandingHeadingS: landingS,
        },
      };
    } finally {
      for (const c of contexts) await c.close();
      await browser.close();
      await server.stop();
    }
  },
};
