/**
 * Checks of the damper life model (server/reliability/life-model.ts). The synthetic fleets
 * draw lives from a known true law that differs from the prior in road sensitivity, scale
 * and shape (computed checks, docs/methods.md "Damper life model": the fit should recover the median per road class
 * within about 10–25 % from a few hundred censored dampers).
 */
import { describe, expect, it } from 'vitest';
import { gamma } from '../../../server/physics/gamma';
import { seededRandom } from '../../../server/physics/iso8608';
import {
  B_MAX,
  B_MIN,
  conditionalFailure,
  DEFAULT_PRIOR,
  fitLifeModel,
  lifeKmAt,
  lifeWearKm,
  logPosterior,
  meanLifeKmAt,
  modelFromJson,
  modelToJson,
  priorModel,
  wearKm,
  type LifeUnit,
} from '../../../server/reliability/life-model';

const RATED = 90_000;
/** Severity of the ISO classes at 80 km/h (rod sliding ∝ √Gd(n0), computed): A ½, B 1, C 2, D 4. */
const CLASS_SEVERITY = { A: 0.5, B: 1, C: 2, D: 4 } as const;

/**
 * A fleet whose true life at severity s is Weibull(shape kTrue, scale RATED·cTrue·s^−bTrue),
 * each damper driving a mix of two classes, censored at a uniform random distance (running
 * units) or with probability 0.1 at a random share of its life (removed for another reason).
 */
function syntheticFleet(n: number, seed: number, truth = { bTrue: 1.0, cTrue: 1.3, kTrue: 3.5 }): LifeUnit[] {
  const rand = seededRandom(seed);
  const classes = Object.values(CLASS_SEVERITY);
  const units: LifeUnit[] = [];
  for (let i = 0; i < n; i++) {
    const s1 = classes[Math.floor(rand() * 4)];
    const s2 = classes[Math.floor(rand() * 4)];
    const share = rand();
    // wear km per km of this damper's mix under the true law
    const perKm = share * Math.pow(s1, truth.bTrue) + (1 - share) * Math.pow(s2, truth.bTrue);
    const lifeWear = RATED * truth.cTrue * Math.pow(-Math.log(1 - rand()), 1 / truth.kTrue);
    const lifeKm = lifeWear / perKm;
    const censorKm = rand() < 0.1 ? lifeKm * rand() : 250_000 * rand();
    const km = Math.min(lifeKm, censorKm);
    units.push({ ratedKm: RATED, failed: lifeKm <= censorKm, rows: [{ km: km * share, severity: s1 }, { km: km * (1 - share), severity: s2 }] });
  }
  return units;
}

describe('life model prior', () => {
  it('gives the rated km as median life on class B at 80 km/h (severity 1) — stated convention', () => {
    expect(lifeKmAt(priorModel(), RATED, 1, 0.5)).toBeCloseTo(RATED, 6);
  });

  it('shortens life on class D by the severe-service ratio: 1.5× per class step, 2.25× over two (common practice: severe service about halves intervals)', () => {
    const m = priorModel();
    const ratio = lifeKmAt(m, RATED, CLASS_SEVERITY.B, 0.5) / lifeKmAt(m, RATED, CLASS_SEVERITY.D, 0.5);
    expect(ratio).toBeCloseTo(2.25, 6);
    expect(ratio).toBeGreaterThan(1.8);
    expect(ratio).toBeLessThan(3);
  });

  it('returns the prior when no damper has failed', () => {
    const units = syntheticFleet(50, 3).map((u) => ({ ...u, failed: false }));
    const m = fitLifeModel(units);
    const p = priorModel();
    expect(m.source).toBe('prior');
    expect(m.beta0).toBe(p.beta0);
    expect(m.b).toBe(p.b);
    expect(m.suspensions).toBe(50);
  });
});

