import { describe, expect, it } from 'vitest';
import { TEST_NOW } from '../../support/server';
import { ApiClient, DEMO } from '../../support/client';
import { snapToSegments } from '../../../server/drivers/snap';
import { currentValue } from '../../../server/roads/current-roughness';
import { classifyGd, gdForClass } from '../../../server/physics/iso8608';
import { iriFromGd } from '../../../server/physics/iri';
import { queueDigests } from '../../../server/mail/service';
import type { LonLat } from '../../../server/roads/geometry';
import { driversFixture } from './fixture';

const { srv, q, ids, manager, driver, other } = driversFixture();

/** A 1×1 PNG (the smallest valid image). */
const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8cfc0f01f0005000201a0e7d6a90000000049454e44ae426082', 'hex');

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
    expect((await other.get(`/api/ride-reports?driverId=${ids.driver}`)).status).toBe(403);
    const own = await other.get<{ items: { driverId: number }[] }>('/api/ride-reports');
    expect(own.body.items.every((r) => r.driverId === ids.other)).toBe(true);
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
    await srv.db.sequelize.query('UPDATE users SET notify_ride_reports = FALSE WHERE id = ?', { replacements: [ids.other] });
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