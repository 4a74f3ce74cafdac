import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { startTestServer, TEST_NOW, type TestServer } from '../support/server';
import { ApiClient, DEMO } from '../support/client';
import { run } from '../../jobs/nightly';
import type { Db } from '../../server/db';
import { sqlDate, wearDayFromDb, wearRepository, type WearDayDb } from '../../server/wear/repository';
import { accumulateDays, daysBetween, predictionWindow, summarizeWear, type WearDayRow } from '../../server/wear/wear';

/**
 * The nightly job end to end on the demo fleet: through the API, twice (idempotent), killed
 * halfway and rerun (crash-safe: same tables as one clean run), cancelled and rerun, with the
 * lock, and with e-mail through real SMTP to the built-in mail catcher.
 */

/** Tables and columns that legitimately differ between two databases holding the same state. */
const SKIP_TABLES = new Set(['sessions', 'job_runs', 'job_locks', 'caught_mail', 'schema_migrations', 'sqlite_sequence']);
const SKIP_COLUMNS = new Set(['created_at', 'updated_at', 'password_hash', 'file_path', 'message_id', 'job_run_id', 'created_by_run_id']);

async function dump(db: Db): Promise<Record<string, unknown[]>> {
  const tables = await db.sequelize.query<{ name: string }>(`SELECT name FROM sqlite_master WHERE type = 'table' ORDER BY name`, { type: QueryTypes.SELECT });
  const out: Record<string, unknown[]> = {};
  for (const { name } of tables) {
    if (SKIP_TABLES.has(name)) continue;
    const rows = await db.sequelize.query<Record<string, unknown>>(`SELECT * FROM "${name}" ORDER BY rowid`, { type: QueryTypes.SELECT });
    out[name] = rows.map((r) => Object.fromEntries(Object.entries(r).filter(([k]) => !SKIP_COLUMNS.has(k))));
  }
  return out;
}

function diffTables(a: Record<string, unknown[]>, b: Record<string, unknown[]>): string[] {
  const problems: string[] = [];
  for (const t of new Set([...Object.keys(a), ...Object.keys(b)])) {
    const x = JSON.stringify(a[t] ?? null);
    const y = JSON.stringify(b[t] ?? null);
    if (x !== y) {
      const rowsA = a[t] ?? [];
      const rowsB = b[t] ?? [];
      const i = rowsA.findIndex((r, k) => JSON.stringify(r) !== JSON.stringify(rowsB[k]));
      problems.push(`${t}: ${rowsA.length} vs ${rowsB.length} rows; first difference at row ${i}: ${JSON.stringify(rowsA[i])} vs ${JSON.stringify(rowsB[i])}`);
    }
  }
  return problems;
}

async function waitForRun(c: ApiClient, id: number) {
  for (let i = 0; i < 600; i++) {
    const r = await c.get<{ run: { status: string; counts: Record<string, number>; errors: unknown[]; errorCount: number; message: string | null } }>(`/api/jobs/runs/${id}`);
    if (r.body.run.status !== 'running') return r.body.run;
    await new Promise((res) => setTimeout(res, 200));
  }
  throw new Error(`run ${id} did not finish`);
}

const count = async (db: Db, sql: string) => Number((await db.sequelize.query<{ n: number }>(sql, { type: QueryTypes.SELECT }))[0].n);

let A: TestServer;
let clean: Record<string, unknown[]>;
let firstRun: { counts: Record<string, number> };

beforeAll(async () => {
  A = await startTestServer({ env: { NIGHTLY_BATCH_TRIPS: '400' } });
});
afterAll(() => A?.stop());

