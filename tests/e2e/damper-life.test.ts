import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { QueryTypes } from 'sequelize';
import { launchBrowser, screenshot, type ViewportName } from '../support/browser';
import { axeViolations } from '../support/axe';
import { startTestServer, type TestServer } from '../support/server';
import { DEMO, expectHeading, expectPath, signedInPage, openPage } from './helpers';

let server: TestServer;
let browser: Browser;

beforeAll(async () => {
  // the demo fleet after one nightly run, which fitted each spec's life model and predicted every damper's wear
  [server, browser] = await Promise.all([startTestServer({ afterNightly: true }), launchBrowser()]);
}, 240_000);
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

/** The page's figures as the app formats them (en-GB, no decimals). */
const km = (x: number) => Math.round(x).toLocaleString('en-GB');

interface LifeTableRow {
  cls: string;
  medianKm: number;
  p10Km: number;
  p90Km: number;
  priorMedianKm: number;
}

async function apiJson<T>(page: Page, path: string): Promise<T> {
  const res = await page.request.get(`${server.url}${path}`);
  expect(res.status(), path).toBe(200);
  return (await res.json()) as T;
}

/**
 * Where a chart's axis title (or a reference line's label — recharts draws both as
 * `.recharts-label`, in layers apart from the axes) runs into a tick label or out of the chart.
 */
async function axisTitleClashes(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const out: string[] = [];
    const overlap = (a: DOMRect, b: DOMRect) => a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom;
    for (const svg of document.querySelectorAll('svg.recharts-surface')) {
      const chart = svg.getBoundingClientRect();
      const ticks = [...svg.querySelectorAll('.recharts-cartesian-axis-tick-value')];
      for (const title of svg.querySelectorAll('.recharts-label')) {
        const t = title.getBoundingClientRect();
        const name = title.textContent ?? '';
        for (const tick of ticks) if (overlap(t, tick.getBoundingClientRect())) out.push(`"${name}" overlaps the tick "${tick.textContent}"`);
        if (t.left < chart.left - 0.5 || t.right > chart.right + 0.5 || t.top < chart.top - 0.5 || t.bottom > chart.bottom + 0.5) out.push(`"${name}" runs out of its chart`);
      }
    }
    return out;
  });
}

