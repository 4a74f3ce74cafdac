import { describe, it } from 'vitest';
import { adhesionPct, dampingFromAdhesion, NoDampingSolutionError, adhesionBand, DEFAULT_PLATE_AMPLITUDE_M } from '../../server/physics/adhesion';
import { modes } from '../../server/physics/quarter-car';
import { checkClose, checkRange, checkThat, CAR, DEMO_CORNERS, thrownBy, errorOf } from './check';

describe('adhesionPct (EUSAMA-style sweep)', () => {
  it('when damping falls toward zero, then predicted adhesion falls, reaching 0 % (property, docs/methods.md "Test-lane checks")', () => {
    const dampings = [1800, 1500, 1200, 900, 600, 300, 50];
    const values = dampings.map((cs) => adhesionPct({ ...CAR, dampingNsPerM: cs }).adhesionPct);
    for (let i = 1; i < values.length; i++) {
      checkThat(values[i] <= values[i - 1], 'property: adhesion falls with damping on the worn side', `cs ${dampings[i]} → ${values[i]} %, above ${values[i - 1]} % at ${dampings[i - 1]}`);
    }
    checkThat(values[0] - values[3] > 15, 'property', `expected a clear fall, got ${values.join(', ')}`);
    checkClose(values[values.length - 1], 0, { abs: 0 }, 'property: undamped wheel hop lifts the wheel (clipped at 0)', { cs: 50 });
  });

  it('when the minimum is found, then it lies near the wheel-hop frequency (docs/methods.md "Test-lane checks")', () => {
    const r = adhesionPct(CAR);
    const hop = modes(CAR).wheelHz;
    checkRange(r.atHz, 0.9 * hop, 1.2 * hop, 'docs/methods.md "Test-lane checks": the minimum is at wheel hop', { wheelHz: hop, atHz: r.atHz });
  });

  it('when the plate amplitude halves, then the loss (100 − adhesion) halves (property: linear model)', () => {
    const a6 = adhesionPct(CAR, { amplitudeM: 0.006 }).adhesionPct;
    const a3 = adhesionPct(CAR, { amplitudeM: 0.003 }).adhesionPct;
    checkClose(100 - a3, (100 - a6) / 2, { rel: 1e-9 }, 'property: linearity', { a6, a3 });
  });

  it('when no amplitude is given, then the default is 3 mm, half the 6 mm peak-to-peak stroke (from memory, docs/methods.md "Test-lane checks")', () => {
    checkClose(DEFAULT_PLATE_AMPLITUDE_M, 0.003, { abs: 0 }, 'docs/methods.md "Test-lane checks" (from memory)', {});
    checkClose(adhesionPct(CAR).adhesionPct, adhesionPct(CAR, { amplitudeM: 0.003 }).adhesionPct, { abs: 0 }, 'definition', {});
  });

  it('when new dampers on the demo specs are read at the 3 mm default, then they read good (≥ 60 %), and worn to half their damping they read lower (common practice, docs/methods.md "Test-lane checks")', () => {
    for (const [name, c] of Object.entries(DEMO_CORNERS)) {
      const fresh = adhesionPct(c).adhesionPct;
      checkRange(fresh, 60, 80, 'docs/methods.md "Test-lane checks": new dampers commonly read 60–80 % (common practice)', { name, fresh });
      const worn = adhesionPct({ ...c, dampingNsPerM: c.dampingNsPerM / 2 }).adhesionPct;
      checkThat(worn < fresh - 8, 'computed: a damper at half its damping reads clearly lower', `${name}: new ${fresh} %, half damping ${worn} %`);
      // read as a 6 mm amplitude the same new damper loses twice as much (linear model): the reading the default used to make
      checkClose(100 - adhesionPct(c, { amplitudeM: 0.006 }).adhesionPct, 2 * (100 - fresh), { rel: 1e-9 }, 'property: linearity', { name });
    }
  });

  it('when the amplitude is 50 mm, then the error names amplitudeM and m', () => {
    const msg = errorOf(() => adhesionPct(CAR, { amplitudeM: 0.05 }));
    checkThat(msg.includes('amplitudeM') && msg.includes('[m]'), 'house rule', `message "${msg}"`);
  });

  it('when bands are read, then ≥ 60 good, 40–59 fair, 20–39 weak, < 20 poor (common practice, docs/methods.md "Test-lane checks")', () => {
    const cases: [number, string][] = [[75, 'good'], [60, 'good'], [59.9, 'fair'], [40, 'fair'], [25, 'weak'], [19, 'poor']];
    for (const [p, b] of cases) checkThat(adhesionBand(p) === b, 'docs/methods.md "Test-lane checks" common practice', `${p} → ${adhesionBand(p)}, expected ${b}`);
  });
});