describe('life model fit on a synthetic fleet with a known true law (computed)', () => {
  const truth = { bTrue: 1.0, cTrue: 1.3, kTrue: 3.5 };
  const units = syntheticFleet(400, 11, truth);
  // fitted inside each test: a mutant under test is active only while a test runs, not while the suite is collected
  const fitted = () => fitLifeModel(units);

  it('counts failures and suspensions', () => {
    const m = fitted();
    expect(m.source).toBe('fleet');
    expect(m.failures + m.suspensions).toBe(400);
    expect(m.failures).toBeGreaterThan(100);
  });

  it.each(Object.entries(CLASS_SEVERITY))('recovers the median life on class %s within 25 %', (_cls, s) => {
    const m = fitted();
    const trueMedian = (RATED * truth.cTrue * Math.pow(Math.log(2), 1 / truth.kTrue)) / Math.pow(s, truth.bTrue);
    const median = lifeKmAt(m, RATED, s, 0.5);
    expect(Math.abs(median / trueMedian - 1)).toBeLessThan(0.25);
  });

  it('moves the road sensitivity from the prior toward the truth', () => {
    const m = fitted();
    const p = priorModel();
    expect(Math.abs(m.b - truth.bTrue)).toBeLessThan(Math.abs(p.b - truth.bTrue));
  });

  it('is the posterior mode: no point of a grid around it scores higher (independent search)', () => {
    const m = fitted();
    const best = logPosterior(units, [m.beta0, m.b, Math.log(1 / m.shape)]);
    for (const d0 of [-0.02, 0, 0.02]) {
      for (const d1 of [-0.02, 0, 0.02]) {
        for (const d2 of [-0.02, 0, 0.02]) {
          if (!d0 && !d1 && !d2) continue;
          expect(logPosterior(units, [m.beta0 + d0, m.b + d1, Math.log(1 / m.shape) + d2])).toBeLessThan(best);
        }
      }
    }
  });

  it('moves more toward the data with more removals: 40 dampers stay nearer the prior than 400', () => {
    const m = fitted();
    const small = fitLifeModel(syntheticFleet(40, 5, truth));
    const p = priorModel();
    expect(Math.abs(small.b - p.b)).toBeLessThan(Math.abs(m.b - p.b) + 0.05);
  });

  it('mean life is scale·Γ(1 + 1/k) (Weibull mean, published identity)', () => {
    const m = fitted();
    const scale = RATED * Math.exp(m.beta0);
    expect(meanLifeKmAt(m, RATED, 1)).toBeCloseTo(scale * gamma(1 + 1 / m.shape), 6);
  });

  it('round-trips through JSON', () => {
    const m = fitted();
    const back = modelFromJson(JSON.parse(JSON.stringify(modelToJson(m))));
    expect(back.beta0).toBe(m.beta0);
    expect(back.b).toBe(m.b);
    expect(back.shape).toBe(m.shape);
    expect(() => modelFromJson({ beta0: 0, roadSensitivity: 5, shape: 2 })).toThrow(/roadSensitivity/);
  });
});

/** The log of a Weibull density and survival of T = W/R with scale e^β0 and shape 1/σ, written from their definitions (not shared code). */
function weibullLogLik(units: readonly LifeUnit[], beta0: number, b: number, sigma: number): number {
  let l = 0;
  for (const u of units) {
    let w = 0;
    for (const r of u.rows) if (r.km > 0) w += r.km * Math.pow(r.severity, b);
    const t = w / u.ratedKm;
    const k = 1 / sigma, eta = Math.exp(beta0);
    const surv = Math.exp(-Math.pow(t / eta, k));
    // the model leaves out the −ln T of a failure's density (it does not depend on θ): add it back
    l += u.failed ? Math.log((k / eta) * Math.pow(t / eta, k - 1) * surv) + Math.log(t) : Math.log(surv);
  }
  return l;
}

/** Central-difference gradient and negative Hessian of logPosterior at θ (computed in the test). */
function curvature(units: readonly LifeUnit[], theta: number[], prior = DEFAULT_PRIOR) {
  const h = 1e-4;
  const f = (t: number[]) => logPosterior(units, [t[0], t[1], t[2]], prior);
  const at = (d: number[]) => f(theta.map((x, i) => x + d[i]));
  const e = (i: number, s: number) => [0, 1, 2].map((j) => (j === i ? s : 0));
  const grad = [0, 1, 2].map((i) => (at(e(i, h)) - at(e(i, -h))) / (2 * h));
  const info = [0, 1, 2].map((i) =>
    [0, 1, 2].map((j) => {
      const d = (si: number, sj: number) => theta.map((x, k) => x + (k === i ? si : 0) + (k === j ? sj : 0));
      return -(f(d(h, h)) - f(d(h, -h)) - f(d(-h, h)) + f(d(-h, -h))) / (4 * h * h);
    }),
  );
  return { grad, info };
}

