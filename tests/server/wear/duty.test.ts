import { describe, expect, it } from 'vitest';
import {
  computeVehicleDuty,
  cornerPayloadKg,
  DutyCache,
  dutyRow,
  TRIP_DUTY_COLUMNS,
  FRONT_AXLE_PAYLOAD_SHARE,
  travelMoments,
  massBand,
  type RouteInput,
  type SegmentInput,
  type VehicleWork,
} from '../../../server/wear/duty';
import { simulateTravel, simulateWeighted } from '../../../server/physics/simulate';
import { rainflowDamage } from '../../../server/physics/fatigue';
import { createDutyRunner, inProcessDutyRunner, splitBySpec, splitByTrips } from '../../../server/wear/duty-pool';
import { prepareDuty } from '../../../server/physics/closed-form';
import { prepareSimulation, runSimulation } from '../../../server/physics/simulate';
import { minerDamage, rainflow } from '../../../server/physics/fatigue';
import { gdForClass, seededRandom, synthesizeProfile } from '../../../server/physics/iso8608';
import { accumulateDays, plusDays, predict, type LifeBasis } from '../../../server/wear/wear';
import { priorLifeResolver } from '../../../server/workshop/life';

const front = { sprungMassKg: 430, unsprungMassKg: 46, springRateNPerM: 32000, dampingNsPerM: 2400, tireRateNPerM: 260000 };
const rear = { sprungMassKg: 360, unsprungMassKg: 55, springRateNPerM: 38000, dampingNsPerM: 2500, tireRateNPerM: 270000 };

const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);

function route(id: number, gd: number | null, n = 25, profile: SegmentInput['profile'] = null): RouteInput {
  return {
    id,
    lengthM: n * 100,
    segments: Array.from({ length: n }, (_, i) => ({ id: id * 1000 + i, startM: i * 100, endM: (i + 1) * 100, speedKmh: null, gdN0: gd, profile })),
  };
}

function van(vehicleId: number, routeId: number, days: string[], payloadKg = 300): VehicleWork {
  return {
    vehicleId,
    axles: [
      { axleIndex: 0, corner: front, ratedDamperLifeKm: 90000 },
      { axleIndex: 1, corner: rear, ratedDamperLifeKm: 90000 },
    ],
    dampers: ['FL', 'FR', 'RL', 'RR'].map((position, i) => ({ id: vehicleId * 10 + i, position, axleIndex: i < 2 ? 0 : 1, installedAt: '2026-01-01', removedAt: null })),
    trips: days.map((d, i) => ({ id: vehicleId * 1000 + i, routeId, driverId: null, tripDate: d, durationS: 3600, distanceKm: 2.5, meanSpeedKmh: 50, payloadKg })),
  };
}