describe('dampingFromAdhesion', () => {
  it('when adhesion is simulated for a known worn damping, then the inverse recovers it (computed)', () => {
    for (const cs of [950, 1300, 1700]) {
      const measured = adhesionPct({ ...CAR, dampingNsPerM: cs }).adhesionPct;
      const r = dampingFromAdhesion(CAR, measured);
      checkClose(r.dampingNsPerM, cs, { rel: 1e-4 }, 'computed: round trip', { nominal: CAR.dampingNsPerM, cs, measured });
    }
  });

  it('when the wheel leaves the plate over a wide range of low damping (flat 0 %), then the inverse still finds the worn damping (computed)', () => {
    // A van front corner (demo courier van): adhesion is 0 % for all damping below a threshold
    // well above 1 % of nominal, the flat part that once trapped the peak search.
    const van = { sprungMassKg: 430, unsprungMassKg: 46, springRateNPerM: 32000, dampingNsPerM: 2400, tireRateNPerM: 260000 };
    for (const cs of [1300, 1600, 2100]) {
      const measured = adhesionPct({ ...van, dampingNsPerM: cs }).adhesionPct;
      checkThat(measured > 0, 'computed', `the chosen worn damping ${cs} N·s/m keeps the wheel on the plate (adhesion ${measured} %)`);
      const r = dampingFromAdhesion(van, measured);
      checkClose(r.dampingNsPerM, cs, { rel: 1e-4 }, 'computed: round trip past the flat 0 % region', { nominal: van.dampingNsPerM, cs, measured });
    }
  });

  it('when a new courier-van rear damper reads 65 % (above the 63.8 % its nominal predicts), then the inverse reads it as at least new; a poor 20 % reads well below nominal (computed)', () => {
    const rear = DEMO_CORNERS.courierVanRear;
    const fresh = dampingFromAdhesion(rear, 65).dampingNsPerM;
    checkRange(fresh / rear.dampingNsPerM, 1, 1.5, 'computed: above the nominal prediction means at least nominal damping', { fresh });
    const poor = dampingFromAdhesion(rear, 20).dampingNsPerM;
    checkRange(poor / rear.dampingNsPerM, 0.25, 0.5, 'computed: a poor reading means a worn damper', { poor });
    // the lane's own amplitude: the same 20 % read on a 6 mm-amplitude rig is a better damper than on a 3 mm one
    const at6 = dampingFromAdhesion(rear, 20, { amplitudeM: 0.006 }).dampingNsPerM;
    checkThat(at6 > poor * 1.5, 'computed: inversion depends on the amplitude that measured it', `3 mm ${poor}, 6 mm ${at6}`);
  });

  it('when the measurement is above anything the worn side reaches, then it says no damping value explains it', () => {
    const err = thrownBy(() => dampingFromAdhesion(CAR, 97));
    checkThat(err instanceof NoDampingSolutionError, 'definition', `expected NoDampingSolutionError, got ${String(err)}`);
    const msg = (err as Error).message;
    checkThat(msg.includes('no damping value explains 97 %'), 'definition', `message "${msg}"`);
    checkRange((err as NoDampingSolutionError).maxPct, 0, 97, 'definition', {});
  });

  it('when 0 % is measured, then it says every damping below a threshold explains it', () => {
    const msg = errorOf(() => dampingFromAdhesion(CAR, 0));
    checkThat(msg.includes('no damping value explains 0 %') && msg.includes('predicts 0 %'), 'definition', `message "${msg}"`);
  });
});

