import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { startTestServer, TEST_NOW, type TestServer } from '../support/server';
import { ApiClient, DEMO } from '../support/client';
import { run } from '../../jobs/nightly';
import { adhesionPct } from '../../server/physics/adhesion';
import { DAMPING_AT_END_OF_LIFE } from '../../server/wear/wear';
import { inspectionRepository } from '../../server/inspections/repository';

/**
 * Scheduling that follows the wear, through the API on the demo fleet after one nightly run:
 * the follow-up date a "check again soon" verdict sets (validated), the follow-up the next run
 * books for it, predictions recomputed at once when results or work are saved, and the due
 * list sorted by life used. The rules themselves are unit-tested in
 * tests/server/inspections/schedule.test.ts and schedule-basis.test.ts.
 */

interface Corner { damperId: number; position: string; axleIndex: number; lifeUsedFraction: number; nominalNsPerM: number; endOfLifeDate: string | null }
interface Axle { axleIndex: number; corner: { sprungMassKg: number; unsprungMassKg: number; springRateNPerM: number; dampingNsPerM: number; tireRateNPerM: number } }
interface Prediction { damper_id: number; as_of: string; life_source: string; life_used_fraction: number; life_wear_km: number; window_wear_km: number; governed_by: string; distance_life_used: number; end_of_life_date: string | null }

const TODAY = '2026-11-30'; // TEST_NOW's day
let srv: TestServer;
let mechanicId: number;
const login = async (who: string) => {
  const c = new ApiClient(srv.url);
  await c.login(who);
  return c;
};
const rows = <T extends object>(sql: string, replacements: unknown[] = []) => srv.db.sequelize.query<T>(sql, { replacements: replacements as never, type: QueryTypes.SELECT });
const predictionOf = async (damperId: number) => (await rows<Prediction>('SELECT * FROM damper_predictions WHERE damper_id = ?', [damperId]))[0] ?? null;
const assign = async (inspectionId: number) => {
  const m = await login(DEMO.manager);
  const a = await m.json('PATCH', `/api/inspections/${inspectionId}`, { assigneeId: mechanicId });
  expect(a.status).toBe(200);
};
const nightly = async () => {
  const r = await run({ db: srv.db, config: srv.config, log: srv.log, mailer: srv.mailer, now: TEST_NOW, trigger: 'test' });
  expect(r.status, JSON.stringify(r.errors.slice(0, 5))).toMatch(/succeeded|completed_with_errors/);
  return r;
};

/** The vehicle A follow-ups are tried on, and the vehicle B whose predictions are re-made. */
let A: { inspectionId: number; vehicleId: number; odometerKm: number; positions: string[] };
let B: { inspectionId: number; vehicleId: number; odometerKm: number; damperId: number; position: string; axleIndex: number; lifeUsed: number };

