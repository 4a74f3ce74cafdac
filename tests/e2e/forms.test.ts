import { describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { screenshot } from '../support/browser';
import { DEMO, signedInPage, serverAndBrowserForFile } from './helpers';

const { server, browser } = serverAndBrowserForFile();

describe('forms that speak plainly', () => {
  it('when a mechanic enters impossible test-lane values, then each field says what is wrong in one sentence, is marked, focus goes to the first, and a good save says it saved', async () => {
    const sq = server.db.sequelize;
    // an open inspection at the mechanic's depot, with its FL damper past its life on the wear model
    const [insp] = await sq.query<{ id: number; vehicle_id: number }>(
      `SELECT i.id, i.vehicle_id FROM inspections i JOIN vehicles v ON v.id = i.vehicle_id JOIN users u ON u.depot_id = v.depot_id
       WHERE u.email = ? AND i.status IN ('scheduled', 'due', 'overdue') ORDER BY i.id LIMIT 1`,
      { replacements: [DEMO.mechanic], type: QueryTypes.SELECT },
    );
    expect(insp).toBeDefined();
    await sq.query(`UPDATE dampers SET life_used_fraction = 1.05, wear_updated_at = datetime('now') WHERE vehicle_id = ? AND position = 'FL' AND removed_at IS NULL`, { replacements: [insp.vehicle_id] });
    await sq.query(`UPDATE dampers SET life_used_fraction = 0.2, wear_updated_at = datetime('now') WHERE vehicle_id = ? AND position = 'FR' AND removed_at IS NULL`, { replacements: [insp.vehicle_id] });

    const { context, page } = await signedInPage(browser, server.url, DEMO.mechanic, 'tablet');
    await page.goto(`${server.url}/inspections/${insp.id}`);
    const form = page.getByRole('form', { name: 'Test-lane results' });
    await form.waitFor();

    // the corner the model flags has no verdict chosen; the one within its life keeps "Keep in service"
    expect(await page.getByLabel('Verdict FL').inputValue()).toBe('');
    expect(await page.getByLabel('Verdict FR').inputValue()).toBe('ok');
    await form.getByText('The wear model flags this corner: your verdict, no default.').waitFor();

    await page.getByLabel('Adhesion FL [%]').fill('150');
    await page.getByLabel('Adhesion FR [%]').fill('abc');
    await page.getByRole('button', { name: 'Save results' }).click();
    await form.getByText('Adhesion FL must be 0–100 %.').waitFor();
    await form.getByText('Adhesion FR must be a number, 0–100 %.').waitFor();
    await form.getByText(/^Choose a verdict for FL/).waitFor();
    expect(await page.getByLabel('Adhesion FL [%]').getAttribute('aria-invalid')).toBe('true');
    expect(await page.getByLabel('Adhesion RL [%]').getAttribute('aria-invalid')).toBeNull();
    expect(await page.evaluate(() => document.activeElement?.getAttribute('aria-label'))).toBe('Adhesion FL [%]');
    // the sentence is what a screen reader hears with the field
    const described = await page.getByLabel('Adhesion FL [%]').getAttribute('aria-describedby');
    expect(await page.locator(`[id="${described!.split(' ')[0]}"]`).innerText()).toBe('Adhesion FL must be 0–100 %.');
    expect(await form.innerText()).not.toMatch(/corners\.\d|adhesionPct|invalid_type|Too big/);
    await screenshot(page, 'mechanic-tablet-inspection-errors', { fullPage: true });

    // a value only the server can refuse comes back as a sentence on its own field
    await page.getByLabel('Adhesion FL [%]').fill('22');
    await page.getByLabel('Adhesion FR [%]').fill('44');
    await page.getByLabel('Verdict FL').selectOption('replace');
    await page.getByLabel('Odometer [km]').first().fill('6000000');
    await page.getByRole('button', { name: 'Save results' }).click();
    await form.getByText('Odometer must be at most 5 000 000 km.').waitFor();
    expect(await page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.name)).toBe('odometerKm');

    await page.getByLabel('Odometer [km]').first().fill('120000');
    await page.getByRole('button', { name: 'Save results' }).click();
    await form.getByRole('status').getByText(/^Results saved at \d\d:\d\d\.$/).waitFor();
    expect(await form.locator('[aria-invalid="true"]').count()).toBe(0);
    await context.close();
  });

  it('when a manager types a wrong or blank figure in the spec editor, then the field says so, the modes go blank, Save says why it is off; the list shows the same units and modes', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await page.goto(`${server.url}/specs`);
    const table = page.getByRole('table', { name: 'Courier van 2.8 t: corner parameters per axle' });
    await table.waitFor();
    const headers = (await table.locator('thead th').allInnerTexts()).map((h) => h.replace(/\s+/g, ' ').trim());
    expect(headers).toEqual(expect.arrayContaining(['Spring rate (kN/m)', 'Tyre rate (kN/m)', 'Body bounce (Hz)', 'Body damping ratio (%)']));
    const frontRow = (await table.locator('tbody tr').first().locator('th, td').allInnerTexts()).map((t) => t.trim());
    const col = (name: string) => frontRow[headers.indexOf(name)];

    await page.getByRole('link', { name: 'Edit Courier van 2.8 t' }).click();
    const modes = page.getByTestId('corner-modes').first();
    await modes.waitFor();
    // the same figures as the list, in the same units
    expect(await page.getByTestId('body-hz').first().innerText()).toBe(`${col('Body bounce (Hz)')} Hz`);
    expect(await page.getByTestId('body-zeta').first().innerText()).toBe(`${col('Body damping ratio (%)')} %`);
    const spring = page.getByLabel('Spring rate at the wheel [kN/m]').first();
    expect(Number(await spring.inputValue())).toBeCloseTo(Number(col('Spring rate (kN/m)').replace(/,/g, '')), 1);

    await spring.fill('abc');
    await page.getByText('Spring rate at the wheel must be a number.').first().waitFor();
    expect(await spring.getAttribute('aria-invalid')).toBe('true');
    await page.getByText('Fix the values marked in red to see this corner’s modes.').first().waitFor();
    // every axle's figures go blank rather than keep the old values
    expect(await page.getByTestId('body-hz').count()).toBe(0);
    const save = page.getByRole('button', { name: 'Save changes' });
    expect(await save.isDisabled()).toBe(true);
    await page.getByText(/^Save is off until every figure is a number: one field is marked in red\.$/).waitFor();

    await page.getByLabel('Tyre rate [kN/m]').first().fill('');
    await page.getByText('Tyre rate is required.').first().waitFor();
    await page.getByText(/2 fields are marked in red/).waitFor();
    await screenshot(page, 'manager-desktop-spec-editor-errors', { fullPage: true });

    await spring.fill(col('Spring rate (kN/m)').replace(/,/g, ''));
    await page.getByLabel('Tyre rate [kN/m]').first().fill(col('Tyre rate (kN/m)').replace(/,/g, ''));
    await page.getByTestId('body-hz').first().waitFor();
    expect(await save.isDisabled()).toBe(false);

    // the spec's own rules (the shared contract) are checked in the form: a SEAT value out of range is named on its field and nothing is sent
    const seat = page.getByLabel(/^Seat SEAT value/);
    await seat.fill('3');
    const sent: string[] = [];
    page.on('request', (r) => {
      if (r.method() === 'PUT') sent.push(r.url());
    });
    await save.click();
    await page.getByText('SEAT value must be 0.2–2 (SEAT value).').waitFor();
    expect(await seat.getAttribute('aria-invalid')).toBe('true');
    expect(await seat.evaluate((el) => el === document.activeElement)).toBe(true);
    expect(sent).toEqual([]);
    await context.close();
  });

  it('when a mechanic opens another depot’s inspection, then the page says the depot is the reason, not their role', async () => {
    const [insp] = await server.db.sequelize.query<{ id: number }>(
      `SELECT i.id FROM inspections i JOIN vehicles v ON v.id = i.vehicle_id JOIN users u ON u.depot_id = v.depot_id
       WHERE u.email = ? AND i.assignee_id IS NULL AND i.status IN ('scheduled', 'due', 'overdue') ORDER BY i.id LIMIT 1`,
      { replacements: [DEMO.mechanic], type: QueryTypes.SELECT },
    );
    expect(insp).toBeDefined();
    const { context, page } = await signedInPage(browser, server.url, 'mechanic.millbrook@reboundry.test', 'tablet');
    await page.goto(`${server.url}/inspections/${insp.id}`);
    await page.getByText('This inspection belongs to another depot.', { exact: false }).waitFor();
    expect(await page.getByText('Not available for your role').count()).toBe(0);
    await context.close();
  });

  it('when a driver sends a report without saying where and then taps the map, then the "say where it was" message goes away', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.driver, 'phone');
    await page.goto(`${server.url}/report`);
    const picker = page.getByTestId('place-picker');
    await picker.locator('canvas').first().waitFor();
    await page.getByRole('button', { name: 'Send report' }).click();
    const message = page.getByText('Say where it was: use your position or tap the road on the map.');
    await message.waitFor();
    await page.getByText('Choose how bad it was.').waitFor();
    await picker.click({ position: { x: 60, y: 60 } });
    await expect.poll(() => message.count()).toBe(0);
    // the severity message stays until a severity is chosen
    expect(await page.getByText('Choose how bad it was.').count()).toBe(1);
    await context.close();
  });
});