type Cx = [number, number];
const cmul = (a: Cx, b: Cx): Cx => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
const cdiv = (a: Cx, b: Cx): Cx => {
  const d = b[0] * b[0] + b[1] * b[1];
  return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
};

/**
 * |tyre force / plate displacement| at f, from the two equations of motion solved as a 2×2
 * complex system by Cramer's rule (independent of the engine's closed-form denominator):
 * [ks + jωcs − ms·ω², −(ks + jωcs); −(ks + jωcs), ks + kt + jωcs − mu·ω²]·[Zs; Zu] = [0; kt].
 */
function forceGain(c: { sprungMassKg: number; unsprungMassKg: number; springRateNPerM: number; dampingNsPerM: number; tireRateNPerM: number }, f: number): number {
  const w = 2 * Math.PI * f;
  const k: Cx = [c.springRateNPerM, w * c.dampingNsPerM];
  const a11: Cx = [k[0] - c.sprungMassKg * w * w, k[1]];
  const a22: Cx = [k[0] + c.tireRateNPerM - c.unsprungMassKg * w * w, k[1]];
  const det = cmul(a11, a22);
  const kk = cmul(k, k);
  const zu = cdiv(cmul(a11, [c.tireRateNPerM, 0]), [det[0] - kk[0], det[1] - kk[1]]);
  return c.tireRateNPerM * Math.hypot(1 - zu[0], -zu[1]);
}

/** Largest forceGain over [lo, hi]: 0.02 Hz scan, then ternary search around the best point. */
function peakGain(c: Parameters<typeof forceGain>[0], lo: number, hi: number): { g: number; f: number } {
  let bf = lo;
  for (let f = lo; f <= hi + 1e-12; f += 0.02) if (forceGain(c, f) > forceGain(c, bf)) bf = f;
  let a = Math.max(lo, bf - 0.02);
  let b = Math.min(hi, bf + 0.02);
  for (let i = 0; i < 100; i++) {
    const m1 = a + (b - a) / 3;
    const m2 = b - (b - a) / 3;
    if (forceGain(c, m1) < forceGain(c, m2)) a = m1;
    else b = m2;
  }
  return { g: forceGain(c, (a + b) / 2), f: (a + b) / 2 };
}