describe('damper life in the browser', () => {
  for (const size of ['phone', 'tablet', 'desktop'] as ViewportName[]) {
    it(`when the wear, life and speed charts are drawn on a ${size}, then no axis title overlaps its tick labels or runs out of its chart`, async () => {
      const { context, page } = await signedInPage(browser, server.url, DEMO.manager, size);
      const list = await apiJson<{ items: { id: number }[] }>(page, '/api/vehicles?q=CV-106&page=1&pageSize=5');
      const [seg] = await server.db.sequelize.query<{ route_id: number }>(`SELECT route_id FROM route_segments WHERE iso_class IN ('D', 'E') ORDER BY id LIMIT 1`, { type: QueryTypes.SELECT });
      const pages: [string, RegExp][] = [
        [`/vehicles/${list.items[0]!.id}`, /Consumed life of the FL damper/],
        ['/damper-life', /Weibull probability plot/],
        ['/damper-life/back-test', /Predicted against actual life of each removal/],
        [`/routes/${seg!.route_id}`, /Duty against speed/],
      ];
      for (const [path, figure] of pages) {
        await page.goto(`${server.url}${path}`);
        await page.getByRole('figure', { name: figure }).first().locator('svg.recharts-surface').first().waitFor();
        expect(await page.locator('.recharts-label').count(), `${path}: axis titles drawn`).toBeGreaterThan(0);
        // charts first draw in a fallback font and at a provisional size; what counts is the
        // drawing they settle on once the font has loaded (a clash that stays fails)
        await page.evaluate(() => document.fonts.ready.then(() => undefined));
        await expect.poll(() => axisTitleClashes(page), { message: path, timeout: 5000 }).toEqual([]);
      }
      await context.close();
    }, 120_000);
  }

  it('when a manager opens a vehicle, then each damper shows one life figure with its basis, and each section its own caution, with no figure said to be "from memory"', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    const list = await apiJson<{ items: { id: number }[] }>(page, '/api/vehicles?q=CV-106&page=1&pageSize=5');
    await openPage(page, `/vehicles/${list.items[0]!.id}`, 'CV-106');
    await page.getByRole('region', { name: 'Damper wear', exact: true }).getByRole('figure').first().waitFor();
    for (const corner of ['Front left', 'Front right', 'Rear left', 'Rear right']) {
      const card = page.getByRole('article', { name: `${corner} damper` });
      const text = await card.innerText();
      // one share of life, not a second one "of rated km" beside it
      expect(text.match(/\d+\s%/g), `${corner}: ${text}`).toHaveLength(1);
      expect(text).not.toMatch(/of rated km/i);
      expect(await card.getByTestId('life-basis').innerText()).toMatch(/^Basis: wear model, from its roads, speeds and loads, estimated \d{1,2} \w{3} \d{4}\.$/);
    }
    // the same safety words once on the page; the other cautions say what is particular to their section
    const cautions = (await page.getByRole('note', { name: 'Caution' }).allInnerTexts()).map((t) => t.replace(/^Caution\.?\s*/, '').trim());
    expect(cautions.length).toBeGreaterThanOrEqual(3);
    expect(cautions.filter((t) => /qualified mechanic/i.test(t))).toHaveLength(1);
    expect(new Set(cautions).size).toBe(cautions.length);
    for (const name of ['Dampers by corner', 'Damper state and the life it rests on', 'Damper wear']) {
      expect(await page.getByRole('region', { name, exact: true }).getByRole('note', { name: 'Caution' }).count(), name).toBe(1);
    }
    expect(await page.getByRole('main').innerText()).not.toMatch(/from memory/i);
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, 'manager-desktop-vehicle-page', { fullPage: true });
    await context.close();
  }, 120_000);

  it('when a manager opens the damper-life page, then it shows the life per ISO class of the fitted model against the prior, and links to the back-test of the same spec', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    const specs = await apiJson<{ items: { id: number; name: string }[] }>(page, '/api/specs?pageSize=200');
    const truck = specs.items.find((s) => /truck/i.test(s.name));
    expect(truck, specs.items.map((s) => s.name).join(', ')).toBeDefined();
    if (!truck) return;

    await openPage(page, '/damper-life', 'Damper life from the fleet');
    await page.getByLabel('Spec').selectOption({ label: truck.name });
    await page.waitForURL((u) => u.searchParams.get('specId') === String(truck.id));
    const life = await apiJson<{ lifeTable: LifeTableRow[]; comparison: { disagrees: boolean; ratio: number | null } }>(page, `/api/fleet-life?specId=${truck.id}`);

    const table = page.getByRole('table', { name: 'Damper life per ISO 8608 road class at 80 km/h' });
    await table.waitFor();
    // the truck's rows, not the first spec's, once the picked spec has loaded
    await table.getByRole('row', { name: /class B/ }).getByText(km(life.lifeTable[1].medianKm), { exact: true }).waitFor();
    const rows = await table.locator('tbody tr').allInnerTexts();
    expect(rows).toHaveLength(4);
    life.lifeTable.forEach((r, i) => {
      expect(rows[i]).toContain(`ISO 8608 class ${r.cls}`);
      expect(rows[i]).toContain(km(r.medianKm));
      expect(rows[i]).toContain(`${km(r.p10Km)}–${km(r.p90Km)}`);
      expect(rows[i]).toContain(km(r.priorMedianKm));
    });
    // rougher roads, shorter life
    const medians = life.lifeTable.map((r) => r.medianKm);
    expect(medians.slice(1).every((m, i) => m < medians[i])).toBe(true);

    // the model against the fleet's history, in plain words either way
    await page.getByRole('heading', { name: "The model against the fleet's history" }).waitFor();
    await page.getByText(life.comparison.disagrees ? /differ by more than 1\.5×/ : /agree within a factor 1\.5/).first().waitFor();
    await page.getByRole('heading', { name: 'Assumptions' }).waitFor();
    await page.getByRole('figure', { name: 'Weibull probability plot of the removals in km' }).waitFor();
    expect(await page.getByRole('main').innerText()).not.toMatch(/\bMJ\b|\benergy\b|blend/i);
    await screenshot(page, 'manager-desktop-damper-life-truck', { fullPage: true });

    await page.getByRole('link', { name: 'How good are these predictions? → back-test' }).click();
    await expectPath(page, '/damper-life/back-test');
    await expectHeading(page, 'How good are the life predictions?');
    expect(new URL(page.url()).searchParams.get('specId')).toBe(String(truck.id));
    expect(await page.getByLabel('Spec').inputValue()).toBe(String(truck.id));
    await context.close();
  }, 120_000);

  it('when a mechanic opens the back-test, then it shows the median error and the share inside P10–P90 against the prior, one table row per removal, and the method', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.mechanic, 'tablet');
    await openPage(page, '/damper-life/back-test', 'How good are the life predictions?');
    await page.getByText('Median error of the predicted life', { exact: true }).waitFor();
    const specId = Number(await page.getByLabel('Spec').inputValue());
    expect(specId).toBeGreaterThan(0);
    const bt = await apiJson<{ points: unknown[]; mdape: number | null; insideShare: number | null; prior: { mdape: number | null; insideShare: number | null }; method: string }>(
      page,
      `/api/life-backtest?specId=${specId}`,
    );
    // the demo fleet has removals for wear on every spec
    expect(bt.points.length).toBeGreaterThan(0);
    expect(bt.mdape).not.toBeNull();

    // each figure card: its label, then its value and the prior's beside it
    const error = page.getByText('Median error of the predicted life', { exact: true }).locator('xpath=..');
    await expect(error.innerText()).resolves.toMatch(new RegExp(`^Median error of the predicted life\\s+${Math.round(bt.mdape!)}\\s*%`));
    await expect(error.innerText()).resolves.toContain(`The prior alone: ${Math.round(bt.prior.mdape!)} %`);
    const inside = page.getByText('Removals inside the predicted P10–P90', { exact: true }).locator('xpath=..');
    await expect(inside.innerText()).resolves.toMatch(new RegExp(`^Removals inside the predicted P10–P90\\s+${Math.round(bt.insideShare! * 100)}\\s*%`));
    await expect(inside.innerText()).resolves.toContain(`The prior alone: ${Math.round(bt.prior.insideShare! * 100)} %`);

    await page.getByRole('figure', { name: /Predicted against actual life of each removal/ }).waitFor();
    const table = page.getByRole('table', { name: /Back-test: predicted and actual life/ });
    await expect(table.locator('tbody tr').count()).resolves.toBe(bt.points.length);
    await page.getByText(bt.method).waitFor();
    await screenshot(page, 'mechanic-tablet-life-backtest', { fullPage: true });

    // back to the damper-life page on the same spec
    await page.getByRole('main').getByRole('link', { name: 'Damper life' }).click();
    await expectHeading(page, 'Damper life from the fleet');
    expect(new URL(page.url()).searchParams.get('specId')).toBe(String(specId));
    await context.close();
  }, 120_000);

  it('when a driver opens the back-test by its address, then it is not available to them', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.driver, 'phone');
    await openPage(page, '/damper-life/back-test', 'Not available for your role');
    await context.close();
  }, 60_000);

  it("when a manager opens a vehicle's wear, then each damper reads in km, km/day, road severity and dates with a P10–P90 range, and nothing in energy", async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    const list = await apiJson<{ items: { id: number; fleetNumber: string }[] }>(page, '/api/vehicles?q=CV-106&page=1&pageSize=5');
    const v = list.items.find((x) => x.fleetNumber === 'CV-106');
    expect(v).toBeDefined();
    if (!v) return;
    const wear = await apiJson<{
      dampers: { position: string; prediction: { lifeKm: number | null; distanceLifeUsed: number; kmPerDay: number; severity: number | null; endOfLifeDate: string | null; endOfLifeP10Date: string | null; endOfLifeP90Date: string | null; governedBy: string } | null }[];
    }>(page, `/api/vehicles/${v.id}/wear`);
    const rl = wear.dampers.find((d) => d.position === 'RL');
    expect(rl?.prediction?.lifeKm).toBeGreaterThan(0);

    await openPage(page, `/vehicles/${v.id}`, 'CV-106');
    const region = page.getByRole('region', { name: 'Damper wear', exact: true });
    await region.getByRole('figure', { name: /Consumed life of the RL damper/ }).waitFor();
    const card = region.locator('div.rounded-md', { has: page.getByRole('heading', { name: 'RL damper' }) });
    const text = await card.innerText();
    const p = rl!.prediction!;
    expect(text).toMatch(/of its expected life/);
    expect(text).toContain('A new damper’s life on these roads');
    // what is left is the unused share of that life, so life used and distance agree
    expect(text).toMatch(new RegExp(`Still to go on its recent roads\\s+about ${km(Math.max(0, 1 - p.distanceLifeUsed) * p.lifeKm!)}\\s+km`));
    // a number and its unit may be kept together by a no-break space
    expect(text).toMatch(new RegExp(`${km(p.lifeKm!)}\\s+km`));
    expect(text).toMatch(new RegExp(`${km(p.kmPerDay)}\\s+km/day`));
    expect(text).toMatch(/Road severity \(last \d+ days\)/);
    expect(text).toContain(`${p.severity!.toFixed(2)}×`);
    expect(text).toMatch(/P10–P90: \d{1,2} \w{3} \d{4} – \d{1,2} \w{3} \d{4}/);
    if (p.governedBy === 'calendar') expect(text).toContain('(calendar limit)');
    expect(text).toMatch(/Worn before the records\s+\d+\s%\sof its life/);
    // the wear chart marks the end-of-life range
    const caption = await region.getByRole('figure', { name: /Consumed life of the RL damper/ }).locator('figcaption').innerText();
    expect(caption).toMatch(/Shaded: end of life between/);

    const all = await region.innerText();
    expect(all).not.toMatch(/kJ|\bMJ\b|J\/km|energy/i);
    const routes = await page.getByRole('table', { name: 'Damper duty by route' }).innerText();
    expect(routes).toContain('Road severity');
    expect(routes).not.toMatch(/J\/km|energy/i);
    await screenshot(page, 'manager-desktop-vehicle-wear-km', { fullPage: true });
    await context.close();
  }, 120_000);
});
