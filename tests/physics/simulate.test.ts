import { describe, it } from 'vitest';
import { simulateProfile, prepareSimulation, runSimulation, simulateTravel, simulateWeighted } from '../../server/physics/simulate';
import { cornerTransfer } from '../../server/physics/quarter-car';
import { synthesizeProfile } from '../../server/physics/iso8608';
import { checkClose, checkThat, CAR, DEMO_CORNERS, errorOf, thrownBy } from './check';

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

/** Mean square of `a[from..to)`. */
const meanSquare = (a: Float64Array, from: number, to: number): number => {
  let s = 0;
  for (let i = from; i < to; i++) s += a[i] * a[i];
  return s / (to - from);
};

describe('simulation loops and statistics', () => {
  it('when the weighted 12-state fast loop and the general loop run the same road, then all five statistics agree (computed: same recurrence written twice)', () => {
    const z = synthesizeProfile({ gdN0: 1024e-6, lengthM: 300, dxM: 0.05, seed: 7 });
    const p = prepareSimulation(CAR, 0.05, V, { weighted: true });
    checkThat(p.n === 12 && p.rows.weightedAccel !== null, 'definition: Wk adds 8 states', String(p.n));
    const fast = runSimulation(p, z, { warmupM: 10 });
    const general = runSimulation(p, z, { warmupM: 10, series: true });
    for (const k of ['rmsBodyAccel', 'rmsWeightedAccel', 'rmsSuspensionTravel', 'rmsRelativeVelocity', 'rmsTireLoadRatio', 'damperPowerW'] as const) {
      checkClose(fast[k], general[k], { rel: 1e-12 }, 'computed: same recurrence', { k });
      checkThat(fast[k] > 0, 'property: a rough road moves the car', k);
    }
  });

  it('when series are returned, then the statistics are the mean squares of the series after the warm-up, and the bookkeeping fields follow from the profile (definition)', () => {
    const dx = 0.05;
    const z = synthesizeProfile({ gdN0: 256e-6, lengthM: 200, dxM: dx, seed: 9 });
    for (const weighted of [false, true]) {
      const r = simulateProfile(CAR, z, dx, V, { weighted, series: true, warmupM: 12.3 });
      const s = r.series!;
      const len = z.length;
      const first = Math.ceil(12.3 / dx); // step index of the first counted step; its end state is series index first + 1
      checkThat(r.steps === len - 1 && r.countedSteps === len - 1 - first, 'definition', `${r.steps} ${r.countedSteps}`);
      checkClose(r.dtS, dx / V, { rel: 1e-15 }, 'definition: dt = dx / v', {});
      checkThat(s.bodyAccel.length === len && s.suspensionTravel[0] === 0 && s.tireLoad[0] === 0, 'definition: index 0 is the resting start', '');
      checkClose(r.rmsBodyAccel, Math.sqrt(meanSquare(s.bodyAccel, first + 1, len)), { rel: 1e-12 }, 'definition', { weighted });
      checkClose(r.rmsSuspensionTravel, Math.sqrt(meanSquare(s.suspensionTravel, first + 1, len)), { rel: 1e-12 }, 'definition', { weighted });
      checkClose(r.rmsRelativeVelocity, Math.sqrt(meanSquare(s.relativeVelocity, first + 1, len)), { rel: 1e-12 }, 'definition', { weighted });
      const staticLoad = (CAR.sprungMassKg + CAR.unsprungMassKg) * 9.80665;
      checkClose(r.rmsTireLoadRatio, Math.sqrt(meanSquare(s.tireLoad, first + 1, len)) / staticLoad, { rel: 1e-12 }, 'definition: static load (ms + mu)·g', { weighted });
      checkClose(r.damperPowerW, CAR.dampingNsPerM * meanSquare(s.relativeVelocity, first + 1, len), { rel: 1e-12 }, 'definition: cs·E[v²]', {});
      checkClose(r.damperEnergyJ, r.damperPowerW * r.countedSteps * r.dtS, { rel: 1e-12 }, 'definition: power × counted time', {});
      checkClose(r.damperEnergyJPerKm, (r.damperPowerW / V) * 1000, { rel: 1e-12 }, 'definition: J/km', {});
      // relative velocity is the travel's rate: a central difference of the travel series matches it
      const i = Math.round(len / 2);
      checkClose(s.relativeVelocity[i], (s.suspensionTravel[i + 1] - s.suspensionTravel[i - 1]) / (2 * r.dtS), { abs: 0.05 * Math.sqrt(meanSquare(s.relativeVelocity, 1, len)) }, 'computed: d(travel)/dt', {});
      if (weighted) {
        checkThat(s.weightedAccel !== undefined, 'definition', '');
        checkClose(r.rmsWeightedAccel, Math.sqrt(meanSquare(s.weightedAccel!, first + 1, len)), { rel: 1e-12 }, 'definition', {});
      } else {
        checkThat(s.weightedAccel === undefined && Number.isNaN(r.rmsWeightedAccel), 'definition: no Wk filter, no weighted figure', String(r.rmsWeightedAccel));
      }
    }
  });

  it('when the warm-up covers the whole profile, then nothing is counted and the statistics are not numbers (definition)', () => {
    const z = synthesizeProfile({ gdN0: 256e-6, lengthM: 20, dxM: 0.05, seed: 1 });
    for (const weighted of [false, true]) {
      const r = simulateProfile(CAR, z, 0.05, V, { weighted, warmupM: 50 });
      checkThat(r.countedSteps === 0 && Number.isNaN(r.rmsBodyAccel) && Number.isNaN(r.damperPowerW), 'definition', JSON.stringify(r));
    }
  });

  it('when the inputs are out of range, then the errors name the parameter and unit (house rule)', () => {
    const p = prepareSimulation(CAR, 0.05, V);
    const cases: [() => unknown, string][] = [
      [() => runSimulation(p, new Float64Array(1)), 'physics: elevationsM [m] needs at least 2 samples, got 1'],
      [() => runSimulation(p, new Float64Array(10), { warmupM: -1 }), 'physics: warmupM [m] must be ≥ 0, got -1'],
      [() => prepareSimulation(CAR, 0.0009, V), 'physics: dxM [m] must be ≥ 0.001, got 0.0009'],
      [() => prepareSimulation(CAR, 10.5, V), 'physics: dxM [m] must be ≤ 10, got 10.5'],
      [() => prepareSimulation(CAR, 0.05, 0), 'physics: speedMps [m/s] must be ≥ 0.1, got 0'],
    ];
    for (const [f, msg] of cases) {
      const e = thrownBy(f);
      checkThat(e instanceof Error && e.message === msg, 'house rule', `${String(e)} / ${msg}`);
    }
    checkThat(runSimulation(p, new Float64Array(2)).steps === 1, 'definition: two samples are one step', '');
  });

  it('when the state overflows on an absurd profile, then the run stops with a non-finite error, whichever loop runs (house rule)', () => {
    const z = Float64Array.from({ length: 200 }, (_, i) => (i % 2 ? 1e300 : -1e300));
    for (const opts of [{}, { weighted: true }, { series: true }, { weighted: true, series: true }]) {
      const e = thrownBy(() => simulateProfile(CAR, z, 0.05, V, opts));
      checkThat(e instanceof Error && e.message === 'physics: non-finite state during simulation', 'house rule', `${JSON.stringify(opts)}: ${String(e)}`);
    }
  });
});

