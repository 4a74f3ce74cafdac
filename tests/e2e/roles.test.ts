import { describe, expect, it } from 'vitest';
import { screenshot } from '../support/browser';
import { DEMO, expectHeading, expectPath, goViaMenu, menuEntries, menuItems, openMenuGroup, signedInPage, openPage, freshPage, serverAndBrowserForFile } from './helpers';

const { server, browser } = serverAndBrowserForFile();

/** The manager's menu groups and the pages in each, with where they go. */
const MANAGER_GROUPS: Record<string, [label: string, path: string][]> = {
  Fleet: [['Overview', '/fleet'], ['Vehicles', '/vehicles'], ['Specs', '/specs'], ['People', '/people']],
  Roads: [['Map', '/map'], ['Routes', '/routes'], ['Segments', '/segments'], ['Trips', '/trips']],
  Workshop: [['Planning', '/planning'], ['Damper life', '/damper-life'], ['Model check', '/model-check'], ['Job runs', '/jobs'], ['Outbox', '/outbox']],
  Drivers: [['Ride reports', '/ride-reports'], ['Exposure', '/exposure']],
};

describe('each role lands on its own page and sees only what it may use', () => {
  it('when a manager signs in at a desk, then the due inspections open, the menu shows its groups, and the fleet overview is in the Fleet group', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');

    await expectPath(page, '/due');
    await expectHeading(page, 'Due inspections');
    expect(await menuEntries(page)).toEqual(['Due', 'Fleet ▾', 'Roads ▾', 'Workshop ▾', 'Drivers ▾', 'Account']);
    // With every group closed only the pages that stand on their own are links.
    expect(await menuItems(page)).toEqual(['Due', 'Account']);
    await screenshot(page, 'manager-desktop-menu-closed');

    for (const [group, items] of Object.entries(MANAGER_GROUPS)) {
      expect(await openMenuGroup(page, group), `pages under ${group}`).toEqual(items.map(([label]) => label));
    }
    // Opening one group closed the one before: only the last is open.
    const nav = page.getByRole('navigation', { name: 'Main' });
    expect(await nav.locator('button[aria-expanded="true"]').allInnerTexts()).toEqual(['Drivers']);

    await openMenuGroup(page, 'Roads');
    await screenshot(page, 'manager-desktop-menu-roads-open');
    await nav.getByRole('link', { name: 'Map', exact: true }).waitFor();

    await openMenuGroup(page, 'Fleet');
    await nav.getByRole('link', { name: 'Overview', exact: true }).click();
    await expectPath(page, '/fleet');
    await expectHeading(page, 'Fleet');
    // The group closes on the way, and shows as the current section.
    const fleet = nav.getByRole('button', { name: 'Fleet', exact: true });
    expect(await fleet.getAttribute('aria-expanded')).toBe('false');
    expect(await fleet.getAttribute('aria-current')).toBe('true');
    expect(await nav.getByRole('button', { name: 'Roads', exact: true }).getAttribute('aria-current')).toBeNull();
    await page.getByRole('heading', { name: 'Vehicles by status' }).waitFor();
    await page.getByText('In service', { exact: true }).first().waitFor();
    await page.getByRole('table', { name: /Depots/ }).waitFor();
    // the inspections coming due, as the due list counts them
    const counts = (await (await page.request.get(`${server.url}/api/inspections/due`)).json()).counts as Record<string, number>;
    const inspections = page.getByRole('region', { name: 'Inspections' });
    await expect.poll(() => inspections.locator('.tabular').allInnerTexts()).toEqual([counts.overdue, counts.due, counts.next30].map(String));
    expect(counts.due + counts.next30).toBeGreaterThan(0);
    await screenshot(page, 'manager-desktop-fleet', { fullPage: true });

    for (const [link, title, shot] of [
      ['Specs', 'Suspension specs', 'manager-desktop-specs'],
      ['Routes', 'Routes', 'manager-desktop-routes'],
      ['People', 'People', 'manager-desktop-people'],
      ['Account', 'Your account', 'manager-desktop-account'],
    ] as const) {
      await goViaMenu(page, link);
      await page.getByRole('heading', { level: 1, name: title }).waitFor();
      await page.waitForLoadState('networkidle');
      await screenshot(page, shot, { fullPage: true });
    }
    // A page below one in a group (a new spec) still marks its group.
    await page.goto(`${server.url}/specs/new`);
    await page.getByRole('heading', { level: 1 }).first().waitFor();
    expect(await nav.getByRole('button', { name: 'Fleet', exact: true }).getAttribute('aria-current')).toBe('true');
    await context.close();
  });

  it('when a manager uses only the keyboard, then each group opens with Enter or Space, Escape closes it and returns focus, and every page in the menu can be reached', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await expectHeading(page, 'Due inspections');
    const nav = page.getByRole('navigation', { name: 'Main' });
    const focused = () => page.evaluate(() => (document.activeElement?.textContent ?? '').trim());

    // Tab order from the brand: Due, then the group buttons (closed groups hide their links), then Account.
    await page.getByRole('link', { name: 'Reboundry, your start page' }).focus();
    const order: string[] = [];
    for (let i = 0; i < 6; i++) {
      await page.keyboard.press('Tab');
      order.push(await focused());
    }
    expect(order).toEqual(['Due', 'Fleet', 'Roads', 'Workshop', 'Drivers', 'Account']);

    // Space opens, Escape closes and leaves focus on the button.
    const roads = nav.getByRole('button', { name: 'Roads', exact: true });
    await roads.focus();
    await page.keyboard.press('Space');
    await expect.poll(() => roads.getAttribute('aria-expanded')).toBe('true');
    await page.keyboard.press('Tab');
    expect(await focused()).toBe('Map');
    await page.keyboard.press('Escape');
    await expect.poll(() => roads.getAttribute('aria-expanded')).toBe('false');
    expect(await roads.evaluate((el) => el === document.activeElement)).toBe(true);

    // Tab past a group's last page closes it and moves on to the next group.
    await page.keyboard.press('Enter');
    await expect.poll(() => roads.getAttribute('aria-expanded')).toBe('true');
    for (let i = 0; i < MANAGER_GROUPS.Roads.length; i++) await page.keyboard.press('Tab');
    expect(await focused()).toBe(MANAGER_GROUPS.Roads.at(-1)?.[0]);
    await page.keyboard.press('Tab');
    expect(await focused()).toBe('Workshop');
    await expect.poll(() => roads.getAttribute('aria-expanded')).toBe('false');

    // A click outside closes an open group.
    await page.keyboard.press('Enter');
    await expect.poll(() => nav.getByRole('button', { name: 'Workshop', exact: true }).getAttribute('aria-expanded')).toBe('true');
    await page.locator('main').click({ position: { x: 5, y: 400 } });
    await expect.poll(() => nav.getByRole('button', { name: 'Workshop', exact: true }).getAttribute('aria-expanded')).toBe('false');

    // Every page under every group: focus its group, Enter, Tab down to it, Enter.
    for (const [group, items] of Object.entries(MANAGER_GROUPS)) {
      for (const [index, [label, path]] of items.entries()) {
        const button = nav.getByRole('button', { name: group, exact: true });
        await button.focus();
        await page.keyboard.press('Enter');
        await expect.poll(() => button.getAttribute('aria-expanded'), { message: `${group} opened with Enter` }).toBe('true');
        for (let i = 0; i <= index; i++) await page.keyboard.press('Tab');
        expect(await focused(), `Tab ${index + 1} under ${group}`).toBe(label);
        await page.keyboard.press('Enter');
        await expectPath(page, path);
        // The address changes before the new page is on screen (the router renders it in a
        // transition); wait until the menu marks the new page, or the next group's Enter could be
        // undone by the page change that closes open groups.
        await nav.locator(`a[href="${path}"][aria-current="page"]`).waitFor({ state: 'attached' });
        await page.getByRole('heading', { level: 1 }).first().waitFor();
      }
    }
    await context.close();
  });

  it('when a manager opens the app on a 1024 px screen, then the grouped menu fits without scrolling sideways', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'tablet');
    await expectHeading(page, 'Due inspections');
    const nav = page.getByRole('navigation', { name: 'Main' });
    expect(await nav.evaluate((el) => el.scrollWidth <= el.clientWidth)).toBe(true);
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
    await screenshot(page, 'manager-tablet-menu-closed');
    await openMenuGroup(page, 'Workshop');
    await screenshot(page, 'manager-tablet-menu-workshop-open');
    await context.close();
  });

  it('when a manager opens the app on a phone, then the bottom bar holds the same groups and a group opens upwards with its pages', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'phone');
    await expectHeading(page, 'Due inspections');
    expect(await menuEntries(page)).toEqual(['Due', 'Fleet ▾', 'Roads ▾', 'Workshop ▾', 'Drivers ▾', 'Account']);
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
    expect(await openMenuGroup(page, 'Roads')).toEqual(MANAGER_GROUPS.Roads.map(([label]) => label));
    await screenshot(page, 'manager-phone-menu-roads-open');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Trips', exact: true }).click();
    await expectPath(page, '/trips');
    await expectHeading(page, 'Trips');
    await context.close();
  });

  it('when a mechanic signs in on a tablet, then the workshop opens with the fleet listed and a short menu', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.mechanic, 'tablet');

    await expectPath(page, '/workshop');
    await expectHeading(page, 'Workshop');
    expect(await menuItems(page)).toEqual(['Workshop', 'Roads', 'Vehicles', 'Damper life', 'Account']);
    // The mechanic's menu is short and flat: no groups.
    expect(await menuEntries(page)).toEqual(['Workshop', 'Roads', 'Vehicles', 'Damper life', 'Account']);
    await page.getByRole('heading', { name: 'My inspections' }).waitFor();
    await page.getByRole('table', { name: /Vehicles/ }).getByRole('link').first().waitFor();
    await screenshot(page, 'mechanic-tablet-workshop', { fullPage: true });

    await page.getByRole('link', { name: /CV-108/ }).first().click();
    await page.getByRole('heading', { level: 1, name: 'CV-108' }).waitFor();
    await page.getByRole('heading', { name: 'Dampers by corner' }).waitFor();
    await page.waitForLoadState('networkidle');
    await screenshot(page, 'mechanic-tablet-vehicle', { fullPage: true });
    await context.close();
  });

  it('when a driver signs in on a phone, then their own vehicle opens and the menu has their vehicle, reporting, exposure and the account', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.driver, 'phone');

    await expectPath(page, '/my-vehicle');
    expect(await menuItems(page)).toEqual(['My vehicle', 'Report', 'My reports', 'Exposure', 'Account']);
    await page.getByText('Your vehicle', { exact: true }).waitFor();
    await page.getByRole('heading', { name: 'Dampers' }).waitFor();
    await page.getByRole('article', { name: 'Front left damper' }).waitFor();
    await screenshot(page, 'driver-phone-my-vehicle');
    await screenshot(page, 'driver-phone-my-vehicle-full', { fullPage: true });

    // Targets for a thumb: every menu item is at least 44 px tall.
    const boxes = await page.getByRole('navigation', { name: 'Main' }).getByRole('link').evaluateAll((els) => els.map((e) => e.getBoundingClientRect().height));
    for (const h of boxes) expect(h).toBeGreaterThanOrEqual(44);
    await context.close();
  });

  it("when a driver signs in at a desk, then the vehicle's plate, odometer, type and depot sit in one row and no word is broken across lines", async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.driver);
    await expectPath(page, '/my-vehicle');
    const facts = page.locator('dl').first();
    await facts.getByText('Depot', { exact: true }).waitFor();
    const columns = await facts.evaluate((el) => getComputedStyle(el).gridTemplateColumns.split(' ').length);
    expect(columns).toBe(4);
    // a word wrapped inside itself has its letters on two lines: two boxes for one word
    const broken = await facts.locator('dd').evaluateAll((dds) =>
      dds.flatMap((dd) => {
        const text = dd.firstChild?.nodeType === Node.TEXT_NODE ? (dd.firstChild as Text) : null;
        if (!text) return [];
        const out: string[] = [];
        for (const m of text.data.matchAll(/\S+/g)) {
          const r = document.createRange();
          r.setStart(text, m.index!);
          r.setEnd(text, m.index! + m[0].length);
          if (r.getClientRects().length > 1) out.push(m[0]);
        }
        return out;
      }),
    );
    expect(broken).toEqual([]);
    await context.close();
  });

  it('when a driver opens a manager page by its address, then a plain "not available for your role" page shows', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.driver, 'phone');

    for (const path of ['/people', '/vehicles', '/fleet']) {
      await page.goto(server.url + path);
      await expectHeading(page, 'Not available for your role');
      expect(await menuItems(page)).toEqual(['My vehicle', 'Report', 'My reports', 'Exposure', 'Account']);
    }
    await screenshot(page, 'driver-phone-not-available');
    await page.getByRole('link', { name: 'Go to your start page' }).click();
    await expectPath(page, '/my-vehicle');
    await context.close();
  });

  it('when a mechanic opens the people page by its address, then it is not available to them', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.mechanic, 'tablet');
    await openPage(page, '/people', 'Not available for your role');
    await context.close();
  });

  it('when nobody is signed in and a page is opened, then sign-in shows and afterwards that page opens', async () => {
    const { context, page } = await freshPage(browser, server.url, 'desktop');
    await page.goto('/vehicles?status=workshop');
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
