import { describe, it } from 'vitest';
import { prepareDuty, dutyOnRoad, ratedLifeEnergyJ, travelMoments, ROAD_BAND, type DutyResult, type PreparedDuty } from '../../server/physics/closed-form';
import { cornerTransfer } from '../../server/physics/quarter-car';
import { wkWeight } from '../../server/physics/exposure';
import { synthesizeProfile, gdForClass, ISO8608_N0 } from '../../server/physics/iso8608';
import { prepareSimulation, simulateProfile } from '../../server/physics/simulate';
import { checkClose, checkThat, CAR, DEMO_CORNERS, errorOf } from './check';
import { PhysicsInputError } from '../../server/physics/types';
import { bandLimitProfile } from '../../server/physics/profile-band';
import { simulateWeighted } from '../../server/physics/simulate';
import type { CornerParams } from '../../server/physics/types';

const VAN: CornerParams = { sprungMassKg: 700, unsprungMassKg: 65, springRateNPerM: 55000, dampingNsPerM: 3500, tireRateNPerM: 300000 };
const KEYS = ['rmsBodyAccel', 'rmsWeightedAccel', 'rmsSuspensionTravel', 'rmsRelativeVelocity', 'rmsTireLoadRatio', 'damperPowerW', 'damperEnergyJPerKm'] as const;

/** ∫₀^∞ g(f) df on a log grid (Simpson in ln f) from 1e-4 Hz to 1e7 Hz. */
function integrateLog(g: (f: number) => number): number {
  const a = Math.log(1e-4);
  const b = Math.log(1e7); // tyre load tends to kt·zr at high f, so its tail falls only as 1/f
  const n = 40000;
  const h = (b - a) / n;
  let s = 0;
  for (let i = 0; i <= n; i++) {
    const f = Math.exp(a + i * h);
    const w = i === 0 || i === n ? 1 : i % 2 ? 4 : 2;
    s += w * g(f) * f;
  }
  return (s * h) / 3;
}

