import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../support/server';
import { ApiClient, DEMO } from '../support/client';
import { adhesionPct } from '../../server/physics/adhesion';
import { estimateDamping } from '../../server/workshop/service';

interface Corner { damperId: number; position: string; axleIndex: number; lifeUsedFraction: number; dampingNsPerM: number; nominalNsPerM: number; basis: string }
interface ListItem { id: number; vehicle: { id: number; fleetNumber: string }; status: string; assignee: { id: number } | null; corners: Corner[] }
interface Axle { axleIndex: number; corner: { sprungMassKg: number; unsprungMassKg: number; springRateNPerM: number; dampingNsPerM: number; tireRateNPerM: number } }

const PNG = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(64, 1)]);
const PDF = Buffer.from('%PDF-1.4\n% test-lane printout\n%%EOF\n');
const form = (kind: string, buf: Buffer, name: string) => {
  const f = new FormData();
  f.append('kind', kind);
  f.append('file', new Blob([new Uint8Array(buf)]), name);
  return f;
};

let srv: TestServer;
const manager = () => { const c = new ApiClient(srv.url); return c.login(DEMO.manager).then(() => c); };
const mechanic = () => { const c = new ApiClient(srv.url); return c.login(DEMO.mechanic).then(() => c); };
let inspection: ListItem;
let mechanicId: number;

beforeAll(async () => {
  srv = await startTestServer();
  const m = await manager();
  const open = await m.get<{ items: ListItem[] }>('/api/inspections?status=open&pageSize=200');
  expect(open.status).toBe(200);
  const mech = await mechanic();
  mechanicId = (await mech.get<{ user: { id: number } }>('/api/auth/me')).body.user.id;
  inspection = open.body.items[0];
  const a = await m.json('PATCH', `/api/inspections/${inspection.id}`, { assigneeId: mechanicId });
  expect(a.status).toBe(200);
});
afterAll(() => srv?.stop());

describe('inverse damping estimate', () => {
  it('when an adhesion % is simulated for a known worn damping, then the estimate recovers that damping within 0.5 % (computed)', () => {
    const corner = { sprungMassKg: 430, unsprungMassKg: 46, springRateNPerM: 32000, dampingNsPerM: 2400, tireRateNPerM: 260000 };
    for (const worn of [1300, 1600, 2100]) {
      const pct = adhesionPct({ ...corner, dampingNsPerM: worn }).adhesionPct;
      const est = estimateDamping(corner, pct);
      expect(est.note, `adhesion ${pct} %`).toBeNull();
      expect(Math.abs(est.dampingNsPerM! / worn - 1), `worn ${worn} N·s/m → ${pct.toFixed(2)} % → ${est.dampingNsPerM}; tol 0.5 %`).toBeLessThan(0.005);
    }
  });

  it('when the adhesion is above what any worn damping explains, then no estimate is made and the reason is kept', () => {
    const corner = { sprungMassKg: 430, unsprungMassKg: 46, springRateNPerM: 32000, dampingNsPerM: 2400, tireRateNPerM: 260000 };
    const est = estimateDamping(corner, 99);
    expect(est.dampingNsPerM).toBeNull();
    expect(est.note).toMatch(/no damping value explains 99 %/);
  });
});