describe('duty per trip and corner', () => {
  it('when Gd(n0) doubles, then the damper energy doubles (closed form, computed)', () => {
    const cache = new DutyCache();
    const a = computeVehicleDuty(van(1, 1, ['2026-11-01']), new Map([[1, route(1, gdForClass('C'))]]), cache);
    const b = computeVehicleDuty(van(1, 1, ['2026-11-01']), new Map([[1, route(1, 2 * gdForClass('C'))]]), cache);
    for (let i = 0; i < 4; i++) {
      const ratio = b.duties[i].energyJ / a.duties[i].energyJ;
      expect(Math.abs(ratio - 2), `corner ${a.duties[i].position}: ratio ${ratio}, expected 2 ± 1e-12`).toBeLessThan(1e-12);
      // RMS values scale with √2
      expect(rel(b.duties[i].rmsWeightedAccel / a.duties[i].rmsWeightedAccel, Math.SQRT2)).toBeLessThan(1e-12);
    }
  });

  it('when a trip drives a class-C road, then its energy equals dutyOnRoad energy per km × km (closed form, computed)', () => {
    const cache = new DutyCache();
    const r = computeVehicleDuty(van(1, 1, ['2026-11-01'], 0), new Map([[1, route(1, gdForClass('C'))]]), cache);
    // the job computes on the mass band's centre (unladen here)
    const p = prepareDuty({ ...front, sprungMassKg: massBand(front.sprungMassKg) }, 50 / 3.6);
    const expected = ((front.dampingNsPerM * p.varRelVelPerGd * gdForClass('C')) / (50 / 3.6)) * 1000 * 2.5;
    const fl = r.duties.find((d) => d.position === 'FL')!;
    expect(rel(fl.energyJ, expected), `energy ${fl.energyJ} J vs ${expected} J`).toBeLessThan(1e-9);
    expect(fl.segments).toBe(25);
    expect(fl.unratedSegments).toBe(0);
  });

  it('when there is payload, then the front axle carries the stated share and the rear the rest', () => {
    expect(cornerPayloadKg(1000, 0, 2)).toBeCloseTo((1000 * FRONT_AXLE_PAYLOAD_SHARE) / 2, 9);
    expect(cornerPayloadKg(1000, 1, 2)).toBeCloseTo((1000 * (1 - FRONT_AXLE_PAYLOAD_SHARE)) / 2, 9);
    const total = 2 * cornerPayloadKg(1000, 0, 3) + 2 * cornerPayloadKg(1000, 1, 3) + 2 * cornerPayloadKg(1000, 2, 3);
    expect(total).toBeCloseTo(1000, 9);
  });

  it('when a segment has no roughness, then it is counted as unrated and adds no duty', () => {
    const r = computeVehicleDuty(van(1, 1, ['2026-11-01']), new Map([[1, route(1, null)]]), new DutyCache());
    expect(r.duties[0].unratedSegments).toBe(25);
    expect(r.duties[0].energyJ).toBe(0);
  });

  it('when a trip names a route that is not loaded, then that trip is reported and the others go on', () => {
    const w = van(1, 1, ['2026-11-01', '2026-11-02']);
    w.trips[1].routeId = 99;
    const r = computeVehicleDuty(w, new Map([[1, route(1, gdForClass('B'))]]), new DutyCache());
    expect(r.errors).toEqual([{ tripId: w.trips[1].id, message: 'route 99 is not loaded' }]);
    expect(r.duties).toHaveLength(4);
  });

  it('when a segment has a measured profile, then every output comes from its simulation and agrees with the closed form of the same Gd(n0) within 6 % (computed)', () => {
    const gd = gdForClass('C');
    const elevations = synthesizeProfile({ gdN0: gd, lengthM: 2600, dxM: 0.25, seed: 7 });
    const profile = { surveyId: 1, dxM: 0.25, startM: 0, elevationsM: elevations };
    const sim = computeVehicleDuty(van(1, 1, ['2026-11-01']), new Map([[1, route(1, gd, 25, profile)]]), new DutyCache());
    const cf = computeVehicleDuty(van(1, 1, ['2026-11-01']), new Map([[1, route(1, gd)]]), new DutyCache());
    expect(sim.duties[0].profiledSegments).toBeGreaterThan(20);
    for (const k of ['energyJ', 'rmsRelativeVelocity', 'rmsWeightedAccel', 'rmsBodyAccel', 'rmsTireLoadRatio', 'rmsSuspensionTravel'] as const) {
      const ratio = sim.duties[0][k] / cf.duties[0][k];
      expect(Math.abs(ratio - 1), `simulated/closed-form ${k} ratio ${ratio}`).toBeLessThan(0.06);
    }
    // one method per segment: a profiled segment's outputs do not read its stated Gd(n0) at all
    const misstated = computeVehicleDuty(van(1, 1, ['2026-11-01']), new Map([[1, route(1, 4 * gd, 25, profile)]]), new DutyCache());
    for (const k of ['energyJ', 'rmsWeightedAccel', 'rmsBodyAccel'] as const) expect(misstated.duties[0][k]).toBe(sim.duties[0][k]);
    expect(sim.duties[0].springDamage).toBeGreaterThan(0);
  });

  it('when the spring damage comes from Dirlik on the travel PSD, then m0 equals the closed-form travel variance (computed, 1 %)', () => {
    const v = 60 / 3.6;
    const m = travelMoments(front, v, 1);
    const p = prepareDuty(front, v);
    expect(rel(m.m0, p.varTravelPerGd), `m0 ${m.m0} vs Lyapunov ${p.varTravelPerGd}`).toBeLessThan(0.01);
    // m2 of travel = variance of relative velocity / (2π)²
    expect(rel(m.m2 * 4 * Math.PI ** 2, p.varRelVelPerGd)).toBeLessThan(0.01);
  });
});

