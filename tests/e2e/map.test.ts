import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot } from '../support/browser';
import { ApiClient } from '../support/client';
import { DEMO, expectHeading, settled, signedInPage, openPage, serverAndBrowserForFile } from './helpers';
import { ROUGHNESS_CLASSES, roughnessColours } from '../../web/src/lib/roughness';

const { server, browser } = serverAndBrowserForFile();

/**
 * A point on the screen where a road segment is drawn and nothing else: a canvas pixel whose 3×3
 * neighbourhood is all one roughness-class colour, inside the map and away from its controls.
 */
async function pointOnASegment(page: Page, container: string): Promise<{ x: number; y: number; cls: string } | null> {
  const colours = ROUGHNESS_CLASSES.map((c) => [c, roughnessColours[c]] as const);
  return page.evaluate(
    ({ container, colours }) => {
      const box = document.querySelector(container)!.getBoundingClientRect();
      const rgb = colours.map(([c, hex]) => ({ c, v: [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16)) }));
      for (const canvas of document.querySelectorAll<HTMLCanvasElement>(`${container} canvas`)) {
        const ctx = canvas.getContext('2d');
        if (!ctx || !canvas.width) continue;
        const r = canvas.getBoundingClientRect();
        const sx = r.width / canvas.width;
        const sy = r.height / canvas.height;
        const d = ctx.getImageData(0, 0, canvas.width, canvas.height).data;
        const at = (x: number, y: number) => {
          const i = (y * canvas.width + x) * 4;
          if (d[i + 3] < 250) return null;
          return rgb.find((k) => Math.abs(d[i] - k.v[0]) <= 2 && Math.abs(d[i + 1] - k.v[1]) <= 2 && Math.abs(d[i + 2] - k.v[2]) <= 2)?.c ?? null;
        };
        for (let y = 2; y < canvas.height - 2; y += 3) {
          for (let x = 2; x < canvas.width - 2; x += 3) {
            const c = at(x, y);
            if (!c) continue;
            let same = true;
            for (let dy = -1; dy <= 1 && same; dy++) for (let dx = -1; dx <= 1 && same; dx++) same = at(x + dx, y + dy) === c;
            if (!same) continue;
            const cx = r.left + (x + 0.5) * sx;
            const cy = r.top + (y + 0.5) * sy;
            // inside the map, clear of the zoom buttons (top left), scale (bottom left) and attribution (bottom right)
            if (cx < box.left + 70 || cx > box.right - 20 || cy < box.top + 110 || cy > box.bottom - 50) continue;
            if (!(document.elementFromPoint(cx, cy) instanceof HTMLCanvasElement)) continue;
            return { x: cx, y: cy, cls: c };
          }
        }
      }
      return null;
    },
    { container, colours },
  );
}

describe('the road map in the browser', () => {
  it('when a manager clicks a road segment on a freshly loaded map, then that segment’s panel opens', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await openPage(page, '/map', 'Road map');
    await page.locator('[data-testid=fleet-map] canvas').first().waitFor();
    await page.waitForLoadState('networkidle');
    // the roads are drawn on the canvas once their data has arrived
    await expect.poll(() => pointOnASegment(page, '[data-testid=fleet-map]'), { message: 'a segment drawn on the map' }).not.toBeNull();
    await settled(page);
    const point = await pointOnASegment(page, '[data-testid=fleet-map]');
    expect(point, 'a segment drawn on the map').not.toBeNull();
    await page.mouse.click(point!.x, point!.y);
    const panel = page.getByTestId('segment-panel');
    await panel.waitFor({ timeout: 10_000 });
    expect(await panel.innerText()).toMatch(/Segment \d+/);
    expect(await panel.innerText()).toContain(`Class`);
    await screenshot(page, 'manager-desktop-map-clicked-segment');
    await context.close();
  });

  it('when the map opens, then the base has our own context: depot names, route names and a metric scale bar', async () => {
    const api = new ApiClient(server.url);
    await api.login(DEMO.manager);
    const data = await api.get<{ routes: { name: string }[]; depots: { name: string }[] }>('/api/map/segments');
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await page.goto(`${server.url}/map`);
    await page.locator('[data-testid=fleet-map] canvas').first().waitFor();
    const map = page.getByTestId('fleet-map');
    for (const d of data.body.depots) await map.getByText(`Depot: ${d.name}`).waitFor();
    await expect.poll(async () => (await map.locator('.map-route-label').allInnerTexts()).sort()).toEqual(data.body.routes.map((r) => r.name).sort());
    expect(await map.locator('.leaflet-control-scale-line').innerText()).toMatch(/^\d+ (m|km)$/);
    await context.close();
  });

  it('when a manager opens the due map, then each depot shows its vehicles due with the worst status, and their routes are drawn and named', async () => {
    const api = new ApiClient(server.url);
    await api.login(DEMO.manager);
    const due = await api.get<{ items: { depotName: string; status: string; routeIds: number[] }[] }>('/api/inspections/due');
    const roads = await api.get<{ routes: { id: number; name: string }[] }>('/api/map/segments');
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await expectHeading(page, 'Due inspections');
    await page.getByRole('button', { name: 'Map' }).click();
    const region = page.getByTestId('due-map');
    await region.locator('canvas').first().waitFor();
    const depots = [...new Set(due.body.items.map((i) => i.depotName))];
    expect(depots.length).toBeGreaterThan(0);
    for (const name of depots) {
      const mine = due.body.items.filter((i) => i.depotName === name);
      const worst = ['overdue', 'due', 'scheduled'].find((s) => mine.some((i) => i.status === s))!;
      const label = await region.getByText(new RegExp(`^${name}: `)).innerText();
      expect(label).toContain(`${mine.length} vehicle`);
      // the most urgent status comes first, in words
      expect(label).toMatch(new RegExp(`\\(\\d+ ${worst}`, 'i'));
    }
    const driven = new Set(due.body.items.flatMap((i) => i.routeIds));
    expect(driven.size).toBeGreaterThan(0);
    const wanted = roads.body.routes.filter((r) => driven.has(r.id)).map((r) => r.name).sort();
    // the roads arrive after the due list
    await expect.poll(async () => (await region.locator('.map-route-label').allInnerTexts()).sort()).toEqual(wanted);
    expect(await pointOnASegment(page, '[data-testid=due-map]')).not.toBeNull();
    const list = page.getByRole('list', { name: 'Vehicles due, by depot' });
    const firstRoute = roads.body.routes.find((r) => driven.has(r.id))!.name;
    await list.getByText(firstRoute).first().waitFor();
    await screenshot(page, 'manager-desktop-due-map-routes', { fullPage: true });
    await context.close();
  });

  it('when the map is used on a phone, then the zoom buttons are at least 44 px square', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.mechanic, 'phone');
    await openPage(page, '/map', 'Road map');
    for (const name of ['Zoom in', 'Zoom out']) {
      const box = (await page.getByRole('button', { name }).boundingBox())!;
      expect(box.width, name).toBeGreaterThanOrEqual(44);
      expect(box.height, name).toBeGreaterThanOrEqual(44);
    }
    await screenshot(page, 'mechanic-phone-map');
    await context.close();
  });
});
