import { describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { screenshot } from '../support/browser';
import { axeViolations } from '../support/axe';
import { DEMO, signIn, signedInPage, openPage, freshPage, serverAndBrowserForFile } from './helpers';
import { refreshExposure } from '../../server/drivers/exposure';

const { server, browser } = serverAndBrowserForFile();

/** A 1×1 PNG. */
const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8cfc0f01f0005000201a0e7d6a90000000049454e44ae426082', 'hex');

async function q<T extends object>(sql: string, replacements: unknown[] = []) {
  return server.db.sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT });
}

/** A point 20 m off the middle of a segment's first edge of non-zero length, at right angles. */
async function beside(segmentId: number) {
  const [s] = await q<{ geometry: string }>('SELECT geometry FROM route_segments WHERE id = ?', [segmentId]);
  const all = JSON.parse(s!.geometry) as [number, number][];
  const i = all.findIndex((p, k) => k > 0 && (p[0] !== all[k - 1]![0] || p[1] !== all[k - 1]![1]));
  const [a, b] = [all[i - 1]!, all[i]!];
  const mid = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
  const mLat = 111_195;
  const mLon = mLat * Math.cos((mid[1]! * Math.PI) / 180);
  const dx = (b[0] - a[0]) * mLon;
  const dy = (b[1] - a[1]) * mLat;
  const len = Math.hypot(dx, dy);
  return { latitude: mid[1]! + ((dx / len) * 20) / mLat, longitude: mid[0]! - ((dy / len) * 20) / mLon };
}

