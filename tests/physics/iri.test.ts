import { describe, it } from 'vitest';
import { goldenCarST_PR, iri, iriSegments, iriFromGd, gdFromIri, iriPerSqrtGdConstant, iriPerSqrtGdContinuous, iriPerSqrtGdForInterval } from '../../server/physics/iri';
import { synthesizeProfile } from '../../server/physics/iso8608';
import { checkClose, checkThat } from './check';

const sine = (amplitudeM: number, wavelengthM: number, lengthM: number, dxM: number): Float64Array =>
  Float64Array.from({ length: Math.round(lengthM / dxM) + 1 }, (_, i) => amplitudeM * Math.sin((2 * Math.PI * i * dxM) / wavelengthM));

describe('golden car coefficients', () => {
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

  it('when the profile is shorter than 11 m, then the error names profileM', () => {
    let msg = '';
    try {
      iri(new Float64Array(20), 0.25);
    } catch (e) {
      msg = (e as Error).message;
    }
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

describe('IRI ↔ Gd(n0) for w = 2 roads', () => {
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