describe('adhesionPct against an independent solve', () => {
  it('when the sweep is predicted, then adhesion is 100·(1 − a·max|F|/((ms+mu)·g)) with max|F| from a direct 2×2 solve of the equations of motion, at the frequency of that maximum (computed)', () => {
    for (const c of [CAR, DEMO_CORNERS.courierVanRear, DEMO_CORNERS.truckFront, { ...CAR, dampingNsPerM: 1100 }]) {
      const ref = peakGain(c, 3, 25);
      const w = (c.sprungMassKg + c.unsprungMassKg) * 9.80665;
      const r = adhesionPct(c);
      checkClose(100 - r.adhesionPct, (100 * 0.003 * ref.g) / w, { rel: 1e-8 }, 'computed: direct solve of the equations of motion', { c });
      checkClose(r.atHz, ref.f, { abs: 1e-4 }, 'computed: frequency of the largest dynamic tyre load', { c });
    }
  });

  it('when wheel hop lies above the sweep (light stiff wheel), then the minimum is read at the sweep\'s 25 Hz end and not beyond (computed: |F| rises up to wheel hop)', () => {
    const c = { sprungMassKg: 400, unsprungMassKg: 10, springRateNPerM: 22000, dampingNsPerM: 1800, tireRateNPerM: 1e6 };
    checkThat(modes(c).wheelHz > 40, 'computed', `wheel hop ${modes(c).wheelHz} Hz`);
    const r = adhesionPct(c);
    checkClose(r.atHz, 25, { abs: 1e-9 }, 'computed: end of the sweep', {});
    checkClose(100 - r.adhesionPct, (100 * 0.003 * forceGain(c, 25)) / ((410) * 9.80665), { rel: 1e-9 }, 'computed: direct solve at 25 Hz', {});
  });

  it('when the plate amplitude is at the ends of its 0.1–20 mm range, then it is accepted, and just outside it is refused (house rule: inclusive bounds)', () => {
    checkThat(adhesionPct(CAR, { amplitudeM: 0.0001 }).adhesionPct > 99, 'property: a tiny stroke barely unloads the wheel', '');
    checkThat(adhesionPct(CAR, { amplitudeM: 0.02 }).adhesionPct === 0, 'property: a 20 mm amplitude lifts the wheel (clipped at 0)', '');
    for (const a of [0.00009, 0.0201]) {
      const msg = errorOf(() => adhesionPct(CAR, { amplitudeM: a }));
      checkThat(msg.includes('amplitudeM'), 'house rule', `${a}: "${msg}"`);
    }
  });
});

describe('adhesionBand edges', () => {
  it('when a reading is exactly on a band edge, then it belongs to the band above; 0 and 100 are valid and outside 0–100 is refused (common practice, docs/methods.md "Test-lane checks"; house rule)', () => {
    const cases: [number, string][] = [[100, 'good'], [39.9, 'weak'], [20, 'weak'], [19.99, 'poor'], [0, 'poor']];
    for (const [p, b] of cases) checkThat(adhesionBand(p) === b, 'docs/methods.md "Test-lane checks" common practice', `${p} → ${adhesionBand(p)}, expected ${b}`);
    for (const p of [-0.1, 100.1]) {
      const e = thrownBy(() => adhesionBand(p));
      checkThat(e instanceof Error && e.message.includes('pct [%]'), 'house rule', String(e));
    }
  });
});

