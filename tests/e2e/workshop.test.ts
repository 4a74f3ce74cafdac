import { beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { screenshot } from '../support/browser';
import { TEST_NOW } from '../support/server';
import { run as runNightly } from '../../jobs/nightly';
import { axeViolations } from '../support/axe';
import { DEMO, expectHeading, signedInPage, openPage, serverAndBrowserForFile } from './helpers';

const { server, browser } = serverAndBrowserForFile();

/** A 1×1 PNG (the smallest valid image; the server refuses an image cut off before its end). */
const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8cfc0f01f0005000201a0e7d6a90000000049454e44ae426082', 'hex');

beforeAll(async () => {
  // Arrange a front pair near the end of its life whatever the demo roads: the busiest courier van
  // has 88 000 km on the odometer since its front dampers were fitted (of a life near 90 000 km),
  // most of it before the trips on record, which the nightly run charges as the dampers' opening wear.
  const [van] = await server.db.sequelize.query<{ vehicle_id: number; installed_odometer_km: number }>(
    `SELECT d.vehicle_id, MAX(d.installed_odometer_km) AS installed_odometer_km FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id JOIN suspension_specs s ON s.id = v.spec_id
     WHERE d.removed_at IS NULL AND d.position IN ('FL', 'FR') AND s.name LIKE 'Courier van%' AND v.status != 'retired'
     GROUP BY d.vehicle_id ORDER BY (SELECT SUM(t.distance_km) FROM trips t WHERE t.vehicle_id = d.vehicle_id) DESC LIMIT 1`,
    { type: QueryTypes.SELECT },
  );
  await server.db.sequelize.query('UPDATE vehicles SET odometer_km = MAX(odometer_km, ?) WHERE id = ?', { replacements: [van.installed_odometer_km + 88_000, van.vehicle_id] });
  // the wear model's end-of-life dates feed the replacement forecast
  const r = await runNightly({ db: server.db, config: server.config, log: server.log, mailer: server.mailer, now: TEST_NOW, trigger: 'test' });
  expect(r.status).toBe('succeeded');
}, 120_000);
describe('workshop', () => {
  it('when a mechanic records an inspection with a photo and a replacement, then the manager sees the vehicle state and the forecast change', async () => {
    // Arrange: a vehicle whose dampers are in the 90-day forecast gets an open inspection (demo data has none for it).
    const sq = server.db.sequelize;
    const { context: mgrCtx, page: mgr } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    const before = (await (await mgr.request.get(`${server.url}/api/forecast`)).json()) as { totals: { replacements: number }; items: { vehicleId: number; damperId: number; fleetNumber: string; position: string; chance: number }[] };
    // a vehicle whose front dampers are due for replacement (the work below replaces the front pair)
    const target = before.items.find((i) => i.position === 'FL' || i.position === 'FR');
    expect(target, JSON.stringify(before.items.slice(0, 5))).toBeDefined();
    if (!target) return;
    const open = await sq.query<{ n: number }>(`SELECT COUNT(*) AS n FROM inspections WHERE vehicle_id = ? AND status IN ('scheduled','due','overdue')`, { replacements: [target.vehicleId], type: QueryTypes.SELECT });
    if (Number(open[0].n) === 0) {
      await sq.query(
        `INSERT INTO inspections (vehicle_id, due_date, status, reason, assignee_id, completed_at, odometer_km, notes, created_at, updated_at) VALUES (?, '2026-12-03', 'due', 'Front dampers near the end of their life (wear model).', NULL, NULL, NULL, NULL, datetime('now'), datetime('now'))`,
        { replacements: [target.vehicleId] },
      );
    }

    // The manager assigns it to the mechanic on the planning page.
    await openPage(mgr, '/planning', 'Workshop planning');
    const picker = mgr.getByLabel(`Mechanic for ${target.fleetNumber}`);
    await picker.waitFor();
    await picker.selectOption({ label: 'Tomasz Reyes' });
    await mgr.waitForResponse((r) => r.url().includes('/api/inspections') && r.request().method() === 'GET');
    await mgr.getByText(/damper replacements expected/).waitFor();
    await screenshot(mgr, 'manager-desktop-planning', { fullPage: true });

    // The mechanic, on a tablet, opens it from "My inspections".
    const { context: mecCtx, page: mec } = await signedInPage(browser, server.url, DEMO.mechanic, 'tablet');
    await expectHeading(mec, 'Workshop');
    const card = mec.getByRole('list', { name: 'My inspections' }).getByRole('link', { name: new RegExp(target.fleetNumber) });
    await card.waitFor();
    await screenshot(mec, 'mechanic-tablet-my-inspections', { fullPage: true });
    await card.click();
    await mec.getByRole('form', { name: 'Test-lane results' }).waitFor();

    // A half-filled form survives a reload.
    await mec.getByLabel('Adhesion FL [%]').fill('18');
    // the draft is kept in the browser's storage a moment after typing
    await expect.poll(() => mec.evaluate(() => Object.keys(localStorage).some((k) => k.endsWith(':results') && (localStorage.getItem(k) ?? '').includes('"18"')))).toBe(true);
    await mec.reload();
    await mec.getByText('Draft restored').first().waitFor();
    expect(await mec.getByLabel('Adhesion FL [%]').inputValue()).toBe('18');

    await mec.getByLabel('Adhesion FR [%]').fill('41');
    await mec.getByLabel('Adhesion RL [%]').fill('30');
    await mec.getByLabel('Adhesion RR [%]').fill('32');
    // corners the wear model flags have no verdict until the mechanic chooses one
    for (const pos of ['FR', 'RL', 'RR']) {
      if ((await mec.getByLabel(`Verdict ${pos}`).inputValue()) === '') await mec.getByLabel(`Verdict ${pos}`).selectOption('monitor');
    }
    await mec.getByLabel('Verdict FL').selectOption('replace');
    await mec.getByRole('group', { name: 'Corner FL' }).first().getByLabel(/Oil on the damper body/).check();
    await expect(mec.getByText(/large: over 15 points/).count()).resolves.toBeGreaterThan(0);
    // "check again soon" asks for a follow-up day: the form refuses one not after today (the server too: API tests)
    await mec.getByLabel('Verdict RR').selectOption('monitor');
    const followUp = mec.getByLabel('Check again by');
    await followUp.fill('2026-11-30');
    await expect(followUp.evaluate((el) => (el as HTMLInputElement).validity.rangeUnderflow)).resolves.toBe(true);
    await followUp.fill('2027-01-20');
    await expect(followUp.evaluate((el) => (el as HTMLInputElement).checkValidity())).resolves.toBe(true);
    // the lane's plate amplitude is a setting, shown and sent with the results
    expect(await mec.getByLabel('Plate amplitude [mm]').inputValue()).toBe('3');
    // a phase-shift reading beside adhesion on one corner
    await mec.getByLabel('Minimum phase FL [°]').fill('30');
    await mec.getByRole('button', { name: 'Save results' }).click();
    await mec.getByRole('table', { name: 'Predicted and measured damping' }).waitFor();
    await mec.getByText('Follow-up set for 20 Jan 2027.').waitFor();
    await mec.getByText(/plate amplitude of 3 mm zero-to-peak \(6 mm stroke\)/).first().waitFor();
    await mec.getByRole('cell', { name: '30.0 (fail)' }).waitFor();

    // A photo, checked by content on the server.
    await mec.getByLabel('Attach a file').setInputFiles({ name: 'front-left-leak.png', mimeType: 'image/png', buffer: PNG });
    await mec.getByRole('link', { name: /Photo: front-left-leak.png/ }).waitFor();
    await screenshot(mec, 'mechanic-tablet-inspection', { fullPage: true });

    // The replacement: both front dampers; closes the inspection.
    for (const pos of ['FL', 'FR']) {
      await mec.getByLabel(`Replace damper ${pos}`).check();
      await mec.getByLabel(`Part description ${pos}`).fill('Twin-tube damper, front');
      await mec.getByLabel(`Part number ${pos}`).fill('BX-2201');
      await mec.getByLabel(`Cost ${pos}`).fill('96');
    }
    await mec.getByLabel('Work summary').fill('Front dampers replaced as a pair');
    await mec.getByLabel('Labour [h]').fill('1.5');
    // the test server's clock is fixed at TEST_NOW while the browser's is not; work dated after the server's day is refused
    await mec.getByLabel('Date', { exact: true }).fill(TEST_NOW.toISOString().slice(0, 10));
    await mec.getByRole('button', { name: 'Save work record and close inspection' }).click();
    await mec.getByRole('heading', { level: 1, name: /Work record \d+/ }).waitFor();
    await mec.getByText('The work record is saved').waitFor();
    // the print view carries the evidence: the lane's readings at its plate amplitude, the findings and the photo
    const sheet = mec.getByRole('article', { name: /Work record \d+/ });
    const lane = sheet.getByRole('table', { name: 'Test-lane results and findings' });
    await lane.waitFor();
    await sheet.getByText(/plate amplitude of 3 mm zero-to-peak \(6 mm stroke\)/).waitFor();
    const fl = await lane.getByRole('row', { name: /^FL/ }).innerText();
    expect(fl).toMatch(/18\.0/);
    expect(fl).toMatch(/30\.0 \(fail\)/);
    expect(fl).toContain('Oil on the damper body');
    expect(fl).toContain('Replace');
    expect(await lane.getByRole('row', { name: /^FR/ }).innerText()).toMatch(/41\.0/);
    const photo = sheet.getByRole('img', { name: /Photo from inspection #\d+: front-left-leak\.png/ });
    await photo.waitFor();
    await expect.poll(() => photo.evaluate((img) => (img as HTMLImageElement).complete && (img as HTMLImageElement).naturalWidth)).toBe(1);
    expect(await axeViolations(mec)).toEqual([]);
    await screenshot(mec, 'mechanic-tablet-work-record', { fullPage: true });
    // as printed: only the sheet, without the notice and the print button
    await mec.emulateMedia({ media: 'print' });
    expect(await mec.getByText('The work record is saved').isVisible()).toBe(false);
    expect(await sheet.getByRole('button', { name: 'Print' }).isVisible()).toBe(false);
    expect(await lane.isVisible()).toBe(true);
    await screenshot(mec, 'mechanic-print-work-record', { fullPage: true });
    await mec.emulateMedia({ media: 'screen' });
    // opened again later by its address, it does not claim to have just been saved
    const recordUrl = mec.url();
    await mec.goto(`${server.url}/workshop`);
    await mec.goto(recordUrl);
    await lane.waitFor();
    expect(await mec.getByText('The work record is saved').count()).toBe(0);

    // The manager sees the vehicle's new state and the forecast move.
    await mgr.goto(`${server.url}/vehicles/${target.vehicleId}`);
    await mgr.getByRole('table', { name: 'Predicted and measured damping by inspection' }).waitFor();
    const flRow = mgr.getByRole('table', { name: 'Damper state per corner' }).getByRole('row', { name: /^FL/ });
    await expect(flRow.innerText()).resolves.toMatch(/\b0\b/);
    await screenshot(mgr, 'manager-desktop-vehicle-workshop', { fullPage: true });
    const after = (await (await mgr.request.get(`${server.url}/api/forecast`)).json()) as { totals: { replacements: number }; items: { damperId: number; vehicleId: number; position: string }[] };
    // the replaced front pair leaves the forecast; the new dampers start with no wear
    const replaced = before.items.filter((i) => i.vehicleId === target.vehicleId && (i.position === 'FL' || i.position === 'FR')).map((i) => i.damperId);
    expect(replaced.length).toBeGreaterThan(0);
    expect(after.items.filter((i) => replaced.includes(i.damperId))).toEqual([]);
    expect(after.items.filter((i) => i.vehicleId === target.vehicleId && (i.position === 'FL' || i.position === 'FR'))).toEqual([]);
    await mgr.goto(`${server.url}/planning`);
    await mgr.getByText(new RegExp(`about ${after.totals.replacements.toFixed(1).replace('.', '\\.')} damper replacements expected`)).waitFor();

    await openPage(mgr, '/model-check', 'Model check');
    await mgr.getByText('Corners compared').waitFor();
    await screenshot(mgr, 'manager-desktop-model-check', { fullPage: true });
    await openPage(mgr, '/damper-life', 'Damper life from the fleet');
    await mgr.getByRole('table', { name: 'Damper life per ISO 8608 road class at 80 km/h' }).waitFor();
    await screenshot(mgr, 'manager-desktop-damper-life', { fullPage: true });
    await mgrCtx.close();
    await mecCtx.close();
  }, 120_000);
});
