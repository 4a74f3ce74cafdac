import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { managerForFile } from '../support/server';
import { iriSegments, gdFromIri, iriFromGd } from '../../server/physics/iri';
import { classifyGd, synthesizeProfile } from '../../server/physics/iso8608';
import { formatProfileCsv, loadSurveyProfile, parseProfileCsv } from '../../server/roads/profile-store';
import { pickCurrent } from '../../server/roads/current-roughness';
import { mapConfigOf } from '../../server/roads/routes';
import { loadConfig } from '../../server/config';

const { srv, manager } = managerForFile();

const TABLES = ['routes', 'route_segments', 'roughness_observations', 'road_surveys'];
async function counts() {
  const out: Record<string, number> = {};
  for (const t of TABLES) {
    const [rows] = await srv.db.sequelize.query(`SELECT COUNT(*) AS n FROM ${t}`);
    out[t] = Number((rows as { n: number }[])[0].n);
  }
  out.files = fs.existsSync(path.join(srv.dataDir, 'surveys')) ? fs.readdirSync(path.join(srv.dataDir, 'surveys')).length : 0;
  return out;
}

function upload(routeId: number, csv: string, opts: { preview?: boolean; name?: string; surveyedOn?: string } = {}) {
  const form = new FormData();
  form.set('file', new Blob([csv], { type: 'text/csv' }), opts.name ?? 'profile.csv');
  if (opts.surveyedOn) form.set('surveyedOn', opts.surveyedOn);
  return manager.raw('POST', `/api/routes/${routeId}/surveys${opts.preview ? '?preview=true' : ''}`, { form });
}

interface Detail {
  route: { id: number; name: string; lengthM: number; segmentLengthM: number; defaultSpeedKmh: number };
  segments: { id: number; seq: number; startM: number; endM: number; iri: number | null; isoClass: string | null; roughnessSource: string | null; surveyId: number | null; speedKmh: number | null }[];
  surveys: { id: number; surveyedOn: string }[];
  trips: { count: number };
}

const line = [
  [-1.5, 52.6],
  [-1.49, 52.6],
  [-1.49, 52.605],
] as [number, number][];

describe('demo surveys', () => {
  it('when seeded, then surveyed segments point to a stored profile whose golden-car IRI is the segment IRI (computed)', async () => {
    const routes = await manager.get<{ items: { id: number; name: string }[] }>('/api/routes?pageSize=200');
    const quarry = routes.body.items.find((r) => r.name === 'Quarry Lane aggregates')!;
    const d = await manager.get<Detail>(`/api/routes/${quarry.id}`);
    expect(d.body.surveys.length).toBe(1);
    const seg = d.body.segments[5];
    expect(seg.roughnessSource).toBe('survey');
    expect(seg.surveyId).toBe(d.body.surveys[0].id);
    const p = await loadSurveyProfile(srv.dataDir, seg.surveyId!);
    expect(p.dxM).toBe(0.25);
    expect(p.startM).toBe(0);
    const bins = iriSegments(p.elevationsM, p.dxM, 100);
    expect(seg.iri!).toBeCloseTo(bins[5].iri, 2);
  });

  it('when seeded, then no demo segment is rougher than the roughest unpaved roads (IRI under 35 m/km, docs/methods.md "Road roughness"), and rough stretches exist', async () => {
    // snake_case names: PostgreSQL folds an unquoted alias to lower case
    const [row] = await srv.db.sequelize.query<{ max_gd: number; max_iri: number | null; rough: number }>(
      `SELECT MAX(gd_n0) AS max_gd, MAX(iri) AS max_iri, SUM(CASE WHEN iso_class = 'D' THEN 1 ELSE 0 END) AS rough FROM route_segments`,
      { type: 'SELECT' as never },
    );
    expect(iriFromGd(row.max_gd)).toBeLessThan(35);
    expect(row.max_iri ?? 0).toBeLessThan(35);
    expect(Number(row.rough)).toBeGreaterThan(50);
  });
});

