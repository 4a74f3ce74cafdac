import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot } from '../support/browser';
import { DEMO, expectHeading, expectPath, menuItems, signedInPage, openPage, serverAndBrowserForFile } from './helpers';

const { server, browser } = serverAndBrowserForFile();

interface RouteDetailBody {
  route: { id: number; name: string; lengthM: number; defaultSpeedKmh: number };
  segments: { seq: number; speedKmh: number | null }[];
}

async function firstRoute(page: Page): Promise<{ id: number; name: string }> {
  const list = (await (await page.request.get(`${server.url}/api/routes?sort=name`)).json()) as { items: { id: number; name: string }[] };
  return list.items[0];
}

const editControls = ['Typical speed per segment', 'Upload a profile survey', 'Set roughness by hand'];

describe('routes: drawing, speeds, segments, and reading without edit rights', () => {
  it('when a manager draws a short route on the map, previews it and saves it, then its page opens with the previewed segments', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await openPage(page, '/routes', 'Routes');

    const map = page.getByTestId('draw-map');
    await map.scrollIntoViewIfNeeded();
    const status = page.getByTestId('draw-status');
    await status.getByText('0 points').waitFor();
    await map.click({ position: { x: 200, y: 200 } });
    await map.click({ position: { x: 420, y: 230 } });
    await map.click({ position: { x: 900, y: 300 } });
    await status.getByText('3 points').waitFor();
    const threeKm = Number(/([\d.]+) km/.exec(await status.innerText())![1]);

    await page.getByRole('button', { name: 'Undo last point' }).click();
    await status.getByText('2 points').waitFor();
    const twoKm = Number(/([\d.]+) km/.exec(await status.innerText())![1]);
    expect(twoKm).toBeGreaterThan(0);
    expect(twoKm).toBeLessThan(threeKm);
    await map.click({ position: { x: 640, y: 330 } });
    await status.getByText('3 points').waitFor();

    // No name yet: the server's preview names the field.
    await page.getByRole('button', { name: 'Preview segments' }).click();
    await page.getByText(/Route name must be at least 2 characters|must be at least 2 characters/).first().waitFor();

    const form = page.getByRole('region', { name: 'Add a route' });
    await form.getByLabel('Route name').fill('Drawn test loop');
    await form.getByLabel('Segment length [m]').fill('250');
    await page.getByRole('button', { name: 'Preview segments' }).click();
    const preview = page.getByRole('status').filter({ hasText: 'Nothing is saved until' });
    await preview.waitFor();
    const previewText = await preview.innerText();
    const previewSegments = Number(/in ([\d,]+) segments?/.exec(previewText)![1].replace(/,/g, ''));
    expect(previewSegments).toBeGreaterThan(1);
    await screenshot(page, 'manager-desktop-route-draw', { fullPage: true });

    await page.getByRole('button', { name: 'Save route' }).click();
    await expectHeading(page, 'Drawn test loop');
    const id = Number(new URL(page.url()).pathname.split('/').pop());
    const saved = (await (await page.request.get(`${server.url}/api/routes/${id}`)).json()) as RouteDetailBody;
    expect(saved.segments).toHaveLength(previewSegments);
    // a new route has no roughness yet: the IRI chart says so instead of showing bare axes
    await page.getByRole('figure', { name: 'IRI along the route' }).getByText(/^No survey yet/).waitFor();
    await context.close();
  });

  it('when a manager edits one segment speed, then a wrong value is refused on its row, and a good one is saved with the others left on the route speed', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    const route = await firstRoute(page);
    await openPage(page, `/routes/${route.id}`, route.name);

    const first = page.getByLabel('Speed on segment 1 [km/h]');
    const second = page.getByLabel('Speed on segment 2 [km/h]');
    await first.scrollIntoViewIfNeeded();
    expect(await first.getAttribute('placeholder')).toMatch(/\(route\)$/);

    await first.fill('200');
    await second.fill('40');
    await page.getByRole('button', { name: 'Save 2 speeds' }).click();
    await page.getByText('Speed must be between 5 and 130 km/h.').waitFor();
    await page.getByText(/Nothing was saved: 1 row needs a fix/).waitFor();
    await screenshot(page, 'manager-desktop-route-speeds-error');
    let detail = (await (await page.request.get(`${server.url}/api/routes/${route.id}`)).json()) as RouteDetailBody;
    expect(detail.segments.find((s) => s.seq === 1)?.speedKmh ?? null).not.toBe(40);

    await first.fill('35');
    await page.getByRole('button', { name: 'Save 2 speeds' }).click();
    await page.getByText('Saved speeds on 2 segments.').waitFor();
    detail = (await (await page.request.get(`${server.url}/api/routes/${route.id}`)).json()) as RouteDetailBody;
    expect(detail.segments.find((s) => s.seq === 0)?.speedKmh).toBe(35);
    expect(detail.segments.find((s) => s.seq === 1)?.speedKmh).toBe(40);
    expect(detail.segments.find((s) => s.seq === 2)?.speedKmh).toBeNull();
    await screenshot(page, 'manager-desktop-route-page', { fullPage: true });

    // Clearing a row puts the segment back on the route's speed.
    await first.fill('');
    await page.getByRole('button', { name: 'Save 1 speed' }).click();
    await page.getByText('Saved speeds on 1 segment.').waitFor();
    detail = (await (await page.request.get(`${server.url}/api/routes/${route.id}`)).json()) as RouteDetailBody;
    expect(detail.segments.find((s) => s.seq === 0)?.speedKmh).toBeNull();
    await context.close();
  });

  it('when a manager filters and sorts the segments table, then the server answers and a segment opens on the map', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await page.goto(`${server.url}/routes`);
    await page.getByRole('link', { name: 'All segments' }).click();
    await expectHeading(page, 'Segments');
    await page.getByText(/^1–25 of [\d,]+ segments$/).waitFor();
    await screenshot(page, 'manager-desktop-segments', { fullPage: true });

    const rows = page.getByRole('table', { name: /^Segments/ }).locator('tbody tr');
    const column = (n: number) => rows.locator(`td:nth-child(${n})`).allInnerTexts();
    await page.getByLabel('Source').selectOption('survey');
    expect(new URL(page.url()).searchParams.get('source')).toBe('survey');
    await expect.poll(async () => [...new Set(await column(6))], { timeout: 10_000 }).toEqual(['Profile survey']);

    const before = await column(5);
    await page.getByRole('button', { name: /IRI/ }).click();
    await page.waitForURL((u) => u.searchParams.get('sort') === 'iri');
    // The table is marked busy while the new page is fetched; the range line says "Loading" meanwhile.
    await expect.poll(async () => (await page.locator('table[aria-busy="true"]').count()) + (await page.getByText('Loading segments…').count()), { timeout: 10_000 }).toBe(0);
    // the busy mark may not be up yet when first polled, so wait for the sorted rows themselves
    const sortedNew = async () => {
      const iris = (await column(5)).map(Number);
      return iris.length > 1 && iris.join() !== before.map(Number).join() && iris.every((v, i, a) => i === 0 || a[i - 1] <= v);
    };
    await expect.poll(sortedNew, { timeout: 15_000 }).toBe(true);
    expect(await page.getByText('Loading segments…').count()).toBe(0);

    await page.getByRole('link', { name: /on the map$/ }).first().click();
    await expectPath(page, '/map');
    await page.getByTestId('segment-panel').waitFor();
    await context.close();
  });

  it('when a mechanic opens the road map and a route page, then they read it all but see no edit controls', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.mechanic, 'tablet');
    expect(await menuItems(page)).toContain('Roads');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Roads' }).click();
    await expectHeading(page, 'Road map');
    await page.getByTestId('fleet-map').waitFor();
    await page.waitForLoadState('networkidle');
    await screenshot(page, 'mechanic-tablet-map');

    const route = await firstRoute(page);
    await openPage(page, `/routes/${route.id}`, route.name);
    await page.getByTestId('route-map').waitFor();
    await page.getByRole('heading', { name: 'Trips on this route' }).waitFor();
    await page.waitForLoadState('networkidle');
    for (const heading of editControls) expect(await page.getByRole('heading', { name: heading }).count()).toBe(0);
    expect(await page.getByRole('textbox').count()).toBe(0);
    expect(await page.getByRole('button', { name: /Save|Upload|Set roughness|Preview/ }).count()).toBe(0);
    await screenshot(page, 'mechanic-tablet-route', { fullPage: true });
    await context.close();
  });

  it('when a driver opens a route page on a phone, then it reads well and has no edit controls', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.driver, 'phone');
    const route = await firstRoute(page);
    await openPage(page, `/routes/${route.id}`, route.name);
    await page.getByTestId('route-map').waitFor();
    await page.waitForLoadState('networkidle');
    for (const heading of editControls) expect(await page.getByRole('heading', { name: heading }).count()).toBe(0);
    expect(await page.getByRole('textbox').count()).toBe(0);
    await screenshot(page, 'driver-phone-route');
    await screenshot(page, 'driver-phone-route-full', { fullPage: true });
    await context.close();
  });
});