describe('inspections for the mechanic', () => {
  it('when the manager assigns an inspection, then it is in the mechanic\'s list with each corner\'s predicted state and an assignment note is queued', async () => {
    const mech = await mechanic();
    const mine = await mech.get<{ items: ListItem[]; total: number }>('/api/inspections?assignee=me');
    expect(mine.status).toBe(200);
    const it = mine.body.items.find((x) => x.id === inspection.id)!;
    expect(it).toBeTruthy();
    expect(it.corners.length).toBeGreaterThanOrEqual(4);
    for (const c of it.corners) {
      expect(c.lifeUsedFraction).toBeGreaterThanOrEqual(0);
      expect(c.dampingNsPerM).toBeGreaterThan(0);
    }
    const [mail] = await srv.db.sequelize.query<{ n: number }>(`SELECT COUNT(*) AS n FROM mail_messages WHERE kind = 'assignment' AND dedupe_key LIKE ?`, { replacements: [`assignment:${inspection.id}:%`], type: 'SELECT' as never });
    expect(Number(mail.n)).toBe(1);
  });

  it('when a driver or an unknown filter asks, then access is refused or the field is named', async () => {
    const d = new ApiClient(srv.url);
    await d.login(DEMO.driver);
    expect((await d.get('/api/inspections')).status).toBe(403);
    const m = await manager();
    const bad = await m.get<{ error: { fields: Record<string, string> } }>('/api/inspections?status=later');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.status).toBeTruthy();
  });

  it('when test-lane results are recorded, then each adhesion % becomes a measured damping beside the predicted one, the wear state takes it, and a large left–right difference is flagged', async () => {
    const mech = await mechanic();
    const veh = await mech.get<{ vehicle: { specId: number } }>(`/api/vehicles/${inspection.vehicle.id}`);
    const spec = await mech.get<{ spec: { axles: Axle[] } }>(`/api/specs/${veh.body.vehicle.specId}`);
    const a0 = spec.body.spec.axles.find((a) => a.axleIndex === 0)!;
    const corner = a0.corner;
    const known = corner.dampingNsPerM * 0.75;
    const flPct = adhesionPct({ ...corner, dampingNsPerM: known }).adhesionPct;
    const frPct = Math.min(100, flPct + 20);
    const res = await mech.json<{ results: { position: string; measuredNsPerM: number | null; predictedNsPerM: number; estimateNote: string | null }[]; axleDifferences: { axleIndex: number; flagged: boolean; differencePoints: number }[]; status: string }>(
      'POST',
      `/api/inspections/${inspection.id}/results`,
      {
        odometerKm: 200000,
        notes: 'Front left weak on the lane.',
        corners: [
          { position: 'FL', adhesionPct: flPct, findings: ['oil_leak'], verdict: 'replace' },
          { position: 'FR', adhesionPct: frPct, findings: [], verdict: 'monitor' },
          { position: 'RL', adhesionPct: null, findings: ['tyre_uneven_wear'], verdict: 'ok' },
        ],
      },
    );
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const fl = res.body.results.find((r) => r.position === 'FL')!;
    expect(Math.abs(fl.measuredNsPerM! / known - 1), `measured ${fl.measuredNsPerM} vs ${known}`).toBeLessThan(0.005);
    expect(fl.predictedNsPerM).toBeGreaterThan(0);
    expect(res.body.axleDifferences.find((a) => a.axleIndex === 0)!.flagged).toBe(true);
    expect(res.body.status).not.toBe('done');
    const ws = await mech.get<{ corners: Corner[]; comparisons: { position: string; measuredNsPerM: number }[] }>(`/api/vehicles/${inspection.vehicle.id}/workshop`);
    const flNow = ws.body.corners.find((c) => c.position === 'FL')!;
    expect(flNow.dampingNsPerM).toBeCloseTo(fl.measuredNsPerM!, 6);
    expect(ws.body.comparisons.some((c) => c.position === 'FL')).toBe(true);
    const m = await manager();
    const check = await m.get<{ n: number; biasNsPerM: number }>('/api/model-check');
    expect(check.body.n).toBeGreaterThanOrEqual(1);
    expect(Number.isFinite(check.body.biasNsPerM)).toBe(true);
  });

  it('when results name a corner the vehicle does not have or give a bad adhesion, then the field is named and nothing is saved', async () => {
    const mech = await mechanic();
    const r = await mech.json<{ error: { fields: Record<string, string> } }>('POST', `/api/inspections/${inspection.id}/results`, {
      odometerKm: 1, corners: [{ position: 'FL', adhesionPct: 140, findings: [], verdict: 'ok' }],
    });
    expect(r.status).toBe(400);
    expect(r.body.error.fields['corners.0.adhesionPct']).toMatch(/0–100/);
    const r2 = await mech.json<{ error: { fields: Record<string, string> } }>('POST', `/api/inspections/${inspection.id}/results`, {
      odometerKm: 1, corners: [{ position: 'ZZ', adhesionPct: 40, findings: [], verdict: 'ok' }],
    });
    expect(r2.status).toBe(400);
    expect(r2.body.error.fields['corners.0.position']).toMatch(/no damper/);
  });
});