describe('routes', () => {
  it('when a manager previews and creates a route from coordinates, then it is split into segments of the chosen length', async () => {
    const body = { name: 'Test lane', defaultSpeedKmh: 40, segmentLengthM: 100, line: { format: 'coordinates', coordinates: line } };
    const before = await counts();
    const prev = await manager.json<{ lengthM: number; segments: { startM: number; endM: number }[] }>('POST', '/api/routes?preview=true', body);
    expect(prev.status).toBe(200);
    expect(prev.body.lengthM).toBeGreaterThan(1200);
    expect(await counts()).toEqual(before);
    const res = await manager.json<Detail>('POST', '/api/routes', { ...body, statedClass: 'C' });
    expect(res.status).toBe(201);
    const segs = res.body.segments;
    // splitLine: whole 100 m segments, plus the remainder as its own segment when ≥ 25 m
    const L = prev.body.lengthM;
    expect(segs.length).toBe(Math.floor(L / 100) + (L % 100 >= 25 ? 1 : 0));
    expect(segs[0].endM - segs[0].startM).toBeCloseTo(100, 6);
    expect(segs.every((s) => s.isoClass === 'C' && s.roughnessSource === 'stated')).toBe(true);
  });

  it('when the route comes as GeoJSON or as a CSV of points, then it is read', async () => {
    const geo = JSON.stringify({ type: 'Feature', properties: {}, geometry: { type: 'LineString', coordinates: line } });
    const a = await manager.json<Detail>('POST', '/api/routes', { name: 'Geo lane', defaultSpeedKmh: 50, line: { format: 'geojson', text: geo } });
    expect(a.status).toBe(201);
    const csv = 'lat,lon\n' + line.map(([lon, lat]) => `${lat},${lon}`).join('\n');
    const b = await manager.json<Detail>('POST', '/api/routes', { name: 'Csv lane', defaultSpeedKmh: 50, segmentLengthM: 200, line: { format: 'csv', text: csv } });
    expect(b.status).toBe(201);
    expect(b.body.route.lengthM).toBeCloseTo(a.body.route.lengthM, 6);
    expect(b.body.segments.length).toBeLessThan(a.body.segments.length);
  });

  it('when route input is bad, then the error names the field or row and nothing is saved', async () => {
    const before = await counts();
    const cases: [unknown, string][] = [
      [{ name: 'X1', defaultSpeedKmh: 40, line: { format: 'csv', text: 'lat,lon\n52.6,-1.5\nabc,-1.49\n' } }, 'line'],
      [{ name: 'X2', defaultSpeedKmh: 40, line: { format: 'geojson', text: '{"type":"Point","coordinates":[0,0]}' } }, 'line'],
      [{ name: 'X3', defaultSpeedKmh: 400, line: { format: 'coordinates', coordinates: line } }, 'defaultSpeedKmh'],
      [{ name: 'X4', defaultSpeedKmh: 40, segmentLengthM: 1, line: { format: 'coordinates', coordinates: line } }, 'segmentLengthM'],
      [{ name: 'X5', defaultSpeedKmh: 40, depotId: 999, line: { format: 'coordinates', coordinates: line } }, 'depotId'],
    ];
    for (const [body, field] of cases) {
      const r = await manager.json<{ error: { fields: Record<string, string>; message: string } }>('POST', '/api/routes', body);
      expect(r.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys(r.body.error.fields).join(), JSON.stringify(r.body)).toContain(field);
    }
    const csvErr = await manager.json<{ error: { fields: Record<string, string> } }>('POST', '/api/routes', cases[0][0]);
    expect(csvErr.body.error.fields.line).toContain('Row 3');
    const dup = await manager.json('POST', '/api/routes', { name: 'Test lane', defaultSpeedKmh: 40, line: { format: 'coordinates', coordinates: line } });
    expect(dup.status).toBe(409);
    expect(await counts()).toEqual(before);
  });

  it('when a manager edits a route and its segment speeds, then they are stored; bad segments are refused', async () => {
    const list = await manager.get<{ items: { id: number; name: string }[] }>('/api/routes?q=Test%20lane');
    const id = list.body.items[0].id;
    const p = await manager.json<Detail>('PATCH', `/api/routes/${id}`, { defaultSpeedKmh: 45, description: 'edited' });
    expect(p.status).toBe(200);
    expect(p.body.route.defaultSpeedKmh).toBe(45);
    const s = await manager.json('PUT', `/api/routes/${id}/speeds`, { segments: [{ seq: 0, speedKmh: 20 }, { seq: 1, speedKmh: null }] });
    expect(s.status).toBe(200);
    const d = await manager.get<Detail>(`/api/routes/${id}`);
    expect(d.body.segments[0].speedKmh).toBe(20);
    const bad = await manager.json<{ error: { fields: Record<string, string> } }>('PUT', `/api/routes/${id}/speeds`, { segments: [{ seq: 0, speedKmh: 10 }, { seq: 999, speedKmh: 30 }] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields['segments.1.seq']).toContain('999');
    expect((await manager.get<Detail>(`/api/routes/${id}`)).body.segments[0].speedKmh).toBe(20);
    const bad2 = await manager.json<{ error: { fields: Record<string, string> } }>('PUT', `/api/routes/${id}/speeds`, { segments: [{ seq: 0, speedKmh: 500 }] });
    expect(Object.keys(bad2.body.error.fields)).toContain('segments.0.speedKmh');
  });
});

describe('manual roughness and the current-value rule', () => {
  it('when the rule picks, then the newest wins and on a tie survey beats stated beats driver report', () => {
    expect(pickCurrent([
      { id: 1, source: 'survey' as const, observedOn: '2026-01-01' },
      { id: 2, source: 'stated' as const, observedOn: '2026-02-01' },
    ])!.id).toBe(2);
    expect(pickCurrent([
      { id: 1, source: 'driver_report' as const, observedOn: '2026-02-01' },
      { id: 2, source: 'stated' as const, observedOn: '2026-02-01' },
      { id: 3, source: 'survey' as const, observedOn: '2026-02-01' },
    ])!.id).toBe(3);
    expect(pickCurrent([])).toBeNull();
  });

  it('when a manager sets a class by hand, then it becomes current with history; an IRI sets class from IRI', async () => {
    const list = await manager.get<{ items: { id: number }[] }>('/api/routes?q=Geo%20lane');
    const id = list.body.items[0].id;
    const r = await manager.json('POST', `/api/routes/${id}/roughness`, { seqFrom: 0, seqTo: 2, isoClass: 'E', observedOn: '2026-11-01' });
    expect(r.status).toBe(201);
    const r2 = await manager.json<{ isoClass: string }>('POST', `/api/routes/${id}/roughness`, { seqFrom: 3, seqTo: 3, iri: 4.4, observedOn: '2026-11-01' });
    expect(r2.body.isoClass).toBe(classifyGd(gdFromIri(4.4)));
    const d = await manager.get<Detail>(`/api/routes/${id}`);
    expect(d.body.segments.slice(0, 3).map((s) => s.isoClass)).toEqual(['E', 'E', 'E']);
    expect(d.body.segments[3].iri).toBe(4.4);
    const seg = await manager.get<{ observations: unknown[]; segment: { isoClass: string } }>(`/api/segments/${d.body.segments[0].id}`);
    expect(seg.body.observations.length).toBe(1);
    const segList = await manager.get<{ items: { isoClass: string }[]; total: number }>(`/api/segments?routeId=${id}&isoClass=E`);
    expect(segList.body.total).toBe(3);
  });

  it('when manual roughness is bad, then the field is named and nothing changes', async () => {
    const list = await manager.get<{ items: { id: number }[] }>('/api/routes?q=Geo%20lane');
    const id = list.body.items[0].id;
    const before = await counts();
    const cases: [unknown, string][] = [
      [{ seqFrom: 0, seqTo: 1, observedOn: '2026-11-01' }, 'isoClass'],
      [{ seqFrom: 0, seqTo: 1, isoClass: 'Z', observedOn: '2026-11-01' }, 'isoClass'],
      [{ seqFrom: 0, seqTo: 1, isoClass: 'B', iri: 3, observedOn: '2026-11-01' }, 'isoClass'],
      [{ seqFrom: 0, seqTo: 999, isoClass: 'B', observedOn: '2026-11-01' }, 'seqTo'],
      [{ seqFrom: 0, seqTo: 1, isoClass: 'B', observedOn: '2027-05-01' }, 'observedOn'],
      [{ seqFrom: 0, seqTo: 1, iri: 500, observedOn: '2026-11-01' }, 'iri'],
    ];
    for (const [body, field] of cases) {
      const r = await manager.json<{ error: { fields: Record<string, string> } }>('POST', `/api/routes/${id}/roughness`, body);
      expect(r.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys(r.body.error.fields), JSON.stringify(r.body)).toContain(field);
    }
    expect(await counts()).toEqual(before);
  });
});

describe('profile survey upload', () => {
  const profile = synthesizeProfile({ gdN0: 1024e-6, lengthM: 1000, dxM: 0.25, seed: 77 });
  const csv = formatProfileCsv({ dxM: 0.25, startM: 0, elevationsM: profile });

  it('when a manager previews a survey, then IRI per segment equals the engine on the same profile (iriSegments, computed) and nothing is saved', async () => {
    const list = await manager.get<{ items: { id: number }[] }>('/api/routes?q=Test%20lane');
    const id = list.body.items[0].id;
    const before = await counts();
    const res = await upload(id, csv, { preview: true });
    expect(res.status).toBe(200);
    const body = (await res.json()) as { segments: { seq: number; iri: number; isoClass: string }[]; summary: { dxM: number; pointCount: number } };
    const parsed = parseProfileCsv(csv);
    const engine = iriSegments(parsed.elevationsM, 0.25, 100);
    expect(body.summary.pointCount).toBe(4001);
    expect(body.segments.length).toBe(10);
    for (const s of body.segments) expect(s.iri).toBeCloseTo(engine[s.seq].iri, 9);
    expect(await counts()).toEqual(before);
  });

  it('when a manager saves a survey, then observations, the stored file and current values follow, and the file reads back', async () => {
    const list = await manager.get<{ items: { id: number }[] }>('/api/routes?q=Test%20lane');
    const id = list.body.items[0].id;
    const before = await counts();
    // surveyed before the class stated on creation (today): the stated value stays current (newest wins)
    const older = await upload(id, csv, { surveyedOn: '2026-11-20', name: 'old-survey.csv' });
    expect(older.status).toBe(201);
    expect((await manager.get<Detail>(`/api/routes/${id}`)).body.segments[0].roughnessSource).toBe('stated');
    // surveyed today: a tie on date, and a survey beats a stated value
    const res = await upload(id, csv, { name: 'lane-survey.csv' });
    expect(res.status).toBe(201);
    const body = (await res.json()) as { surveyId: number; segments: { seq: number; iri: number }[] };
    const after = await counts();
    expect(after.road_surveys).toBe(before.road_surveys + 2);
    expect(after.roughness_observations).toBe(before.roughness_observations + 20);
    expect(after.files).toBe(before.files + 2);
    const d = await manager.get<Detail>(`/api/routes/${id}`);
    const engine = iriSegments(profile, 0.25, 100);
    for (const s of d.body.segments.slice(0, 10)) {
      expect(s.roughnessSource).toBe('survey');
      expect(s.surveyId).toBe(body.surveyId);
      expect(s.iri!).toBeCloseTo(engine[s.seq].iri, 3);
      expect(s.isoClass).toBe(classifyGd(gdFromIri(s.iri!)));
    }
    expect(d.body.surveys[0].id).toBe(body.surveyId);
    const back = await loadSurveyProfile(srv.dataDir, body.surveyId);
    expect(back.elevationsM.length).toBe(4001);
    const file = await manager.raw('GET', `/api/surveys/${body.surveyId}/file`);
    expect(file.status).toBe(200);
    expect((await file.text()).split('\n')[0]).toBe('distance_m,elevation_m');
  });

  it('when a profile file is bad, then the error names the row and nothing is half-saved', async () => {
    const list = await manager.get<{ items: { id: number }[] }>('/api/routes?q=Geo%20lane');
    const id = list.body.items[0].id;
    const before = await counts();
    const rows = (n: number, dx = 0.25) => Array.from({ length: n }, (_, i) => `${(i * dx).toFixed(2)},0.00${i % 7}`);
    const cases: [string, string, number][] = [
      ['dist,height\n0,0\n', 'row 1', 400],
      [['distance_m,elevation_m', ...rows(50), '12.50,abc', ...rows(100).slice(51)].join('\n'), 'row 52', 400],
      [['distance_m,elevation_m', ...rows(50), '13.00,0.001'].join('\n'), 'row 52', 400],
      [['distance_m,elevation_m', ...rows(100, 0.5)].join('\n'), 'row 3', 400],
      [['distance_m,elevation_m', ...rows(20)].join('\n'), 'file', 400],
      [['distance_m,elevation_m', ...rows(50).map((r) => `${r},9`)].join('\n'), 'row 2', 400],
    ];
    for (const [text, field, status] of cases) {
      const r = await upload(id, text);
      const b = (await r.json()) as { error: { fields: Record<string, string>; message: string } };
      expect(r.status, text.slice(0, 60)).toBe(status);
      expect(Object.keys(b.error.fields), JSON.stringify(b)).toContain(field);
    }
    const binary = await upload(id, '\u0000\u0001\u0002PNG');
    expect(binary.status).toBe(400);
    const noFile = await manager.raw('POST', `/api/routes/${id}/surveys`, { form: new FormData() });
    expect(((await noFile.json()) as { error: { fields: Record<string, string> } }).error.fields.file).toBeTruthy();
    const future = await upload(id, csv, { surveyedOn: '2027-01-01' });
    expect(future.status).toBe(400);
    const missing = await upload(99999, csv);
    expect(missing.status).toBe(404);
    expect(await counts()).toEqual(before);
  });
});

describe('map', () => {
  it('when the map loads, then every segment comes with its class and geometry, and the config points to the offline tiles', async () => {
    const m = await manager.get<{ segments: { id: number[]; isoClass: (string | null)[]; coords: unknown[] }; depots: unknown[] }>('/api/map/segments');
    expect(m.body.segments.id.length).toBeGreaterThan(3000);
    expect(m.body.segments.coords.length).toBe(m.body.segments.id.length);
    expect(m.body.depots.length).toBe(2);
    const cfg = await manager.get<{ tileUrl: string }>('/api/map-config');
    expect(cfg.body.tileUrl).toBe('/tiles/{z}/{x}/{y}.png');
    const tile = await fetch(`${srv.url}/tiles/10/507/337.png`);
    expect(tile.status).toBe(200);
    expect(tile.headers.get('content-type')).toBe('image/png');
    const bytes = new Uint8Array(await tile.arrayBuffer());
    expect([...bytes.slice(1, 4)].map((c) => String.fromCharCode(c)).join('')).toBe('PNG');
    expect((await fetch(`${srv.url}/tiles/2/9/0.png`)).status).toBe(404);
  });

  it('when MAP_TILE_URL is set, then map-config returns it with its attribution; unset, the offline tiles', () => {
    const set = mapConfigOf(loadConfig({ MAP_TILE_URL: 'https://tiles.example/{z}/{x}/{y}.png', MAP_TILE_ATTRIBUTION: '© Example' }));
    expect(set).toEqual({ tileUrl: 'https://tiles.example/{z}/{x}/{y}.png', attribution: '© Example', offline: false });
    expect(mapConfigOf(loadConfig({})).tileUrl).toBe('/tiles/{z}/{x}/{y}.png');
  });
});

describe('map data validators', () => {
  it('when the map data is asked for again with its ETag, then 304 without a body; after a segment changes, the new data with a new ETag', async () => {
    const first = await manager.raw('GET', '/api/map/segments');
    expect(first.status).toBe(200);
    const etag = first.headers.get('etag')!;
    expect(etag).toMatch(/^"map-[0-9a-f]{24}"$/);
    expect(first.headers.get('cache-control')).toBe('private, no-cache');
    const data = (await first.json()) as { segments: { id: number[]; isoClass: (string | null)[] } };
    const again = await manager.raw('GET', '/api/map/segments', { headers: { 'if-none-match': etag } });
    expect(again.status).toBe(304);
    expect(await again.text()).toBe('');
    // a class change on the first segment of route 1 shows in the next answer
    const k = data.segments.id.indexOf(Math.min(...data.segments.id));
    const next = data.segments.isoClass[k] === 'H' ? 'G' : 'H';
    const set = await manager.json('POST', '/api/routes/1/roughness', { seqFrom: 0, seqTo: 0, isoClass: next, observedOn: '2026-11-29' });
    expect(set.status).toBe(201);
    const changed = await manager.raw('GET', '/api/map/segments', { headers: { 'if-none-match': etag } });
    expect(changed.status).toBe(200);
    expect(changed.headers.get('etag')).not.toBe(etag);
    const after = (await changed.json()) as { segments: { id: number[]; isoClass: (string | null)[] } };
    expect(after.segments.isoClass[after.segments.id.indexOf(data.segments.id[k])]).toBe(next);
  });
});
