import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { QueryTypes } from 'sequelize';
import { launchBrowser, newContext, screenshotPath } from '../support/browser';
import { startTestServer, TEST_NOW, type TestServer } from '../support/server';
import { run as runNightly } from '../../jobs/nightly';
import { DEMO, expectHeading, signIn } from './helpers';

let server: TestServer;
let browser: Browser;

const PNG = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAABAAAAAQCAIAAACQkWg2AAAAHElEQVR4nGP4z0AaYBjVMKphVMOohlENQ0kDAHjtAf+gRwNQAAAAAElFTkSuQmCC',
  'base64',
);

beforeAll(async () => {
  [server, browser] = await Promise.all([startTestServer(), launchBrowser()]);
  // the wear model's end-of-life dates feed the replacement forecast
  const r = await runNightly({ db: server.db, config: server.config, log: server.log, mailer: server.mailer, now: TEST_NOW, trigger: 'test' });
  expect(r.status).toBe('succeeded');
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

describe('workshop', () => {
  it('when a mechanic records an inspection with a photo and a replacement, then the manager sees the vehicle state and the forecast change', async () => {
    // Arrange: a vehicle whose dampers are in the 90-day forecast gets an open inspection (demo data has none for it).
    const sq = server.db.sequelize;
    const mgrCtx = await newContext(browser, 'desktop');
    const mgr = await mgrCtx.newPage();
    await signIn(mgr, server.url, DEMO.manager);
    const before = (await (await mgr.request.get(`${server.url}/api/forecast`)).json()) as { totals: { replacements: number }; items: { vehicleId: number; fleetNumber: string; position: string }[] };
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
    await mgr.goto(`${server.url}/planning`);
    await expectHeading(mgr, 'Workshop planning');
    const picker = mgr.getByLabel(`Mechanic for ${target.fleetNumber}`);
    await picker.waitFor();
    await picker.selectOption({ label: 'Tomasz Reyes' });
    await mgr.waitForResponse((r) => r.url().includes('/api/inspections') && r.request().method() === 'GET');
    await mgr.getByText(/damper replacements expected/).waitFor();
    await mgr.screenshot({ path: screenshotPath('manager-desktop-planning'), fullPage: true });

    // The mechanic, on a tablet, opens it from "My inspections".
    const mecCtx = await newContext(browser, 'tablet');
    const mec = await mecCtx.newPage();
    await signIn(mec, server.url, DEMO.mechanic);
    await expectHeading(mec, 'Workshop');
    const card = mec.getByRole('list', { name: 'My inspections' }).getByRole('link', { name: new RegExp(target.fleetNumber) });
    await card.waitFor();
    await mec.screenshot({ path: screenshotPath('mechanic-tablet-my-inspections'), fullPage: true });
    await card.click();
    await mec.getByRole('form', { name: 'Test-lane results' }).waitFor();

    // A half-filled form survives a reload.
    await mec.getByLabel('Adhesion FL [%]').fill('18');
    await mec.waitForTimeout(300);
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
    await mec.getByRole('button', { name: 'Save results' }).click();
    await mec.getByRole('table', { name: 'Predicted and measured damping' }).waitFor();

    // A photo, checked by content on the server.
    await mec.getByLabel('Attach a file').setInputFiles({ name: 'front-left-leak.png', mimeType: 'image/png', buffer: PNG });
    await mec.getByRole('link', { name: /Photo: front-left-leak.png/ }).waitFor();
    await mec.screenshot({ path: screenshotPath('mechanic-tablet-inspection'), fullPage: true });

    // The replacement: both front dampers; closes the inspection.
    for (const pos of ['FL', 'FR']) {
      await mec.getByLabel(`Replace damper ${pos}`).check();
      await mec.getByLabel(`Part description ${pos}`).fill('Twin-tube damper, front');
      await mec.getByLabel(`Part number ${pos}`).fill('BX-2201');
      await mec.getByLabel(`Cost ${pos}`).fill('96');
    }
    await mec.getByLabel('Work summary').fill('Front dampers replaced as a pair');
    await mec.getByLabel('Labour [h]').fill('1.5');
    await mec.getByRole('button', { name: 'Save work record and close inspection' }).click();
    await mec.getByRole('heading', { level: 1, name: /Work record \d+/ }).waitFor();
    await mec.screenshot({ path: screenshotPath('mechanic-tablet-work-record'), fullPage: true });

    // The manager sees the vehicle's new state and the forecast move.
    await mgr.goto(`${server.url}/vehicles/${target.vehicleId}`);
    await mgr.getByRole('table', { name: 'Predicted and measured damping by inspection' }).waitFor();
    const flRow = mgr.getByRole('table', { name: 'Damper state per corner' }).getByRole('row', { name: /^FL/ });
    await expect(flRow.innerText()).resolves.toMatch(/\b0\b/);
    await mgr.screenshot({ path: screenshotPath('manager-desktop-vehicle-workshop'), fullPage: true });
    const after = (await (await mgr.request.get(`${server.url}/api/forecast`)).json()) as { totals: { replacements: number } };
    expect(after.totals.replacements).toBeLessThan(before.totals.replacements);
    await mgr.goto(`${server.url}/planning`);
    await mgr.getByText(new RegExp(`${after.totals.replacements} damper replacements expected`)).waitFor();

    await mgr.goto(`${server.url}/model-check`);
    await expectHeading(mgr, 'Model check');
    await mgr.getByText('Corners compared').waitFor();
    await mgr.screenshot({ path: screenshotPath('manager-desktop-model-check'), fullPage: true });
    await mgr.goto(`${server.url}/damper-life`);
    await expectHeading(mgr, 'Damper life from the fleet');
    await mgr.getByText('Life in distance').waitFor();
    await mgr.screenshot({ path: screenshotPath('manager-desktop-damper-life'), fullPage: true });
    await mgrCtx.close();
    await mecCtx.close();
  }, 120_000);
});