describe('attachments', () => {
  it('when a PNG photo and a PDF printout are sent, then both are stored under DATA_DIR with random names', async () => {
    const mech = await mechanic();
    const p = await mech.raw('POST', `/api/inspections/${inspection.id}/attachments`, { form: form('photo', PNG, 'front-left.png') });
    expect(p.status).toBe(201);
    const pdf = await mech.raw('POST', `/api/inspections/${inspection.id}/attachments`, { form: form('printout', PDF, 'lane.pdf') });
    expect(pdf.status).toBe(201);
    const files = fs.readdirSync(path.join(srv.dataDir, 'attachments'));
    expect(files.length).toBe(2);
    for (const f of files) expect(f).toMatch(/^[a-f0-9]{32}\.(png|pdf)$/);
    const body = (await p.json()) as { url: string };
    const got = await mech.raw('GET', body.url);
    expect(got.status).toBe(200);
    expect(got.headers.get('content-type')).toBe('image/png');
  });

  it('when the content is not an image or PDF (whatever its name says), then it is refused', async () => {
    const mech = await mechanic();
    const r = await mech.raw('POST', `/api/inspections/${inspection.id}/attachments`, { form: form('photo', Buffer.from('<html><script>alert(1)</script>'), 'photo.png') });
    expect(r.status).toBe(400);
    const pdfAsPhoto = await mech.raw('POST', `/api/inspections/${inspection.id}/attachments`, { form: form('photo', PDF, 'photo.jpg') });
    expect(pdfAsPhoto.status).toBe(400);
  });

  it('when the file is larger than the limit, then it is refused with 413', async () => {
    const mech = await mechanic();
    const big = Buffer.concat([PNG, Buffer.alloc(8 * 1024 * 1024 + 10)]);
    const r = await mech.raw('POST', `/api/inspections/${inspection.id}/attachments`, { form: form('photo', big, 'big.png') });
    expect(r.status).toBe(413);
  });

  it('when the file name tries to climb out of the folder, then nothing is written outside the attachments folder', async () => {
    const mech = await mechanic();
    const before = fs.readdirSync(srv.dataDir).sort();
    const r = await mech.raw('POST', `/api/inspections/${inspection.id}/attachments`, { form: form('photo', PNG, '../../escape.png') });
    // busboy keeps only the base name unless asked otherwise; a name that still holds a folder part is refused
    if (r.status === 201) {
      const b = (await r.json()) as { originalName: string };
      expect(b.originalName).not.toMatch(/[/\\]|\.\./);
    } else expect(r.status).toBe(400);
    expect(fs.readdirSync(srv.dataDir).sort()).toEqual(before);
    expect(fs.existsSync(path.join(srv.dataDir, '..', 'escape.png'))).toBe(false);
    // an attachment id never reaches the file system as a path
    expect((await mech.raw('GET', '/api/attachments/..%2F..%2Fetc/file')).status).toBe(400);
  });
});

