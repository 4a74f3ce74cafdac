import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../support/server';
import { ApiClient, DEMO } from '../support/client';
import { adhesionPct } from '../../server/physics/adhesion';
import { estimateDamping } from '../../server/workshop/corners';
import { phaseShift } from '../../server/physics/phase-shift';
import { estimateFromLane } from '../../server/physics/lane-estimate';

interface Corner { damperId: number; position: string; axleIndex: number; lifeUsedFraction: number; dampingNsPerM: number; nominalNsPerM: number; basis: string }
interface ListItem { id: number; vehicle: { id: number; fleetNumber: string }; status: string; assignee: { id: number } | null; corners: Corner[] }
interface Axle { axleIndex: number; corner: { sprungMassKg: number; unsprungMassKg: number; springRateNPerM: number; dampingNsPerM: number; tireRateNPerM: number } }

/** A 1×1 PNG (the smallest valid image). */
const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8cfc0f01f0005000201a0e7d6a90000000049454e44ae426082', 'hex');
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
      const est = estimateDamping(corner, pct, 3);
      expect(est.note, `adhesion ${pct} %`).toBeNull();
      expect(Math.abs(est.dampingNsPerM! / worn - 1), `worn ${worn} N·s/m → ${pct.toFixed(2)} % → ${est.dampingNsPerM}; tol 0.5 %`).toBeLessThan(0.005);
    }
  });

  it('when the adhesion is above what any worn damping explains, then no estimate is made and the reason is kept', () => {
    const corner = { sprungMassKg: 430, unsprungMassKg: 46, springRateNPerM: 32000, dampingNsPerM: 2400, tireRateNPerM: 260000 };
    const est = estimateDamping(corner, 99, 3);
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
    const mails = await srv.db.sequelize.query<{ text_body: string }>(`SELECT text_body FROM mail_messages WHERE kind = 'assignment' AND dedupe_key LIKE ?`, { replacements: [`assignment:${inspection.id}:%`], type: 'SELECT' as never });
    expect(mails).toHaveLength(1);
    // the note opens the inspection itself, at the configured public address
    expect(mails[0].text_body).toMatch(new RegExp(`Open the inspection: https?://[^\\s]+/inspections/${inspection.id}\\b`));
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
    // the lane's default plate amplitude (3 mm, LANE_PLATE_AMPLITUDE_MM) is what the result is inverted at
    const flPct = adhesionPct({ ...corner, dampingNsPerM: known }, { amplitudeM: 0.003 }).adhesionPct;
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
    const r3 = await mech.json<{ error: { fields: Record<string, string> } }>('POST', `/api/inspections/${inspection.id}/results`, {
      odometerKm: 1, plateAmplitudeMm: 20, corners: [{ position: 'FL', adhesionPct: 40, findings: [], verdict: 'ok' }],
    });
    expect(r3.status).toBe(400);
    expect(r3.body.error.fields.plateAmplitudeMm).toMatch(/0.5–10 mm/);
  });

  it('when a lane with a 6 mm amplitude records results, then each value is inverted at 6 mm and the inspection says so (computed)', async () => {
    const mech = await mechanic();
    const veh = await mech.get<{ vehicle: { specId: number } }>(`/api/vehicles/${inspection.vehicle.id}`);
    const spec = await mech.get<{ spec: { axles: Axle[] } }>(`/api/specs/${veh.body.vehicle.specId}`);
    const corner = spec.body.spec.axles.find((a) => a.axleIndex === 0)!.corner;
    const known = corner.dampingNsPerM * 0.8;
    const pct6 = adhesionPct({ ...corner, dampingNsPerM: known }, { amplitudeM: 0.006 }).adhesionPct;
    const res = await mech.json<{ plateAmplitudeMm: number; results: { position: string; measuredNsPerM: number | null }[] }>('POST', `/api/inspections/${inspection.id}/results`, {
      odometerKm: 200000, plateAmplitudeMm: 6, corners: [{ position: 'FL', adhesionPct: pct6, findings: [], verdict: 'monitor' }],
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.plateAmplitudeMm).toBe(6);
    const fl = res.body.results.find((r) => r.position === 'FL')!;
    expect(Math.abs(fl.measuredNsPerM! / known - 1), `measured ${fl.measuredNsPerM} vs ${known}`).toBeLessThan(0.005);
    const opts = await mech.get<{ lanePlateAmplitudeMm: number }>('/api/workshop/options');
    expect(opts.body.lanePlateAmplitudeMm).toBe(3);
  });

  it('when a minimum phase is recorded alone or beside adhesion, then the damping comes from the phase or the better-conditioned reading and says which (computed)', async () => {
    const mech = await mechanic();
    const veh = await mech.get<{ vehicle: { specId: number } }>(`/api/vehicles/${inspection.vehicle.id}`);
    const spec = await mech.get<{ spec: { axles: Axle[] } }>(`/api/specs/${veh.body.vehicle.specId}`);
    const corner = spec.body.spec.axles.find((a) => a.axleIndex === 0)!.corner;
    const known = { ...corner, dampingNsPerM: corner.dampingNsPerM * 0.6 };
    const phase = phaseShift(known).minPhaseDeg;
    const pct = adhesionPct(known, { amplitudeM: 0.003 }).adhesionPct;
    type R = { results: { position: string; measuredNsPerM: number | null; phaseDeg: number | null; estimateMethod: string | null; estimateNote: string | null }[] };
    const res = await mech.json<R>('POST', `/api/inspections/${inspection.id}/results`, {
      odometerKm: 200000,
      corners: [
        { position: 'FL', adhesionPct: null, phaseDeg: phase, findings: [], verdict: 'monitor' },
        { position: 'FR', adhesionPct: pct, phaseDeg: phase, findings: [], verdict: 'monitor' },
      ],
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const fl = res.body.results.find((r) => r.position === 'FL')!;
    expect(fl.estimateMethod).toBe('phase');
    expect(fl.phaseDeg).toBeCloseTo(phase, 9);
    expect(Math.abs(fl.measuredNsPerM! / known.dampingNsPerM - 1)).toBeLessThan(0.002);
    const fr = res.body.results.find((r) => r.position === 'FR')!;
    const exp = estimateFromLane(corner, { adhesionPct: pct, phaseDeg: phase, amplitudeM: 0.003 });
    expect(fr.estimateMethod).toBe(exp.method);
    expect(fr.estimateNote).toMatch(exp.method === 'phase' ? /^from the phase shift/ : /^from adhesion/);
    const bad = await mech.json<{ error: { fields: Record<string, string> } }>('POST', `/api/inspections/${inspection.id}/results`, {
      odometerKm: 1, corners: [{ position: 'FL', adhesionPct: null, phaseDeg: 200, findings: [], verdict: 'ok' }],
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields['corners.0.phaseDeg']).toMatch(/0–180/);
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
    const countItems = async () => Number((await srv.db.sequelize.query<{ n: number }>('SELECT COUNT(*) AS n FROM work_record_items', { type: 'SELECT' as never }))[0].n);
    const itemsBefore = await countItems();
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
    expect(await countItems()).toBe(itemsBefore);
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

  it("when the fleet life of a spec is asked for, then it gives the life model, the removals' own Weibull in km (or why not), the comparison and its assumptions", async () => {
    const m = await manager();
    const r = await m.get<{ fleetKm: { points: unknown[]; fit: unknown; reason: string | null }; model: { shape: number; source: string }; comparison: { ratio: number | null }; assumptions: string[] }>('/api/fleet-life?specId=1');
    expect(r.status).toBe(200);
    expect(r.body.model.shape).toBeGreaterThan(0);
    expect(r.body.assumptions.length).toBeGreaterThan(3);
    expect(r.body.fleetKm.fit !== null || r.body.fleetKm.reason !== null).toBe(true);
    expect((await m.get('/api/fleet-life')).status).toBe(400);
  });

  it('when the back-test of a spec is asked for, then every removal for wear has a prediction made before it, with the error figures', async () => {
    const m = await manager();
    const r = await m.get<{ points: { actualKm: number; predictedMedianKm: number; p10Km: number; p90Km: number; removedAt: string }[]; mdape: number | null; insideShare: number | null; method: string }>('/api/life-backtest?specId=1');
    expect(r.status).toBe(200);
    expect(r.body.method).toMatch(/before/);
    for (const p of r.body.points) expect(p.p10Km <= p.predictedMedianKm && p.predictedMedianKm <= p.p90Km).toBe(true);
    if (r.body.points.length) {
      expect(r.body.mdape).toBeGreaterThanOrEqual(0);
      expect(r.body.insideShare).toBeGreaterThanOrEqual(0);
    }
    expect((await m.get('/api/life-backtest?specId=abc')).status).toBe(400);
    const d = new ApiClient(srv.url);
    await d.login(DEMO.driver);
    expect((await d.get('/api/life-backtest?specId=1')).status).toBe(403);
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
  it("when the life models are refitted, then the resolver measures each damper against its spec's stored model, and the damper-life page shows the same model", async () => {
    const { createWorkshopLifeResolver, refitLifeModels } = await import('../../server/workshop/life');
    const { lifeWearKm } = await import('../../server/reliability/life-model');
    const { loadConfig } = await import('../../server/config');
    const settings = loadConfig({}).workshop.life;
    const models = await refitLifeModels(settings, new Date('2026-11-30T03:00:00Z'));
    const resolve = await createWorkshopLifeResolver(settings.prior);
    const m = await manager();
    let fitted = 0;
    for (const [specId, model] of models) {
      const [d] = await srv.db.sequelize.query<{ id: number; axle_index: number; rated_damper_life_km: number }>(
        `SELECT d.id, d.axle_index, a.rated_damper_life_km FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id JOIN spec_axles a ON a.spec_id = v.spec_id AND a.axle_index = d.axle_index
         WHERE v.spec_id = ? AND d.removed_at IS NULL AND NOT EXISTS (SELECT 1 FROM inspection_corners c WHERE c.damper_id = d.id AND c.measured_damping_ns_per_m IS NOT NULL) LIMIT 1`,
        { replacements: [specId], type: 'SELECT' as never },
      );
      if (!d) continue;
      const got = resolve({ damperId: d.id, specId, axleIndex: d.axle_index, ratedDamperLifeKm: d.rated_damper_life_km });
      expect(got.source).toBe(model.source);
      expect(got.b).toBe(model.b);
      expect(got.medianWearKm).toBeCloseTo(lifeWearKm(model, d.rated_damper_life_km, 0.5), 6);
      expect(got.p10WearKm).toBeLessThan(got.medianWearKm);
      expect(got.p90WearKm).toBeGreaterThan(got.medianWearKm);
      const page = await m.get<{ model: { roadSensitivity: number; failures: number }; lifeTable: { cls: string; medianKm: number }[] }>(`/api/fleet-life?specId=${specId}`);
      expect(page.status).toBe(200);
      expect(page.body.model.roadSensitivity).toBeCloseTo(model.b, 12);
      expect(page.body.model.failures).toBe(model.failures);
      // rougher class, shorter life
      const t = page.body.lifeTable;
      expect(t.map((r) => r.cls)).toEqual(['A', 'B', 'C', 'D']);
      for (let i = 1; i < t.length; i++) expect(t[i].medianKm).toBeLessThanOrEqual(t[i - 1].medianKm);
      if (model.source === 'fleet') fitted++;
    }
    expect(fitted, 'the demo fleet has a spec with removals for wear').toBeGreaterThan(0);
  });

  it('when the refit reads a spec a few vehicles at a time, then it fits the units one read of the whole spec gives, in the same order', async () => {
    const { damperLives, specLifeUnits } = await import('../../server/workshop/life');
    let compared = 0;
    const specs = await srv.db.sequelize.query<{ id: number }>('SELECT id FROM suspension_specs ORDER BY id', { type: 'SELECT' as never });
    for (const spec of specs) {
      const whole = { bandRows: 0 };
      const expected = (await damperLives(spec.id, whole)).filter((d) => d.lifeKm > 0).map((d) => ({ rows: d.rows, failed: d.failed, ratedKm: d.ratedKm }));
      for (const perRead of [1, 3]) {
        const read = { bandRows: 0 };
        expect(await specLifeUnits(spec.id, read, perRead)).toEqual(expected);
        expect(read.bandRows).toBe(whole.bandRows);
      }
      compared += expected.length;
    }
    expect(compared, 'the demo fleet has dampers with a life').toBeGreaterThan(10);
  });
});
