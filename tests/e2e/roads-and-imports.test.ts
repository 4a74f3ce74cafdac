import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot } from '../support/browser';
import { ApiClient } from '../support/client';
import { DEMO, expectHeading, settled, goViaMenu, signedInPage, openPage, serverAndBrowserForFile } from './helpers';
import { synthesizeProfile } from '../../server/physics/iso8608';
import { formatProfileCsv } from '../../server/roads/profile-store';
import { roughnessColours } from '../../web/src/lib/roughness';

const { server, browser } = serverAndBrowserForFile();

/** Counts canvas pixels close to a colour inside a container (the map's canvas renderer). */
async function pixelsOf(page: Page, container: string, hex: string): Promise<number> {
  return page.evaluate(
    ({ container, hex }) => {
      const want = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));
      let n = 0;
      for (const c of document.querySelectorAll<HTMLCanvasElement>(`${container} canvas`)) {
        const ctx = c.getContext('2d');
        if (!ctx || !c.width || !c.height) continue;
        const d = ctx.getImageData(0, 0, c.width, c.height).data;
        for (let i = 0; i < d.length; i += 4) {
          if (d[i + 3] > 200 && Math.abs(d[i] - want[0]) < 8 && Math.abs(d[i + 1] - want[1]) < 8 && Math.abs(d[i + 2] - want[2]) < 8) n++;
        }
      }
      return n;
    },
    { container, hex },
  );
}

const CLASS_F = roughnessColours.F;

describe('roads, surveys and imports in the browser', () => {
  it('when a manager uploads a rough survey for a smooth route, then its segments turn to the rough class colour on the map', async () => {
    const api = new ApiClient(server.url);
    await api.login(DEMO.manager);
    const routes = await api.get<{ items: { id: number; name: string; lengthKm: number }[] }>('/api/routes?q=Northgate');
    const route = routes.body.items[0];
    // ISO 8608 class F geometric mean Gd(n0) = 16 384 × 10⁻⁶ m³ (docs/methods.md "Road roughness")
    const profile = synthesizeProfile({ gdN0: 16384e-6, lengthM: Math.floor(route.lengthKm * 1000), dxM: 0.25, seed: 5 });
    const csv = formatProfileCsv({ dxM: 0.25, startM: 0, elevationsM: profile });

    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await openPage(page, '/map', 'Road map');
    await page.locator('[data-testid=fleet-map] canvas').first().waitFor();
    await page.waitForLoadState('networkidle');
    await settled(page);
    const before = await pixelsOf(page, '[data-testid=fleet-map]', CLASS_F);
    await screenshot(page, 'manager-desktop-map');

    await openPage(page, `/routes/${route.id}`, route.name);
    await page.getByLabel('Profile file (CSV)').setInputFiles({ name: 'northgate-profile.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
    await page.getByRole('button', { name: 'Preview IRI' }).click();
    await page.getByRole('table', { name: 'Survey preview' }).waitFor();
    await screenshot(page, 'manager-desktop-survey-preview', { fullPage: true });
    await page.getByRole('button', { name: 'Save survey' }).click();
    await page.getByText(/Survey saved/).waitFor();
    await expect.poll(() => pixelsOf(page, '[data-testid=route-map]', CLASS_F)).toBeGreaterThan(200);
    await screenshot(page, 'manager-desktop-route', { fullPage: true });

    await page.goto(`${server.url}/map`);
    await page.locator('[data-testid=fleet-map] canvas').first().waitFor();
    await expect.poll(() => pixelsOf(page, '[data-testid=fleet-map]', CLASS_F)).toBeGreaterThan(before + 100);
    await screenshot(page, 'manager-desktop-map-after-survey');
    await context.close();
  });

  it('when a manager imports a trip file with one bad row, then the report names that row and nothing is imported', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await goViaMenu(page, 'Trips');
    await expectHeading(page, 'Trips');
    const csv = [
      'vehicle,route,driver_email,start,end,distance_km,mean_speed_kmh,payload_kg',
      'CV-101,Tanner Way town loop,driver@reboundry.test,2026-11-30T06:00:00Z,2026-11-30T06:40:00Z,14,32,300',
      'ZZ-404,Tanner Way town loop,,2026-11-30T06:00:00Z,2026-11-30T06:40:00Z,14,32,',
    ].join('\n');
    await page.getByLabel('Trip file (CSV)').setInputFiles({ name: 'trips.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
    await page.getByRole('button', { name: 'Check file' }).click();
    const report = page.getByRole('table', { name: 'Rows of the trip file' });
    await report.waitFor();
    await page.getByText('1 of 2 rows have problems').waitFor();
    await report.getByText('unknown vehicle "ZZ-404"').waitFor();
    expect(await page.getByRole('button', { name: 'Import trips' }).isDisabled()).toBe(true);
    await screenshot(page, 'manager-desktop-trip-import', { fullPage: true });
    await context.close();
  });

  it('when a manager edits a spec’s damping, then the body damping ratio updates', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await page.goto(`${server.url}/specs`);
    await page.getByRole('link', { name: 'Edit Courier van 2.8 t' }).click();
    await expectHeading(page, 'Edit Courier van 2.8 t');
    const zeta = page.getByTestId('body-zeta').first();
    await zeta.waitFor();
    const before = await zeta.innerText();
    const damping = page.getByLabel('Damping at the wheel [N·s/m]').first();
    await damping.fill('4800');
    await page.waitForFunction((b) => document.querySelector('[data-testid=body-zeta]')?.textContent !== b, before);
    const after = await zeta.innerText();
    expect(parseFloat(after)).toBeGreaterThan(parseFloat(before));
    await screenshot(page, 'manager-desktop-spec-editor', { fullPage: true });
    await page.getByRole('button', { name: 'Save changes' }).click();
    await page.getByText('Saved.').waitFor();
    await context.close();
  });
});