describe('work records', () => {
  it('when the second part names a corner the vehicle does not have, then the whole record is rolled back (nothing half-saved)', async () => {
    const mech = await mechanic();
    const before = await mech.get<{ corners: Corner[]; workRecords: unknown[] }>(`/api/vehicles/${inspection.vehicle.id}/workshop`);
    const items = async () => Number((await srv.db.sequelize.query<{ n: number }>('SELECT COUNT(*) AS n FROM work_record_items', { type: 'SELECT' as never }))[0].n);
    const itemsBefore = await items();
    const r = await mech.json<{ error: { fields: Record<string, string> } }>('POST', '/api/work-records', {
      vehicleId: inspection.vehicle.id, inspectionId: inspection.id, performedOn: '2026-11-30', odometerKm: 200000, summary: 'Front dampers', labourHours: 1.5,
      items: [
        { position: 'FL', component: 'damper', partDescription: 'Twin-tube damper, front', partNumber: 'BX-2201', cost: 96, removalReason: 'leaking' },
        { position: 'XX', component: 'damper', partDescription: 'Twin-tube damper, front', partNumber: 'BX-2201', cost: 96, removalReason: 'leaking' },
      ],
    });
    expect(r.status).toBe(400);
    expect(r.body.error.fields['items.1.position']).toBeTruthy();
    const after = await mech.get<{ corners: Corner[]; workRecords: unknown[] }>(`/api/vehicles/${inspection.vehicle.id}/workshop`);
    expect(after.body.corners.map((c) => c.damperId)).toEqual(before.body.corners.map((c) => c.damperId));
    expect(after.body.workRecords.length).toBe(before.body.workRecords.length);
    // the demo's own work records have items; none was added
    expect(await items()).toBe(itemsBefore);
    const insp = await mech.get<{ status: string }>(`/api/inspections/${inspection.id}`);
    expect(insp.body.status).not.toBe('done');
  });

  it('when a replacement is recorded, then the old damper is retired, a new one fitted, the inspection closed, and the forecast no longer holds the old one', async () => {
    const mech = await mechanic();
    const m = await manager();
    const fBefore = await m.get<{ items: { damperId: number }[]; totals: { replacements: number } }>('/api/forecast');
    expect(fBefore.status).toBe(200);
    const before = await mech.get<{ corners: Corner[] }>(`/api/vehicles/${inspection.vehicle.id}/workshop`);
    const oldFl = before.body.corners.find((c) => c.position === 'FL')!;
    const r = await mech.json<{ id: number; items: { removedDamperId: number; installedDamperId: number }[] }>('POST', '/api/work-records', {
      vehicleId: inspection.vehicle.id, inspectionId: inspection.id, performedOn: '2026-11-30', odometerKm: 200000, summary: 'Front left damper replaced', labourHours: 0.8,
      items: [{ position: 'FL', component: 'damper', partDescription: 'Twin-tube damper, front', partNumber: 'BX-2201', cost: 96, removalReason: 'leaking' }],
    });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.items[0].removedDamperId).toBe(oldFl.damperId);
    const after = await mech.get<{ corners: Corner[]; workRecords: { id: number }[] }>(`/api/vehicles/${inspection.vehicle.id}/workshop`);
    const newFl = after.body.corners.find((c) => c.position === 'FL')!;
    expect(newFl.damperId).toBe(r.body.items[0].installedDamperId);
    expect(newFl.lifeUsedFraction).toBe(0);
    const insp = await mech.get<{ status: string }>(`/api/inspections/${inspection.id}`);
    expect(insp.body.status).toBe('done');
    const fAfter = await m.get<{ items: { damperId: number }[] }>('/api/forecast');
    expect(fAfter.body.items.some((i) => i.damperId === oldFl.damperId)).toBe(false);
    const rec = await m.get<{ summary: string; items: unknown[] }>(`/api/work-records/${r.body.id}`);
    expect(rec.body.items.length).toBe(1);
  });

  it('when the forecast is asked for as CSV, then it is a spreadsheet file with a header row', async () => {
    const m = await manager();
    const r = await m.raw('GET', '/api/forecast?format=csv');
    expect(r.status).toBe(200);
    expect(r.headers.get('content-type')).toMatch(/text\/csv/);
    expect((await r.text()).split('\n')[0]).toBe('spec,depot,replacements,cost,cost_known');
  });

  it('when the fleet life of a spec is asked for, then it gives the km and energy fits or why not, and the blending rule', async () => {
    const m = await manager();
    const r = await m.get<{ km: { points: unknown[]; fit: unknown; reason: string | null }; energy: unknown; blend: { minRemovals: number; rule: string; axles: unknown[] } }>('/api/fleet-life?specId=1');
    expect(r.status).toBe(200);
    expect(r.body.blend.minRemovals).toBe(5);
    expect(r.body.blend.axles.length).toBeGreaterThan(0);
    expect(r.body.km.fit !== null || r.body.km.reason !== null).toBe(true);
    expect((await m.get('/api/fleet-life')).status).toBe(400);
  });

  it('when the workload is asked for, then each depot has its weeks', async () => {
    const m = await manager();
    const r = await m.get<{ weekStarts: string[]; depots: { weeks: unknown[] }[] }>('/api/workload?weeks=6');
    expect(r.status).toBe(200);
    expect(r.body.weekStarts.length).toBe(6);
    for (const d of r.body.depots) expect(d.weeks.length).toBe(6);
  });
});