describe('drivers on a phone (390 × 844)', () => {
  it('when a driver files a report with a photo and the manager accepts it, then the segment’s roughness changes and the driver sees the outcome', async () => {
    const [seg] = await q<{ id: number; iso_class: string; gd_n0: number; route_name: string; seq: number }>(
      `SELECT s.id, s.iso_class, s.gd_n0, r.name AS route_name, s.seq FROM route_segments s JOIN routes r ON r.id = s.route_id
       WHERE s.roughness_source = 'survey' AND s.iso_class IN ('B', 'C') ORDER BY s.id LIMIT 1 OFFSET 5`,
    );
    const where = await beside(seg!.id);

    // --- the driver, on the road
    const { context: driverCtx, page } = await freshPage(browser, server.url, 'phone');
    await driverCtx.grantPermissions(['geolocation'], { origin: server.url });
    await driverCtx.setGeolocation({ ...where, accuracy: 12 });
    await signIn(page, server.url, DEMO.driver);
    await openPage(page, '/report', 'Report a rough stretch');

    // the draft survives a reload (a dropped connection)
    await page.getByRole('radio', { name: /Severe/ }).check();
    await page.getByRole('checkbox', { name: 'Potholes' }).check();
    await page.reload();
    await expect.poll(() => page.getByRole('radio', { name: /Severe/ }).isChecked()).toBe(true);
    expect(await page.getByRole('checkbox', { name: 'Potholes' }).isChecked()).toBe(true);

    // sending without a place asks for one; finding the position answers it
    const sayWhere = page.getByText(/^Say where it was/);
    await page.getByRole('button', { name: 'Send report' }).click();
    await sayWhere.waitFor();
    // focus goes to what answers it, which names the error to a screen reader
    const focused = page.getByRole('button', { name: 'Use my position' });
    expect(await focused.evaluate((el) => el === document.activeElement)).toBe(true);
    expect(await focused.getAttribute('aria-describedby')).toBeTruthy();
    await page.getByRole('button', { name: 'Use my position' }).click();
    const snap = page.getByTestId('snap-result');
    await snap.waitFor();
    expect(await sayWhere.count()).toBe(0);
    expect(await snap.innerText()).toContain(seg!.route_name);
    expect(await snap.innerText()).toMatch(/segment \d+/);
    await page.getByLabel(/Anything else/).fill('Deep hole on the left after the bend');
    await page.locator('input[type=file]').setInputFiles({ name: 'hole.png', mimeType: 'image/png', buffer: PNG });
    await page.getByText('Photo chosen: hole.png').waitFor();
    // the send bar (pinned while the form runs on below it) and the bottom menu together leave
    // the form most of the screen
    await page.evaluate(() => window.scrollTo(0, 0));
    const pinned = await page.evaluate(() => {
      const bar = document.querySelector('form .sticky')!.getBoundingClientRect();
      const menu = [...document.querySelectorAll('nav[aria-label="Main"]')].map((n) => n.getBoundingClientRect()).find((r) => r.height > 0)!;
      return { barTop: bar.top, barBottom: bar.bottom, menuTop: menu.top, menuBottom: menu.bottom, screen: window.innerHeight };
    });
    expect(pinned.screen).toBe(844);
    expect(pinned.menuBottom).toBe(844);
    expect(pinned.barBottom).toBeLessThanOrEqual(pinned.menuTop + 0.5);
    expect(pinned.screen - pinned.barTop, JSON.stringify(pinned)).toBeLessThanOrEqual(120);
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, 'drivers-phone-report-form');
    await screenshot(page, 'drivers-phone-report-form-full', { fullPage: true });
    await page.getByRole('button', { name: 'Send report' }).click();
    await page.getByText('Report sent').waitFor();
    await screenshot(page, 'drivers-phone-report-sent');

    const [report] = await q<{ id: number; segment_id: number; photo_path: string | null; severity: number }>('SELECT id, segment_id, photo_path, severity FROM ride_reports ORDER BY id DESC LIMIT 1');
    expect(report!.segment_id).toBe(seg!.id);
    expect(report!.photo_path).toMatch(/^ride-photos\/[0-9a-f]{32}\.png$/);
    expect(report!.severity).toBe(3);

    await page.goto(`${server.url}/my-reports`);
    await page.getByText('Waiting for review').first().waitFor();
    // the driver sees the photo they sent, loaded (the photo address answers only its own driver)
    const mine = page.getByTestId('my-report').first().getByRole('img', { name: /Your photo with the report on/ });
    await mine.waitFor();
    await expect.poll(() => mine.evaluate((img) => (img as HTMLImageElement).complete && (img as HTMLImageElement).naturalWidth)).toBe(1);
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, 'drivers-phone-my-reports-new', { fullPage: true });

    // --- the manager reviews (also on a phone)
    const { context: mgrCtx, page: mp } = await signedInPage(browser, server.url, DEMO.manager, 'phone');
    await openPage(mp, '/ride-reports', 'Drivers’ ride reports');
    await mp.getByRole('button', { name: new RegExp(seg!.route_name) }).first().click();
    const before = await mp.getByTestId('segment-roughness').innerText();
    expect(before).toContain(`class ${seg!.iso_class}`);
    await mp.getByTestId('review-report').first().getByRole('img').waitFor();
    await screenshot(mp, 'drivers-phone-manager-review', { fullPage: true });
    await mp.getByTestId('review-report').first().getByRole('button', { name: 'Accept' }).click();
    const msg = mp.getByTestId('review-message');
    await msg.waitFor();
    const text = await msg.innerText();
    expect(text).toMatch(new RegExp(`class ${seg!.iso_class} → [A-H]`));
    // the decisions table tells the same classes as the notice
    const said = text.match(/segment class [A-H] → [A-H] \(report’s estimate class [A-H]\)/)?.[0];
    expect(said, text).toBeTruthy();
    await mp.getByRole('table', { name: 'Recent decisions' }).getByText(said!).first().waitFor();
    await screenshot(mp, 'drivers-phone-manager-accepted', { fullPage: true });

    const [after] = await q<{ gd_n0: number; iso_class: string; roughness_source: string }>('SELECT gd_n0, iso_class, roughness_source FROM route_segments WHERE id = ?', [seg!.id]);
    expect(after!.roughness_source).toBe('driver_report');
    expect(after!.gd_n0).toBeGreaterThan(seg!.gd_n0);
    // the manager sees the change on the segment's own page too
    await mp.goto(`${server.url}/map`);
    await screenshot(mp, 'drivers-phone-manager-map');

    // --- the driver sees the outcome
    await page.goto(`${server.url}/my-reports`);
    await page.getByText('Accepted', { exact: true }).first().waitFor();
    await screenshot(page, 'drivers-phone-my-reports-accepted', { fullPage: true });
    await driverCtx.close();
    await mgrCtx.close();
  });

  it('when a driver is far from every route, then the distance reads in km and the nearest route can be shown on the map and picked', async () => {
    const { context: ctx, page } = await freshPage(browser, server.url, 'phone');
    await ctx.grantPermissions(['geolocation'], { origin: server.url });
    // central London: over 100 km from the demo fleet's roads
    await ctx.setGeolocation({ latitude: 51.5, longitude: -0.12, accuracy: 10 });
    await signIn(page, server.url, DEMO.driver);
    await openPage(page, '/report', 'Report a rough stretch');
    await page.getByRole('button', { name: 'Use my position' }).click();
    const refused = page.getByText(/^That place is .* from the nearest route we know/);
    await refused.waitFor();
    const said = await refused.innerText();
    expect(said).toMatch(/is \d{2,3} km from/);
    expect(said).not.toMatch(/\d{4,} m\b/);
    await page.getByRole('button', { name: 'Show the nearest route' }).click();
    const panel = page.getByTestId('nearest-route');
    await panel.waitFor();
    const routeName = await panel.locator('strong').innerText();
    expect(routeName).not.toBe('');
    expect(await panel.innerText()).toMatch(/\d{2,3}\s+km away/);
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, 'drivers-phone-report-nearest-route');
    await panel.getByRole('button', { name: `Report it on ${routeName}` }).click();
    const snap = page.getByTestId('snap-result');
    await snap.waitFor();
    expect(await snap.innerText()).toContain(routeName);
    expect(await refused.count()).toBe(0);
    expect(await panel.count()).toBe(0);
    await ctx.close();
  });

  it('when a driver opens their exposure, then the chart shows the action and limit values with the screening caution', async () => {
    const [driver] = await q<{ id: number }>('SELECT id FROM users WHERE email = ?', [DEMO.driver]);
    // 24 days of driving; from the 9th day back on, rough enough to be above the action value
    const trips = await q<{ id: number; vehicle_id: number; route_id: number; started_at: string }>('SELECT id, vehicle_id, route_id, started_at FROM trips WHERE driver_id = ? ORDER BY started_at DESC LIMIT 24', [driver!.id]);
    expect(trips).toHaveLength(24);
    const now = new Date().toISOString();
    for (const [i, t] of trips.entries()) {
      const day = new Date(Date.parse('2026-11-29T00:00:00Z') - i * 86_400_000).toISOString().slice(0, 10);
      for (const pos of ['FL', 'FR']) {
        await server.db.sequelize.query(
          `INSERT INTO trip_duties (trip_id, vehicle_id, route_id, driver_id, position, axle_index, trip_date, distance_km, duration_s, sprung_mass_kg, energy_j, mean_power_w, rms_relative_velocity, rms_suspension_travel, rms_tire_load_ratio, rms_body_accel, rms_weighted_accel, spring_damage, segments, profiled_segments, unrated_segments, created_at, updated_at)
           VALUES (?, ?, ?, ?, ?, 0, ?, 60, ?, 400, 1, 1, 0.1, 0.01, 0.1, 1, ?, 0, 1, 0, 0, ?, ?)`,
          { replacements: [t.id, t.vehicle_id, t.route_id, driver!.id, pos, day, 3600 * (3 + (i % 4)), i >= 8 ? 1.0 : 0.35 + 0.05 * (i % 6), now, now] },
        );
      }
    }
    await refreshExposure({ sequelize: server.db.sequelize, now: new Date('2026-11-30T12:00:00Z'), asOf: '2026-11-30', publicUrl: server.url, runId: null });
    const { context: ctx, page } = await signedInPage(browser, server.url, DEMO.driver, 'phone');
    await openPage(page, '/exposure', 'My vibration exposure');
    await page.getByText(/not a measurement at the seat/).waitFor();
    await page.getByText(/action 0.5 m\/s²/).first().waitFor();
    await screenshot(page, 'drivers-phone-exposure', { fullPage: true });
    await ctx.close();

    const { context: mctx, page: mp } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await openPage(mp, '/exposure', 'Drivers’ vibration exposure');
    await mp.getByRole('heading', { name: /Days above the action value/ }).waitFor();
    // the 15 highest days first, the rest on request
    const days = mp.getByRole('table', { name: 'Days above the action value' });
    const above = Number((await mp.getByRole('heading', { name: /Days above the action value/ }).innerText()).match(/\((\d+)\)/)![1]);
    expect(above).toBeGreaterThanOrEqual(16);
    expect(await days.locator('tbody tr').count()).toBe(15);
    const a8s = (await days.locator('tbody tr td:nth-child(3)').allInnerTexts()).map(Number);
    expect(a8s).toEqual([...a8s].sort((x, y) => y - x));
    await screenshot(mp, 'drivers-desktop-exposure-overview', { fullPage: true });
    await mp.getByRole('button', { name: `Show all ${above} days` }).click();
    await expect.poll(() => days.locator('tbody tr').count()).toBe(above);
    await mctx.close();
  });

  it('when a manager opens a route and a segment on the map, then speed advice shows with its chart and caution', async () => {
    const [seg] = await q<{ id: number; route_id: number }>(`SELECT id, route_id FROM route_segments WHERE iso_class IN ('D', 'E') ORDER BY id LIMIT 1`);
    const { context: ctx, page } = await signedInPage(browser, server.url, DEMO.manager, 'desktop');
    await page.goto(`${server.url}/routes/${seg!.route_id}`);
    const section = page.getByRole('region', { name: 'Speed advice' });
    await section.getByRole('table', { name: 'Advised speed per segment' }).waitFor();
    await section.getByText(/Posted limits/).waitFor();
    const assumptions = await section.getByTestId('speed-advice-assumptions').innerText();
    for (const w of [/Load: laden/, /SEAT/, /class B at 80 km\/h/, /No advice below 20 km\/h/]) expect(assumptions).toMatch(w);
    const advised = await section.getByRole('table', { name: 'Advised speed per segment' }).locator('tbody tr td:nth-child(5)').allInnerTexts();
    for (const a of advised) expect(a === 'Road needs attention' || a === '—' || Number(a) >= 20, a).toBe(true);
    await section.getByLabel('Load').selectOption('unladen');
    await section.getByText(/Load: unladen/).waitFor();
    await section.getByLabel('Ride limit at the seat').selectOption('daily-exposure');
    await section.getByText(/8 h a day at that level/).waitFor();
    await section.scrollIntoViewIfNeeded();
    await screenshot(section, 'drivers-desktop-route-speed-advice');
    await page.goto(`${server.url}/map?segment=${seg!.id}`);
    const panel = page.getByTestId('segment-speed-advice');
    await panel.waitFor();
    expect(await panel.innerText()).toMatch(/Up to \d+ km\/h|Road needs attention/);
    expect(await panel.innerText()).toMatch(/Load: laden[\s\S]*SEAT/);
    await screenshot(page, 'drivers-desktop-map-segment-advice');
    await ctx.close();
  });
});
