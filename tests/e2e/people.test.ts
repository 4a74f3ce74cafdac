import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot } from '../support/browser';
import { DEMO, choosePassword, expectHeading, expectPath, menuItems, signIn, goViaMenu, signedInPage, freshPage, submitSignIn, openDialog, fillFields, serverAndBrowserForFile } from './helpers';

const { server, browser } = serverAndBrowserForFile();

const row = (page: Page, name: string) => page.getByRole('table', { name: /^People/ }).getByRole('row').filter({ hasText: name });

describe('people (managers only)', () => {
  it('when a manager adds a person, changes their role and deactivates them, then the list shows each change and sign-in follows it', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await goViaMenu(page, 'People');
    await expectHeading(page, 'People');
    await page.getByText(/^1–\d+ of \d+ people$/).waitFor();

    // Filters: role
    await page.getByLabel('Role', { exact: true }).selectOption('mechanic');
    await page.waitForFunction(() => new URL(location.href).searchParams.get('role') === 'mechanic');
    // wait for the filtered rows themselves (the busy mark may not be up yet when first checked)
    const roleCells = page.getByRole('table', { name: /^People/ }).locator('tbody tr td:nth-child(3)');
    await expect.poll(async () => [...new Set(await roleCells.allInnerTexts())], { timeout: 15_000 }).toEqual(['Mechanic']);
    await page.getByRole('button', { name: 'Clear filters' }).click();

    // Add a person: a short password is refused with a field message, then a good one works.
    const dialog = await openDialog(page, 'Add a person');
    await fillFields(dialog, { Name: 'Rosa Quintero', 'E-mail': 'rosa.quintero@reboundry.test', 'First password': 'short' });
    await dialog.getByLabel('Role').selectOption('driver');
    await dialog.getByRole('button', { name: 'Add person' }).click();
    await dialog.getByText('First password must be at least 10 characters.').waitFor();
    expect(await dialog.getByLabel('First password').evaluate((el) => el === document.activeElement)).toBe(true);
    await screenshot(page, 'manager-desktop-people-add');
    await dialog.getByLabel('First password').fill('quarry-lane-42');
    await dialog.getByRole('button', { name: 'Add person' }).click();
    await page.getByText('Rosa Quintero is added as a driver').waitFor();

    // Find them, make them a mechanic.
    await page.getByLabel('Name or e-mail').fill('Quintero');
    await page.waitForFunction(() => new URL(location.href).searchParams.get('q') === 'Quintero');
    await row(page, 'Rosa Quintero').getByRole('cell', { name: 'Driver' }).waitFor();
    const roleDialog = await openDialog(page, 'Change role for Rosa Quintero');
    await roleDialog.getByLabel('Role').selectOption('mechanic');
    await roleDialog.getByRole('button', { name: 'Save role' }).click();
    await page.getByText('Rosa Quintero is now a mechanic.').waitFor();
    await row(page, 'Rosa Quintero').getByRole('cell', { name: 'Mechanic' }).waitFor();

    // The new person can sign in, chooses their own password (the manager's first one is
    // temporary) and lands where a mechanic does.
    const { context: theirs, page: theirPage } = await signedInPage(browser, server.url, 'rosa.quintero@reboundry.test', 'tablet', 'quarry-lane-42');
    await expectPath(theirPage, '/choose-password');
    await choosePassword(theirPage, 'quarry-lane-42', 'rosa-own-password');
    await expectPath(theirPage, '/workshop');
    expect(await menuItems(theirPage)).toEqual(['Workshop', 'Roads', 'Vehicles', 'Damper life', 'Account']);
    await theirs.close();

    // Deactivate: confirm first; then the badge says so and sign-in is refused.
    const confirm = await openDialog(page, 'Deactivate Rosa Quintero', 'Deactivate Rosa Quintero?');
    await screenshot(page, 'manager-desktop-people-deactivate');
    await confirm.getByRole('button', { name: 'Deactivate' }).click();
    await page.getByText('Rosa Quintero can no longer sign in.').waitFor();
    await row(page, 'Rosa Quintero').getByText('Deactivated').waitFor();

    const { context: again, page: againPage } = await freshPage(browser, server.url, 'tablet');
    await againPage.goto('/sign-in');
    await submitSignIn(againPage, 'rosa.quintero@reboundry.test', 'rosa-own-password');
    await againPage.getByRole('alert').getByText(/do not match an active account/).waitFor();
    await again.close();

    // Reactivate
    await page.getByRole('button', { name: 'Reactivate Rosa Quintero' }).click();
    await page.getByRole('dialog', { name: 'Reactivate Rosa Quintero?' }).getByRole('button', { name: 'Reactivate' }).click();
    await row(page, 'Rosa Quintero').getByText('Active', { exact: true }).waitFor();
    await context.close();
  });

  it('when a manager sets a temporary password, then the person is signed out, signs in with it, must choose their own and then lands in the app', async () => {
    // The driver is signed in on their phone.
    const { context: phone, page: phonePage } = await signedInPage(browser, server.url, DEMO.driver, 'phone');
    await expectPath(phonePage, '/my-vehicle');

    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await page.goto(`${server.url}/people?q=${encodeURIComponent(DEMO.driver)}`);
    const action = page.getByRole('button', { name: /^Set temporary password for / });
    await action.click();
    const name = ((await action.getAttribute('aria-label')) ?? '').replace('Set temporary password for ', '');
    const dialog = page.getByRole('dialog', { name: `Set temporary password for ${name}` });
    await dialog.getByText('must then choose a password of their own').waitFor();
    await dialog.getByText('Any sessions they have open now end.').waitFor();
    await dialog.getByLabel('Temporary password').fill('short');
    await dialog.getByRole('button', { name: 'Set password' }).click();
    await dialog.getByText('Temporary password must be at least 10 characters.').waitFor();
    expect(await dialog.getByLabel('Temporary password').evaluate((el) => el === document.activeElement)).toBe(true);
    await dialog.getByLabel('Temporary password').fill('harbour-road-93');
    await screenshot(page, 'manager-desktop-people-temporary-password');
    await dialog.getByRole('button', { name: 'Set password' }).click();
    await page.getByText(`${name} has a temporary password and is signed out everywhere.`).waitFor();
    await row(page, name).getByText('Temporary password', { exact: true }).waitFor();

    // The manager signs out; the driver's phone session has ended.
    await page.getByRole('button', { name: 'Sign out' }).click();
    await expectPath(page, '/sign-in');
    await phonePage.reload();
    await expectPath(phonePage, '/sign-in');
    await phone.close();

    // The driver signs in with the temporary password and sees only the page to choose their own.
    await signIn(page, server.url, DEMO.driver, 'harbour-road-93');
    await expectPath(page, '/choose-password');
    await expectHeading(page, 'Choose a new password');
    expect(await page.evaluate(() => document.activeElement?.textContent)).toBe('Choose a new password');
    expect(await page.getByRole('navigation', { name: 'Main' }).count()).toBe(0);
    // the app's own pages lead back here until the password is chosen
    await page.goto(`${server.url}/vehicles`);
    await expectPath(page, '/choose-password');
    // keeping the temporary password is refused
    await choosePassword(page, 'harbour-road-93', 'harbour-road-93');
    await page.getByText('New password must differ from the current password.').waitFor();
    await screenshot(page, 'driver-desktop-choose-password');
    await choosePassword(page, 'harbour-road-93', 'quay-side-rebound');
    await expectPath(page, '/my-vehicle');
    expect(await menuItems(page)).toContain('My vehicle');

    // The chosen password is the one that works from now on.
    await page.getByRole('button', { name: 'Sign out' }).click();
    await expectPath(page, '/sign-in');
    await signIn(page, server.url, DEMO.driver, 'quay-side-rebound');
    await expectPath(page, '/my-vehicle');
    await context.close();
  });

  it('when a manager looks at their own row, then they cannot deactivate themselves or change their own role', async () => {
    const { context, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await page.goto(`${server.url}/people?q=manager%40reboundry.test`);
    await page.getByText('(you)').waitFor();
    expect(await page.getByRole('button', { name: /^Deactivate / }).isDisabled()).toBe(true);
    expect(await page.getByRole('button', { name: /^Change role for / }).isDisabled()).toBe(true);
    expect(await page.getByRole('button', { name: /^Set temporary password for / }).isDisabled()).toBe(true);
    await context.close();
  });
});