describe('fast loops of the nightly run', () => {
  it('when the travel loop runs, then it matches runSimulation (computed, 1e-9)', () => {
    const prof = synthesizeProfile({ gdN0: gdForClass('D'), lengthM: 150, dxM: 0.25, seed: 3 });
    const p = prepareSimulation(front, 0.25, 12);
    const ref = runSimulation(p, prof, { warmupM: 30, series: true });
    const buf = new Float64Array(prof.length);
    const mine = simulateTravel(p, prof, 120, buf);
    expect(rel(mine.msRelVel, ref.rmsRelativeVelocity ** 2)).toBeLessThan(1e-9);
    expect(rel(mine.msTravel, ref.rmsSuspensionTravel ** 2)).toBeLessThan(1e-9);
    expect(rel(mine.msBodyAccel, ref.rmsBodyAccel ** 2)).toBeLessThan(1e-9);
    expect(rel(buf[10], ref.series!.suspensionTravel[121 + 10])).toBeLessThan(1e-9);
  });

  it('when the weighted loop runs, then it matches runSimulation with the Wk filter (computed, 1e-9)', () => {
    const prof = synthesizeProfile({ gdN0: gdForClass('D'), lengthM: 150, dxM: 0.0625, seed: 4 });
    const p = prepareSimulation(rear, 0.0625, 14, { weighted: true });
    const ref = runSimulation(p, prof, { warmupM: 30, series: true });
    const buf = new Float64Array(prof.length);
    const first = Math.ceil(30 / 0.0625);
    const mine = simulateWeighted(p, prof, first, prof.length - 1, buf);
    expect(rel(mine.msWeightedAccel, ref.rmsWeightedAccel ** 2)).toBeLessThan(1e-9);
    expect(rel(mine.msRelVel, ref.rmsRelativeVelocity ** 2)).toBeLessThan(1e-9);
    expect(rel(mine.msTireLoad, (ref.rmsTireLoadRatio * p.staticLoadN) ** 2)).toBeLessThan(1e-9);
    expect(rel(buf[10], ref.series!.suspensionTravel[first + 1 + 10])).toBeLessThan(1e-9);
  });

  it('when rainflow damage is summed on the fly, then it equals rainflow + Miner of the physics engine', () => {
    const rand = seededRandom(11);
    for (let trial = 0; trial < 20; trial++) {
      const x = Float64Array.from({ length: 300 }, () => Math.round((rand() - 0.5) * 20) / 2);
      const ref = minerDamage(rainflow(x), { k: 3, C: 7 });
      const got = rainflowDamage(x, x.length, 3, 7);
      expect(rel(got, ref), `trial ${trial}: ${got} vs ${ref}`).toBeLessThan(1e-12);
    }
    // ASTM E1049-85 §5.4.4 example: ranges 3(½) 4(1½) 6(½) 8(1) 9(½) → Σ n·S with k = 1 is 23
    const astm = Float64Array.from([-2, 1, -3, 5, -1, 3, -4, 4, -2]);
    expect(rainflowDamage(astm, astm.length, 1, 1)).toBeCloseTo(0.5 * 3 + 1.5 * 4 + 0.5 * 6 + 1 * 8 + 0.5 * 9, 12);
  });
});

