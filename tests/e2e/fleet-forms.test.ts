import { describe, expect, it } from 'vitest';
import { screenshot } from '../support/browser';
import { DEMO, expectHeading, expectPath, signedInPage, openPage, openDialog, fillFields, serverAndBrowserForFile } from './helpers';

const { server, browser } = serverAndBrowserForFile();

describe('vehicle and depot forms', () => {
  it('when a manager adds a vehicle and then updates its odometer, then the reading moves forward only and retiring asks first', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await openPage(page, '/vehicles', 'Vehicles');

    const dialog = await openDialog(page, 'Add a vehicle');
    // Nothing filled in: the form says what is missing and sends nothing.
    await dialog.getByRole('button', { name: 'Add vehicle' }).click();
    await dialog.getByText('Fleet number is required.').waitFor();
    await dialog.getByText('Choose a suspension spec.').waitFor();

    await fillFields(dialog, { 'Fleet number': 'TST-901', Plate: 'BK26 TST', 'Odometer [km]': '1200' });
    await dialog.getByLabel('Suspension spec').selectOption({ index: 1 });
    await dialog.getByLabel('Depot').selectOption({ index: 1 });
    await screenshot(page, 'manager-desktop-vehicle-add');
    await dialog.getByRole('button', { name: 'Add vehicle' }).click();

    await expectHeading(page, 'TST-901');
    expect(new URL(page.url()).pathname).toMatch(/^\/vehicles\/\d+$/);
    await page.getByText('1,200 km').first().waitFor();

    // A lower reading is refused in the form, naming the recorded one.
    const edit = await openDialog(page, 'Edit vehicle', 'Edit TST-901');
    await edit.getByLabel('Odometer [km]').fill('900');
    await edit.getByRole('button', { name: 'Save changes' }).click();
    await edit.getByText(/cannot go backwards: the recorded reading is 1,200 km/).waitFor();
    await screenshot(page, 'manager-desktop-vehicle-odometer-error');

    await edit.getByLabel('Odometer [km]').fill('1850');
    await edit.getByRole('button', { name: 'Save changes' }).click();
    await edit.waitFor({ state: 'hidden' });
    await page.getByText('1,850 km').first().waitFor();

    // Retiring needs a second press.
    await openDialog(page, 'Edit vehicle', 'Edit TST-901');
    await edit.getByLabel('Status').selectOption('retired');
    await edit.getByRole('button', { name: 'Save changes' }).click();
    await edit.getByText('Retire TST-901?').waitFor();
    await screenshot(page, 'manager-desktop-vehicle-retire');
    await edit.getByRole('button', { name: 'Retire vehicle' }).click();
    await edit.waitFor({ state: 'hidden' });
    await page.getByRole('heading', { level: 1, name: 'TST-901' }).waitFor();
    await page.locator('header').getByText('Retired').first().waitFor();

    const api = await page.request.get(`${server.url}/api/vehicles?q=TST-901`);
    const body = (await api.json()) as { items: { odometerKm: number; status: string }[] };
    expect(body.items[0]).toMatchObject({ odometerKm: 1850, status: 'retired' });

    // The same form opens from the vehicles table's row.
    await page.goto(`${server.url}/vehicles?q=TST-901`);
    const fromTable = await openDialog(page, 'Edit TST-901');
    expect(await fromTable.getByLabel('Odometer [km]').inputValue()).toBe('1850');
    await fromTable.getByRole('button', { name: 'Cancel' }).click();
    await fromTable.waitFor({ state: 'hidden' });
    await context.close();
  });

  it('when a manager adds a depot by clicking the map, then the position is filled in and the depot is listed', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await openPage(page, '/fleet', 'Fleet');
    const dialog = await openDialog(page, 'Add a depot');
    await dialog.getByLabel('Name').fill('Testbridge yard');
    await dialog.getByLabel('Address').fill('1 Test Lane');
    // the server's own rules, checked in the form: a position that is not a number is named on its field
    await dialog.getByLabel('Latitude [°]').fill('abc');
    await dialog.getByRole('button', { name: 'Add depot' }).click();
    await dialog.getByText('Latitude must be a number in degrees.').waitFor();
    await dialog.getByText('Longitude must be a number in degrees.').waitFor();
    expect(await page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.value)).toBe('abc');
    await dialog.getByTestId('depot-map').click({ position: { x: 120, y: 90 } });
    await expect.poll(() => dialog.getByText('Latitude must be a number in degrees.').count()).toBe(0);
    const lat = Number(await dialog.getByLabel('Latitude [°]').inputValue());
    const lon = Number(await dialog.getByLabel('Longitude [°]').inputValue());
    expect(Math.abs(lat)).toBeGreaterThan(1);
    expect(Math.abs(lon)).toBeGreaterThan(0);
    await screenshot(page, 'manager-desktop-depot-add');
    await dialog.getByRole('button', { name: 'Add depot' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await page.getByRole('table', { name: 'Depots' }).getByText('Testbridge yard').waitFor();

    const edit = await openDialog(page, 'Edit Testbridge yard');
    await edit.getByLabel('Latitude [°]').fill('52.6');
    await edit.getByRole('button', { name: 'Save changes' }).click();
    await edit.waitFor({ state: 'hidden' });
    const depots = (await (await page.request.get(`${server.url}/api/depots`)).json()) as { items: { name: string; lat: number }[] };
    expect(depots.items.find((d) => d.name === 'Testbridge yard')?.lat).toBe(52.6);
    await expectPath(page, '/fleet');
    await context.close();
  });
});