describe('buffer loops of the nightly job', () => {
  it('when simulateTravel writes its buffer, then it holds the travel after each counted step, as the general loop\'s series does (computed: same recurrence)', () => {
    const z = synthesizeProfile({ gdN0: 256e-6, lengthM: 100, dxM: 0.05, seed: 4 });
    const p = prepareSimulation(DEMO_CORNERS.courierVanRear, 0.05, V);
    const ref = runSimulation(p, z, { series: true }).series!;
    const first = 37;
    const buf = new Float64Array(z.length - 1 - first);
    const r = simulateTravel(p, z, first, buf);
    checkThat(r.counted === buf.length, 'definition', `${r.counted} ${buf.length}`);
    buf.forEach((v, j) => checkClose(v, ref.suspensionTravel[first + 1 + j], { abs: 1e-15 }, 'computed: same recurrence', { j }));
    checkClose(r.msTravel, meanSquare(ref.suspensionTravel, first + 1, z.length), { rel: 1e-12 }, 'computed', {});
    checkClose(r.msTireLoad, meanSquare(ref.tireLoad, first + 1, z.length), { rel: 1e-12 }, 'computed', {});
    checkClose(r.msRelVel, meanSquare(ref.relativeVelocity, first + 1, z.length), { rel: 1e-12 }, 'computed', {});
    checkClose(r.msBodyAccel, meanSquare(ref.bodyAccel, first + 1, z.length), { rel: 1e-12 }, 'computed', {});
    const none = simulateTravel(p, z, z.length, null);
    checkThat(none.counted === 0 && none.msTravel === 0, 'definition: nothing counted, zero', JSON.stringify(none));
  });

  it('when simulateWeighted counts a window of steps, then its mean squares and buffer are those of the general loop\'s series over that window (computed: same recurrence)', () => {
    const z = synthesizeProfile({ gdN0: 256e-6, lengthM: 100, dxM: 0.05, seed: 6 });
    const p = prepareSimulation(DEMO_CORNERS.truckFront, 0.05, V, { weighted: true });
    const ref = runSimulation(p, z, { series: true }).series!;
    const [first, end] = [50, 1500];
    const buf = new Float64Array(end - first);
    const r = simulateWeighted(p, z, first, end, buf);
    checkThat(r.counted === end - first, 'definition', String(r.counted));
    buf.forEach((v, j) => checkClose(v, ref.suspensionTravel[first + 1 + j], { abs: 1e-15 }, 'computed: same recurrence', { j }));
    checkClose(r.msWeightedAccel, meanSquare(ref.weightedAccel!, first + 1, end + 1), { rel: 1e-10 }, 'computed', {});
    checkClose(r.msBodyAccel, meanSquare(ref.bodyAccel, first + 1, end + 1), { rel: 1e-10 }, 'computed', {});
    checkClose(r.msTireLoad, meanSquare(ref.tireLoad, first + 1, end + 1), { rel: 1e-10 }, 'computed', {});
    checkClose(r.msRelVel, meanSquare(ref.relativeVelocity, first + 1, end + 1), { rel: 1e-10 }, 'computed', {});
    checkClose(r.msTravel, meanSquare(ref.suspensionTravel, first + 1, end + 1), { rel: 1e-10 }, 'computed', {});
    // an end beyond the profile stops at its last step
    checkThat(simulateWeighted(p, z, first, 10 * z.length, null).counted === z.length - 1 - first, 'definition', '');
  });

  it('when a buffer loop gets the wrong model order, then it refuses (definition)', () => {
    const p4 = prepareSimulation(CAR, 0.05, V);
    const p12 = prepareSimulation(CAR, 0.05, V, { weighted: true });
    const z = new Float64Array(10);
    checkThat(String(thrownBy(() => simulateTravel(p12, z, 0, null))).includes('simulateTravel: needs the 4-state model'), 'definition', '');
    checkThat(String(thrownBy(() => simulateWeighted(p4, z, 0, 9, null))).includes('simulateWeighted: needs the 12-state weighted model'), 'definition', '');
  });
});