describe('closed-form duty (Lyapunov)', () => {
  it('when compared with direct frequency integration of |H|²·Gz, then every variance agrees (computed)', () => {
    for (const [c, v] of [[CAR, 80 / 3.6], [VAN, 50 / 3.6]] as const) {
      const gd = 256e-6;
      const d = dutyOnRoad(prepareDuty(c, v, { maxCyclesPerM: 'unlimited' }), gd);
      // road displacement PSD in time frequency: Gz(f) = Gd(n0)·n0²·v / f²
      const gz = (f: number): number => (gd * ISO8608_N0 * ISO8608_N0 * v) / (f * f);
      const sq = (p: [number, number]): number => p[0] * p[0] + p[1] * p[1];
      const w = (c.sprungMassKg + c.unsprungMassKg) * 9.80665;
      const ref: Record<string, number> = {
        rmsBodyAccel: Math.sqrt(integrateLog((f) => sq(cornerTransfer(c, f).bodyAccel) * gz(f))),
        rmsWeightedAccel: Math.sqrt(integrateLog((f) => wkWeight(f) ** 2 * sq(cornerTransfer(c, f).bodyAccel) * gz(f))),
        rmsSuspensionTravel: Math.sqrt(integrateLog((f) => sq(cornerTransfer(c, f).suspensionTravel) * gz(f))),
        rmsRelativeVelocity: Math.sqrt(integrateLog((f) => sq(cornerTransfer(c, f).relativeVelocity) * gz(f))),
        rmsTireLoadRatio: Math.sqrt(integrateLog((f) => sq(cornerTransfer(c, f).tireLoad) * gz(f))) / w,
      };
      for (const k of Object.keys(ref) as (keyof DutyResult)[]) {
        checkClose(d[k], ref[k], { rel: 1e-5 }, 'computed: direct frequency integration', { corner: c, speedMps: v, gd, k });
      }
    }
  });

  it('when compared with a long time-domain simulation of a synthesised road, then all outputs agree within 2 % (computed)', () => {
    for (const [c, kmh, seed] of [[CAR, 80, 3], [VAN, 50, 4]] as const) {
      const v = kmh / 3.6;
      const gd = gdForClass('C');
      const dx = v * 0.002; // 2 ms step keeps the road's linear interpolation loss < 0.5 % at wheel hop
      const z = synthesizeProfile({ gdN0: gd, lengthM: 8000, dxM: dx, seed });
      const sim = simulateProfile(c, z, dx, v, { weighted: true, warmupM: 200 });
      const cf = dutyOnRoad(prepareDuty(c, v, { maxCyclesPerM: 'unlimited' }), gd);
      for (const k of KEYS) {
        const tol = k === 'damperPowerW' || k === 'damperEnergyJPerKm' ? 0.04 : 0.02; // power is a variance: 2 % on RMS ≈ 4 %
        checkClose(sim[k], cf[k], { rel: tol }, 'computed: time domain vs closed form', { corner: c, kmh, gd, dx, seed, k });
      }
    }
  });

  it('when the road band is applied, then every variance equals direct frequency integration up to n_max·v, and only short-wave outputs lose much (computed)', () => {
    for (const [c, kmh] of [[CAR, 30], [VAN, 80]] as const) {
      const v = kmh / 3.6;
      const gd = 256e-6;
      const d = dutyOnRoad(prepareDuty(c, v), gd);
      const fMax = ROAD_BAND.maxCyclesPerM * v;
      const gz = (f: number): number => (f > fMax ? 0 : (gd * ISO8608_N0 * ISO8608_N0 * v) / (f * f));
      const sq = (p: [number, number]): number => p[0] * p[0] + p[1] * p[1];
      const rel = Math.sqrt(integrateLog((f) => sq(cornerTransfer(c, f).relativeVelocity) * gz(f)));
      const wacc = Math.sqrt(integrateLog((f) => wkWeight(f) ** 2 * sq(cornerTransfer(c, f).bodyAccel) * gz(f)));
      const tyre = Math.sqrt(integrateLog((f) => sq(cornerTransfer(c, f).tireLoad) * gz(f))) / ((c.sprungMassKg + c.unsprungMassKg) * 9.80665);
      checkClose(d.rmsRelativeVelocity, rel, { rel: 2e-3 }, 'computed: direct band-limited integration', { kmh });
      checkClose(d.rmsWeightedAccel, wacc, { rel: 2e-3 }, 'computed: direct band-limited integration', { kmh });
      checkClose(d.rmsTireLoadRatio, tyre, { rel: 2e-3 }, 'computed: direct band-limited integration', { kmh });
      const white = dutyOnRoad(prepareDuty(c, v, { maxCyclesPerM: 'unlimited' }), gd);
      checkClose(d.rmsSuspensionTravel, white.rmsSuspensionTravel, { rel: 0.01 }, 'computed: travel lives in long waves', { kmh });
    }
  });

  it('when a synthetic 0.25 m or 0.3 m profile of known Gd(n0) is simulated as the nightly job does (band limit, resampling, Wk in the loop), then every output agrees with the closed form within 5 % at 30, 50, 80 and 100 km/h (computed)', () => {
    const gd = gdForClass('C');
    for (const dx of [0.25, 0.3]) {
      const z = synthesizeProfile({ gdN0: gd, lengthM: 8000, dxM: dx, seed: 12 });
      const part = bandLimitProfile(z, dx);
      for (const c of [VAN, DEMO_CORNERS.courierVanFront, DEMO_CORNERS.truckRear]) {
        for (const kmh of [30, 50, 80, 100]) {
          const v = kmh / 3.6;
          const cf = dutyOnRoad(prepareDuty(c, v), gd);
          const sim = prepareSimulation(c, part.dxM, v, { weighted: true });
          const first = Math.round(100 / part.dxM);
          const end = part.elevationsM.length - 1 - Math.round(20 / part.dxM);
          const r = simulateWeighted(sim, part.elevationsM, first, end, new Float64Array(end - first));
          const got: Record<string, number> = {
            rmsRelativeVelocity: Math.sqrt(r.msRelVel),
            rmsSuspensionTravel: Math.sqrt(r.msTravel),
            rmsBodyAccel: Math.sqrt(r.msBodyAccel),
            rmsWeightedAccel: Math.sqrt(r.msWeightedAccel),
            rmsTireLoadRatio: Math.sqrt(r.msTireLoad) / sim.staticLoadN,
            damperEnergyJPerKm: ((sim.dampingNsPerM * r.msRelVel) / v) * 1000,
          };
          for (const [k, value] of Object.entries(got)) {
            checkClose(value, cf[k as keyof DutyResult], { rel: 0.05 }, 'computed: simulation vs closed form on the same road band', { dx, corner: c, kmh, k });
          }
        }
      }
    }
  });

  it('when Gd(n0) is multiplied by 4, then variances (and power) scale by 4 and RMS by 2 (property, docs/methods.md "Road roughness")', () => {
    const p = prepareDuty(CAR, 70 / 3.6);
    const a = dutyOnRoad(p, 64e-6);
    const b = dutyOnRoad(p, 256e-6);
    for (const k of KEYS) {
      const factor = k === 'damperPowerW' || k === 'damperEnergyJPerKm' ? 4 : 2;
      checkClose(b[k], factor * a[k], { rel: 1e-12 }, 'property: variance linear in Gd(n0)', { k });
    }
  });

  it('when speed doubles on a w = 2 road, then variances double (property, docs/methods.md "Road roughness": linear in Gd(n0)·v)', () => {
    const a = dutyOnRoad(prepareDuty(CAR, 10, { maxCyclesPerM: 'unlimited' }), 100e-6);
    const b = dutyOnRoad(prepareDuty(CAR, 20, { maxCyclesPerM: 'unlimited' }), 100e-6);
    checkClose(b.rmsSuspensionTravel, Math.SQRT2 * a.rmsSuspensionTravel, { rel: 1e-9 }, 'property', {});
    checkClose(b.damperPowerW, 2 * a.damperPowerW, { rel: 1e-9 }, 'property', {});
    // energy per km = power / v: unchanged by speed on w = 2 roads
    checkClose(b.damperEnergyJPerKm, a.damperEnergyJPerKm, { rel: 1e-9 }, 'property', {});
  });

  it('when the road is perfectly smooth (Gd = 0), then every output is zero (property)', () => {
    const d = dutyOnRoad(prepareDuty(CAR, 20), 0);
    for (const k of KEYS) checkClose(d[k], 0, { abs: 0 }, 'property: zero road', { k });
  });

  it('when the rated life energy is computed with defaults, then it is 90 000 km × energy per km on class B at 80 km/h (product.md §3)', () => {
    const perKm = dutyOnRoad(prepareDuty(CAR, 80 / 3.6), 64e-6).damperEnergyJPerKm;
    checkClose(ratedLifeEnergyJ(CAR), 90000 * perKm, { rel: 1e-12 }, 'product.md §3 default rating', CAR);
    checkClose(ratedLifeEnergyJ(CAR, { km: 45000 }), 45000 * perKm, { rel: 1e-12 }, 'product.md §3', CAR);
  });

  it('when Gd is negative or not a number, then the error names gdN0 and m³', () => {
    const p = prepareDuty(CAR, 20);
    for (const bad of [-1e-6, Number.NaN]) {
      const msg = errorOf(() => dutyOnRoad(p, bad));
      checkClose(msg.includes('gdN0') && msg.includes('[m³]') ? 1 : 0, 1, { abs: 0 }, 'house rule: error names parameter and unit', { bad, msg });
    }
  });
});

