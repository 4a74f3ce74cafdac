import { describe, it } from 'vitest';
import { GOLDEN_CAR, goldenCarST_PR, iri, iriSegments, iriFromGd, gdFromIri, iriPerSqrtGdConstant, iriPerSqrtGdContinuous, iriPerSqrtGdForInterval } from '../../server/physics/iri';
import { solveLinear } from '../../server/physics/linalg';
import { synthesizeProfile } from '../../server/physics/iso8608';
import { checkClose, checkThat, errorOf } from './check';

/**
 * K of the discrete golden car fed the moving-average slope of a w = 2 road, from its
 * definition (docs/methods.md "IRI and Gd(n0)"): σ² = ∫₀^{1/(2dx)} |C(e^{jθ}I − ST)⁻¹PR|²·S_u(n) dn,
 * θ = 2πn·dx, S_u = n0²/n²·4·sin²(πn·k·dx)/(k·dx)² per unit Gd(n0), K = √(2/π)·σ·1000. Evaluated
 * here with a general real 8×8 solve and Simpson's rule in ln n from 10⁻⁷ cycles/m (computed).
 */
const kFromDefinition = (dx: number): number => {
  const { ST, PR } = goldenCarST_PR(dx);
  const k = Math.max(1, Math.round(0.25 / dx));
  const b = k * dx;
  const gain2 = (n: number): number => {
    const th = 2 * Math.PI * n * dx;
    const m = new Float64Array(64);
    for (let i = 0; i < 4; i++) {
      for (let j = 0; j < 4; j++) {
        const re = (i === j ? Math.cos(th) : 0) - ST[i * 4 + j];
        m[i * 8 + j] = re;
        m[(i + 4) * 8 + j + 4] = re;
      }
      m[i * 8 + i + 4] = -Math.sin(th);
      m[(i + 4) * 8 + i] = Math.sin(th);
    }
    const x = solveLinear(m, Float64Array.from([...PR, 0, 0, 0, 0]), 8);
    return (x[0] - x[2]) ** 2 + (x[4] - x[6]) ** 2;
  };
  const integrand = (u: number): number => {
    const n = Math.exp(u);
    const s = Math.sin(Math.PI * n * b);
    return gain2(n) * ((0.01 / (n * n)) * 4 * s * s) / (b * b) * n; // n0² = 0.01 (ISO 8608 n0 = 0.1 cycles/m)
  };
  const [u0, u1] = [Math.log(1e-7), Math.log(1 / (2 * dx))];
  const steps = 4000;
  const h = (u1 - u0) / steps;
  let v = 0;
  for (let i = 0; i <= steps; i++) v += (i === 0 || i === steps ? 1 : i % 2 ? 4 : 2) * integrand(u0 + i * h);
  return Math.sqrt(2 / Math.PI) * Math.sqrt((v * h) / 3) * 1000;
};

const sine = (amplitudeM: number, wavelengthM: number, lengthM: number, dxM: number): Float64Array =>
  Float64Array.from({ length: Math.round(lengthM / dxM) + 1 }, (_, i) => amplitudeM * Math.sin((2 * Math.PI * i * dxM) / wavelengthM));

describe('golden car coefficients', () => {
  it('when the constants are read, then k1 = 653, k2 = 63.3, c = 6.0 s⁻¹, μ = 0.15 at 80 km/h, 250 mm base and 11 m start (ASTM E1926 / World Bank TP 46, from memory)', () => {
    const exp = { k1: 653, k2: 63.3, c: 6.0, mu: 0.15, speedMps: 80 / 3.6, baseM: 0.25, initM: 11 };
    for (const [key, v] of Object.entries(exp)) checkClose(GOLDEN_CAR[key as keyof typeof exp], v, { rel: 1e-15 }, 'ASTM E1926 golden car, from memory', { key });
  });

  it('when computed for 0.25 m, then ST and PR reproduce Sayers\' published values to 6 digits, PR(1) to 4 (World Bank TP 46 / Sayers 1995, docs/methods.md "Road roughness")', () => {
    const ST = [
      [0.9966071, 0.01091514, -0.002083274, 0.0003190145],
      [-0.5563044, 0.9438768, -0.8324718, 0.05064701],
      [0.02153176, 0.002126763, 0.7508714, 0.008221888],
      [3.335013, 0.3376467, -39.12762, 0.4347564],
    ];
    const PR = [0.005476107, 1.388776, 0.2275968, 35.79262];
    const c = goldenCarST_PR(0.25);
    for (let i = 0; i < 4; i++) {
      for (let j = 0; j < 4; j++) {
        checkClose(c.ST[i * 4 + j], ST[i][j], { rel: 5e-6 }, 'Sayers golden-car ST (World Bank TP 46), 6 significant digits', { dxM: 0.25, i: i + 1, j: j + 1 });
      }
      // PR(1) carries a single-precision artefact in the published program (docs/methods.md "Road roughness")
      checkClose(c.PR[i], PR[i], { rel: i === 0 ? 5e-4 : 5e-6 }, `Sayers golden-car PR (World Bank TP 46), ${i === 0 ? 4 : 6} digits`, { dxM: 0.25, i: i + 1 });
    }
  });
});