describe('nightly job through the API', () => {
  it('when a manager runs the job, then trips become duty, dampers wear, inspections are scheduled and mail is sent', async () => {
    const c = new ApiClient(A.url);
    await c.login(DEMO.manager);
    const trips = await count(A.db, `SELECT COUNT(*) AS n FROM trips WHERE processed_at IS NULL`);
    const start = await c.json<{ runId: number }>('POST', '/api/jobs/nightly/run', {});
    expect(start.status).toBe(202);
    const runRow = await waitForRun(c, start.body.runId);
    expect(runRow.status, JSON.stringify(runRow)).toBe('succeeded');
    firstRun = runRow;
    expect(runRow.counts.trips).toBe(trips);
    expect(runRow.counts.dutyRecords).toBe(4 * trips);
    expect(runRow.counts.segments).toBeGreaterThan(trips * 10);
    expect(runRow.counts.profileSimulations).toBeGreaterThan(0);
    expect(runRow.counts.inspectionsCreated).toBeGreaterThan(0);
    expect(runRow.counts.mailsSent).toBeGreaterThan(0);
    expect(await count(A.db, `SELECT COUNT(*) AS n FROM trips WHERE processed_at IS NULL`)).toBe(0);
    expect(await count(A.db, `SELECT COUNT(*) AS n FROM dampers WHERE removed_at IS NULL AND energy_j > 0`)).toBeGreaterThan(100);
    // never more than one open inspection per vehicle
    expect(await count(A.db, `SELECT COUNT(*) AS n FROM (SELECT vehicle_id FROM inspections WHERE status IN ('scheduled','due','overdue') GROUP BY vehicle_id HAVING COUNT(*) > 1)`)).toBe(0);
    clean = await dump(A.db);

    const list = await c.get<{ items: { id: number; status: string }[]; total: number }>('/api/jobs/runs');
    expect(list.body.items[0]).toMatchObject({ id: start.body.runId, status: 'succeeded' });
  }, 180_000);

  it('when the due list is read, then it holds the new inspections with reason, days left and depot', async () => {
    const c = new ApiClient(A.url);
    await c.login(DEMO.manager);
    const due = await c.get<{ items: { status: string; reason: string; daysLeft: number; depotName: string; trigger: string | null; vehicleId: number }[]; counts: Record<string, number>; today: string }>('/api/inspections/due');
    expect(due.status).toBe(200);
    expect(due.body.today).toBe('2026-11-30');
    expect(due.body.items.length).toBeGreaterThan(0);
    const byNight = due.body.items.filter((i) => i.trigger);
    expect(byNight.length).toBeGreaterThan(0);
    for (const i of byNight) {
      expect(i.reason.length).toBeGreaterThan(20);
      expect(i.depotName).toMatch(/Brackenford|Millbrook/);
    }
    expect(due.body.counts.due + due.body.counts.overdue + due.body.counts.next30 + due.body.counts.next90 + due.body.counts.later).toBe(due.body.items.length);
    const bad = await c.get('/api/inspections/due?withinDays=abc');
    expect(bad.status).toBe(400);
  });

  it("when a vehicle's wear is read, then each fitted damper has its daily history, prediction and path, and duty per route", async () => {
    const c = new ApiClient(A.url);
    await c.login(DEMO.manager);
    // the hardest-worked vehicle with an inspection open, so its next inspection's reason can be read
    const vehicleId = Number(
      (await A.db.sequelize.query<{ id: number }>(
        `SELECT vehicle_id AS id FROM trip_duties WHERE vehicle_id IN (SELECT vehicle_id FROM inspections WHERE status IN ('scheduled', 'due', 'overdue'))
         GROUP BY vehicle_id ORDER BY SUM(energy_j) DESC LIMIT 1`,
        { type: QueryTypes.SELECT },
      ))[0].id,
    );
    const w = await c.get<{
      dampers: { position: string; history: { day: string; lifeUsedFraction: number }[]; prediction: { thresholdDate: string | null; lifeSource: string; rateJPerDay: number } | null; path: unknown[] }[];
      dutyByRoute: { routeName: string; energyJ: number }[];
      nextInspection: { reason: string } | null;
      caution: string;
      thresholdFraction: number;
    }>(`/api/vehicles/${vehicleId}/wear`);
    expect(w.status).toBe(200);
    expect(w.body.dampers).toHaveLength(4);
    // the life is the rated one, or the fleet-blended one once the spec's removals suffice
    const specId = Number((await A.db.sequelize.query<{ id: number }>(`SELECT spec_id AS id FROM vehicles WHERE id = ?`, { replacements: [vehicleId], type: QueryTypes.SELECT }))[0].id);
    const blend = (await c.get<{ blend: { used: boolean } }>(`/api/fleet-life?specId=${specId}`)).body.blend;
    for (const d of w.body.dampers) {
      expect(d.history.length).toBeGreaterThan(10);
      expect(d.prediction?.lifeSource).toBe(blend.used ? 'fleet' : 'rated');
      expect(d.prediction!.rateJPerDay).toBeGreaterThan(0);
      // the path runs from the prediction day through the threshold and end-of-life dates still ahead
      const p = d.prediction as unknown as { asOf: string; thresholdDate: string | null; endOfLifeDate: string | null };
      const ahead = [p.thresholdDate, p.endOfLifeDate].filter((x) => x !== null && x > p.asOf).length;
      expect(d.path.length).toBe(1 + ahead);
      const u = d.history.map((h) => h.lifeUsedFraction);
      expect([...u].sort((a, b) => a - b)).toEqual(u); // consumed life never goes down
    }
    expect(w.body.dutyByRoute.length).toBeGreaterThan(0);
    expect(w.body.caution).toMatch(/never replace/);
    expect(w.body.thresholdFraction).toBe(0.8);
    expect(w.body.nextInspection?.reason).toBeTruthy();

    const d = new ApiClient(A.url);
    await d.login(DEMO.driver);
    const own = (await d.get<{ items: { id: number }[] }>('/api/vehicles')).body.items[0].id;
    expect((await d.get(`/api/vehicles/${own}/wear`)).status).toBe(200);
    if (own !== vehicleId) expect((await d.get(`/api/vehicles/${vehicleId}/wear`)).status).toBe(403);
  });

  it('when dampers were fitted before the trips on record, then the job estimates what they used before and carries it through their wear', async () => {
    const rows = await A.db.sequelize.query<{
      id: number; odo: number; inst: number; recorded: number; opening_km: number | null; opening_energy_j: number | null; opening_basis: string | null;
      energy_j: number; duty_e: number; life_used_fraction: number; first_cum: number | null; first_e: number | null;
    }>(
      `SELECT d.id, COALESCE(d.removed_odometer_km, v.odometer_km) AS odo, d.installed_odometer_km AS inst,
              (SELECT COALESCE(SUM(t.distance_km), 0) FROM trips t WHERE t.vehicle_id = d.vehicle_id AND t.started_at >= d.installed_at
                 AND (d.removed_at IS NULL OR t.started_at < d.removed_at)) AS recorded,
              d.opening_km, d.opening_energy_j, d.opening_basis, d.energy_j, d.life_used_fraction,
              (SELECT COALESCE(SUM(td.energy_j), 0) FROM trip_duties td WHERE td.damper_id = d.id) AS duty_e,
              (SELECT w.cum_energy_j FROM damper_wear_days w WHERE w.damper_id = d.id ORDER BY w.day LIMIT 1) AS first_cum,
              (SELECT w.energy_j FROM damper_wear_days w WHERE w.damper_id = d.id ORDER BY w.day LIMIT 1) AS first_e
       FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id WHERE v.status != 'retired'`,
      { type: QueryTypes.SELECT },
    );
    expect(rows.length).toBeGreaterThan(100);
    let before = 0;
    for (const r of rows) {
      expect(r.opening_basis, `damper ${r.id}`).toBeTruthy();
      expect(r.opening_km).toBeCloseTo(Math.max(0, r.odo - r.inst - r.recorded), 6);
      // the opening is where the damper's cumulative wear starts
      expect(Math.abs(r.energy_j - (r.opening_energy_j! + r.duty_e))).toBeLessThanOrEqual(1e-9 * r.energy_j);
      if (r.first_cum !== null) expect(Math.abs(r.first_cum - (r.opening_energy_j! + r.first_e!))).toBeLessThanOrEqual(1e-9 * r.first_cum);
      if (r.opening_km! > 1000) {
        before++;
        expect(r.opening_energy_j).toBeGreaterThan(0);
        expect(r.opening_basis).toMatch(/no trip on record covers/);
      }
    }
    expect(before).toBeGreaterThan(rows.length / 2);
  });

  it('when mail is sent, then it travels through SMTP to the catcher, with plain-text and HTML bodies and links into the app', async () => {
    const c = new ApiClient(A.url);
    await c.login(DEMO.manager);
    const out = await c.get<{ items: { id: number; to: string; subject: string; key: string }[]; total: number; catches: boolean; sent: Record<string, number> }>('/api/outbox?pageSize=200');
    expect(out.body.catches).toBe(true);
    expect(out.body.total).toBe(firstRun.counts.mailsSent);
    expect(out.body.sent.sent).toBe(firstRun.counts.mailsSent);
    const digest = out.body.items.find((m) => m.to === DEMO.manager)!;
    expect(digest.subject).toMatch(/^Reboundry digest for 2026-11-30: \d+ new items?$/);
    const full = await c.get<{ message: { text: string; html: string; key: string } }>(`/api/outbox/${digest.id}`);
    expect(full.body.message.key).toMatch(/^digest:\d+:2026-11-30:/);
    expect(full.body.message.text).toContain('Inspections now due or overdue');
    expect(full.body.message.text).toMatch(new RegExp(`${A.config.publicUrl.replace(/[.:/]/g, '\\$&')}/vehicles/\\d+`));
    expect(full.body.message.text).toContain('never replace, inspection by a qualified mechanic');
    expect(full.body.message.html).toMatch(/<a href="http:\/\/[^"]+\/vehicles\/\d+"/);
    // one note to each mechanic listing the inspections newly assigned to them
    const notes = out.body.items.filter((m) => m.key.startsWith('assignment'));
    expect(notes.map((m) => m.to).sort()).toEqual(['mechanic.millbrook@reboundry.test', 'mechanic@reboundry.test']);
    const assigned = await count(A.db, `SELECT COUNT(*) AS n FROM inspections WHERE created_by_run_id IS NOT NULL AND assignee_id IS NOT NULL`);
    let listed = 0;
    for (const n of notes) {
      const note = await c.get<{ message: { text: string; html: string; subject: string } }>(`/api/outbox/${n.id}`);
      expect(note.body.message.subject).toMatch(/^(\d+ inspections assigned to you, first due|Inspection of [A-Z]{2}-\d+ assigned to you, due) \d{4}-\d{2}-\d{2}$/);
      listed += (note.body.message.text.match(/^ {2}Why: /gm) ?? []).length;
      expect(note.body.message.html).toContain('assigned to you');
      expect(note.body.message.html).toMatch(/<a href="http:\/\/[^"]+\/vehicles\/\d+"/);
    }
    expect(listed).toBe(assigned);
    // the mechanic cannot read the outbox
    const m = new ApiClient(A.url);
    await m.login(DEMO.mechanic);
    expect((await m.get('/api/outbox')).status).toBe(403);
  });

  it('when the job runs a second time on the same data, then it changes nothing and sends nothing', async () => {
    const c = new ApiClient(A.url);
    await c.login(DEMO.manager);
    const caught = await count(A.db, `SELECT COUNT(*) AS n FROM caught_mail`);
    const start = await c.json<{ runId: number }>('POST', '/api/jobs/nightly/run', {});
    const again = await waitForRun(c, start.body.runId);
    expect(again.status).toBe('succeeded');
    expect(again.counts).toMatchObject({ trips: 0, dutyRecords: 0, inspectionsCreated: 0, inspectionsMovedEarlier: 0, mailsQueued: 0, mailsSent: 0 });
    expect(diffTables(clean, await dump(A.db))).toEqual([]);
    expect(await count(A.db, `SELECT COUNT(*) AS n FROM caught_mail`)).toBe(caught);
  }, 60_000);

  it('when a run holds a live lock, then a second start is refused; when the lock is stale, then it is taken over', async () => {
    const c = new ApiClient(A.url);
    await c.login(DEMO.manager);
    const now = new Date();
    await A.db.sequelize.query(`INSERT INTO job_locks (name, run_id, holder, acquired_at, heartbeat_at) VALUES ('nightly', 999, 'other', ?, ?)`, {
      replacements: [sqlDate(now), sqlDate(now)],
    });
    const refused = await c.json<{ error: { code: string; message: string } }>('POST', '/api/jobs/nightly/run', {});
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/already in progress \(run #999/);
    const old = sqlDate(new Date(now.getTime() - 31 * 60_000));
    await A.db.sequelize.query(`UPDATE job_locks SET heartbeat_at = ?, acquired_at = ? WHERE name = 'nightly'`, { replacements: [old, old] });
    const taken = await c.json<{ runId: number }>('POST', '/api/jobs/nightly/run', {});
    expect(taken.status).toBe(202);
    expect((await waitForRun(c, taken.body.runId)).status).toBe('succeeded');
    expect(await count(A.db, `SELECT COUNT(*) AS n FROM job_locks`)).toBe(0);
  }, 60_000);

  it('when the body is not valid, then nothing runs', async () => {
    const c = new ApiClient(A.url);
    await c.login(DEMO.manager);
    const before = await count(A.db, `SELECT COUNT(*) AS n FROM job_runs`);
    const r = await c.json<{ error: { fields: Record<string, string> } }>('POST', '/api/jobs/nightly/run', { asOf: '30/11/2026' });
    expect(r.status).toBe(400);
    expect(r.body.error.fields.asOf).toMatch(/date/);
    expect(await count(A.db, `SELECT COUNT(*) AS n FROM job_runs`)).toBe(before);
  });
});

describe('nightly job threads', () => {
  // A ran on the default `auto` setting: at least one worker thread computes the duty.
  for (const workers of ['0', '2']) {
    it(`when the duty is computed on ${workers === '0' ? "the job's own thread" : `${workers} worker threads`}, then the tables equal those of the run on the default setting`, async () => {
      const D = await startTestServer({ env: { NIGHTLY_BATCH_TRIPS: '400', NIGHTLY_WORKERS: workers } });
      try {
        expect(D.config.nightlyWorkers).toBe(Number(workers));
        const r = await run({ db: D.db, config: D.config, log: D.log, mailer: D.mailer, now: TEST_NOW, trigger: 'test' });
        expect(r.status, JSON.stringify(r.errors)).toBe('succeeded');
        expect(r.counts.trips).toBe(firstRun.counts.trips);
        expect(diffTables(clean, await dump(D.db))).toEqual([]);
      } finally {
        await D.stop();
      }
    }, 240_000);
  }
});

describe('prediction inputs', () => {
  it("when the job accumulates wear days in SQL, then each day equals what accumulateDays gives from the damper's daily duty and opening wear", async () => {
    const repo = wearRepository(A.db.sequelize);
    const ids = (await A.db.sequelize.query<{ id: number }>(`SELECT DISTINCT damper_id AS id FROM damper_wear_days ORDER BY damper_id LIMIT 60`, { type: QueryTypes.SELECT })).map((r) => r.id);
    expect(ids.length).toBeGreaterThan(20);
    const context = await repo.damperContext(ids);
    let days = 0;
    for (const c of context) {
      const stored = (await A.db.sequelize.query<WearDayDb>(`SELECT * FROM damper_wear_days WHERE damper_id = ? ORDER BY day`, { replacements: [c.id], type: QueryTypes.SELECT })).map(wearDayFromDb);
      const daily = await A.db.sequelize.query<{ day: string; km: number; e: number; f: number }>(
        `SELECT trip_date AS day, SUM(distance_km) AS km, SUM(energy_j) AS e, SUM(spring_damage) AS f FROM trip_duties WHERE damper_id = ? GROUP BY trip_date ORDER BY trip_date`,
        { replacements: [c.id], type: QueryTypes.SELECT },
      );
      const lifeJ = stored[0].lifeEnergyJ;
      const start = { cumEnergyJ: c.opening?.energyJ ?? 0, cumSpringDamage: c.opening?.springDamage ?? 0 };
      const js = accumulateDays({ damperId: c.id, vehicleId: c.vehicleId }, start, daily.map((d) => ({ day: d.day, distanceKm: d.km, energyJ: d.e, springDamage: d.f })), lifeJ, c.corner.dampingNsPerM);
      expect(stored.map((d) => d.day), `damper ${c.id}`).toEqual(js.map((d) => d.day));
      const close = (a: number, b: number) => Math.abs(a - b) <= 1e-12 * Math.max(Math.abs(a), Math.abs(b), 1e-300);
      stored.forEach((d, i) => {
        const j = js[i];
        for (const k of ['distanceKm', 'energyJ', 'springDamage', 'cumEnergyJ', 'cumSpringDamage', 'lifeUsedFraction', 'dampingNsPerM'] as const) {
          expect(close(d[k], j[k]), `damper ${c.id} ${d.day} ${k}: ${d[k]} vs ${j[k]}`).toBe(true);
        }
        expect(d.vehicleId).toBe(c.vehicleId);
      });
      days += stored.length;
      // the damper's totals are those of its last day
      const [tot] = await A.db.sequelize.query<{ energy_j: number; fatigue_damage: number; life_used_fraction: number; damping_ns_per_m: number }>(
        `SELECT energy_j, fatigue_damage, life_used_fraction, damping_ns_per_m FROM dampers WHERE id = ?`,
        { replacements: [c.id], type: QueryTypes.SELECT },
      );
      const last = js[js.length - 1];
      expect(close(tot.energy_j, last.cumEnergyJ) && close(tot.fatigue_damage, last.cumSpringDamage) && close(tot.life_used_fraction, last.lifeUsedFraction) && close(tot.damping_ns_per_m, last.dampingNsPerM), `damper ${c.id} totals`).toBe(true);
    }
    expect(days).toBeGreaterThan(100);
  });

  it("when the job sums a damper's wear in SQL, then it finds what the history itself gives: window sums, last cumulative wear and the days the levels were reached", async () => {
    const repo = wearRepository(A.db.sequelize);
    const ids = (await A.db.sequelize.query<{ id: number }>(`SELECT DISTINCT damper_id AS id FROM damper_wear_days ORDER BY damper_id LIMIT 60`, { type: QueryTypes.SELECT })).map((r) => r.id);
    expect(ids.length).toBeGreaterThan(20);
    const asOf = '2026-11-30';
    const context = await repo.damperContext(ids);
    const histories = new Map<number, WearDayRow[]>();
    for (const c of context) {
      const rows = await A.db.sequelize.query<WearDayDb>(`SELECT * FROM damper_wear_days WHERE damper_id = ? ORDER BY day`, { replacements: [c.id], type: QueryTypes.SELECT });
      histories.set(c.id, rows.map(wearDayFromDb));
    }
    // each damper's window starts on a day it has duty (so a window edge off by one shows), and
    // a low threshold and a short life for every third damper, so that some reached both levels
    const targets = context.map((c, k) => {
      const h = histories.get(c.id)!;
      const edge = h[Math.floor(h.length / 2)].day;
      const opts = {
        asOf, installedAt: c.installedAt, windowDays: daysBetween(edge, asOf) + 1,
        life: { energyJ: k % 3 === 0 ? 2e5 : 5e8, source: 'test', note: '' }, thresholdFraction: 0.5, nominalDampingNsPerM: c.corner.dampingNsPerM,
      };
      return { c, opts, windowStart: predictionWindow(opts).windowStart };
    });
    expect(targets.filter((t) => histories.get(t.c.id)!.some((h) => h.day === t.windowStart)).length).toBeGreaterThan(20);
    const sql = await repo.wearSummaries(
      targets.map((t) => ({ damperId: t.c.id, windowStart: t.windowStart, thresholdJ: 0.5 * t.opts.life.energyJ, endOfLifeJ: t.opts.life.energyJ })),
      0.5,
      asOf,
    );
    let reached = 0;
    for (const t of targets) {
      const js = summarizeWear(histories.get(t.c.id)!, t.opts);
      const got = sql.get(t.c.id)!;
      expect(got, `damper ${t.c.id}`).toBeDefined();
      // sums may differ in the last bits (SQLite sums with compensation); days and stored values are exact
      for (const k of ['windowEnergyJ', 'windowKm', 'windowSpringDamage'] as const) expect(Math.abs(got[k] - js[k]), `${k} of damper ${t.c.id}`).toBeLessThanOrEqual(1e-12 * Math.abs(js[k]));
      expect({ ...got, windowEnergyJ: 0, windowKm: 0, windowSpringDamage: 0 }).toEqual({ ...js, windowEnergyJ: 0, windowKm: 0, windowSpringDamage: 0 });
      if (js.endOfLifeDay) reached++;
    }
    expect(reached).toBeGreaterThan(0);
    expect(reached).toBeLessThan(targets.length);
  });
});

describe('nightly job crash safety', () => {
  it('when a run fails after one batch and is run again, then the tables equal those of one clean run', async () => {
    const B = await startTestServer({ env: { NIGHTLY_BATCH_TRIPS: '400' } });
    try {
      const deps = { db: B.db, config: B.config, log: B.log, mailer: B.mailer, now: TEST_NOW, trigger: 'test' as const };
      const crashed = await run({ ...deps, failAfterBatches: 1 });
      expect(crashed.status).toBe('failed');
      const left = await count(B.db, `SELECT COUNT(*) AS n FROM trips WHERE processed_at IS NULL`);
      expect(left).toBeGreaterThan(0);
      expect(crashed.counts.trips).toBeGreaterThan(0);
      const again = await run(deps);
      expect(again.status).toBe('succeeded');
      expect(again.counts.trips).toBe(left);
      expect(diffTables(clean, await dump(B.db))).toEqual([]);
    } finally {
      await B.stop();
    }
  }, 240_000);

  it('when a run is cancelled while it writes wear history or predictions and run again, then the tables equal those of one clean run', async () => {
    for (const phase of ['wear', 'predictions']) {
      const E = await startTestServer({ env: { NIGHTLY_BATCH_TRIPS: '400' } });
      try {
        const deps = { db: E.db, config: E.config, log: E.log, mailer: E.mailer, now: TEST_NOW, trigger: 'test' as const };
        const abort = new AbortController();
        // small chunks, so that the demo's dampers take several and the cancel lands between two
        const cancelled = await run({ ...deps, damperChunk: 40, signal: abort.signal, onProgress: (p, done) => p === phase && done > 0 && abort.abort() });
        expect(cancelled.status, phase).toBe('cancelled');
        if (phase === 'predictions') expect(await count(E.db, `SELECT COUNT(*) AS n FROM damper_predictions`)).toBeLessThan(firstRun.counts.predictions);
        if (phase === 'wear') expect(await count(E.db, `SELECT COUNT(*) AS n FROM dampers WHERE wear_dirty_from IS NOT NULL`)).toBeGreaterThan(0);
        const again = await run(deps);
        expect(again.status).toBe('succeeded');
        expect(diffTables(clean, await dump(E.db)), phase).toEqual([]);
      } finally {
        await E.stop();
      }
    }
  }, 240_000);

  it('when a run is cancelled through its signal and run again, then the tables equal those of one clean run; a user who turned the digest off gets none', async () => {
    const C = await startTestServer({ env: { NIGHTLY_BATCH_TRIPS: '400' } });
    try {
      const deps = { db: C.db, config: C.config, log: C.log, mailer: C.mailer, now: TEST_NOW, trigger: 'test' as const };
      const abort = new AbortController();
      const cancelled = await run({ ...deps, signal: abort.signal, onProgress: (phase, done) => phase === 'duty' && done > 0 && abort.abort() });
      expect(cancelled.status).toBe('cancelled');
      expect(cancelled.counts.batches).toBe(1);
      const again = await run(deps);
      expect(again.status).toBe('succeeded');
      expect(diffTables(clean, await dump(C.db))).toEqual([]);

      // preferences: the manager turns the digest off; a later day makes scheduled inspections due
      const c = new ApiClient(C.url);
      await c.login(DEMO.manager);
      const off = await c.json<{ preferences: Record<string, boolean> }>('PATCH', '/api/account/notifications', { inspectionDigest: false });
      expect(off.body.preferences).toEqual({ inspectionDigest: false, rideReports: true, assignments: true });
      const bad = await c.json('PATCH', '/api/account/notifications', {});
      expect(bad.status).toBe(400);
      const before = await count(C.db, `SELECT COUNT(*) AS n FROM mail_messages WHERE kind = 'digest'`);
      const later = await run({ ...deps, now: new Date('2026-12-20T12:00:00Z') });
      expect(later.status).toBe('succeeded');
      expect(later.counts.inspectionsNowDue + later.counts.inspectionsNowOverdue).toBeGreaterThan(0);
      expect(await count(C.db, `SELECT COUNT(*) AS n FROM mail_messages WHERE kind = 'digest'`)).toBe(before);
      expect(await count(C.db, `SELECT COUNT(*) AS n FROM inspections WHERE status IN ('due','overdue') AND notified_status IS NOT status`)).toBe(0);
    } finally {
      await C.stop();
    }
  }, 300_000);
});