/** ∫ g(f) df from f0 to f1 by Simpson's rule in ln f (20 000 intervals; no discontinuity inside). */
function simpsonLog(g: (f: number) => number, f0: number, f1: number, n = 20000): number {
  const a = Math.log(f0);
  const h = (Math.log(f1) - a) / n;
  let s = 0;
  for (let i = 0; i <= n; i++) {
    const f = Math.exp(a + i * h);
    s += (i === 0 || i === n ? 1 : i % 2 ? 4 : 2) * g(f) * f;
  }
  return (s * h) / 3;
}

const sq = (p: [number, number]): number => p[0] * p[0] + p[1] * p[1];

/** Each variance per unit Gd(n0) of a band-limited road, by Simpson integration of |H|²·n0²·v/f² from 1e-4 Hz to n_max·v. */
function bandVariances(c: CornerParams, v: number, nMax: number): Omit<PreparedDuty, 'speedMps' | 'dampingNsPerM'> {
  const f1 = nMax * v;
  const gz = (f: number): number => (ISO8608_N0 * ISO8608_N0 * v) / (f * f);
  const w = (c.sprungMassKg + c.unsprungMassKg) * 9.80665;
  return {
    varBodyAccelPerGd: simpsonLog((f) => sq(cornerTransfer(c, f).bodyAccel) * gz(f), 1e-4, f1),
    varWeightedAccelPerGd: simpsonLog((f) => wkWeight(f) ** 2 * sq(cornerTransfer(c, f).bodyAccel) * gz(f), 1e-4, f1),
    varTravelPerGd: simpsonLog((f) => sq(cornerTransfer(c, f).suspensionTravel) * gz(f), 1e-4, f1),
    varRelVelPerGd: simpsonLog((f) => sq(cornerTransfer(c, f).relativeVelocity) * gz(f), 1e-4, f1),
    varTireLoadRatioPerGd: simpsonLog((f) => sq(cornerTransfer(c, f).tireLoad) * gz(f), 1e-4, f1) / (w * w),
  };
}