beforeAll(async () => {
  // the demo fleet after one nightly run
  srv = await startTestServer({ afterNightly: true });
  mechanicId = (await (await login(DEMO.mechanic)).get<{ user: { id: number } }>('/api/auth/me')).body.user.id;
  const open = await rows<{ id: number; vehicle_id: number }>(`SELECT id, vehicle_id FROM inspections WHERE status IN ('scheduled','due','overdue') ORDER BY id`);
  expect(open.length).toBeGreaterThan(1);
  // B: a fitted damper with wear on record whose test-lane life stays inside the ⅓–3× bound at half its predicted life used
  const [b] = await rows<{ inspection_id: number; vehicle_id: number; odometer_km: number; damper_id: number; position: string; axle_index: number; life_used_fraction: number }>(
    `SELECT i.id AS inspection_id, i.vehicle_id, v.odometer_km, d.id AS damper_id, d.position, d.axle_index, p.life_used_fraction
     FROM inspections i JOIN vehicles v ON v.id = i.vehicle_id JOIN dampers d ON d.vehicle_id = i.vehicle_id AND d.removed_at IS NULL JOIN damper_predictions p ON p.damper_id = d.id
     WHERE i.status IN ('scheduled','due','overdue') AND d.energy_j > 0 AND p.life_used_fraction BETWEEN 0.3 AND 1.4
     ORDER BY ABS(p.life_used_fraction - 0.8), d.id LIMIT 1`,
  );
  expect(b, 'a demo damper with 30–140 % life used on a vehicle with an open inspection').toBeTruthy();
  B = { inspectionId: b.inspection_id, vehicleId: b.vehicle_id, odometerKm: Math.ceil(b.odometer_km), damperId: b.damper_id, position: b.position, axleIndex: b.axle_index, lifeUsed: b.life_used_fraction };
  // A: no damper predicted to reach its end of life before the follow-up date used below
  const [a] = await rows<{ id: number; vehicle_id: number; odometer_km: number }>(
    `SELECT i.id, i.vehicle_id, v.odometer_km FROM inspections i JOIN vehicles v ON v.id = i.vehicle_id
     WHERE i.status IN ('scheduled','due','overdue') AND i.vehicle_id != ?
       AND NOT EXISTS (SELECT 1 FROM damper_predictions p WHERE p.vehicle_id = i.vehicle_id AND p.end_of_life_date < '2027-01-15')
     ORDER BY i.id LIMIT 1`,
    [B.vehicleId],
  );
  expect(a, 'a demo vehicle with an open inspection and no damper near its end of life').toBeTruthy();
  const positions = (await rows<{ position: string }>('SELECT position FROM dampers WHERE vehicle_id = ? AND removed_at IS NULL ORDER BY axle_index, position', [a.vehicle_id])).map((p) => p.position);
  A = { inspectionId: a.id, vehicleId: a.vehicle_id, odometerKm: Math.ceil(a.odometer_km), positions };
  await assign(A.inspectionId);
  await assign(B.inspectionId);
}, 300_000);
afterAll(() => srv?.stop());

describe('the follow-up date of "check again soon"', () => {
  const results = (over: Record<string, unknown>, verdict = 'monitor') => ({ odometerKm: A.odometerKm, corners: [{ position: 'FL', adhesionPct: null, findings: [], verdict }], ...over });

  it('when the date is not after the inspection day, more than a year on, not a calendar day, or given without "check again soon", then it is refused with the field named and nothing is saved (stated rule)', async () => {
    const mech = await login(DEMO.mechanic);
    const cases: [Record<string, unknown>, string, RegExp][] = [
      [{ followUpOn: TODAY }, 'monitor', /after the inspection day \(2026-11-30\)/],
      [{ followUpOn: '2026-11-01' }, 'monitor', /after the inspection day/],
      [{ followUpOn: '2027-12-01' }, 'monitor', /within a year of the inspection \(on or before 2027-11-30\)/],
      [{ followUpOn: '2027-02-30' }, 'monitor', /real calendar date/],
      [{ followUpOn: 'next week' }, 'monitor', /YYYY-MM-DD/],
      [{ followUpOn: '2027-01-15' }, 'ok', /check again soon/],
    ];
    for (const [over, verdict, message] of cases) {
      const r = await mech.json<{ error: { fields: Record<string, string> } }>('POST', `/api/inspections/${A.inspectionId}/results`, results(over, verdict));
      expect(r.status, JSON.stringify(over)).toBe(400);
      expect(r.body.error.fields.followUpOn, JSON.stringify(r.body)).toMatch(message);
    }
    const [row] = await rows<{ follow_up_on: string | null; results_at: string | null }>('SELECT follow_up_on, results_at FROM inspections WHERE id = ?', [A.inspectionId]);
    expect(row).toEqual({ follow_up_on: null, results_at: null });
  });

  it('when "check again soon" is given without a date, then the follow-up is 30 days on; a date given is kept; the last day of the year is accepted (stated rule)', async () => {
    const mech = await login(DEMO.mechanic);
    const none = await mech.json<{ followUpOn: string | null }>('POST', `/api/inspections/${A.inspectionId}/results`, results({}));
    expect(none.status, JSON.stringify(none.body)).toBe(200);
    expect(none.body.followUpOn).toBe('2026-12-30');
    const last = await mech.json<{ followUpOn: string | null }>('POST', `/api/inspections/${A.inspectionId}/results`, results({ followUpOn: '2027-11-30' }));
    expect(last.body.followUpOn).toBe('2027-11-30');
    const keep = await mech.json<{ followUpOn: string | null }>('POST', `/api/inspections/${A.inspectionId}/results`, results({ followUpOn: '2027-01-15' }));
    expect(keep.body.followUpOn).toBe('2027-01-15');
    // the verdict changed to keep in service: no follow-up
    const ok = await mech.json<{ followUpOn: string | null }>('POST', `/api/inspections/${A.inspectionId}/results`, results({}, 'ok'));
    expect(ok.body.followUpOn).toBeNull();
  });
});