/** Standard errors from the inverse of a 3×3 information matrix (cofactors, computed). */
function standardErrors(m: number[][]): number[] {
  const [[a, b, c], [d, e, f], [g, h, i]] = m;
  const det = a * (e * i - f * h) - b * (d * i - f * g) + c * (d * h - e * g);
  return [(e * i - f * h) / det, (a * i - c * g) / det, (a * e - b * d) / det].map(Math.sqrt);
}

/**
 * With b held at a bound, the Newton step in (β0, ln σ) from the gradient and information there:
 * how far the point is from the mode of the other two parameters (computed).
 */
function distanceToModeAtFixedB(c: { grad: number[]; info: number[][] }): number {
  const [a, d, e] = [c.info[0][0], c.info[0][2], c.info[2][2]];
  const det = a * e - d * d;
  const step0 = (e * c.grad[0] - d * c.grad[2]) / det;
  const step2 = (a * c.grad[2] - d * c.grad[0]) / det;
  return Math.max(Math.abs(step0), Math.abs(step2));
}

describe('life model building blocks (computed)', () => {
  it('when a prior states a class-step factor and a shape, then b = log2 of the factor, the median at severity 1 is the rated km and the model carries the prior', () => {
    const prior = { ...DEFAULT_PRIOR, classStepFactor: 2, shape: 4 };
    const m = priorModel(prior);
    expect(m.b).toBeCloseTo(1, 14);
    expect(m.shape).toBe(4);
    expect(m.classStepFactor).toBe(2);
    expect(m.source).toBe('prior');
    expect(m.failures).toBe(0);
    expect(m.prior).toBe(prior);
    // median e^β0·(ln 2)^(1/k) = 1
    expect(Math.exp(m.beta0) * Math.pow(Math.log(2), 1 / 4)).toBeCloseTo(1, 14);
    expect(lifeKmAt(m, RATED, 4, 0.5)).toBeCloseTo(RATED / 4, 6);
  });

  it('when wear km are summed, then each km counts severity^b, a severity that is not positive counts as 1 and distances that are not positive count nothing', () => {
    expect(wearKm([{ km: 100, severity: 2 }, { km: 50, severity: 0.5 }], 2)).toBeCloseTo(100 * 4 + 50 * 0.25, 12);
    expect(wearKm([{ km: 100, severity: 0 }, { km: 30, severity: -2 }], 1.5)).toBeCloseTo(130, 12);
    expect(wearKm([{ km: 0, severity: 3 }, { km: -40, severity: 2 }, { km: 10, severity: 3 }], 1)).toBeCloseTo(30, 12);
    expect(wearKm([], 1)).toBe(0);
    expect(wearKm([{ km: 70, severity: 4 }], 0)).toBe(70);
  });

  it('when a quantile is asked, then it is the Weibull quantile R·e^β0·(−ln(1 − q))^(1/k) divided by s^b', () => {
    const m = { ...priorModel(), beta0: 0.2, b: 0.8, shape: 2 };
    expect(lifeWearKm(m, RATED, 0.1)).toBeCloseTo(RATED * Math.exp(0.2) * Math.sqrt(-Math.log(0.9)), 6);
    expect(lifeWearKm(m, RATED, 1 - Math.exp(-1))).toBeCloseTo(RATED * Math.exp(0.2), 6);
    expect(lifeKmAt(m, RATED, 3, 0.1)).toBeCloseTo((RATED * Math.exp(0.2) * Math.sqrt(-Math.log(0.9))) / Math.pow(3, 0.8), 6);
  });

  it('when the mean life is asked at a severity, then it is the scale·Γ(1 + 1/k)/s^b (shape 1: the scale; shape 2: scale·√π/2)', () => {
    const m1 = { ...priorModel(), beta0: 0.1, b: 0.5, shape: 1 };
    expect(meanLifeKmAt(m1, RATED, 4)).toBeCloseTo((RATED * Math.exp(0.1)) / 2, 5);
    const m2 = { ...m1, shape: 2 };
    expect(meanLifeKmAt(m2, RATED, 4)).toBeCloseTo((RATED * Math.exp(0.1) * Math.sqrt(Math.PI)) / 4, 5);
  });

  it('when the conditional failure probability is asked, then it is 1 − R(w + dw)/R(w): memoryless for shape 1, rising with wear for shape > 1, from new below zero wear', () => {
    const exp1 = { ...priorModel(), beta0: 0, b: 1, shape: 1 };
    expect(conditionalFailure(exp1, 1000, 0, 500)).toBeCloseTo(1 - Math.exp(-0.5), 14);
    expect(conditionalFailure(exp1, 1000, 3000, 500)).toBeCloseTo(1 - Math.exp(-0.5), 12);
    const wear = { ...exp1, beta0: Math.log(2), shape: 3 };
    // scale 2000: 1 − exp(−((1.5)³ − 1³)) from w = 2000 to 3000
    expect(conditionalFailure(wear, 1000, 2000, 1000)).toBeCloseTo(1 - Math.exp(-(Math.pow(1.5, 3) - 1)), 12);
    expect(conditionalFailure(wear, 1000, 1000, 1000)).toBeLessThan(conditionalFailure(wear, 1000, 2000, 1000));
    // a negative wear counts as new: from −500 to +500 is the chance of failing by 500
    expect(conditionalFailure({ ...wear, shape: 2.5 }, 1000, -500, 1000)).toBeCloseTo(1 - Math.exp(-Math.pow(0.25, 2.5)), 12);
  });

  it('when the log posterior is evaluated, then it is the Weibull log-likelihood of the wear km plus normal log priors on β0, b and ln σ (written out independently)', () => {
    const units = syntheticFleet(30, 9);
    const p = priorModel();
    const sigmaP = 1 / DEFAULT_PRIOR.shape;
    for (const theta of [[0.3, 0.9, Math.log(0.3)], [-0.1, 0.2, Math.log(0.5)], [p.beta0, p.b, Math.log(sigmaP)]] as const) {
      const [beta0, b, ls] = theta;
      const logPrior =
        -0.5 * (((beta0 - p.beta0) / (sigmaP / Math.sqrt(DEFAULT_PRIOR.removals))) ** 2 + ((b - p.b) / DEFAULT_PRIOR.sdB) ** 2 + ((ls - Math.log(sigmaP)) / DEFAULT_PRIOR.sdLogSigma) ** 2);
      expect(logPosterior(units, theta)).toBeCloseTo(weibullLogLik(units, beta0, b, Math.exp(ls)) + logPrior, 8);
    }
    // without units the log posterior is the log prior: 0 at the prior's mode, −½ one prior sd away in each coordinate
    expect(logPosterior([], [p.beta0, p.b, Math.log(sigmaP)])).toBe(0);
    expect(logPosterior([], [p.beta0 + sigmaP / Math.sqrt(5), p.b, Math.log(sigmaP)])).toBeCloseTo(-0.5, 12);
    expect(logPosterior([], [p.beta0, p.b - 0.25, Math.log(sigmaP)])).toBeCloseTo(-0.5, 12);
    expect(logPosterior([], [p.beta0, p.b, Math.log(sigmaP) + 0.3])).toBeCloseTo(-0.5, 12);
    // a prior passed in is the one used
    const other = { ...DEFAULT_PRIOR, classStepFactor: 2, shape: 4, removals: 20, sdB: 0.1, sdLogSigma: 0.2 };
    const po = priorModel(other);
    expect(logPosterior([], [po.beta0, po.b, Math.log(0.25)], other)).toBe(0);
    expect(logPosterior([], [po.beta0 + 0.25 / Math.sqrt(20), po.b + 0.1, Math.log(0.25) - 0.2], other)).toBeCloseTo(-1.5, 12);
  });

  it('when a unit has no distance, then the log posterior leaves it out', () => {
    const units = syntheticFleet(10, 4);
    const theta = [0.2, 0.7, Math.log(0.3)] as const;
    expect(logPosterior([...units, { ratedKm: RATED, failed: true, rows: [] }], theta)).toBe(logPosterior(units, theta));
  });
});