const basis = (L: number): LifeBasis => ({ b: 0.585, medianWearKm: L, p10WearKm: 0.5 * L, p90WearKm: 1.5 * L, source: 'prior', note: '' });
const dayOf = (i: number) => `2026-11-${String(i + 1).padStart(2, '0')}`;

describe('wear and prediction', () => {
  it('when twin dampers drive a rough and a smooth route, then the rough one is predicted to reach the threshold sooner', () => {
    const cache = new DutyCache();
    const trips = Array.from({ length: 30 }, (_, i) => dayOf(i));
    const rough = computeVehicleDuty(van(1, 1, trips), new Map([[1, route(1, gdForClass('D'))]]), cache);
    const smooth = computeVehicleDuty(van(2, 2, trips), new Map([[2, route(2, gdForClass('B'))]]), cache);
    const life = priorLifeResolver()({ damperId: 10, specId: 1, axleIndex: 0, ratedDamperLifeKm: 90000 });
    const forecast = (r: typeof rough, damperId: number) => {
      const perDay = r.duties
        .filter((d) => d.damperId === damperId)
        .map((d) => ({ day: d.tripDate, distanceKm: d.distanceKm, energyJ: d.energyJ, springDamage: d.springDamage, wearKm: d.distanceKm * Math.pow(d.severity, life.b) }));
      const hist = accumulateDays({ damperId, vehicleId: 1 }, null, perDay, life.medianWearKm, front.dampingNsPerM);
      return predict(hist, { asOf: '2026-11-30', installedAt: '2026-11-01', life, thresholdFraction: 0.8, nominalDampingNsPerM: front.dampingNsPerM, untrackedKm: 0, calendarYears: 50 });
    };
    const a = forecast(rough, 10);
    const b = forecast(smooth, 20);
    expect(a.thresholdDate && b.thresholdDate).toBeTruthy();
    expect(a.thresholdDate! < b.thresholdDate!, `rough ${a.thresholdDate} vs smooth ${b.thresholdDate}`).toBe(true);
    // class D is two ISO class steps rougher: severity about 4, wear rate 4^0.585 ≈ 2.25× (computed)
    expect(a.wearKmPerDay / b.wearKmPerDay).toBeGreaterThan(1.8);
    expect(a.wearKmPerDay / b.wearKmPerDay).toBeLessThan(3);
  });

  it('when a damper has used 40 % of its life at 1 %/day, then it reaches 80 % in 40 days and end of life in 60 (computed)', () => {
    const L = 100_000;
    const hist = accumulateDays(
      { damperId: 1, vehicleId: 1 },
      { cumKm: 10_000, cumEnergyJ: 0, cumWearKm: 0.1 * L, cumSpringDamage: 0 },
      Array.from({ length: 30 }, (_, i) => ({ day: dayOf(i), distanceKm: 100, energyJ: 1, springDamage: 0, wearKm: 0.01 * L })),
      L,
      2000,
    );
    const p = predict(hist, { asOf: '2026-11-30', installedAt: '2025-01-01', life: basis(L), thresholdFraction: 0.8, nominalDampingNsPerM: 2000, untrackedKm: 0, calendarYears: 20 });
    expect(p.lifeUsedFraction).toBeCloseTo(0.4, 12);
    expect(p.wearKmPerDay).toBeCloseTo(0.01 * L, 6);
    expect(p.thresholdDate).toBe('2027-01-09');
    expect(p.endOfLifeDate).toBe('2027-01-29');
    // P10 life is half the median here: 0.1 L to go at 0.01 L/day; P90 1.5 L: 110 days
    expect(p.endOfLifeP10Date).toBe('2026-12-10');
    expect(p.endOfLifeP90Date).toBe('2027-03-20');
    // linear fade to 60 % at end of life (stated assumption): 40 % used → 84 % of nominal
    expect(p.dampingNsPerM).toBeCloseTo(2000 * 0.84, 9);
    expect(p.windowDays).toBe(30);
    expect(p.governedBy).toBe('distance');
  });

  it('when the calendar limit comes first, then it sets the end of life (common practice: 5–7 years)', () => {
    const p = predict([], { asOf: '2026-11-30', installedAt: '2021-01-01', life: basis(100_000), thresholdFraction: 0.8, nominalDampingNsPerM: 2000, untrackedKm: 0, calendarYears: 6 });
    expect(p.endOfLifeDate).toBe('2027-01-01');
    expect(p.governedBy).toBe('calendar');
    expect(p.calendarLifeUsed).toBeGreaterThan(0.95);
    expect(p.lifeUsedFraction).toBe(p.calendarLifeUsed);
  });

  it('when the wear before the records alone passed end of life, then its date is estimated between fitting and the records, not the first day on record (stated rule)', () => {
    const L = 50_000;
    // 110 000 km untracked at the rated road's rate, then 10 days on record
    const hist = accumulateDays({ damperId: 1, vehicleId: 1 }, null, Array.from({ length: 10 }, (_, i) => ({ day: dayOf(20 + i), distanceKm: 100, energyJ: 0, springDamage: 0, wearKm: 100 })), L, 2000);
    const p = predict(hist, { asOf: '2026-11-30', installedAt: '2022-11-30', life: basis(L), thresholdFraction: 0.8, nominalDampingNsPerM: 2000, untrackedKm: 110_000, calendarYears: 20 });
    expect(p.lifeUsedFraction).toBeCloseTo(111_000 / L, 9);
    // even growth over 1 461 days: end of life at 50 000 / 111 000 of them (computed)
    expect(p.endOfLifeDate).toBe(plusDays('2022-11-30', Math.floor((50_000 / 111_000) * 1461)));
    expect(p.endOfLifeDate! < '2026-11-21').toBe(true);
    expect(p.basis.opening).toMatch(/evenly since fitting/);
  });

  it('when the threshold was already passed, then the threshold date is the day it was crossed', () => {
    const L = 100;
    const hist = accumulateDays({ damperId: 1, vehicleId: 1 }, null, [
      { day: '2026-11-01', distanceKm: 1, energyJ: 0, springDamage: 0, wearKm: 50 },
      { day: '2026-11-02', distanceKm: 1, energyJ: 0, springDamage: 0, wearKm: 35 },
      { day: '2026-11-03', distanceKm: 1, energyJ: 0, springDamage: 0, wearKm: 5 },
    ], L, 1000);
    const p = predict(hist, { asOf: '2026-11-30', installedAt: '2026-11-01', life: basis(L), thresholdFraction: 0.8, nominalDampingNsPerM: 1000, untrackedKm: 0 });
    expect(p.thresholdDate).toBe('2026-11-02');
    expect(p.endOfLifeDate! > '2026-11-30').toBe(true);
  });

  it('when a damper had no duty in the window, then no distance date is predicted (only the calendar limit)', () => {
    const p = predict([], { asOf: '2026-11-30', installedAt: '2026-01-01', life: basis(1), thresholdFraction: 0.8, nominalDampingNsPerM: 1000, untrackedKm: 0 });
    expect(p.governedBy).toBe('calendar');
    expect(p.endOfLifeDate).toBe('2032-01-01');
  });
});