describe('predictions recomputed when the workshop saves', () => {
  it('when test-lane results are saved, then the damper is predicted again at once with the life the lane implies, so its end of life and life used agree (computed)', async () => {
    const before = (await predictionOf(B.damperId))!;
    expect(before.life_source).not.toBe('test-lane');
    const mech = await login(DEMO.mechanic);
    const veh = await mech.get<{ vehicle: { specId: number } }>(`/api/vehicles/${B.vehicleId}`);
    const spec = await mech.get<{ spec: { axles: Axle[] } }>(`/api/specs/${veh.body.vehicle.specId}`);
    const corner = spec.body.spec.axles.find((a) => a.axleIndex === B.axleIndex)!.corner;
    // a lane result saying half the life the model predicts is used: damping fades linearly to
    // DAMPING_AT_END_OF_LIFE × nominal at end of life (the wear model's stated assumption)
    const measuredUse = B.lifeUsed / 2;
    const damping = corner.dampingNsPerM * (1 - measuredUse * (1 - DAMPING_AT_END_OF_LIFE));
    const pct = adhesionPct({ ...corner, dampingNsPerM: damping }).adhesionPct;
    const r = await mech.json('POST', `/api/inspections/${B.inspectionId}/results`, {
      odometerKm: B.odometerKm,
      corners: [{ position: B.position, adhesionPct: pct, findings: [], verdict: 'ok' }],
    });
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    const after = (await predictionOf(B.damperId))!;
    expect(after.as_of).toBe(TODAY);
    expect(after.life_source).toBe('test-lane');
    // same wear on record, life from the lane: distance life used ≈ the measured share (the damping estimate is within 0.5 %)
    expect(after.window_wear_km).toBeCloseTo(before.window_wear_km, 6);
    // (life used is the larger of this and the calendar share, which the lane does not measure)
    expect(Math.abs(after.distance_life_used / measuredUse - 1), `${after.distance_life_used} vs ${measuredUse}`).toBeLessThan(0.03);
    expect(after.life_used_fraction).toBeGreaterThanOrEqual(after.distance_life_used);
    const ws = await mech.get<{ corners: Corner[] }>(`/api/vehicles/${B.vehicleId}/workshop`);
    const c = ws.body.corners.find((x) => x.damperId === B.damperId)!;
    expect(Math.abs(c.lifeUsedFraction / after.life_used_fraction - 1)).toBeLessThan(0.03);
    // below 100 % used, the end of life is not in the past
    expect(c.endOfLifeDate === null || c.endOfLifeDate >= TODAY, `end of life ${c.endOfLifeDate} at ${c.lifeUsedFraction}`).toBe(true);
  });

  it('when a replacement is recorded, then the new damper has its prediction at once and the old one none (stated rule: a new damper starts at 0 % used)', async () => {
    const mech = await login(DEMO.mechanic);
    const w = await mech.json<{ items: { removedDamperId: number; installedDamperId: number }[] }>('POST', '/api/work-records', {
      vehicleId: B.vehicleId, inspectionId: B.inspectionId, performedOn: TODAY, odometerKm: B.odometerKm, summary: 'Damper replaced after the lane test', labourHours: 1,
      items: [{ position: B.position, component: 'damper', partDescription: 'Damper', partNumber: null, cost: 90, removalReason: 'worn: low adhesion' }],
    });
    expect(w.status, JSON.stringify(w.body)).toBe(201);
    expect(await predictionOf(B.damperId)).toBeNull();
    const fresh = await predictionOf(w.body.items[0].installedDamperId);
    // nothing driven yet: only the calendar limit dates its end of life (common practice: 5–7 years)
    expect(fresh).toMatchObject({ as_of: TODAY, life_used_fraction: 0, governed_by: 'calendar' });
  });
});