describe('closed-form duty on the band-limited road, precisely', () => {
  it('when the default road band is used, then every variance per unit Gd(n0) equals Simpson integration up to 1/0.6 cycles/m · v within 2e-5, and speed and damping are carried (computed)', () => {
    for (const [c, kmh] of [[CAR, 30], [DEMO_CORNERS.truckRear, 80], [DEMO_CORNERS.courierVanFront, 100]] as const) {
      const v = kmh / 3.6;
      const p = prepareDuty(c, v);
      checkThat(p.speedMps === v && p.dampingNsPerM === c.dampingNsPerM, 'definition', JSON.stringify(p));
      const ref = bandVariances(c, v, 1 / 0.6);
      for (const [k, r] of Object.entries(ref)) {
        checkClose(p[k as keyof typeof ref], r, { rel: 2e-5 }, 'computed: Simpson integration in ln f up to the band top', { c, kmh, k });
      }
    }
  });

  it('when another road band is asked for, then the integrals end at that band top (computed)', () => {
    for (const nMax of [0.05, 0.4, 3]) {
      const v = 60 / 3.6;
      const p = prepareDuty(DEMO_CORNERS.longVanFront, v, { maxCyclesPerM: nMax });
      const ref = bandVariances(DEMO_CORNERS.longVanFront, v, nMax);
      // a band top at 0.83 Hz ends the grid on the steep flank below body bounce, where the integrand grows
      // like f⁶: the trapezoid's relative error there is ≈ h²·36/12 ≈ 1e-4 (h = ln 10 / 400)
      const tol = nMax < 0.1 ? 3e-4 : 2e-5;
      for (const [k, r] of Object.entries(ref)) {
        checkClose(p[k as keyof typeof ref], r, { rel: tol }, 'computed: Simpson integration in ln f up to the band top', { nMax, k });
      }
    }
  });

  it('when the band top is outside 0.05–1000 cycles/m, then it is refused naming maxCyclesPerM [cycles/m] (house rule)', () => {
    for (const bad of [0.04, 1001, Number.NaN]) {
      let err: unknown = null;
      try {
        prepareDuty(CAR, 20, { maxCyclesPerM: bad });
      } catch (e) {
        err = e;
      }
      checkThat(err instanceof PhysicsInputError && (err as Error).message.startsWith('physics: maxCyclesPerM [cycles/m] must be'), 'house rule', String(err));
    }
  });

  it('when the damper power and energy per km are read, then they are cs·Var(v) and power/v·1000 (definition, docs/methods.md §3)', () => {
    const p = prepareDuty(CAR, 25);
    const d = dutyOnRoad(p, 64e-6);
    checkClose(d.damperPowerW, CAR.dampingNsPerM * p.varRelVelPerGd * 64e-6, { rel: 1e-14 }, 'definition: cs·E[v²]', {});
    checkClose(d.damperEnergyJPerKm, (d.damperPowerW / 25) * 1000, { rel: 1e-14 }, 'definition: J/km', {});
    checkClose(d.rmsTireLoadRatio, Math.sqrt(p.varTireLoadRatioPerGd * 64e-6), { rel: 1e-14 }, 'definition', {});
  });

  it('when Gd(n0) is above 1 m³, then dutyOnRoad refuses it naming gdN0 [m³] (house rule)', () => {
    const p = prepareDuty(CAR, 20);
    for (const bad of [1.5, 2]) {
      let msg = '';
      try {
        dutyOnRoad(p, bad);
      } catch (e) {
        msg = (e as Error).message;
      }
      checkThat(msg.startsWith('physics: gdN0 [m³] must be'), 'house rule', msg);
    }
    checkThat(dutyOnRoad(p, 0.999).rmsBodyAccel > 0, 'definition: just below 1 m³ is accepted', '');
  });

  it('when the rated life is asked for another road, speed or distance, then it is that energy per km times the distance; a zero or negative distance is refused (product.md §3; house rule)', () => {
    const perKm = (gd: number, v: number): number => dutyOnRoad(prepareDuty(CAR, v), gd).damperEnergyJPerKm;
    checkClose(ratedLifeEnergyJ(CAR, { gdN0: 256e-6 }), 90000 * perKm(256e-6, 80 / 3.6), { rel: 1e-12 }, 'product.md §3', {});
    checkClose(ratedLifeEnergyJ(CAR, { speedMps: 15 }), 90000 * perKm(64e-6, 15), { rel: 1e-12 }, 'product.md §3', {});
    checkThat(perKm(64e-6, 15) !== perKm(64e-6, 80 / 3.6), 'computed: the band-limited road depends on speed', '');
    for (const [opts, name] of [[{ km: 0 }, 'km [km]'], [{ gdN0: 0 }, 'gdN0 [m³]'], [{ km: 2e7 }, 'km [km]']] as const) {
      let msg = '';
      try {
        ratedLifeEnergyJ(CAR, opts);
      } catch (e) {
        msg = (e as Error).message;
      }
      checkThat(msg.startsWith(`physics: ${name} must be`), 'house rule', msg);
    }
  });

  it('when travel moments are taken on a w = 2 road, then m0, m1, m2 and m4 equal Simpson integrals of f^k·|H|²·Gd·n0²·v/f² from 0.01 Hz to the band top (computed)', () => {
    for (const [c, kmh] of [[CAR, 50], [DEMO_CORNERS.truckFront, 80]] as const) {
      const v = kmh / 3.6;
      const gd = 256e-6;
      const m = travelMoments(c, v, gd);
      const f1 = ROAD_BAND.maxCyclesPerM * v;
      const g = (f: number): number => sq(cornerTransfer(c, f).suspensionTravel) * ((gd * ISO8608_N0 * ISO8608_N0 * v) / (f * f));
      const ref = [0, 1, 2, 4].map((k) => simpsonLog((f) => f ** k * g(f), 0.01, f1));
      [m.m0, m.m1, m.m2, m.m4].forEach((value, i) => checkClose(value, ref[i], { rel: 2e-3 }, 'computed: Simpson integration in ln f, 600-point trapezoid in the engine', { c, kmh, k: [0, 1, 2, 4][i] }));
    }
  });
});
