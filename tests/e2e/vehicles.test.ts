import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot } from '../support/browser';
import { DEMO, expectHeading, expectPath, goViaMenu, signedInPage, serverAndBrowserForFile } from './helpers';

const { server, browser } = serverAndBrowserForFile();

const table = (page: Page) => page.getByRole('table', { name: /^Vehicles/ });

/** The text of one column for every row shown, by its header's position. */
async function column(page: Page, index: number): Promise<string[]> {
  return table(page)
    .locator('tbody tr')
    .evaluateAll((rows, i) => rows.map((r) => (r.children[i] as HTMLElement).innerText.trim()), index);
}

/** The range line above the table, e.g. "1–25 of 44 vehicles", once it has settled. */
async function range(page: Page, expected: RegExp) {
  const line = page.getByText(expected);
  await line.waitFor();
  return line.innerText();
}

const km = (s: string) => Number(s.replace(/[^\d]/g, ''));

describe('vehicles table', () => {
  it('when a manager pages, sorts, filters and searches, then the server answers each view and the address keeps it', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await goViaMenu(page, 'Vehicles');
    await expectHeading(page, 'Vehicles');

    const first = await range(page, /^1–25 of \d+ vehicles$/);
    const total = Number(/of (\d+)/.exec(first)![1]);
    expect(total).toBeGreaterThan(25);
    await screenshot(page, 'manager-desktop-vehicles', { fullPage: true });

    // Paging
    const firstPage = await column(page, 0);
    await page.getByRole('button', { name: /Next/ }).click();
    await range(page, new RegExp(`^26–${total} of ${total} vehicles$`));
    const secondPage = await column(page, 0);
    expect(secondPage).toHaveLength(total - 25);
    expect(secondPage.some((f) => firstPage.includes(f))).toBe(false);
    expect(new URL(page.url()).searchParams.get('page')).toBe('2');

    // Sorting by odometer: first ascending, then descending; the header says which.
    const odoHeader = table(page).getByRole('columnheader', { name: /Odometer/ });
    await odoHeader.getByRole('button').click();
    await range(page, /^1–25 of/);
    await page.waitForFunction(() => new URL(location.href).searchParams.get('sort') === 'odometerKm');
    // the header's mark follows the address a moment later under load: wait for it
    await expect.poll(() => odoHeader.getAttribute('aria-sort'), { timeout: 10_000 }).toBe('ascending');
    await odoHeader.getByRole('button').click();
    await page.waitForFunction(() => new URL(location.href).searchParams.get('sort') === '-odometerKm');
    await expect.poll(() => odoHeader.getAttribute('aria-sort'), { timeout: 10_000 }).toBe('descending');
    // the busy mark may not be up yet when first checked: wait for the rows themselves
    await expect
      .poll(async () => {
        const odo = (await column(page, 6)).map(km);
        return odo.length > 1 && odo.every((v, i, a) => i === 0 || a[i - 1] >= v);
      }, { timeout: 15_000 })
      .toBe(true);

    // Filter by status
    await page.getByLabel('Status').selectOption('workshop');
    await range(page, /^1–1 of 1 vehicle$/);
    expect(await column(page, 2)).toEqual(['In workshop']);

    // Filter by depot as well as status cleared; every row is at that depot
    await page.getByRole('button', { name: 'Clear filters' }).click();
    await range(page, new RegExp(`^1–25 of ${total} vehicles$`));
    await page.getByLabel('Depot').selectOption({ label: 'Millbrook Cross Depot' });
    await page.waitForFunction(() => new URL(location.href).searchParams.has('depotId'));
    await expect.poll(async () => [...new Set(await column(page, 4))], { timeout: 15_000 }).toEqual(['Millbrook Cross Depot']);

    // Filter by spec
    await page.getByLabel('Spec').selectOption({ label: 'Rigid truck 18 t' });
    await page.waitForFunction(() => new URL(location.href).searchParams.has('specId'));
    await expect.poll(async () => [...new Set(await column(page, 3))], { timeout: 15_000 }).toEqual(['Rigid truck 18 t']);

    // Search by fleet number
    await page.getByRole('button', { name: 'Clear filters' }).click();
    await page.getByLabel('Fleet number or plate').fill('LV-11');
    await page.waitForFunction(() => new URL(location.href).searchParams.get('q') === 'LV-11');
    await expect
      .poll(async () => {
        const found = await column(page, 0);
        return found.length > 0 && found.every((f) => f.includes('LV-11'));
      }, { timeout: 15_000 })
      .toBe(true);

    // A search that finds nothing says what to do
    await page.getByLabel('Fleet number or plate').fill('nothing-like-this');
    await page.getByText('No vehicles match these filters').waitFor();
    await context.close();
  });

  it('when a manager downloads the CSV, then it holds every matching row, not only the page on screen, with units in the header', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await page.goto(`${server.url}/vehicles?status=in_service&pageSize=25&sort=-odometerKm`);
    const line = await range(page, /^1–\d+ of \d+ vehicles$/);
    const [, shownText, totalText] = /–(\d+) of ([\d,]+)/.exec(line)!;
    const [shown, total] = [shownText, totalText].map((x) => Number(x.replace(/,/g, '')));
    expect(total).toBeGreaterThan(shown);

    const link = page.getByRole('link', { name: /^Download CSV/ });
    expect(await link.innerText()).toBe(`Download CSV of all ${totalText} matching rows`);
    const [download] = await Promise.all([page.waitForEvent('download'), link.click()]);
    expect(download.suggestedFilename()).toMatch(/^reboundry-vehicles-\d{4}-\d{2}-\d{2}\.csv$/);
    // a copy of the file: the shared Chromium of the browser run is remote, so the download has no local path
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-download-'));
    const saved = path.join(dir, download.suggestedFilename());
    await download.saveAs(saved);
    const csv = fs.readFileSync(saved, 'utf8').replace(/^\ufeff/, '');
    fs.rmSync(dir, { recursive: true, force: true });
    const lines = csv.trim().split(/\r\n/);
    expect(lines[0]).toBe('Fleet number,Plate,Status,Spec,Depot,Driver,Odometer (km)');
    expect(lines).toHaveLength(total + 1);
    const odo = lines.slice(1).map((l) => Number(l.split(',').at(-1)));
    expect(odo).toEqual([...odo].sort((a, b) => b - a));
    expect(lines.slice(1).every((l) => l.includes(',In service,'))).toBe(true);
    await context.close();
  });

  it('when a manager opens a vehicle, then its dampers by corner, spec with units, trips and inspections show', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await page.goto(`${server.url}/vehicles?q=CV-102`);
    await table(page).getByRole('link', { name: 'CV-102' }).click();
    await page.getByRole('heading', { level: 1, name: 'CV-102' }).waitFor();
    await expectPath(page, new URL(page.url()).pathname);
    expect(new URL(page.url()).pathname).toMatch(/^\/vehicles\/\d+$/);

    for (const corner of ['Front left', 'Front right', 'Rear left', 'Rear right']) {
      await page.getByRole('article', { name: `${corner} damper` }).waitFor();
    }
    const frontLeft = await page.getByRole('article', { name: 'Front left damper' }).innerText();
    expect(frontLeft).toMatch(/Fitted/);
    expect(frontLeft).toMatch(/\d\skm/);
    // the wear caution is there (the wear and workshop panels carry their own too)
    const cautions = page.getByRole('note', { name: 'Caution' });
    await cautions.first().waitFor();
    expect((await cautions.allInnerTexts()).join(' ')).toMatch(/qualified mechanic/i);

    const spec = page.getByRole('table', { name: 'Corner parameters per axle' });
    const headers = (await spec.getByRole('columnheader').allInnerTexts()).map((h) => h.replace(/\s+/g, ' ').trim());
    expect(headers).toEqual(expect.arrayContaining(['Sprung mass (kg)', 'Spring rate (kN/m)', 'Damping (N·s/m)', 'Tyre rate (kN/m)', 'Rated life (km)']));

    const trips = page.getByRole('table', { name: 'Recent trips' });
    expect(await trips.locator('tbody tr').count()).toBeGreaterThan(0);
    await page.getByRole('table', { name: 'Inspections' }).waitFor();
    await page.getByRole('table', { name: 'Replaced dampers' }).waitFor();
    await screenshot(page, 'manager-desktop-vehicle', { fullPage: true });

    await page.getByRole('link', { name: 'Vehicles', exact: true }).first().click();
    await expectPath(page, '/vehicles');
    await context.close();
  });

  it('when a vehicle address does not exist, then the page says it could not be found, having asked the server once', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    const asked: string[] = [];
    page.on('request', (r) => {
      if (new URL(r.url()).pathname === '/api/vehicles/99999') asked.push(r.url());
    });
    await page.goto(`${server.url}/vehicles/99999`);
    await page.getByText('Could not find this vehicle').waitFor();
    await page.waitForLoadState('networkidle');
    expect(asked).toHaveLength(1);
    await context.close();
  });
});