describe('the follow-up booked by the nightly run', () => {
  it('when the inspection closes with "check again soon", then the next run books the follow-up for the mechanic\'s date, not for today (stated rule)', async () => {
    const mech = await login(DEMO.mechanic);
    const r = await mech.json('POST', `/api/inspections/${A.inspectionId}/results`, {
      odometerKm: A.odometerKm, complete: true, followUpOn: '2027-01-15',
      // FL to be checked again soon, the others kept in service: all looked at
      corners: A.positions.map((position) => ({ position, adhesionPct: null, findings: [], verdict: position === 'FL' ? 'monitor' : 'ok' })),
    });
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    await nightly();
    const open = await rows<{ due_date: string; trigger: string; reason: string; status: string }>(
      `SELECT due_date, "trigger", reason, status FROM inspections WHERE vehicle_id = ? AND status IN ('scheduled','due','overdue')`,
      [A.vehicleId],
    );
    expect(open).toHaveLength(1);
    expect(open[0]).toMatchObject({ due_date: '2027-01-15', trigger: 'follow_up', status: 'scheduled' });
    expect(open[0].reason).toBe('Follow-up: at the inspection on 30 Nov 2026 the mechanic asked to check FL again by 15 Jan 2027.');
    // a further run changes nothing
    await nightly();
    const again = await rows<{ due_date: string }>(`SELECT due_date FROM inspections WHERE vehicle_id = ? AND status IN ('scheduled','due','overdue')`, [A.vehicleId]);
    expect(again).toEqual([{ due_date: '2027-01-15' }]);
  }, 300_000);

  it('when the damper to be checked again is replaced, then the follow-up no longer holds (stated rule)', async () => {
    const repo = inspectionRepository(srv.db.sequelize);
    const day = (d: Date) => d.toISOString().slice(0, 10);
    expect((await repo.followUps(day)).get(A.vehicleId)).toMatchObject({ date: '2027-01-15', checkAgain: ['FL'] });
    const mech = await login(DEMO.mechanic);
    const w = await mech.json('POST', '/api/work-records', {
      vehicleId: A.vehicleId, performedOn: TODAY, odometerKm: A.odometerKm, summary: 'FL damper replaced', labourHours: 1,
      items: [{ position: 'FL', component: 'damper', partDescription: 'Damper', partNumber: null, cost: 90, removalReason: 'leaking' }],
    });
    expect(w.status, JSON.stringify(w.body)).toBe(201);
    expect((await repo.followUps(day)).has(A.vehicleId)).toBe(false);
  });
});

describe('the due list sorted by life used', () => {
  type Due = { items: { id: number; dueDate: string; maxLifeUsed: number | null }[]; sort: string; error?: { fields: Record<string, string> } };

  it('when the manager asks for sort=lifeUsed, then the most-worn damper comes first; sort=due (the default) keeps due-date order; another value is refused with the field named (stated rule)', async () => {
    const m = await login(DEMO.manager);
    const worn = await m.get<Due>('/api/inspections/due?sort=lifeUsed');
    expect(worn.status).toBe(200);
    expect(worn.body.sort).toBe('lifeUsed');
    expect(worn.body.items.length).toBeGreaterThan(2);
    const lives = worn.body.items.map((i) => i.maxLifeUsed ?? -1);
    for (let k = 1; k < lives.length; k++) expect(lives[k], `row ${k}`).toBeLessThanOrEqual(lives[k - 1]);
    const due = await m.get<Due>('/api/inspections/due?sort=due');
    const plain = await m.get<Due>('/api/inspections/due');
    expect(plain.body.items.map((i) => i.id)).toEqual(due.body.items.map((i) => i.id));
    const dates = due.body.items.map((i) => i.dueDate);
    expect([...dates].sort()).toEqual(dates);
    // the same inspections either way, in another order
    expect([...worn.body.items.map((i) => i.id)].sort()).toEqual([...due.body.items.map((i) => i.id)].sort());
    expect(worn.body.items.map((i) => i.id)).not.toEqual(due.body.items.map((i) => i.id));
    const bad = await m.get<Due>('/api/inspections/due?sort=worn');
    expect(bad.status).toBe(400);
    expect(bad.body.error?.fields.sort).toBe('must be due or lifeUsed');
  });
});