describe('iri', () => {
  it('when the profile is a 5 mm sinusoid at 0.25 m, then IRI is 2.03 / 4.65 / 13.4 m/km at 15 / 5 / 2.4 m wavelength (computed, docs/methods.md "Road roughness")', () => {
    const cases: [number, number, number][] = [[15, 2.03, 0.005], [5, 4.65, 0.005], [2.4, 13.4, 0.05]];
    for (const [lambda, exp, tol] of cases) {
      const v = iri(sine(0.005, lambda, 2000, 0.25), 0.25);
      checkClose(v, exp, { abs: tol }, 'computed (docs/methods.md "Road roughness", not published)', { amplitudeM: 0.005, wavelengthM: lambda, lengthM: 2000, dxM: 0.25 });
    }
  });

  it('when the profile is an inclined plane, then IRI is 0 (computed, docs/methods.md "Road roughness")', () => {
    for (const dx of [0.25, 0.05]) {
      const z = Float64Array.from({ length: Math.round(300 / dx) + 1 }, (_, i) => 0.02 * i * dx + 3);
      checkClose(iri(z, dx), 0, { abs: 1e-9 }, 'computed: inclined plane', { slope: 0.02, dxM: dx });
    }
  });

  it('when a 0.25 m profile is resampled at 0.05 m, then the 250 mm moving average keeps IRI of a long sinusoid nearly unchanged (ASTM E1926 smoothing, computed)', () => {
    const coarse = iri(sine(0.005, 15, 2000, 0.25), 0.25);
    const fine = iri(sine(0.005, 15, 2000, 0.05), 0.05);
    checkClose(fine, coarse, { rel: 0.01 }, 'computed: moving average barely touches 15 m waves', { wavelengthM: 15 });
  });

  it('when the amplitude doubles, then IRI doubles (property: linearity)', () => {
    const a = iri(sine(0.003, 7, 500, 0.1), 0.1);
    const b = iri(sine(0.006, 7, 500, 0.1), 0.1);
    checkClose(b, 2 * a, { rel: 1e-12 }, 'property', {});
  });

  it('when a profile is scaled by k or shifted up, then IRI scales by |k| and is unchanged by the shift (property: linearity, slope input)', () => {
    const z = synthesizeProfile({ gdN0: 256e-6, lengthM: 300, dxM: 0.1, seed: 3 });
    const base = iri(z, 0.1);
    checkClose(iri(z.map((v) => -3 * v), 0.1), 3 * base, { rel: 1e-12 }, 'property: IRI of k·z is |k|·IRI', {});
    checkClose(iri(z.map((v) => v + 0.7), 0.1), base, { rel: 1e-9 }, 'property: a level shift has no slope', {});
  });

  it('when the profile is just long enough for the 11 m start, then it is accepted; one sample less is refused; a non-finite sample or a bad interval is named (ASTM E1926 start rule)', () => {
    const need = Math.round(11 / 0.25) + 2;
    checkClose(iri(new Float64Array(need), 0.25), 0, { abs: 0 }, 'definition: flat profile', { need });
    checkThat(errorOf(() => iri(new Float64Array(need - 1), 0.25)).startsWith('physics: profileM'), 'house rule', '');
    const z = new Float64Array(200);
    z[7] = Infinity;
    checkThat(errorOf(() => iri(z, 0.25)).includes('profileM[7]'), 'house rule', errorOf(() => iri(z, 0.25)));
    checkThat(errorOf(() => iri(new Float64Array(5000), 1.5)).startsWith('physics: dxM [m]'), 'house rule: 1 mm – 1 m', '');
    checkThat(errorOf(() => goldenCarST_PR(0.0005)).startsWith('physics: dxM [m]'), 'house rule: 1 mm – 1 m', '');
    checkClose(goldenCarST_PR(1).ST.length, 16, { abs: 0 }, 'definition: 1 m is the coarsest interval accepted', {});
  });

  it('when the profile is shorter than 11 m, then the error names profileM', () => {
    const msg = errorOf(() => iri(new Float64Array(20), 0.25));
    checkThat(msg.includes('profileM') && msg.includes('[m]'), 'house rule', `message "${msg}"`);
  });
});

