import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { startTestServer, type TestServer } from '../../support/server';
import { seededRandom } from '../../../server/physics/iso8608';
import { fitWeibull } from '../../../server/reliability/weibull';
import { REMOVAL_REASONS } from '../../../server/workshop/life';
import { CENSORING_REASONS, DEMO_LIFE_LAWS, PAIR_SHARE, WEAR_REASONS, demoMeanLifeKm, demoMedianLifeKm, simulateAxleHistory } from '../../../server/demo/history';

/** The demo fleet as a fleet manager would check it (docs/methods.md, "Demo fleet"). */

describe('the demo removal law', () => {
  it('when the route mix gets rougher, then the median life falls linearly with the rough share, and the mean is the lognormal median · exp(σ²/2) (computed from the stated law)', () => {
    const law = DEMO_LIFE_LAWS.CV;
    expect(demoMedianLifeKm(law, 0)).toBe(law.medianKm);
    expect(demoMedianLifeKm(law, 1)).toBeCloseTo(law.medianKm * (1 - law.roughSlope), 6);
    expect(demoMedianLifeKm(law, 0.5)).toBeCloseTo((demoMedianLifeKm(law, 0) + demoMedianLifeKm(law, 1)) / 2, 6);
    expect(demoMeanLifeKm(law, 0.3)).toBeCloseTo(demoMedianLifeKm(law, 0.3) * Math.exp(law.sigma ** 2 / 2), 6);
  });

  it('when many axles are simulated, then each corner\'s dampers follow one another, reasons are the workshop\'s, and partners go as a pair at the stated share', () => {
    const rand = seededRandom(7);
    let wearOrDamage = 0;
    let paired = 0;
    const lives: number[] = [];
    for (let n = 0; n < 3000; n++) {
      const { spans, visits } = simulateAxleHistory(rand, DEMO_LIFE_LAWS.CV, 0.2, 250_000, ['FL', 'FR']);
      for (const p of ['FL', 'FR']) {
        const mine = spans.filter((s) => s.position === p);
        expect(mine[0].fittedKm).toBe(0);
        for (let i = 1; i < mine.length; i++) expect(mine[i].fittedKm).toBe(mine[i - 1].removedKm);
        expect(mine[mine.length - 1].removedKm).toBeNull();
      }
      for (const s of spans) if (s.reason) expect(REMOVAL_REASONS as readonly string[]).toContain(s.reason);
      for (const [k, v] of visits.entries()) {
        const removed = spans.filter((s) => s.visit === k);
        if (v.kind === 'other_work') continue;
        wearOrDamage++;
        if (removed.length === 2) paired++;
        const cause = removed.find((s) => s.position === v.cause)!;
        if (v.kind === 'wear') {
          expect(WEAR_REASONS as readonly string[]).toContain(cause.reason);
          lives.push(cause.removedKm! - cause.fittedKm);
        }
      }
    }
    expect(paired / wearOrDamage).toBeGreaterThan(PAIR_SHARE - 0.03);
    expect(paired / wearOrDamage).toBeLessThan(PAIR_SHARE + 0.03);
    // wear removals happen around the law's median (competing removals cut the long lives, so below it)
    const sorted = lives.sort((a, b) => a - b);
    const median = sorted[Math.floor(sorted.length / 2)];
    expect(median).toBeLessThan(demoMedianLifeKm(DEMO_LIFE_LAWS.CV, 0.2));
    expect(median).toBeGreaterThan(0.6 * demoMedianLifeKm(DEMO_LIFE_LAWS.CV, 0.2));
  });
});