describe('dampingFromAdhesion against brute force', () => {
  /** Highest adhesion over damping on a fine log grid from 1 % to 5× nominal (brute force, no search). */
  function bruteMax(c: typeof CAR): { pct: number; cs: number } {
    let best = { pct: -1, cs: 0 };
    for (let i = 0; i <= 200; i++) {
      const cs = c.dampingNsPerM * 0.01 * Math.pow(500, i / 200);
      const p = adhesionPct({ ...c, dampingNsPerM: cs }).adhesionPct;
      if (p > best.pct) best = { pct: p, cs };
    }
    return best;
  }

  it('when the measurement is above the peak, then the error carries the peak adhesion and its damping found by brute force over damping (computed)', () => {
    const ref = bruteMax(CAR);
    const err = thrownBy(() => dampingFromAdhesion(CAR, ref.pct + 0.5));
    checkThat(err instanceof NoDampingSolutionError && (err as Error).name === 'NoDampingSolutionError', 'definition', String(err));
    const e = err as NoDampingSolutionError;
    checkClose(e.measuredPct, ref.pct + 0.5, { abs: 0 }, 'definition', {});
    checkClose(e.maxPct, ref.pct, { abs: 0.01 }, 'computed: brute-force peak over damping', ref);
    checkClose(e.atDampingNsPerM, ref.cs, { rel: 0.04 }, 'computed: brute-force peak over damping (grid step 3 %)', ref);
    checkThat(e.message.includes(`highest adhesion for this corner is ${e.maxPct.toFixed(1)} % (at ${e.atDampingNsPerM.toFixed(0)} N·s/m, ${(e.atDampingNsPerM / CAR.dampingNsPerM).toFixed(1)}× nominal)`), 'definition', e.message);
    // just below the peak is explained, by a damping on the rising side
    const cs = dampingFromAdhesion(CAR, ref.pct - 0.05).dampingNsPerM;
    checkRange(cs, 0.5 * ref.cs, ref.cs * 1.05, 'property: the rising side ends at the peak', { cs });
    checkClose(adhesionPct({ ...CAR, dampingNsPerM: cs }).adhesionPct, ref.pct - 0.05, { abs: 1e-6 }, 'property: the forward map of the inverse returns the reading', {});
  });

  it('when 0 % is measured, then the damping named as the most it can be is the threshold where the wheel starts to stay on the plate (property: adhesion 0 just below it, above 0 just above it)', () => {
    const msg = errorOf(() => dampingFromAdhesion(CAR, 0));
    const m = /every damping up to (\d+) N·s\/m predicts 0 %/.exec(msg);
    checkThat(m !== null, 'definition', msg);
    const t = Number(m![1]);
    checkThat(adhesionPct({ ...CAR, dampingNsPerM: t * 0.99 }).adhesionPct === 0, 'property: 0 % below the threshold', `${t}`);
    checkThat(adhesionPct({ ...CAR, dampingNsPerM: t * 1.01 }).adhesionPct > 0, 'property: above 0 % past the threshold', `${t}`);
  });

  it('when the lowest damping searched is raised above the damping that explains a reading, then the reading is refused as below that minimum; at its default it is explained (property: inverse of the forward map)', () => {
    const measured = adhesionPct({ ...CAR, dampingNsPerM: 1000 }).adhesionPct;
    checkClose(dampingFromAdhesion(CAR, measured, { minDampingNsPerM: 900 }).dampingNsPerM, 1000, { rel: 1e-6 }, 'property: round trip', {});
    const err = thrownBy(() => dampingFromAdhesion(CAR, measured, { minDampingNsPerM: 1200 }));
    checkThat(err instanceof NoDampingSolutionError && (err as Error).message.includes('at the minimum damping searched (1200 N·s/m)'), 'definition', String(err));
    // 0 % with a lowest damping that keeps the wheel on the plate: refused as below that minimum,
    // not as "every damping up to 1200 N·s/m predicts 0 %" (1200 N·s/m predicts more)
    const at1200 = adhesionPct({ ...CAR, dampingNsPerM: 1200 }).adhesionPct;
    checkThat(at1200 > 0, 'computed', `${at1200}`);
    const zero = thrownBy(() => dampingFromAdhesion(CAR, 0, { minDampingNsPerM: 1200 }));
    checkThat(zero instanceof NoDampingSolutionError && zero.message.includes(`below the model's ${at1200.toFixed(1)} % at the minimum damping searched (1200 N·s/m)`), 'definition', String(zero));
    for (const [pct, min] of [[-1, undefined], [100.5, undefined], [50, 0.5], [50, 1801]] as const) {
      const e2 = thrownBy(() => dampingFromAdhesion(CAR, pct, { minDampingNsPerM: min }));
      checkThat(e2 instanceof Error && !(e2 instanceof NoDampingSolutionError) && /measuredPct \[%\]|minDampingNsPerM \[N·s\/m\]/.test(e2.message), 'house rule', String(e2));
    }
    checkThat(dampingFromAdhesion(CAR, measured, { minDampingNsPerM: 1 }).dampingNsPerM > 0, 'house rule: 1 N·s/m is accepted', '');
  });

  it('when a damping above nominal is read at a 2 mm amplitude, then the inverse at that amplitude returns it (property: inverse of the forward map)', () => {
    const measured = adhesionPct({ ...CAR, dampingNsPerM: 2500 }, { amplitudeM: 0.002 }).adhesionPct;
    checkClose(dampingFromAdhesion(CAR, measured, { amplitudeM: 0.002 }).dampingNsPerM, 2500, { rel: 1e-6 }, 'property: round trip above nominal', {});
  });
});