describe('duty on worker threads', () => {
  const profile = { surveyId: 7, dxM: 0.25, startM: 0, elevationsM: synthesizeProfile({ gdN0: gdForClass('C'), lengthM: 2600, dxM: 0.25, seed: 11 }) };
  const routes = new Map([
    [1, route(1, gdForClass('B'))],
    [2, route(2, gdForClass('D'), 25, profile)],
  ]);
  const works = Array.from({ length: 9 }, (_, k) => van(k + 1, (k % 2) + 1, ['2026-11-01', '2026-11-02', '2026-11-03'].slice(0, 1 + (k % 3)), 100 * k));

  it('when vehicles are split between threads, then the parts keep their order and balance the trips', () => {
    const parts = splitByTrips(works, 2);
    expect(parts).toHaveLength(2);
    expect(parts.flat()).toEqual(works);
    const trips = parts.map((p) => p.reduce((s, w) => s + w.trips.length, 0));
    expect(Math.abs(trips[0] - trips[1])).toBeLessThanOrEqual(3);
    expect(splitByTrips(works.slice(0, 1), 4)).toEqual([works.slice(0, 1)]);
    expect(splitByTrips([], 2)).toEqual([[]]);
  });

  // a second spec: the van's corners with a heavier body (other cache keys, the same routes)
  const truck = (vehicleId: number, routeId: number, days: string[]): VehicleWork => {
    const w = van(vehicleId, routeId, days);
    return { ...w, axles: w.axles.map((a) => ({ ...a, corner: { ...a.corner, sprungMassKg: a.corner.sprungMassKg * 2 } })) };
  };
  const mixed = Array.from({ length: 8 }, (_, k) => (k % 2 ? truck : van)(k + 1, 2, ['2026-11-01', '2026-11-02']));

  it('when a batch of two specs is split between two threads, then each spec goes to one thread, and to the same one in the next batch', () => {
    const owner = new Map<string, number>();
    const load = [0, 0];
    const first = splitBySpec(mixed, 2, owner, load);
    expect(first.flat().sort((a, b) => a - b)).toEqual(mixed.map((_, i) => i));
    const specOf = (i: number) => (i % 2 ? 'truck' : 'van');
    for (const part of first) expect(new Set(part.map(specOf)).size).toBe(1);
    const second = splitBySpec(mixed.slice(0, 4), 2, owner, load);
    expect(second.map((p) => p.map(specOf)[0])).toEqual(first.map((p) => p.map(specOf)[0]));
    // one spec alone would leave a thread idle: split by trips instead
    const one = splitBySpec(works, 2, new Map(), [0, 0]);
    expect(one.map((p) => p.length)).toEqual(splitByTrips(works, 2).map((p) => p.length));
    expect(one.flat()).toEqual(works.map((_, i) => i));
  });

  it('when two specs are computed on two worker threads, then every result equals this thread\'s and each profile segment is simulated once', async () => {
    const { runner } = await createDutyRunner(routes, 2);
    try {
      const local = inProcessDutyRunner(routes);
      expect(await runner.compute(mixed)).toEqual(await local.compute(mixed));
      expect(runner.stats().simulations).toBe(local.stats().simulations);
    } finally {
      await runner.close();
    }
  }, 60_000);

  it('when the duty is computed on two worker threads, then every record equals the one computed in this thread', async () => {
    const { runner, fallback } = await createDutyRunner(routes, 2);
    try {
      expect(fallback).toBeNull();
      expect(runner.workers).toBe(2);
      const threaded = await runner.compute(works);
      const local = await inProcessDutyRunner(routes).compute(works);
      expect(threaded.map((r) => r.dutyCount)).toEqual(works.map((w) => 4 * w.trips.length));
      expect(threaded).toEqual(local);
      // the packed rows are the records, value for value, in the table's column order
      for (const [i, w] of works.entries()) {
        const records = computeVehicleDuty(w, routes, new DutyCache()).duties;
        expect(records.length).toBeGreaterThan(0);
        expect(JSON.parse(threaded[i].dutyRows)).toEqual(records.map(dutyRow));
      }
      expect(TRIP_DUTY_COLUMNS).toHaveLength(dutyRow(computeVehicleDuty(works[0], routes, new DutyCache()).duties[0]).length);
      expect(runner.stats().simulations).toBeGreaterThan(0);
    } finally {
      await runner.close();
    }
  }, 60_000);
});
