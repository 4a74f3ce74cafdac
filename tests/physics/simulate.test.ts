import { describe, it } from 'vitest';
import { simulateProfile, prepareSimulation, runSimulation } from '../../server/physics/simulate';
import { cornerTransfer } from '../../server/physics/quarter-car';
import { synthesizeProfile } from '../../server/physics/iso8608';
import { checkClose, checkThat, CAR, errorOf } from './check';

const V = 60 / 3.6;

describe('simulateProfile', () => {
  it('when the road is flat, then every response is exactly zero (property)', () => {
    const r = simulateProfile(CAR, new Float64Array(5000), 0.05, V, { weighted: true });
    for (const k of ['rmsBodyAccel', 'rmsWeightedAccel', 'rmsSuspensionTravel', 'rmsRelativeVelocity', 'rmsTireLoadRatio', 'damperPowerW'] as const) {
      checkClose(r[k], 0, { abs: 0 }, 'property: zero input, zero state', { k });
    }
  });

  it('when the road amplitude is tripled, then every RMS triples and power grows ninefold (property: linearity)', () => {
    const z = synthesizeProfile({ gdN0: 256e-6, lengthM: 500, dxM: 0.05, seed: 11 });
    const z3 = z.map((v) => 3 * v);
    const a = simulateProfile(CAR, z, 0.05, V, { weighted: true });
    const b = simulateProfile(CAR, z3, 0.05, V, { weighted: true });
    for (const k of ['rmsBodyAccel', 'rmsWeightedAccel', 'rmsSuspensionTravel', 'rmsRelativeVelocity', 'rmsTireLoadRatio'] as const) {
      checkClose(b[k], 3 * a[k], { rel: 1e-12 }, 'property: linearity', { k });
    }
    checkClose(b.damperPowerW, 9 * a.damperPowerW, { rel: 1e-12 }, 'property: power quadratic in amplitude', {});
  });

  it('when the road is an inclined plane, then the car settles to zero travel, zero relative velocity, both masses rising with the road (analytic)', () => {
    const slope = 0.03;
    const dx = 0.05;
    const z = Float64Array.from({ length: 16001 }, (_, i) => slope * i * dx); // 48 s: transient decays below 1e-15
    const r = simulateProfile(CAR, z, dx, V, { series: true });
    const s = r.series!;
    const last = z.length - 1;
    checkClose(s.suspensionTravel[last], 0, { abs: 1e-12 }, 'analytic steady state', { slope });
    checkClose(s.relativeVelocity[last], 0, { abs: 1e-12 }, 'analytic steady state', { slope });
    checkClose(s.bodyAccel[last], 0, { abs: 1e-10 }, 'analytic steady state', { slope });
  });

  it('when the road is a sinusoid, then the steady-state travel amplitude equals |H(f)|·a from the transfer function (computed, independent path)', () => {
    for (const f of [1.2, 4, 11]) {
      const a = 0.005;
      const dx = 0.01;
      const n = Math.round((30 * V) / dx); // 30 s
      const z = Float64Array.from({ length: n + 1 }, (_, i) => a * Math.sin((2 * Math.PI * f * i * dx) / V));
      const r = simulateProfile(CAR, z, dx, V, { series: true, warmupM: 20 * V });
      const tr = r.series!.suspensionTravel;
      let peak = 0;
      for (let i = Math.round((20 * V) / dx); i <= n; i++) peak = Math.max(peak, Math.abs(tr[i]));
      const exp = Math.hypot(...cornerTransfer(CAR, f).suspensionTravel) * a;
      // sampled peak and linear interpolation of the road: error ≈ (π·f·dt)² ≈ 1e-4
      checkClose(peak, exp, { rel: 2e-3 }, 'computed: frequency response', { f, a, dx, speedMps: V });
    }
  });

  it('when the sample spacing halves, then the error against a fine reference falls about fourfold (convergence, computed)', () => {
    // band-limited road so every spacing samples the same profile
    const length = 400;
    const base = { gdN0: 256e-6, lengthM: length, seed: 5, nMaxCyclesPerM: 1.5 };
    const run = (dx: number): number =>
      simulateProfile(CAR, synthesizeProfile({ ...base, dxM: dx }), dx, V, { warmupM: 50 }).rmsTireLoadRatio;
    const ref = run(0.0125 / 4);
    const errs = [0.1, 0.05, 0.025].map((dx) => Math.abs(run(dx) - ref));
    checkThat(errs[0] / errs[1] > 3 && errs[1] / errs[2] > 3, 'computed: second-order convergence of linear road interpolation', `errors ${errs.join(', ')}`);
  });

  it('when the profile holds a NaN, then a prefixed non-finite error names the sample', () => {
    const z = new Float64Array(10);
    z[4] = Number.NaN;
    const msg = errorOf(() => simulateProfile(CAR, z, 0.05, V));
    checkThat(msg.startsWith('physics: non-finite') && msg.includes('elevationsM[4]'), 'convention 13', `message "${msg}"`);
  });

  it('when the 4-state fast loop and the general loop run the same road, then the statistics agree (computed)', () => {
    const z = synthesizeProfile({ gdN0: 1024e-6, lengthM: 300, dxM: 0.05, seed: 2 });
    const p = prepareSimulation(CAR, 0.05, V);
    const fast = runSimulation(p, z, { warmupM: 10 });
    const general = runSimulation(p, z, { warmupM: 10, series: true });
    for (const k of ['rmsBodyAccel', 'rmsSuspensionTravel', 'rmsRelativeVelocity', 'rmsTireLoadRatio'] as const) {
      checkClose(fast[k], general[k], { rel: 1e-12 }, 'computed: same recurrence', { k });
    }
  });
});
