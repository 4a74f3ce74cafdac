import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { fullPageScreenshot, launchBrowser, newContext, screenshotPath } from '../support/browser';
import { startTestServer, type TestServer } from '../support/server';
import { DEMO, expectHeading, expectPath, menuItems, signIn } from './helpers';

let server: TestServer;
let browser: Browser;

beforeAll(async () => {
  [server, browser] = await Promise.all([startTestServer(), launchBrowser()]);
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

describe('each role lands on its own page and sees only what it may use', () => {
  it('when a manager signs in at a desk, then the due inspections open, the menu lists the manager pages, and the fleet overview is one click away', async () => {
    const context = await newContext(browser, 'desktop');
    const page = await context.newPage();
    await signIn(page, server.url, DEMO.manager);

    await expectPath(page, '/due');
    await expectHeading(page, 'Due inspections');
    expect(await menuItems(page)).toEqual([
      'Due', 'Fleet', 'Roads', 'Ride reports', 'Exposure', 'Vehicles', 'Specs', 'Routes', 'Trips',
      'Planning', 'Damper life', 'Model check', 'People', 'Account',
    ]);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Fleet', exact: true }).click();
    await expectHeading(page, 'Fleet');
    await page.getByRole('heading', { name: 'Vehicles by status' }).waitFor();
    await page.getByText('In service', { exact: true }).first().waitFor();
    await page.getByRole('table', { name: /Depots/ }).waitFor();
    await fullPageScreenshot(page, 'manager-desktop-fleet');

    for (const [link, title, shot] of [
      ['Specs', 'Suspension specs', 'manager-desktop-specs'],
      ['Routes', 'Routes', 'manager-desktop-routes'],
      ['People', 'People', 'manager-desktop-people'],
      ['Account', 'Your account', 'manager-desktop-account'],
    ] as const) {
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: link }).click();
      await page.getByRole('heading', { level: 1, name: title }).waitFor();
      await page.waitForLoadState('networkidle');
      await fullPageScreenshot(page, shot);
    }
    await context.close();
  });

  it('when a mechanic signs in on a tablet, then the workshop opens with the fleet listed and a short menu', async () => {
    const context = await newContext(browser, 'tablet');
    const page = await context.newPage();
    await signIn(page, server.url, DEMO.mechanic);

    await expectPath(page, '/workshop');
    await expectHeading(page, 'Workshop');
    expect(await menuItems(page)).toEqual(['Workshop', 'Roads', 'Vehicles', 'Damper life', 'Account']);
    await page.getByRole('heading', { name: 'My inspections' }).waitFor();
    await page.getByRole('table', { name: /Vehicles/ }).getByRole('link').first().waitFor();
    await fullPageScreenshot(page, 'mechanic-tablet-workshop');

    await page.getByRole('link', { name: /CV-108/ }).first().click();
    await page.getByRole('heading', { level: 1, name: 'CV-108' }).waitFor();
    await page.getByRole('heading', { name: 'Dampers by corner' }).waitFor();
    await page.waitForLoadState('networkidle');
    await fullPageScreenshot(page, 'mechanic-tablet-vehicle');
    await context.close();
  });

  it('when a driver signs in on a phone, then their own vehicle opens and the menu has their vehicle, reporting, exposure and the account', async () => {
    const context = await newContext(browser, 'phone');
    const page = await context.newPage();
    await signIn(page, server.url, DEMO.driver);

    await expectPath(page, '/my-vehicle');
    expect(await menuItems(page)).toEqual(['My vehicle', 'Report', 'My reports', 'Exposure', 'Account']);
    await page.getByText('Your vehicle', { exact: true }).waitFor();
    await page.getByRole('heading', { name: 'Dampers' }).waitFor();
    await page.getByRole('article', { name: 'Front left damper' }).waitFor();
    await page.screenshot({ path: screenshotPath('driver-phone-my-vehicle') });
    await fullPageScreenshot(page, 'driver-phone-my-vehicle-full');

    // Targets for a thumb: every menu item is at least 44 px tall.
    const boxes = await page.getByRole('navigation', { name: 'Main' }).getByRole('link').evaluateAll((els) => els.map((e) => e.getBoundingClientRect().height));
    for (const h of boxes) expect(h).toBeGreaterThanOrEqual(44);
    await context.close();
  });

  it('when a driver opens a manager page by its address, then a plain "not available for your role" page shows', async () => {
    const context = await newContext(browser, 'phone');
    const page = await context.newPage();
    await signIn(page, server.url, DEMO.driver);

    for (const path of ['/people', '/vehicles', '/fleet']) {
      await page.goto(server.url + path);
      await expectHeading(page, 'Not available for your role');
      expect(await menuItems(page)).toEqual(['My vehicle', 'Report', 'My reports', 'Exposure', 'Account']);
    }
    await page.screenshot({ path: screenshotPath('driver-phone-not-available') });
    await page.getByRole('link', { name: 'Go to your start page' }).click();
    await expectPath(page, '/my-vehicle');
    await context.close();
  });

  it('when a mechanic opens the people page by its address, then it is not available to them', async () => {
    const context = await newContext(browser, 'tablet');
    const page = await context.newPage();
    await signIn(page, server.url, DEMO.mechanic);
    await page.goto(`${server.url}/people`);
    await expectHeading(page, 'Not available for your role');
    await context.close();
  });

  it('when nobody is signed in and a page is opened, then sign-in shows and afterwards that page opens', async () => {
    const context = await newContext(browser, 'desktop');
    const page = await context.newPage();
    await page.goto(`${server.url}/vehicles?status=workshop`);
    await expectPath(page, '/sign-in');
    expect(new URL(page.url()).searchParams.get('next')).toBe('/vehicles?status=workshop');

    await page.getByLabel('E-mail').fill(DEMO.manager);
    await page.getByLabel('Password').fill('reboundry-demo');
    await page.getByLabel('Password').press('Enter');
    await expectPath(page, '/vehicles');
    expect(new URL(page.url()).searchParams.get('status')).toBe('workshop');
    await context.close();
  });
});