describe('the demo fleet', () => {
  let S: TestServer;
  const q = <T extends object>(sql: string, replacements: unknown[] = []) => S.db.sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT });
  beforeAll(async () => {
    S = await startTestServer();
  }, 120_000);
  afterAll(() => S?.stop());

  it('when the odometers are read against the trips, then each vehicle drove as far a day before the records as in them (within 10 %)', async () => {
    const rows = await q<{ fleet_number: string; odometer_km: number; commissioned_at: string; recorded: number; first: string }>(
      `SELECT v.fleet_number, v.odometer_km, v.commissioned_at, SUM(t.distance_km) AS recorded, MIN(t.started_at) AS first
       FROM vehicles v JOIN trips t ON t.vehicle_id = v.id GROUP BY v.id`,
    );
    expect(rows.length).toBeGreaterThan(40);
    // the records run for the 60 days before "today" (2026-11-30)
    const recordsStart = Date.parse('2026-10-01T00:00:00Z');
    for (const r of rows) {
      const inRecords = r.recorded / 60;
      const before = (r.odometer_km - r.recorded) / ((recordsStart - Date.parse(`${r.commissioned_at}T00:00:00Z`)) / 86_400_000);
      expect(before / inRecords, `${r.fleet_number}: ${before.toFixed(1)} km/day before, ${inRecords.toFixed(1)} in the records`).toBeGreaterThan(0.9);
      expect(before / inRecords, r.fleet_number).toBeLessThan(1.1);
    }
    // a courier van does 50–110 km a calendar day (common practice: tens of thousands of km a year)
    const vans = rows.filter((r) => r.fleet_number.startsWith('CV'));
    const perDay = vans.reduce((a, r) => a + r.recorded, 0) / vans.length / 60;
    expect(perDay).toBeGreaterThan(50);
    expect(perDay).toBeLessThan(110);
  });

  it('when a driver\'s trips are listed, then none overlaps another, and none is longer than 7 h', async () => {
    const overlaps = await q<{ n: number }>(
      `SELECT COUNT(*) AS n FROM trips a JOIN trips b ON a.driver_id = b.driver_id AND a.id < b.id AND a.started_at < b.ended_at AND b.started_at < a.ended_at`,
    );
    expect(Number(overlaps[0].n)).toBe(0);
    // the hours worked out here from the stamps, as each database reads durations its own way
    const trips = await q<{ started_at: string; ended_at: string }>(`SELECT started_at, ended_at FROM trips`);
    const longestH = trips.reduce((m, t) => Math.max(m, (Date.parse(t.ended_at) - Date.parse(t.started_at)) / 3_600_000), 0);
    expect(longestH).toBeLessThanOrEqual(7.0001);
    expect(longestH).toBeGreaterThan(3);
  });

  it('when payloads are added to the unladen mass and a 75 kg driver, then no trip exceeds the gross mass of its vehicle class (from the spec name)', async () => {
    const specs = await q<{ id: number; name: string; unladen: number }>(
      `SELECT s.id, s.name, SUM(2 * (a.sprung_mass_kg + a.unsprung_mass_kg)) AS unladen FROM suspension_specs s JOIN spec_axles a ON a.spec_id = s.id GROUP BY s.id`,
    );
    for (const s of specs) {
      const gross = Number(/(\d+(?:\.\d+)?) t\b/.exec(s.name)![1]) * 1000;
      const [m] = await q<{ max: number }>(`SELECT MAX(t.payload_kg) AS max FROM trips t JOIN vehicles v ON v.id = t.vehicle_id WHERE v.spec_id = ?`, [s.id]);
      expect(s.unladen + 75 + m.max, s.name).toBeLessThanOrEqual(gross);
    }
  });

  it('when each corner\'s dampers are listed, then they follow one another on the odometer and the calendar, with the workshop\'s reasons', async () => {
    const ds = await q<{ vehicle_id: number; status: string; odometer_km: number; position: string; installed_at: string; installed_odometer_km: number; removed_at: string | null; removed_odometer_km: number | null; removal_reason: string | null; removed_by_work_record_id: number | null }>(
      `SELECT d.*, v.status, v.odometer_km FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id ORDER BY d.vehicle_id, d.position, d.installed_odometer_km, d.id`,
    );
    const corners = new Map<string, typeof ds>();
    for (const d of ds) corners.set(`${d.vehicle_id}/${d.position}`, [...(corners.get(`${d.vehicle_id}/${d.position}`) ?? []), d]);
    for (const [k, list] of corners) {
      for (let i = 1; i < list.length; i++) {
        expect(list[i].installed_at, k).toBe(list[i - 1].removed_at);
        expect(list[i].installed_odometer_km, k).toBe(list[i - 1].removed_odometer_km);
      }
      const last = list[list.length - 1];
      if (last.status === 'retired') expect(last.removal_reason).toBe('vehicle retired');
      else expect(last.removed_at, k).toBeNull();
      for (const d of list) {
        expect(d.removed_odometer_km ?? 0).toBeLessThanOrEqual(d.odometer_km);
        if (d.removal_reason) expect(REMOVAL_REASONS as readonly string[], k).toContain(d.removal_reason);
        if (d.removal_reason && d.removal_reason !== 'vehicle retired') expect(d.removed_by_work_record_id, k).not.toBeNull();
      }
    }
    const reasons = new Set(ds.map((d) => d.removal_reason).filter(Boolean));
    for (const r of [...WEAR_REASONS, ...CENSORING_REASONS]) expect(reasons, r).toContain(r);
  });

  it('when a Weibull is fitted to the removals (wear = failure; pairs, accidents, other work, retirement and running units censored), then vans last 70–90 thousand km and trucks 90–120 thousand on average (common practice: dampers are checked from 80 000 km and last 80 000–160 000 km)', async () => {
    const rows = await q<{ spec: string; life: number; reason: string | null }>(
      `SELECT s.name AS spec, COALESCE(d.removed_odometer_km, v.odometer_km) - d.installed_odometer_km AS life, d.removal_reason AS reason
       FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id JOIN suspension_specs s ON s.id = v.spec_id`,
    );
    const censored = new Set<string>(CENSORING_REASONS);
    for (const spec of new Set(rows.map((r) => r.spec))) {
      const data = rows.filter((r) => r.spec === spec && r.life > 0).map((r) => ({ life: r.life, failed: r.reason !== null && !censored.has(r.reason) }));
      const fit = fitWeibull(data);
      expect(fit.failures, spec).toBeGreaterThanOrEqual(10);
      const [lo, hi] = spec.includes('truck') ? [90_000, 120_000] : [70_000, 90_000];
      expect(fit.mean, spec).toBeGreaterThan(lo);
      expect(fit.mean, spec).toBeLessThan(hi);
    }
  });
});
