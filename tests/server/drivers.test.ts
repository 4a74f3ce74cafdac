import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { startTestServer, TEST_NOW, type TestServer } from '../support/server';
import { ApiClient, DEMO } from '../support/client';
import { snapToSegments } from '../../server/drivers/snap';
import { currentValue } from '../../server/roads/current-roughness';
import { classifyGd, gdForClass } from '../../server/physics/iso8608';
import { iriFromGd } from '../../server/physics/iri';
import { prepareDuty, dutyOnRoad } from '../../server/physics/closed-form';
import { refreshExposure } from '../../server/drivers/exposure';
import { DEFAULT_DAMPER_MULTIPLE, MIN_ADVICE_KMH, ROAD_ATTENTION, adviseSpeed, dailyExposureLimit, prepareSpec } from '../../server/drivers/speed-advice';
import { queueDigests } from '../../server/mail/service';
import type { LonLat } from '../../server/roads/geometry';

let srv: TestServer;
let manager: ApiClient;
let driver: ApiClient;
let other: ApiClient;
let driverId: number;
let otherId: number;

/** A 1×1 PNG (the smallest valid image). */
const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8cfc0f01f0005000201a0e7d6a90000000049454e44ae426082', 'hex');

async function q<T extends object>(sql: string, replacements: unknown[] = []) {
  return srv.db.sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT });
}

beforeAll(async () => {
  srv = await startTestServer();
  manager = new ApiClient(srv.url);
  driver = new ApiClient(srv.url);
  other = new ApiClient(srv.url);
  await manager.login(DEMO.manager);
  driverId = (await driver.login(DEMO.driver)).body.user.id;
  otherId = (await other.login('priya.nandakumar@reboundry.test')).body.user.id;
});
afterAll(() => srv?.stop());

/** A point `offsetM` metres off the middle of a segment's first edge, at right angles to it. */
async function pointNear(segmentId: number, offsetM: number) {
  const [s] = await q<{ geometry: string }>('SELECT geometry FROM route_segments WHERE id = ?', [segmentId]);
  const all = JSON.parse(s.geometry) as LonLat[];
  // the first edge of non-zero length (a segment may start on a vertex of the route line)
  const i = all.findIndex((p, k) => k > 0 && (p[0] !== all[k - 1][0] || p[1] !== all[k - 1][1]));
  const c = [all[i - 1], all[i]];
  const mid: LonLat = [(c[0][0] + c[1][0]) / 2, (c[0][1] + c[1][1]) / 2];
  const mPerDegLat = 111_195;
  const mPerDegLon = mPerDegLat * Math.cos((mid[1] * Math.PI) / 180);
  const dx = (c[1][0] - c[0][0]) * mPerDegLon;
  const dy = (c[1][1] - c[0][1]) * mPerDegLat;
  const len = Math.hypot(dx, dy);
  return { lat: mid[1] + ((dx / len) * offsetM) / mPerDegLat, lon: mid[0] - ((dy / len) * offsetM) / mPerDegLon };
}

function fileReport(client: ApiClient, fields: Record<string, string>, photo?: { buf: Buffer; name: string; type: string }) {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  if (photo) form.set('photo', new Blob([new Uint8Array(photo.buf)], { type: photo.type }), photo.name);
  return client.raw('POST', '/api/ride-reports', { form });
}

describe('snapping to the nearest segment', () => {
  it('when a point lies 0.0009° north of one line and farther from another, then it snaps to the nearer at ≈ 100 m (computed: 0.0009° × 111 195 m/°)', () => {
    const lines = [
      { id: 1, coords: [[-0.01, 0], [0.01, 0]] as LonLat[] },
      { id: 2, coords: [[-0.01, 0.003], [0.01, 0.003]] as LonLat[] },
    ];
    const hit = snapToSegments([0.002, 0.0009], lines)!;
    expect(hit.segmentId).toBe(1);
    expect(hit.distanceM).toBeCloseTo(100.08, 0);
    expect(hit.point[0]).toBeCloseTo(0.002, 9);
    expect(hit.point[1]).toBeCloseTo(0, 9);
    // past the end of a line the nearest point is its end vertex
    const end = snapToSegments([0.0109, 0], lines)!;
    expect(end.point[0]).toBeCloseTo(0.01, 9);
  });

  it('when a driver asks for a place 40 m off a demo segment, then it snaps to that segment and says how far', async () => {
    const [seg] = await q<{ id: number }>('SELECT id FROM route_segments ORDER BY id LIMIT 1 OFFSET 25');
    const p = await pointNear(seg.id, 40);
    const r = await driver.json<{ segment: { id: number }; distanceM: number }>('POST', '/api/ride-reports/snap', p);
    expect(r.status).toBe(200);
    expect(r.body.segment.id).toBe(seg.id);
    expect(r.body.distanceM).toBeCloseTo(40, 0);
  });

  it('when the place is farther than 150 m from every route, then it is refused with the distance', async () => {
    const r = await driver.json<{ error: { code: string; message: string; fields: Record<string, string> } }>('POST', '/api/ride-reports/snap', { lat: 10, lon: 10 });
    expect(r.status).toBe(422);
    expect(r.body.error.code).toBe('too_far');
    expect(r.body.error.fields.position).toMatch(/at most 150 m/);
    // thousands of kilometres away: said in km, not in metres
    expect(r.body.error.fields.position).toMatch(/^is [\d,]+ km from the nearest route/);
  });

  it('when a driver far from every route asks for the nearest one anyway, then it names it and the distance and says it is out of reach; near a route it is within reach', async () => {
    // central London: well away from the demo fleet's roads
    const far = { lat: 51.5, lon: -0.12 };
    const r = await driver.json<{ segment: { id: number; routeName: string }; point: { lat: number; lon: number }; distanceM: number; withinReach: boolean }>('POST', '/api/ride-reports/snap', { ...far, nearest: true });
    expect(r.status).toBe(200);
    expect(r.body.withinReach).toBe(false);
    expect(r.body.segment.routeName).not.toBe('');
    expect(r.body.distanceM).toBeGreaterThan(10_000);
    // the point it names is on the road: snapping it again finds it within reach, at (almost) no distance
    const again = await driver.json<{ distanceM: number; withinReach: boolean }>('POST', '/api/ride-reports/snap', r.body.point);
    expect(again.status).toBe(200);
    expect(again.body.withinReach).toBe(true);
    expect(again.body.distanceM).toBeLessThan(1);
    // without the flag the same place is refused, as before
    expect((await driver.json('POST', '/api/ride-reports/snap', far)).status).toBe(422);
    // the flag is checked
    expect((await driver.json('POST', '/api/ride-reports/snap', { ...far, nearest: 'yes' })).status).toBe(400);
  });
});