describe('iriSegments', () => {
  it('when a profile joins a smooth and a rough half, then segments report each part and average to the whole (computed)', () => {
    const dx = 0.25;
    const smooth = sine(0.001, 5, 500, dx);
    const rough = sine(0.006, 5, 500, dx);
    const z = new Float64Array(smooth.length + rough.length - 1);
    z.set(smooth);
    z.set(rough.subarray(1), smooth.length);
    const segs = iriSegments(z, dx, 100, { startM: 1000 });
    checkClose(segs.length, 10, { abs: 0 }, 'computed: 1000 m / 100 m', {});
    checkClose(segs[0].startM, 1000, { abs: 0 }, 'definition', {});
    checkClose(segs[9].endM, 2000, { abs: 1e-9 }, 'definition', {});
    const smoothIri = iri(sine(0.001, 5, 2000, dx), dx);
    checkClose(segs[2].iri, smoothIri, { rel: 0.02 }, 'computed: steady sinusoid', {});
    checkClose(segs[8].iri, 6 * smoothIri, { rel: 0.02 }, 'computed: linearity', {});
    const mean = segs.reduce((s, x) => s + x.iri, 0) / segs.length;
    checkClose(mean, iri(z, dx), { rel: 0.01 }, 'computed: equal-length segments average to the whole', {});
  });
});

describe('iriSegments bounds', () => {
  it('when segments are weighted by their step counts (midpoint (i + k/2)·dx of step i), then they average exactly to the IRI of the whole profile (definition)', () => {
    for (const [dx, seg] of [[0.05, 10], [0.25, 7]]) {
      const z = synthesizeProfile({ gdN0: 1024e-6, lengthM: 61, dxM: dx, seed: 9 });
      const k = Math.max(1, Math.round(0.25 / dx));
      const steps = z.length - k;
      const counts = new Map<number, number>();
      for (let i = 0; i < steps; i++) {
        const s = Math.floor(((i + k / 2) * dx) / seg);
        counts.set(s, (counts.get(s) ?? 0) + 1);
      }
      const segs = iriSegments(z, dx, seg);
      checkClose(segs.length, counts.size, { abs: 0 }, 'definition: one segment per occupied length', { dx, seg });
      let sum = 0;
      segs.forEach((x, s) => {
        checkClose(x.startM, s * seg, { abs: 1e-9 }, 'definition: start 0 by default', { s });
        sum += x.iri * (counts.get(s) ?? NaN);
      });
      checkClose(sum / steps, iri(z, dx), { rel: 1e-12 }, 'definition: step-weighted mean is the whole', { dx, seg });
      checkClose(segs[segs.length - 1].endM, (z.length - 1) * dx, { abs: 1e-9 }, 'definition: the last segment ends with the profile', { dx });
    }
  });

  it('when the last segment would hold no step midpoint, then it is left out (definition)', () => {
    // 200.05 m at 0.05 m: the last step midpoint lies at 200.05 − 0.175 m, so [200, 200.05] is empty
    const z = synthesizeProfile({ gdN0: 256e-6, lengthM: 200.05, dxM: 0.05, seed: 4 });
    const segs = iriSegments(z, 0.05, 100);
    checkClose(segs.length, 2, { abs: 0 }, 'definition', {});
    checkThat(segs.every((x) => Number.isFinite(x.iri)), 'definition', JSON.stringify(segs));
    checkThat(errorOf(() => iriSegments(z, 0.05, 0.5)).startsWith('physics: segmentM [m]'), 'house rule: ≥ 1 m', '');
    checkThat(errorOf(() => iriSegments(z, 0.05, 100, { startM: 2e9 })).startsWith('physics: startM [m]'), 'house rule', '');
    checkClose(iriSegments(z, 0.05, 100, { startM: -250 })[1].startM, -150, { abs: 1e-9 }, 'definition: bounds offset by startM', {});
  });
});

