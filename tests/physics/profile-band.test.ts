import { describe, it } from 'vitest';
import { bandLimitProfile, SIMULATION_TARGET_DX_M } from '../../server/physics/profile-band';
import { ROAD_BAND } from '../../server/physics/closed-form';
import { PhysicsInputError } from '../../server/physics/types';
import { checkClose, checkThat, thrownBy } from './check';

/**
 * A cosine whose samples i = 0 … size−1 at spacing dx are one exact period of the FFT window, with
 * equal first and last samples (phase offset of half a sample), so the straight-line removal takes
 * off a constant only: its spectrum is a single bin k, spatial frequency k/(size·dx).
 */
const binCos = (size: number, k: number, amp: number) => (i: number): number => amp * Math.cos((2 * Math.PI * k * (i + 0.5)) / size);

/** Linear interpolation of `z` (spacing dx) at x, 0 ≤ x < (z.length − 1)·dx. */
function linInterp(z: number[], dx: number, x: number): number {
  const t = x / dx;
  const i = Math.floor(t);
  const f = t - i;
  return z[i] * (1 - f) + z[i + 1] * f;
}

describe('bandLimitProfile', () => {
  it('when a smooth long-wave bump on a slope is resampled 4× finer, then every fine sample lies on the true curve (computed: the bump has no content near the band edge)', () => {
    const dx = 0.25;
    const n = 50; // padded with zeros to 64 for the FFT
    const len = (n - 1) * dx;
    // true law: a sin² bump (zero value and slope at both ends) plus a straight line and an offset
    const truth = (x: number): number => 0.012 * Math.sin((Math.PI * x) / len) ** 2 + 0.004 * x - 0.03;
    const z = Array.from({ length: n }, (_, i) => truth(i * dx));
    const r = bandLimitProfile(z, dx);
    checkThat(r.factor === 4 && r.dxM === 0.0625 && r.elevationsM.length === (n - 1) * 4 + 1, 'computed: 0.25 m / 4 = 0.0625 m ≤ 0.08 m target', JSON.stringify({ factor: r.factor, dxM: r.dxM, len: r.elevationsM.length }));
    for (let j = 0; j < r.elevationsM.length; j++) checkClose(r.elevationsM[j], truth(j * r.dxM), { abs: 2e-5 }, 'computed: true curve', { j });
  });

  it('when a wave inside the band and one beyond it are given, then the one beyond is removed and the one inside is raised by 1/sinc²(π·n·dx′), so that linear interpolation at the new spacing carries it at its own amplitude (computed: linear interpolation passes a wave at sinc²)', () => {
    const dx = 0.25;
    const size = 64;
    const inBand = binCos(size, 20, 0.01); // 1.25 cycles/m, below the 1/0.6 m road band
    const beyond = binCos(size, 28, 0.004); // 1.75 cycles/m, above it
    const z = Array.from({ length: size }, (_, i) => 0.2 + inBand(i) + beyond(i));
    const r = bandLimitProfile(z, dx);
    checkThat(ROAD_BAND.maxCyclesPerM > 1.25 && ROAD_BAND.maxCyclesPerM < 1.75, 'definition', String(ROAD_BAND.maxCyclesPerM));
    const nu = 20 / (size * dx);
    const xs = Math.PI * nu * r.dxM;
    const gain = 1 / (Math.sin(xs) / xs) ** 2;
    for (let j = 0; j < r.elevationsM.length; j++) {
      const expected = 0.2 + gain * 0.01 * Math.cos(2 * Math.PI * nu * (j * r.dxM + dx / 2));
      checkClose(r.elevationsM[j], expected, { abs: 1e-12 }, 'computed: ideal low-pass with sinc² pre-compensation', { j });
    }
    // the simulation's road input: linear interpolation between the fine samples; its Fourier
    // coefficient at the in-band frequency over whole periods of that wave (19 of them fit in the
    // 15.75 m part) is the input wave's amplitude
    const fine = Array.from(r.elevationsM).map((v) => v - 0.2);
    let c = 0;
    const span = 19 / nu;
    const steps = 20000;
    for (let s = 0; s < steps; s++) {
      const x = ((s + 0.5) * span) / steps;
      c += linInterp(fine, r.dxM, x) * Math.cos(2 * Math.PI * nu * (x + dx / 2));
    }
    checkClose((2 * c) / steps, 0.01, { rel: 1e-3 }, 'computed: linear interpolation transfer sinc²(π·n·dx′)', { nu });
  });

  it('when the band is given as an option, then waves above it are removed and below it kept (computed)', () => {
    const size = 32;
    const dx = 0.05;
    const low = binCos(size, 3, 0.01); // 1.875 cycles/m
    const high = binCos(size, 9, 0.01); // 5.625 cycles/m
    const z = Array.from({ length: size }, (_, i) => low(i) + high(i));
    const r = bandLimitProfile(z, dx, { maxCyclesPerM: 3 });
    checkThat(r.factor === 1 && r.dxM === dx, 'computed: 0.05 m is already finer than the target', JSON.stringify(r.factor));
    const xs = Math.PI * (3 / (size * dx)) * dx;
    const gain = 1 / (Math.sin(xs) / xs) ** 2;
    for (let i = 0; i < size; i++) checkClose(r.elevationsM[i], gain * low(i), { abs: 1e-12 }, 'computed: ideal low-pass at 3 cycles/m', { i });
    // a wave exactly at the band limit is kept (the band includes its limit)
    const atLimit = bandLimitProfile(z, dx, { maxCyclesPerM: 3 / (size * dx) });
    for (let i = 0; i < size; i++) checkClose(atLimit.elevationsM[i], gain * low(i), { abs: 1e-12 }, 'definition: band limit inclusive', { i });
  });

  it('when the band reaches past the Nyquist frequency of the input, then every resolvable wave is kept and nothing is invented above them (computed)', () => {
    const size = 64;
    const dx = 0.25;
    const w = binCos(size, 20, 0.01);
    const r = bandLimitProfile(Array.from({ length: size }, (_, i) => w(i)), dx, { maxCyclesPerM: 1000 });
    const nu = 20 / (size * dx);
    const xs = Math.PI * nu * r.dxM;
    const gain = 1 / (Math.sin(xs) / xs) ** 2;
    for (let j = 0; j < r.elevationsM.length; j++) checkClose(r.elevationsM[j], gain * 0.01 * Math.cos(2 * Math.PI * nu * (j * r.dxM + dx / 2)), { abs: 1e-12 }, 'computed: the one input wave, pre-compensated', { j });
  });

  it('when the spacing is an exact power of two above the target, then the factor is that power; a coarser target keeps the spacing (computed: 0.16 m / 0.08 m = 2, 0.3 m / 0.08 m → 4)', () => {
    const z = Array.from({ length: 20 }, (_, i) => 0.001 * Math.sin(i / 5));
    checkThat(SIMULATION_TARGET_DX_M === 0.08, 'definition', String(SIMULATION_TARGET_DX_M));
    checkThat(bandLimitProfile(z, 0.16).factor === 2, 'computed: 0.16/0.08 = 2', String(bandLimitProfile(z, 0.16).factor));
    checkThat(bandLimitProfile(z, 0.3).factor === 4, 'computed: 0.3/0.08 = 3.75 → 4', String(bandLimitProfile(z, 0.3).factor));
    checkThat(bandLimitProfile(z, 0.02).factor === 1, 'computed: finer than target', '');
    const t = bandLimitProfile(z, 0.3, { targetDxM: 0.3 });
    checkThat(t.factor === 1 && t.dxM === 0.3 && t.elevationsM.length === 20, 'computed: target equals spacing', JSON.stringify(t.factor));
    // the extreme accepted values
    checkThat(bandLimitProfile(z, 0.001, { maxCyclesPerM: 0.01 }).factor === 1, 'definition: lower bounds are inclusive', '');
    checkThat(bandLimitProfile(z.slice(0, 8), 0.3, { targetDxM: 0.001, maxCyclesPerM: 1000 }).factor === 512, 'computed: 0.3/0.001 = 300 → 512', '');
  });

  it('when the input is too short or out of range, then the error names the parameter and its unit (house rule)', () => {
    const z = new Array(8).fill(0);
    const cases: [() => unknown, string][] = [
      [() => bandLimitProfile(z.slice(0, 7), 0.25), 'elevationsM [m] needs at least 8 samples, got 7'],
      [() => bandLimitProfile(z, 0.31), 'dxM [m]'],
      [() => bandLimitProfile(z, 0.0009), 'dxM [m]'],
      [() => bandLimitProfile(z, 0.25, { maxCyclesPerM: 0.009 }), 'maxCyclesPerM [cycles/m]'],
      [() => bandLimitProfile(z, 0.25, { targetDxM: 1.1 }), 'targetDxM [m]'],
    ];
    for (const [f, text] of cases) {
      const err = thrownBy(f);
      checkThat(err instanceof PhysicsInputError && (err as Error).message.includes(text), 'house rule', `${String(err)} should include "${text}"`);
    }
  });
});