describe('ride reports: filing, access, decisions', () => {
  let segId: number;
  let reportId: number;

  it('when a driver files a report with a photo, then it is stored snapped to the segment with the photo under DATA_DIR', async () => {
    // a surveyed segment, so the blend of report and survey can be checked below
    const [seg] = await q<{ id: number }>(`SELECT id FROM route_segments WHERE roughness_source = 'survey' ORDER BY id LIMIT 1 OFFSET 10`);
    segId = seg.id;
    const p = await pointNear(segId, 12);
    const res = await fileReport(driver, { lat: String(p.lat), lon: String(p.lon), positionSource: 'gps', accuracyM: '8', severity: '3', felt: 'bottoming,knock', note: 'Deep hole by the farm gate' }, { buf: PNG, name: 'pothole.png', type: 'image/png' });
    const body = (await res.json()) as { id: number; segmentId: number; hasPhoto: boolean; photoType: string; status: string; snapDistanceM: number; felt: string[] };
    expect(res.status).toBe(201);
    expect(body.segmentId).toBe(segId);
    expect(body.hasPhoto).toBe(true);
    expect(body.photoType).toBe('image/png');
    expect(body.status).toBe('new');
    expect(body.felt).toEqual(['bottoming', 'knock']);
    reportId = body.id;
    const photo = await driver.raw('GET', `/api/ride-reports/${reportId}/photo`);
    expect(photo.status).toBe(200);
    expect(photo.headers.get('content-type')).toBe('image/png');
    expect(Buffer.from(await photo.arrayBuffer()).equals(PNG)).toBe(true);
  });

  it('when the photo is not an image (whatever its name says), then the report is refused naming the photo and nothing is stored', async () => {
    const before = await q<{ n: number }>('SELECT COUNT(*) AS n FROM ride_reports');
    const p = await pointNear(segId, 5);
    const res = await fileReport(driver, { lat: String(p.lat), lon: String(p.lon), positionSource: 'map', severity: '1' }, { buf: Buffer.from('not really a picture'), name: 'fake.jpg', type: 'image/jpeg' });
    const body = (await res.json()) as { error: { fields: Record<string, string> } };
    expect(res.status).toBe(400);
    expect(body.error.fields.photo).toMatch(/JPEG, PNG or WebP/);
    expect((await q<{ n: number }>('SELECT COUNT(*) AS n FROM ride_reports'))[0].n).toBe(before[0].n);
  });

  it('when a field is wrong, then the error names it', async () => {
    const res = await fileReport(driver, { lat: '91', lon: 'x', positionSource: 'gps', severity: '7', felt: 'wobbly' });
    const body = (await res.json()) as { error: { fields: Record<string, string> } };
    expect(res.status).toBe(400);
    expect(Object.keys(body.error.fields)).toEqual(expect.arrayContaining(['lat', 'lon', 'severity']));
    expect(Object.keys(body.error.fields).some((k) => k.startsWith('felt'))).toBe(true);
  });

  it('when another driver asks for the report, its photo or the first driver\'s list, then they get nothing of it', async () => {
    expect((await other.get(`/api/ride-reports/${reportId}`)).status).toBe(404);
    expect((await other.raw('GET', `/api/ride-reports/${reportId}/photo`)).status).toBe(404);
    expect((await other.get(`/api/ride-reports?driverId=${driverId}`)).status).toBe(403);
    const own = await other.get<{ items: { driverId: number }[] }>('/api/ride-reports');
    expect(own.body.items.every((r) => r.driverId === otherId)).toBe(true);
    const mine = await driver.get<{ items: { id: number }[] }>('/api/ride-reports');
    expect(mine.body.items.map((r) => r.id)).toContain(reportId);
  });

  it('when two drivers report the same segment, then the manager sees one group with both', async () => {
    const p = await pointNear(segId, 20);
    const res = await fileReport(other, { lat: String(p.lat), lon: String(p.lon), positionSource: 'map', severity: '2', felt: 'shaking' });
    expect(res.status).toBe(201);
    const groups = await manager.get<{ items: { segmentId: number; count: number; maxSeverity: number; reportIds: number[] }[] }>('/api/ride-reports/by-segment');
    const g = groups.body.items.find((x) => x.segmentId === segId)!;
    expect(g.count).toBe(2);
    expect(g.maxSeverity).toBe(3);
    expect(g.reportIds).toContain(reportId);
  });

  it('when a severe report is new, then the manager digest lists it once', async () => {
    await queueDigests({ sequelize: srv.db.sequelize, publicUrl: 'http://app.test', asOf: '2026-11-30', now: TEST_NOW, runId: null });
    const mails = await q<{ text_body: string }>(`SELECT text_body FROM mail_messages WHERE kind = 'digest' AND to_address = ?`, [DEMO.manager]);
    expect(mails.some((m) => m.text_body.includes('Severe ride reports from drivers') && m.text_body.includes(`/ride-reports?report=${reportId}`))).toBe(true);
    const [r] = await q<{ digest_notified_at: string | null }>('SELECT digest_notified_at FROM ride_reports WHERE id = ?', [reportId]);
    expect(r.digest_notified_at).not.toBeNull();
  });

  it('when the manager accepts a severe report, then it becomes a driver_report observation weighted half a survey, the segment changes and the driver is told', async () => {
    const [before] = await q<{ gd_n0: number; iso_class: string }>('SELECT gd_n0, iso_class FROM route_segments WHERE id = ?', [segId]);
    expect((await manager.json('POST', `/api/ride-reports/${reportId}/accept`, {})).status).toBe(400);
    const r = await manager.json<{ report: { status: string; estimatedClass: string; classBefore: string; classAfter: string }; segmentAfter: { isoClass: string; gdN0: number; roughnessSource: string } }>('POST', `/api/ride-reports/${reportId}/accept`, { confirm: true });
    expect(r.status).toBe(200);
    expect(r.body.report.status).toBe('accepted');
    // severe = 3 class steps above the current class (our stated assumption)
    const letters = 'ABCDEFGH';
    const est = letters[Math.min(7, letters.indexOf(before.iso_class) + 3)];
    expect(r.body.report.estimatedClass).toBe(est);
    // computed: ln Gd = (1·ln Gd_survey + 0.5·ln Gd_report) / 1.5
    const expected = Math.exp((Math.log(before.gd_n0) + 0.5 * Math.log(gdForClass(est))) / 1.5);
    expect(r.body.segmentAfter.gdN0).toBeCloseTo(expected, 12);
    expect(r.body.segmentAfter.isoClass).toBe(classifyGd(expected));
    expect(r.body.segmentAfter.roughnessSource).toBe('driver_report');
    expect(r.body.segmentAfter.gdN0).toBeGreaterThan(before.gd_n0);
    // the decision keeps the classes the notice and the decisions table tell: before, the report's estimate, after
    expect(r.body.report).toMatchObject({ classBefore: before.iso_class, estimatedClass: est, classAfter: classifyGd(expected) });
    expect((r.body.report as unknown as { gdN0After: number }).gdN0After).toBeCloseTo(expected, 12);
    const obs = await q<{ source: string }>(`SELECT source FROM roughness_observations WHERE segment_id = ? ORDER BY id DESC LIMIT 1`, [segId]);
    expect(obs[0].source).toBe('driver_report');
    const mail = await q<{ to_address: string; subject: string }>(`SELECT to_address, subject FROM mail_messages WHERE dedupe_key = ?`, [`ride-report:${reportId}:accepted`]);
    expect(mail).toHaveLength(1);
    expect(mail[0].to_address).toBe(DEMO.driver);
    const seen = await driver.get<{ status: string }>(`/api/ride-reports/${reportId}`);
    expect(seen.body.status).toBe('accepted');
    // a second decision is refused
    expect((await manager.json('POST', `/api/ride-reports/${reportId}/dismiss`, { reason: 'changed my mind' })).status).toBe(409);
  });

  it('when the manager dismisses a report, then a reason is required, the driver sees it and is told only if they want e-mail', async () => {
    const list = await manager.get<{ items: { id: number; driverId: number }[] }>(`/api/ride-reports?status=new&segmentId=${segId}`);
    const id = list.body.items[0].id;
    await srv.db.sequelize.query('UPDATE users SET notify_ride_reports = 0 WHERE id = ?', { replacements: [otherId] });
    const bad = await manager.json<{ error: { fields: Record<string, string> } }>('POST', `/api/ride-reports/${id}/dismiss`, { reason: '' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.reason).toBeTruthy();
    const ok = await manager.json<{ report: { status: string; dismissReason: string } }>('POST', `/api/ride-reports/${id}/dismiss`, { reason: 'Resurfaced last week' });
    expect(ok.body.report.status).toBe('dismissed');
    const seen = await other.get<{ status: string; dismissReason: string }>(`/api/ride-reports/${id}`);
    expect(seen.body).toMatchObject({ status: 'dismissed', dismissReason: 'Resurfaced last week' });
    expect(await q(`SELECT id FROM mail_messages WHERE dedupe_key = ?`, [`ride-report:${id}:dismissed`])).toHaveLength(0);
  });
});

describe('the current-value rule with drivers\' reports', () => {
  const gd = (c: string) => gdForClass(c);
  it('when one harsh report follows a stated class B, then the segment is class C (computed from the stated rule: ln Gd = (ln 64 + 0.5 ln 1024)/1.5 → Gd = 161.3e-6, class C 128–512e-6)', () => {
    const obs = [
      { id: 1, source: 'stated' as const, observedOn: '2026-01-01', gdN0: gd('B'), iri: null, isoClass: 'B' },
      { id: 2, source: 'driver_report' as const, observedOn: '2026-02-01', gdN0: gd('D'), iri: null, isoClass: 'D' },
    ];
    const v = currentValue(obs, classifyGd, iriFromGd)!;
    expect(v.gdN0! / 1e-6).toBeCloseTo(161.27, 2);
    expect(v).toMatchObject({ isoClass: 'C', source: 'driver_report', blendedReports: 1 });
  });
  it('when the demo fleet is seeded, then every segment stores the value the rule gives over its observations (the dairy run\'s reported stretch is class C, not the report\'s D)', async () => {
    const segs = await q<{ id: number; gd_n0: number; iso_class: string; roughness_source: string; roughness_date: string; survey_id: number | null; route: string }>(
      `SELECT s.id, s.gd_n0, s.iso_class, s.roughness_source, s.roughness_date, s.survey_id, r.name AS route FROM route_segments s JOIN routes r ON r.id = s.route_id
       WHERE s.id NOT IN (SELECT segment_id FROM ride_reports WHERE status = 'accepted')`,
    );
    const obs = await q<{ id: number; segment_id: number; source: 'survey' | 'stated' | 'driver_report'; observed_on: string; gd_n0: number; iri: number | null; iso_class: string; survey_id: number | null }>('SELECT * FROM roughness_observations');
    const bySeg = new Map<number, typeof obs>();
    for (const o of obs) bySeg.set(o.segment_id, [...(bySeg.get(o.segment_id) ?? []), o]);
    let reported = 0;
    for (const s of segs) {
      const v = currentValue((bySeg.get(s.id) ?? []).map((o) => ({ id: o.id, source: o.source, observedOn: o.observed_on, gdN0: o.gd_n0, iri: o.iri, isoClass: o.iso_class, surveyId: o.survey_id })), classifyGd, iriFromGd)!;
      expect({ gd: s.gd_n0, cls: s.iso_class, src: s.roughness_source }, `segment ${s.id}`).toEqual({ gd: v.gdN0, cls: v.isoClass, src: v.source });
      if (s.route === 'Sedge Vale dairy run' && s.roughness_source === 'driver_report') {
        reported++;
        expect(s.iso_class).toBe('C');
      }
    }
    expect(reported).toBeGreaterThan(0);
  });
  it('when a survey is newer than a report, or on the same day, then the survey alone is current', () => {
    const obs = [
      { id: 1, source: 'driver_report' as const, observedOn: '2026-03-01', gdN0: gd('E'), iri: null, isoClass: 'E' },
      { id: 2, source: 'survey' as const, observedOn: '2026-03-01', gdN0: gd('B'), iri: 2, isoClass: 'B', surveyId: 7 },
    ];
    expect(currentValue(obs, classifyGd, iriFromGd)).toMatchObject({ source: 'survey', isoClass: 'B', surveyId: 7, blendedReports: 0 });
  });
  it('when two reports follow a stated class B, then they pull it with half weight each (computed: ln Gd = (ln 64 + 0.5 ln 1024 + 0.5 ln 1024)/2 → Gd = 256e-6, class C)', () => {
    const obs = [
      { id: 1, source: 'stated' as const, observedOn: '2026-01-01', gdN0: gd('B'), iri: null, isoClass: 'B' },
      { id: 2, source: 'driver_report' as const, observedOn: '2026-02-01', gdN0: gd('D'), iri: null, isoClass: 'D' },
      { id: 3, source: 'driver_report' as const, observedOn: '2026-02-03', gdN0: gd('D'), iri: null, isoClass: 'D' },
    ];
    const v = currentValue(obs, classifyGd, iriFromGd)!;
    expect(v.gdN0).toBeCloseTo(256e-6, 15);
    expect(v.isoClass).toBe('C');
    expect(v).toMatchObject({ source: 'driver_report', observedOn: '2026-02-03', blendedReports: 2 });
  });
});

describe('exposure A(8) from the nightly duty', () => {
  it('when a driver has several trips in a day, then A(8) follows the directive\'s formula on the front axle (hand-worked)', async () => {
    const trips = await q<{ id: number; vehicle_id: number; route_id: number }>('SELECT id, vehicle_id, route_id FROM trips WHERE driver_id = ? ORDER BY id LIMIT 3', [driverId]);
    expect(trips).toHaveLength(3);
    await srv.db.sequelize.query('DELETE FROM trip_duties');
    const duty = (t: (typeof trips)[number], day: string, position: string, axle: number, aw: number, durationS: number) =>
      srv.db.sequelize.query(
        `INSERT INTO trip_duties (trip_id, vehicle_id, route_id, driver_id, position, axle_index, trip_date, distance_km, duration_s, sprung_mass_kg, energy_j, mean_power_w, rms_relative_velocity, rms_suspension_travel, rms_tire_load_ratio, rms_body_accel, rms_weighted_accel, spring_damage, segments, profiled_segments, unrated_segments, created_at, updated_at)
         VALUES (?, ?, ?, ?, ?, ?, ?, 50, ?, 400, 1, 1, 0.1, 0.01, 0.1, 1, ?, 0, 1, 0, 0, ?, ?)`,
        { replacements: [t.id, t.vehicle_id, t.route_id, driverId, position, axle, day, durationS, aw, TEST_NOW.toISOString(), TEST_NOW.toISOString()] },
      );
    // Day 1, trip A: FL = FR = 0.6 m/s² for 2 h; trip B: FL 0.5, FR 0.3 m/s² for 3 h; rear axle 2.0 m/s² (ignored: the driver sits over the front axle)
    await duty(trips[0], '2026-11-20', 'FL', 0, 0.6, 7200);
    await duty(trips[0], '2026-11-20', 'FR', 0, 0.6, 7200);
    await duty(trips[0], '2026-11-20', 'RL', 1, 2.0, 7200);
    await duty(trips[1], '2026-11-20', 'FL', 0, 0.5, 10800);
    await duty(trips[1], '2026-11-20', 'FR', 0, 0.3, 10800);
    await duty(trips[1], '2026-11-20', 'RR', 1, 2.0, 10800);
    // Day 2: one trip at 0.9 m/s² for 6 h
    await duty(trips[2], '2026-11-27', 'FL', 0, 0.9, 21600);
    await duty(trips[2], '2026-11-27', 'FR', 0, 0.9, 21600);
    // floor-to-seat factor 1 for the hand-worked figures: SEAT · √((1 + ρ)/2) = 1 with ρ = 0.5
    await srv.db.sequelize.query('UPDATE suspension_specs SET seat_factor = ?, cab_factor = NULL', { replacements: [1 / Math.sqrt(0.75)] });

    const res1 = await refreshExposure({ sequelize: srv.db.sequelize, now: TEST_NOW, asOf: '2026-11-30', publicUrl: 'http://app.test', runId: null });
    expect(res1).toMatchObject({ exposureDays: 2, exposureDaysAboveAction: 1 });
    const r = await driver.get<{ days: { day: string; a8: number; hours: number; trips: number; status: string }[]; actionValue: number; limitValue: number; caution: string }>('/api/exposure?from=2026-11-01&to=2026-11-30');
    expect(r.status).toBe(200);
    expect(r.body.actionValue).toBe(0.5); // Directive 2002/44/EC Art. 3(2)(b)
    expect(r.body.limitValue).toBe(1.15); // Directive 2002/44/EC Art. 3(2)(a)
    expect(r.body.caution).toMatch(/not a measurement at the seat/);
    const [d1, d2] = r.body.days;
    // Trip A: a_w = √((0.36 + 0.36)/2) = 0.6, T = 2 h → a_w²·T = 0.72
    // Trip B: a_w = √((0.25 + 0.09)/2) = √0.17 = 0.41231, T = 3 h → 0.17 × 3 = 0.51
    // A(8) = √((0.72 + 0.51)/8) = √0.15375 = 0.39211 m/s²
    expect(d1).toMatchObject({ day: '2026-11-20', trips: 2, status: 'within-action-value' });
    expect(d1.a8).toBeCloseTo(0.39211, 5);
    expect(d1.hours).toBeCloseTo(5, 9);
    // Day 2: A(8) = 0.9 × √(6/8) = √(0.81 × 6 / 8) = √0.6075 = 0.77942 m/s² — above the action value
    expect(d2.a8).toBeCloseTo(0.77942, 5);
    expect(d2.status).toBe('exceeds-action-value');

    const mail = await q<{ subject: string; text_body: string }>(`SELECT subject, text_body FROM mail_messages WHERE dedupe_key LIKE 'exposure:%' AND to_address = ?`, [DEMO.manager]);
    expect(mail).toHaveLength(1);
    expect(mail[0].text_body).toMatch(/2026-11-27: A\(8\) 0\.78 m\/s²/);
    // a rerun changes nothing and mails nothing new
    const res2 = await refreshExposure({ sequelize: srv.db.sequelize, now: TEST_NOW, asOf: '2026-11-30', publicUrl: 'http://app.test', runId: null });
    expect(res2.exposureMailsQueued).toBe(0);

    const over = await manager.get<{ daysAbove: { driverId: number; day: string }[]; routes: { id: number; sharePct: number }[]; vehicles: { id: number }[] }>('/api/exposure/overview?from=2026-11-01&to=2026-11-30');
    expect(over.body.daysAbove).toEqual([expect.objectContaining({ driverId, day: '2026-11-27' })]);
    expect(over.body.routes[0].id).toBe(trips[2].route_id);
    expect(over.body.routes.reduce((s, x) => s + x.sharePct, 0)).toBeCloseTo(100, 6);

    // the class defaults: SEAT 0.95 (van) or 0.75 (truck), times √((1 + 0.5)/2) for the two front wheel tracks; a cab factor multiplies in
    await srv.db.sequelize.query('UPDATE suspension_specs SET seat_factor = NULL, cab_factor = NULL');
    await refreshExposure({ sequelize: srv.db.sequelize, now: TEST_NOW, asOf: '2026-11-30', publicUrl: 'http://app.test', runId: null });
    const [cls] = await q<{ vehicle_class: string; spec_id: number }>('SELECT s.vehicle_class, s.id AS spec_id FROM vehicles v JOIN suspension_specs s ON s.id = v.spec_id WHERE v.id = ?', [trips[2].vehicle_id]);
    const seat = cls.vehicle_class === 'heavy goods' ? 0.75 : 0.95;
    const [day2] = await q<{ a8: number; parts: string }>(`SELECT a8, parts FROM driver_exposure_days WHERE driver_id = ? AND day = '2026-11-27'`, [driverId]);
    expect(day2.a8).toBeCloseTo(0.77942 * seat * Math.sqrt(0.75), 4);
    const part = (JSON.parse(day2.parts) as { aw: number; awFloor: number; seatFactor: number }[])[0];
    expect(part.awFloor).toBeCloseTo(0.9, 6);
    expect(part.seatFactor).toBeCloseTo(seat * Math.sqrt(0.75), 4);
    await srv.db.sequelize.query('UPDATE suspension_specs SET cab_factor = 0.8 WHERE id = ?', { replacements: [cls.spec_id] });
    await refreshExposure({ sequelize: srv.db.sequelize, now: TEST_NOW, asOf: '2026-11-30', publicUrl: 'http://app.test', runId: null });
    const [cab] = await q<{ a8: number }>(`SELECT a8 FROM driver_exposure_days WHERE driver_id = ? AND day = '2026-11-27'`, [driverId]);
    expect(cab.a8).toBeCloseTo(0.77942 * seat * Math.sqrt(0.75) * 0.8, 4);
    await srv.db.sequelize.query('UPDATE suspension_specs SET cab_factor = NULL');
  });

  it('when a driver asks for another driver\'s exposure, then it is refused; the manager must name a driver', async () => {
    expect((await driver.get(`/api/exposure?driverId=${otherId}`)).status).toBe(403);
    expect((await other.get(`/api/exposure?driverId=${driverId}`)).status).toBe(403);
    expect((await manager.get(`/api/exposure?driverId=${driverId}&from=2026-11-01`)).status).toBe(200);
    expect((await manager.get('/api/exposure')).status).toBe(400);
  });
});

describe('speed advice', () => {
  const axles = [
    { axleIndex: 0, label: 'front', corner: { sprungMassKg: 430, unsprungMassKg: 46, springRateNPerM: 32000, dampingNsPerM: 2400, tireRateNPerM: 260000 } },
    { axleIndex: 1, label: 'rear', corner: { sprungMassKg: 360, unsprungMassKg: 55, springRateNPerM: 38000, dampingNsPerM: 2500, tireRateNPerM: 270000 } },
  ];
  // The demo's rigid truck (server/demo/seed.ts): dampers ten times the van's.
  const truckAxles = [
    { axleIndex: 0, label: 'front', corner: { sprungMassKg: 2400, unsprungMassKg: 450, springRateNPerM: 600000, dampingNsPerM: 28000, tireRateNPerM: 1600000 } },
    { axleIndex: 1, label: 'rear', corner: { sprungMassKg: 2100, unsprungMassKg: 650, springRateNPerM: 260000, dampingNsPerM: 20000, tireRateNPerM: 1800000 } },
  ];
  const SEAT = 0.95 * Math.sqrt(0.75); // conventional seat, ρ = 0.5
  const spec = prepareSpec(axles, { seatFactor: SEAT });
  const limits = (seatAwLimit: number, multiple = DEFAULT_DAMPER_MULTIPLE) => ({ seatAwLimit, rideLabel: 'comfort' as const, damper: { multiple } });

  it('when the road is rougher, then the advice is lower or equal, and lower over B to F (computed)', () => {
    const adv = ['A', 'B', 'C', 'D', 'E', 'F'].map((c) => adviseSpeed(spec, gdForClass(c), limits(1.6, 8)));
    const speeds = adv.map((a) => (a.belowMinimum ? 0 : a.advisedKmh!));
    for (let i = 1; i < speeds.length; i++) expect(speeds[i], `class ${'ABCDEF'[i]} vs ${'ABCDEF'[i - 1]}: ${speeds}`).toBeLessThanOrEqual(speeds[i - 1]);
    expect(speeds[5]).toBeLessThan(speeds[1]);
    for (let i = 1; i < adv.length; i++) expect(adv[i].rideKmh!).toBeLessThanOrEqual(adv[i - 1].rideKmh!);
  });

  it('when a limit is looser, then the advice is higher or equal (computed)', () => {
    const gd = gdForClass('D');
    const rides = [0.315, 0.63, 1, 1.6, 3].map((l) => adviseSpeed(spec, gd, limits(l, 50)).rideKmh!);
    for (let i = 1; i < rides.length; i++) expect(rides[i]).toBeGreaterThan(rides[i - 1]);
    const powers = [1, 2, 4, 8, 16, 32].map((m) => adviseSpeed(spec, gd, limits(99, m)).powerKmh!);
    for (let i = 1; i < powers.length; i++) expect(powers[i]).toBeGreaterThanOrEqual(powers[i - 1]);
    expect(powers[5]).toBeGreaterThan(powers[0]);
    const hours = [0.5, 2, 4, 8, 12].map((h) => adviseSpeed(spec, gdForClass('B'), limits(dailyExposureLimit(h), 50)).rideKmh!);
    for (let i = 1; i < hours.length; i++) expect(hours[i], `${hours}`).toBeLessThanOrEqual(hours[i - 1]);
  });

  it('when the ride limits, then a fresh closed-form solve at that speed gives the limit at the seat; the damper limit is its own class-B power times the multiple (computed)', () => {
    const gd = gdForClass('D');
    const a = adviseSpeed(spec, gd, limits(0.63, 50));
    expect(a.limitedBy).toBe('comfort');
    const aw = SEAT * dutyOnRoad(prepareDuty(axles[0].corner, a.rideKmh! / 3.6), gd).rmsWeightedAccel;
    expect(Math.abs(aw / 0.63 - 1), `seat a_w ${aw} at ${a.rideKmh} km/h`).toBeLessThan(1e-3); // grid interpolation
    const b = adviseSpeed(spec, gd, limits(99, 3));
    expect(b.limitedBy).toBe('damper power');
    // Reference: mean damper power c·σ_rel² on class B at 80 km/h, from a fresh solve.
    const ratios = axles.map((x) => {
      const ref = dutyOnRoad(prepareDuty(x.corner, 80 / 3.6), gdForClass('B')).damperPowerW;
      return dutyOnRoad(prepareDuty(x.corner, b.powerKmh! / 3.6), gd).damperPowerW / ref;
    });
    expect(Math.abs(Math.max(...ratios) / 3 - 1), `ratios ${ratios} at ${b.powerKmh} km/h`).toBeLessThan(1e-3);
    // The default multiple puts the damper limit at class D, 80 km/h (the wear model's heat line).
    expect(adviseSpeed(spec, gd, limits(99)).powerKmh!).toBeGreaterThan(75);
    expect(adviseSpeed(spec, gd, limits(99)).powerKmh!).toBeLessThan(85);
  });

  it('when the daily-exposure limit is chosen, then the seat a_w at the advised speed is 0.5·√(8/T) (Directive 2002/44/EC A(8); computed)', () => {
    for (const hours of [2, 8]) {
      const limit = 0.5 * Math.sqrt(8 / hours);
      expect(dailyExposureLimit(hours)).toBeCloseTo(limit, 12);
      const a = adviseSpeed(spec, gdForClass('C'), { seatAwLimit: limit, rideLabel: 'daily exposure', damper: { multiple: 50 } });
      expect(a.limitedBy).toBe('daily exposure');
      const aw = SEAT * dutyOnRoad(prepareDuty(axles[0].corner, a.rideKmh! / 3.6), gdForClass('C')).rmsWeightedAccel;
      expect(Math.abs(aw / limit - 1), `a_w ${aw} at ${a.rideKmh} km/h, T ${hours} h`).toBeLessThan(1e-3);
      // A(8) of T hours at that level, from the definition A(8) = a_w·√(T/8).
      expect(aw * Math.sqrt(hours / 8)).toBeCloseTo(0.5, 3);
    }
  });

  it('when laden, then the ride advice is higher (heavier body, lower acceleration) and the damper advice about the same (computed)', () => {
    // With the same tyre forcing a heavier body moves less: the body-bounce frequency falls and the
    // floor's weighted acceleration drops, so unladen is the harsher case for the ride. The mean
    // damper power on a w = 2 road hardly depends on the sprung mass (the power the road puts in
    // is set mainly by the tyre), so the damper limit moves by a few per cent at most.
    const gd = gdForClass('C');
    const unladen = adviseSpeed(spec, gd, limits(1.0, 4));
    const laden = adviseSpeed(prepareSpec(axles, { seatFactor: SEAT, payloadKg: 600 }), gd, limits(1.0, 4));
    expect(laden.rideKmh!).toBeGreaterThan(unladen.rideKmh! * 1.1);
    expect(Math.abs(laden.powerKmh! / unladen.powerKmh! - 1)).toBeLessThan(0.05);
  });

  it('when the damper limit is relative, then truck and van get advice of the same order on class D; an absolute 150 W would hold the truck to walking pace (computed)', () => {
    const truck = prepareSpec(truckAxles, { seatFactor: 0.75 * Math.sqrt(0.75) });
    const gd = gdForClass('D');
    const v = adviseSpeed(spec, gd, limits(99, 4)).powerKmh!;
    const t = adviseSpeed(truck, gd, limits(99, 4)).powerKmh!;
    expect(t / v, `truck ${t} van ${v}`).toBeGreaterThan(0.6);
    expect(t / v).toBeLessThan(1.6);
    expect(t).toBeGreaterThan(MIN_ADVICE_KMH);
    const abs = adviseSpeed(truck, gd, { seatAwLimit: 99, rideLabel: 'comfort', damper: { absoluteW: 150 } });
    expect(abs.belowMinimum).toBe(true);
    expect(abs.advisedKmh).toBeNull();
  });

  it('when the limits are not met at the floor speed, then there is no figure but the road needs attention', () => {
    const a = adviseSpeed(spec, gdForClass('F'), limits(0.315));
    expect(a.belowMinimum).toBe(true);
    expect(a.advisedKmh).toBeNull();
    expect(a.rideKmh!).toBeLessThan(MIN_ADVICE_KMH);
    expect(ROAD_ATTENTION).toMatch(new RegExp(`needs attention.*${MIN_ADVICE_KMH} km/h.*Report the segment`));
    const ok = adviseSpeed(spec, gdForClass('B'), limits(1));
    expect(ok.advisedKmh!).toBeGreaterThanOrEqual(MIN_ADVICE_KMH);
  });

  it('when the API is asked for a route, then every rated segment gets advice or a call for attention, rougher segments never faster, with the assumptions and caution', async () => {
    type Body = {
      segments: { gdN0: number | null; advisedKmh: number | null; belowMinimum: boolean }[];
      chart: { points: { speedKmh: number; seatWeightedAccel: number; damperPowerRatio: number }[] };
      caution: string;
      assumptions: string[];
      load: { case: string; payloadKg: number };
      damper: { multiple: number | null; absoluteW: number | null; axles: { referencePowerW: number; limitW: number }[] };
      comfort: { key: string; limit: number };
    };
    const r = await driver.get<Body>('/api/routes/1/speed-advice?comfort=fairly&damperMultiple=8');
    expect(r.status).toBe(200);
    expect(r.body.caution).toMatch(/Posted limits/);
    expect(r.body.load.case).toBe('laden');
    expect(r.body.damper.multiple).toBe(8);
    for (const a of r.body.damper.axles) expect(a.limitW).toBeCloseTo(8 * a.referencePowerW, 9);
    const text = r.body.assumptions.join(' ');
    for (const w of [/Load: laden/, /SEAT/, /ρ = 0\.5/, /8× its own mean power on ISO 8608 class B at 80 km\/h/, /No advice below 20 km\/h/]) expect(text).toMatch(w);
    const rated = r.body.segments.filter((s) => s.gdN0 !== null);
    expect(rated.length).toBeGreaterThan(0);
    const speed = (s: Body['segments'][number]) => (s.belowMinimum ? 0 : s.advisedKmh!);
    const sorted = [...rated].sort((a, b) => a.gdN0! - b.gdN0!);
    for (let i = 1; i < sorted.length; i++) expect(speed(sorted[i])).toBeLessThanOrEqual(speed(sorted[i - 1]));
    for (const s of rated) expect(s.belowMinimum || s.advisedKmh! >= MIN_ADVICE_KMH).toBe(true);
    const pts = r.body.chart.points;
    for (let i = 1; i < pts.length; i++) expect(pts[i].damperPowerRatio).toBeGreaterThan(pts[i - 1].damperPowerRatio);

    const un = await driver.get<Body>('/api/routes/1/speed-advice?load=unladen');
    expect(un.body.load).toMatchObject({ case: 'unladen', payloadKg: 0 });
    const daily = await driver.get<Body>('/api/routes/1/speed-advice?comfort=daily-exposure&exposureHours=2');
    expect(daily.status).toBe(200);
    expect(daily.body.comfort.limit).toBeCloseTo(1, 9); // 0.5·√(8/2)
    expect(daily.body.assumptions.join(' ')).toMatch(/2 h a day/);
    const abs = await driver.get<Body>('/api/routes/1/speed-advice?powerLimitW=300&load=laden&payloadKg=500');
    expect(abs.body.damper).toMatchObject({ multiple: null, absoluteW: 300 });
    expect(abs.body.load.payloadKg).toBe(500);

    for (const [qs, field] of [
      ['comfort=bumpy', 'comfort'],
      ['damperMultiple=0.5', 'damperMultiple'],
      ['damperMultiple=lots', 'damperMultiple'],
      ['load=half', 'load'],
      ['exposureHours=0', 'exposureHours'],
      ['exposureHours=30', 'exposureHours'],
      ['load=unladen&payloadKg=300', 'payloadKg'],
      ['payloadKg=-1', 'payloadKg'],
      ['powerLimitW=1', 'powerLimitW'],
      ['speed=50', ''],
    ] as const) {
      const bad = await driver.get<{ error: { fields: Record<string, string> } }>(`/api/routes/1/speed-advice?${qs}`);
      expect(bad.status, qs).toBe(400);
      if (field) expect(bad.body.error.fields[field], qs).toBeTruthy();
    }
  });
});
