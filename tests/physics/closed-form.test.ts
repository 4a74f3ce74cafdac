import { describe, it } from 'vitest';
import { prepareDuty, dutyOnRoad, ratedLifeEnergyJ, ROAD_BAND, type DutyResult } from '../../server/physics/closed-form';
import { cornerTransfer } from '../../server/physics/quarter-car';
import { wkWeight } from '../../server/physics/exposure';
import { synthesizeProfile, gdForClass, ISO8608_N0 } from '../../server/physics/iso8608';
import { prepareSimulation, simulateProfile } from '../../server/physics/simulate';
import { checkClose, CAR, DEMO_CORNERS, errorOf } from './check';
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