describe('life used by the nightly job', () => {
  it('when a spec has at least FLEET_LIFE_MIN_REMOVALS removals, then the resolver gives the fleet-blended life (credibility n/(n+k)) and says so', async () => {
    const { createWorkshopLifeResolver } = await import('../../server/workshop/life');
    const { loadConfig } = await import('../../server/config');
    const { ratedLife } = await import('../../server/wear/wear');
    const m = await manager();
    const specs = await m.get<{ items: { id: number }[] }>('/api/specs');
    let checked = 0;
    const resolve = await createWorkshopLifeResolver(loadConfig({}).workshop);
    for (const s of specs.body.items) {
      const life = await m.get<{ blend: { used: boolean; weight: number; failures: number; axles: { axleIndex: number; ratedKm: number; usedKm: number }[] } }>(`/api/fleet-life?specId=${s.id}`);
      if (!life.body.blend.used) continue;
      expect(life.body.blend.failures).toBeGreaterThanOrEqual(5);
      expect(life.body.blend.weight).toBeCloseTo(life.body.blend.failures / (life.body.blend.failures + 10), 12);
      const [d] = await srv.db.sequelize.query<{ id: number; axle_index: number; sprung_mass_kg: number; unsprung_mass_kg: number; spring_rate_n_per_m: number; damping_ns_per_m: number; tire_rate_n_per_m: number; rated_damper_life_km: number }>(
        `SELECT d.id, d.axle_index, a.sprung_mass_kg, a.unsprung_mass_kg, a.spring_rate_n_per_m, a.damping_ns_per_m, a.tire_rate_n_per_m, a.rated_damper_life_km
         FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id JOIN spec_axles a ON a.spec_id = v.spec_id AND a.axle_index = d.axle_index
         WHERE v.spec_id = ? AND d.removed_at IS NULL AND NOT EXISTS (SELECT 1 FROM inspection_corners c WHERE c.damper_id = d.id) LIMIT 1`,
        { replacements: [s.id], type: 'SELECT' as never },
      );
      const corner = { sprungMassKg: d.sprung_mass_kg, unsprungMassKg: d.unsprung_mass_kg, springRateNPerM: d.spring_rate_n_per_m, dampingNsPerM: d.damping_ns_per_m, tireRateNPerM: d.tire_rate_n_per_m };
      const got = resolve({ damperId: d.id, corner, ratedDamperLifeKm: d.rated_damper_life_km });
      const axle = life.body.blend.axles.find((a) => a.axleIndex === d.axle_index)!;
      const rated = ratedLife({ damperId: d.id, corner, ratedDamperLifeKm: d.rated_damper_life_km }).energyJ;
      expect(got.source).toBe('fleet');
      // rated-life energy is linear in km (class B at 80 km/h), so the blend scales it by used/rated km (computed)
      expect(got.energyJ / rated).toBeCloseTo(axle.usedKm / axle.ratedKm, 6);
      checked++;
    }
    expect(checked, 'the demo fleet has a spec past the removal threshold').toBeGreaterThan(0);
  });
});