describe('life model fit: the posterior mode, against true laws unlike the prior (computed)', () => {
  // true law: shape 3.5 (prior 2.5), scale 1.3 × rated at severity 1 (prior ≈ 1.16), b = 1 (prior 0.585)
  const truth = { bTrue: 1.0, cTrue: 1.3, kTrue: 3.5 };
  const big = syntheticFleet(2000, 21, truth);
  // fitted inside each test: a mutant under test is active only while a test runs, not while the suite is collected
  const fitBig = () => {
    const m = fitLifeModel(big);
    const theta = [m.beta0, m.b, Math.log(1 / m.shape)];
    return { m, theta, ...curvature(big, theta) };
  };

  it('when fitted to 2000 dampers, then the log posterior is flat at the result (its gradient, by central differences, vanishes)', () => {
    const { theta, grad } = fitBig();
    // Hessian entries are ~10³–10⁵ here; a point off the mode by 1e-6 in any coordinate would show a gradient ≳ 1e-3
    for (const g of grad) expect(Math.abs(g)).toBeLessThan(2e-3);
    for (const d of [-1e-3, 1e-3]) {
      for (let i = 0; i < 3; i++) expect(logPosterior(big, theta.map((x, k) => (k === i ? x + d : x)) as [number, number, number])).toBeLessThan(logPosterior(big, theta as [number, number, number]));
    }
  });

  it('when fitted to 2000 dampers, then β0, b and the shape recover the true law within 3.5 standard errors of the posterior (errors from its curvature, ~1/√failures)', () => {
    const { m, theta, info } = fitBig();
    const se = standardErrors(info);
    const trueTheta = [Math.log(truth.cTrue), truth.bTrue, Math.log(1 / truth.kTrue)];
    trueTheta.forEach((t, i) => expect(Math.abs(theta[i] - t), `θ${i}: fit ${theta[i]}, true ${t}, se ${se[i]}`).toBeLessThan(3.5 * se[i]));
    // and with that many failures the errors are small: shape to about ±10 %, b to about ±0.1
    expect(m.failures).toBeGreaterThan(1000);
    expect(Math.abs(m.shape / truth.kTrue - 1)).toBeLessThan(0.1);
    expect(Math.abs(m.b - truth.bTrue)).toBeLessThan(0.1);
    expect(m.classStepFactor).toBeCloseTo(Math.pow(2, m.b), 14);
    expect(m.prior).toBe(DEFAULT_PRIOR);
  });

  it('when the fleet lasts longer on rougher roads (b = −0.5), then b stays at its lower bound 0 and the other parameters are a mode', () => {
    const units = syntheticFleet(400, 11, { bTrue: -0.5, cTrue: 1.3, kTrue: 3.5 });
    const f = fitLifeModel(units);
    expect(f.b).toBe(B_MIN);
    expect(f.classStepFactor).toBe(1);
    const c = curvature(units, [f.beta0, 0, Math.log(1 / f.shape)]);
    expect(distanceToModeAtFixedB(c)).toBeLessThan(1e-4);
    expect(c.grad[1]).toBeLessThan(0);
  });

  it('when the fleet wears much faster on rough roads (b = 2), then b stays at its upper bound and the other parameters are a mode', () => {
    const units = syntheticFleet(400, 11, { bTrue: 2, cTrue: 1.3, kTrue: 3.5 });
    const f = fitLifeModel(units);
    expect(f.b).toBe(B_MAX);
    expect(f.classStepFactor).toBeCloseTo(Math.pow(2, 1.25), 14);
    const c = curvature(units, [f.beta0, B_MAX, Math.log(1 / f.shape)]);
    expect(distanceToModeAtFixedB(c)).toBeLessThan(1e-4);
    expect(c.grad[1]).toBeGreaterThan(0);
  });

  it('when a prior is passed, then the fit is that prior\'s posterior mode: a very confident prior keeps its own parameters', () => {
    const units = syntheticFleet(400, 11, truth);
    const sure = { classStepFactor: 2, shape: 4, removals: 1e9, sdB: 1e-6, sdLogSigma: 1e-6 };
    const f = fitLifeModel(units, sure);
    const p = priorModel(sure);
    expect(f.prior).toBe(sure);
    expect(f.source).toBe('fleet');
    expect(f.beta0).toBeCloseTo(p.beta0, 4);
    expect(f.b).toBeCloseTo(1, 4);
    expect(f.shape).toBeCloseTo(4, 3);
    const g = curvature(units, [f.beta0, f.b, Math.log(1 / f.shape)], sure).grad;
    // the prior's curvature is ~10¹², so a flat point means the gradient is small next to it
    for (const x of g) expect(Math.abs(x)).toBeLessThan(1);
  });

  it('when units have no rated km or no distance, then the fit leaves them out of the counts and the result', () => {
    const units = syntheticFleet(200, 13, truth);
    const a = fitLifeModel(units);
    const b = fitLifeModel([
      ...units,
      { ratedKm: 0, failed: true, rows: [{ km: 50_000, severity: 1 }] },
      { ratedKm: -1, failed: false, rows: [{ km: 50_000, severity: 1 }] },
      { ratedKm: RATED, failed: true, rows: [] },
      { ratedKm: RATED, failed: true, rows: [{ km: 0, severity: 2 }] },
    ]);
    expect(b).toEqual(a);
  });

  it('when only suspensions are usable, then the prior comes back with their count', () => {
    const m0 = fitLifeModel([{ ratedKm: RATED, failed: false, rows: [{ km: 10_000, severity: 1 }] }, { ratedKm: 0, failed: true, rows: [{ km: 10_000, severity: 1 }] }]);
    expect(m0).toEqual({ ...priorModel(), suspensions: 1 });
  });
});

