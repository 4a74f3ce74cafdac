import { describe, expect, it } from 'vitest';
import { screenshot } from '../support/browser';
import { DEMO, expectHeading, expectPath, settled, signIn, freshPage, serverAndBrowserForFile } from './helpers';

const { server, browser } = serverAndBrowserForFile({ fleet: 'small' });

describe('nightly damper-duty run in the browser', () => {
  it('when a manager runs the job, then new due inspections, the vehicle wear and the outbox show its results', async () => {
    const { context, page } = await freshPage(browser, server.url, 'desktop');
    const renderErrors: string[] = [];
    page.on('console', (m) => {
      if (m.type() === 'error' && /TypeError|ReferenceError|caught the following error/.test(m.text())) renderErrors.push(m.text().slice(0, 300));
    });
    await signIn(page, server.url, DEMO.manager);

    // the manager's home is the due list
    await expectPath(page, '/due');
    await expectHeading(page, 'Due inspections');
    const before = await page.locator('tbody tr').count();

    // run the job from the Job runs page and watch it finish
    await page.getByRole('main').getByRole('link', { name: 'Job runs' }).click();
    await expectHeading(page, 'Job runs');
    await page.getByText('No runs yet').waitFor();
    await page.getByRole('button', { name: 'Run now' }).click();
    await page.getByText(/^Run #1$/).waitFor();
    await page.getByRole('progressbar', { name: 'Progress of the run' }).waitFor({ timeout: 30_000 }).catch(() => undefined);
    await page.getByText(/trips, .* duty records, .* inspections created, .* e-mails sent/).waitFor({ timeout: 240_000 });
    await page.getByRole('table', { name: 'Job runs' }).getByText('Succeeded').waitFor();
    await screenshot(page, 'manager-desktop-job-runs', { fullPage: true });

    // the due list now holds the night's inspections, with their reasons
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Due' }).click();
    await expectHeading(page, 'Due inspections');
    await page.getByRole('heading', { name: /^Due now \(\d+\)$/ }).waitFor();
    const after = await page.locator('tbody tr').count();
    expect(after).toBeGreaterThan(before);
    await page.getByText(/Interval rule|predicted to reach/).first().waitFor();
    await page.getByText(/never replace, inspection by a/).first().waitFor();
    await screenshot(page, 'manager-desktop-due', { fullPage: true });

    // map mode: where the vehicles due are based
    await page.getByRole('button', { name: 'Map' }).click();
    await page.getByRole('region', { name: /Map of depots/ }).waitFor();
    await page.getByText(/Brackenford North Yard: \d+ vehicles? \(/).waitFor();
    await page.waitForLoadState('networkidle');
    await settled(page);
    await screenshot(page, 'manager-desktop-due-map', { fullPage: true });
    await page.getByRole('button', { name: 'List' }).click();

    // ordered by life used: one table, in the server's order (most-worn damper first)
    await page.getByLabel('Order by').selectOption('lifeUsed');
    const byLife = page.getByRole('table', { name: 'Open inspections by life used' });
    await byLife.waitFor();
    const api = (await (await page.request.get(`${server.url}/api/inspections/due?sort=lifeUsed`)).json()) as { items: { fleetNumber: string; maxLifeUsed: number | null }[] };
    const shown = (await byLife.locator('tbody tr').getByRole('link').allInnerTexts()).map((t) => t.split('\n')[0].trim());
    expect(shown).toEqual(api.items.map((i) => i.fleetNumber));
    expect(api.items[0].maxLifeUsed).toBeGreaterThanOrEqual(api.items[api.items.length - 1].maxLifeUsed ?? 0);
    await screenshot(page, 'manager-desktop-due-by-life', { fullPage: true });
    await page.getByLabel('Order by').selectOption('due');
    await page.getByRole('heading', { name: /^Due now \(\d+\)$/ }).waitFor();

    // a vehicle's wear: charts with the predicted path, duty per route, next inspection and why
    const firstDue = page.getByRole('table', { name: 'Due now inspections' }).getByRole('link').first();
    const fleetNumber = (await firstDue.innerText()).split('\n')[0].trim();
    await firstDue.click();
    await expectHeading(page, fleetNumber);
    await page.getByRole('heading', { name: 'Damper wear' }).waitFor();
    await page.getByRole('figure', { name: /Consumed life of the FL damper/ }).waitFor();
    await page.getByRole('heading', { name: 'Duty by route' }).waitFor();
    await page.getByText(/^Why: /).waitFor();
    await screenshot(page, 'manager-desktop-vehicle-wear', { fullPage: true });

    // the outbox shows the digest sent to the manager
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Due' }).click();
    await page.getByRole('main').getByRole('link', { name: 'Outbox' }).click();
    await expectHeading(page, 'Outbox');
    const digest = page.getByRole('button', { name: /Reboundry digest for 30 Nov 2026/ });
    await digest.click();
    await page.getByRole('article', { name: 'Message' }).getByText(/To manager@reboundry\.test|to manager@reboundry\.test/).waitFor();
    const body = page.frameLocator('iframe[title="HTML body"]');
    await body.getByText('Inspections now due or overdue').waitFor();
    await screenshot(page, 'manager-desktop-outbox', { fullPage: true });
    await screenshot(page.getByRole('article', { name: 'Message' }), 'manager-desktop-outbox-message');
    await page.getByRole('button', { name: 'Plain text' }).click();
    await page.getByText('Inspections now due or overdue').waitFor();

    // e-mail settings on the account page
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Account' }).click();
    const digestBox = page.getByRole('checkbox', { name: /Digest of inspections/ });
    await digestBox.waitFor();
    expect(await digestBox.isChecked()).toBe(true);
    await digestBox.click();
    await expect.poll(() => digestBox.isChecked()).toBe(false);
    await screenshot(page, 'manager-desktop-account-email', { fullPage: true });
    expect(renderErrors).toEqual([]);
    await context.close();
  }, 300_000);
});