describe('IRI ↔ Gd(n0) for w = 2 roads', () => {
  it('when K is computed for 0.05, 0.25 and 0.3 m, then it equals its frequency-domain definition evaluated independently, ≈ 543, 532 and 523 (computed, docs/methods.md "Road roughness")', () => {
    for (const [dx, approx] of [[0.05, 543], [0.25, 532], [0.3, 523]]) {
      const k = iriPerSqrtGdForInterval(dx);
      checkClose(k, kFromDefinition(dx), { rel: 2e-5 }, 'computed: 8×8 solve, Simpson in ln n', { dx });
      checkClose(k, approx, { abs: 1 }, 'docs/methods.md "Road roughness"', { dx });
      checkThat(iriPerSqrtGdForInterval(dx) === k, 'definition: the same value again', '');
    }
  });

  it('when Gd(n0) is multiplied by k², then IRI is multiplied by k, and the default interval is 0.05 m (property: IRI = K·√Gd)', () => {
    checkClose(iriFromGd(9 * 64e-6), 3 * iriFromGd(64e-6), { rel: 1e-14 }, 'property', {});
    checkClose(gdFromIri(3 * iriFromGd(64e-6)), 9 * 64e-6, { rel: 1e-12 }, 'property', {});
    checkThat(iriFromGd(64e-6) === iriFromGd(64e-6, 0.05) && gdFromIri(4) === gdFromIri(4, 0.05), 'docs/methods.md "Road roughness": reference interval 0.05 m', '');
    checkClose(iriFromGd(0), 0, { abs: 0 }, 'definition', {});
    checkClose(gdFromIri(0), 0, { abs: 0 }, 'definition', {});
    checkThat(errorOf(() => iriFromGd(1.5)).startsWith('physics: gdN0 [m³]') && errorOf(() => gdFromIri(-1)).startsWith('physics: iri [m/km]'), 'house rule', '');
    checkThat(errorOf(() => iriPerSqrtGdForInterval(0.31)).startsWith('physics: dxM [m]'), 'house rule: 1 mm – 0.3 m', '');
  });

  it('when converted there and back, then Gd(n0) is recovered (property)', () => {
    for (const gd of [16e-6, 64e-6, 1024e-6]) checkClose(gdFromIri(iriFromGd(gd)), gd, { rel: 1e-12 }, 'property: inverse', { gd });
  });

  it('when long seeded w = 2 roads of known Gd(n0) are measured by the golden car, then IRI/√Gd matches K for their interval within 1 % (computed, docs/methods.md "Road roughness": K ≈ 542 ± 2 at 50 mm with the moving average)', () => {
    for (const dx of [0.05, 0.25, 0.3]) {
      const k = iriPerSqrtGdForInterval(dx);
      let sum = 0;
      const seeds = [21, 22, 23];
      for (const [i, seed] of seeds.entries()) {
        const gd = [64e-6, 256e-6, 1024e-6][i];
        sum += iri(synthesizeProfile({ gdN0: gd, lengthM: 20000, dxM: dx, seed }), dx) / Math.sqrt(gd);
      }
      checkClose(sum / seeds.length, k, { rel: 0.01 }, 'computed: golden-car runs vs frequency-domain K of the same discrete golden car', { dx, k });
    }
    // docs/methods.md "Road roughness": golden-car runs over seeded w = 2 profiles at 0.05 m + moving average give K ≈ 542 ± 2
    checkClose(iriPerSqrtGdConstant(), 542, { abs: 2 }, 'computed, docs/methods.md "Road roughness"', {});
    // the continuous closed form (no moving average, white slope) is the ≈ 555 the app used before
    checkClose(iriPerSqrtGdContinuous(), 554.7, { abs: 0.1 }, 'computed, docs/methods.md "Road roughness"', {});
  });

  it('when a road of known Gd(n0) is synthesised and measured, then converting its IRI back gives that Gd(n0) within 3 % (computed)', () => {
    for (const dx of [0.05, 0.25]) {
      const gd = 256e-6;
      const z = synthesizeProfile({ gdN0: gd, lengthM: 20000, dxM: dx, seed: 5 });
      checkClose(gdFromIri(iri(z, dx), dx), gd, { rel: 0.03 }, 'computed: round trip through the app\'s own IRI', { dx, gd });
      checkClose(iriFromGd(gd, dx), iri(z, dx), { rel: 0.015 }, 'computed', { dx, gd });
    }
  });
});