describe('life model as JSON', () => {
  const m = { ...priorModel(), beta0: 0.25, b: 0.75, shape: 3, source: 'fleet' as const, failures: 12, suspensions: 30, classStepFactor: Math.pow(2, 0.75) };

  it('when written, then it names every field and the prior as a copy', () => {
    const j = modelToJson(m);
    expect(j).toEqual({ beta0: 0.25, roadSensitivity: 0.75, shape: 3, classStepFactor: Math.pow(2, 0.75), source: 'fleet', failures: 12, suspensions: 30, prior: { ...DEFAULT_PRIOR } });
    expect(j.prior).not.toBe(m.prior);
  });

  it('when read back, then every field returns and the class-step factor is 2^b', () => {
    const back = modelFromJson(JSON.parse(JSON.stringify(modelToJson(m))));
    expect(back).toEqual(m);
    expect(modelFromJson({ beta0: 0, roadSensitivity: 1, shape: 2 }).classStepFactor).toBe(2);
  });

  it('when optional fields are missing or wrong, then the source is the prior, counts are 0 and the default prior fills the gaps', () => {
    const back = modelFromJson({ beta0: 0.1, roadSensitivity: 0.5, shape: 2, source: 'guess', failures: '3', prior: { shape: 3, sdB: 'wide', removals: Number.NaN } });
    expect(back.source).toBe('prior');
    expect(back.failures).toBe(0);
    expect(back.suspensions).toBe(0);
    expect(back.prior).toEqual({ ...DEFAULT_PRIOR, shape: 3 });
    expect(modelFromJson({ beta0: 0.1, roadSensitivity: 0.5, shape: 2 }).prior).toEqual(DEFAULT_PRIOR);
  });

  it('when a number is missing, not finite or out of range, then it names the field', () => {
    expect(() => modelFromJson(null)).toThrow('life model: "beta0" must be a finite number');
    expect(() => modelFromJson({ beta0: '0', roadSensitivity: 1, shape: 2 })).toThrow('"beta0" must be a finite number');
    expect(() => modelFromJson({ beta0: 0, roadSensitivity: Number.POSITIVE_INFINITY, shape: 2 })).toThrow('"roadSensitivity" must be a finite number');
    expect(() => modelFromJson({ beta0: 0, roadSensitivity: 1 })).toThrow('"shape" must be a finite number');
    expect(() => modelFromJson({ beta0: 0, roadSensitivity: 1, shape: 0 })).toThrow('life model: "shape" must be positive');
    expect(() => modelFromJson({ beta0: 0, roadSensitivity: -0.01, shape: 2 })).toThrow('life model: "roadSensitivity" must be within 0–1.25');
    expect(() => modelFromJson({ beta0: 0, roadSensitivity: 1.26, shape: 2 })).toThrow(/roadSensitivity/);
    expect(modelFromJson({ beta0: 0, roadSensitivity: B_MIN, shape: 2 }).b).toBe(0);
    expect(modelFromJson({ beta0: 0, roadSensitivity: B_MAX, shape: 2 }).b).toBe(1.25);
  });
});
