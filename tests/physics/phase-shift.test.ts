import { describe, it } from 'vitest';
import { phaseShift, phaseDeg, dampingFromPhase, NoDampingForPhaseError, PHASE_FAIL_BELOW_DEG } from '../../server/physics/phase-shift';
import { estimateFromLane } from '../../server/physics/lane-estimate';
import { adhesionPct } from '../../server/physics/adhesion';
import { stateSpace, modes } from '../../server/physics/quarter-car';
import { solveLinear } from '../../server/physics/linalg';
import { PhysicsInputError, type CornerParams } from '../../server/physics/types';
import { checkClose, checkRange, checkThat, CAR, DEMO_CORNERS, thrownBy } from './check';

/**
 * Phase of contact force against plate displacement straight from the state-space matrices:
 * (jωI − A)·X = B·jω (road displacement in, B takes road velocity), force = C·X, solved as an
 * 8×8 real system — independent of the closed-form transfer functions the engine uses.
 */
function directPhaseDeg(c: CornerParams, fHz: number): number {
  const { A, B, outputs } = stateSpace(c);
  const w = 2 * Math.PI * fHz;
  const m = new Float64Array(64);
  for (let i = 0; i < 4; i++) {
    for (let j = 0; j < 4; j++) {
      m[i * 8 + j] = -A[i * 4 + j];
      m[(i + 4) * 8 + (j + 4)] = -A[i * 4 + j];
    }
    m[i * 8 + (i + 4)] = -w; // Re: −A·xr − ω·xi = Re(jω·B) = 0
    m[(i + 4) * 8 + i] = w; //  Im:  ω·xr − A·xi = ω·B
  }
  const rhs = new Float64Array(8);
  for (let i = 0; i < 4; i++) rhs[i + 4] = w * B[i];
  const x = solveLinear(m, rhs, 8);
  let re = 0;
  let im = 0;
  for (let i = 0; i < 4; i++) {
    re += outputs.tireLoad[i] * x[i];
    im += outputs.tireLoad[i] * x[i + 4];
  }
  return (Math.abs(Math.atan2(im, re)) * 180) / Math.PI;
}

/** Lowest interior local minimum of the direct phase between the resonances, brute force on a 0.001 Hz grid. */
function directDip(c: CornerParams): { deg: number; hz: number } {
  const md = modes(c);
  let best = { deg: Infinity, hz: NaN };
  const step = 0.001;
  let prev = directPhaseDeg(c, md.bodyHz);
  let cur = directPhaseDeg(c, md.bodyHz + step);
  for (let f = md.bodyHz + step; f < md.wheelHz; f += step) {
    const next = directPhaseDeg(c, f + step);
    if (cur <= prev && cur <= next && cur < best.deg) best = { deg: cur, hz: f };
    prev = cur;
    cur = next;
  }
  return best;
}

describe('phase-shift method', () => {
  it('when the minimum phase is predicted, then it matches a direct frequency-response computation from the state-space matrices (computed)', () => {
    for (const c of [CAR, DEMO_CORNERS.courierVanRear, DEMO_CORNERS.truckRear, { ...DEMO_CORNERS.longVanFront, dampingNsPerM: 1200 }]) {
      const r = phaseShift(c);
      const d = directDip(c);
      checkClose(r.minPhaseDeg, d.deg, { abs: 0.01 }, 'computed: direct (jωI − A)⁻¹ solve', { c });
      checkClose(r.atHz, d.hz, { abs: 0.02 }, 'computed: direct (jωI − A)⁻¹ solve', { c });
      checkRange(r.atHz, modes(c).bodyHz, modes(c).wheelHz, 'docs/methods.md "Test-lane checks": between the two resonances', { c });
    }
  });

  it('when damping falls, then the minimum phase falls toward 0°, new demo dampers pass and a damper at a third of its damping fails the commonly cited 35° line (docs/methods.md "Test-lane checks", common practice)', () => {
    checkThat(PHASE_FAIL_BELOW_DEG === 35, 'docs/methods.md "Test-lane checks" (common practice)', String(PHASE_FAIL_BELOW_DEG));
    for (const [name, c] of Object.entries(DEMO_CORNERS)) {
      const values = [1, 0.75, 0.5, 0.3, 0.1].map((x) => phaseShift({ ...c, dampingNsPerM: c.dampingNsPerM * x }).minPhaseDeg);
      for (let i = 1; i < values.length; i++) checkThat(values[i] < values[i - 1], 'property: φmin rises with damping', `${name}: ${values.join(', ')}`);
      checkThat(values[0] >= PHASE_FAIL_BELOW_DEG + 15, 'computed: a new damper passes clearly', `${name}: ${values[0]}°`);
      checkThat(phaseShift({ ...c, dampingNsPerM: c.dampingNsPerM / 3 }).minPhaseDeg < PHASE_FAIL_BELOW_DEG || name === 'truckRear', 'computed', name);
      checkThat(values[4] < 16, 'property: nearly undamped reads near 0°', `${name}: ${values[4]}`);
    }
  });

  it('when the tyre is 30 % stiffer, then the minimum phase moves less than adhesion does (docs/methods.md "Test-lane checks": phase depends on damping far more than on tyre stiffness)', () => {
    const c = DEMO_CORNERS.courierVanFront;
    const stiff = { ...c, tireRateNPerM: c.tireRateNPerM * 1.3 };
    const dPhase = Math.abs(phaseShift(stiff).minPhaseDeg / phaseShift(c).minPhaseDeg - 1);
    const dAdh = Math.abs(adhesionPct(stiff).adhesionPct / adhesionPct(c).adhesionPct - 1);
    checkThat(dPhase < dAdh, 'docs/methods.md "Test-lane checks"', `phase ${dPhase}, adhesion ${dAdh}`);
  });

  it('when a minimum phase is simulated for a known damping, then the inverse recovers it; above the highest reachable value it says so (computed)', () => {
    for (const [name, c] of Object.entries(DEMO_CORNERS)) {
      for (const x of [0.2, 0.5, 0.8, 1]) {
        const cs = c.dampingNsPerM * x;
        const deg = phaseShift({ ...c, dampingNsPerM: cs }).minPhaseDeg;
        checkClose(dampingFromPhase(c, deg).dampingNsPerM, cs, { rel: 1e-4 }, 'computed: round trip', { name, x, deg });
      }
    }
    const err = thrownBy(() => dampingFromPhase(DEMO_CORNERS.courierVanFront, 120));
    checkThat(err instanceof NoDampingForPhaseError && (err as Error).message.includes('no damping value explains a minimum phase of 120°'), 'definition', String(err));
  });

  it('when both readings are given, then the estimate takes the one whose repeatability moves damping least and says which; either alone works (computed)', () => {
    const c = DEMO_CORNERS.courierVanRear;
    const worn = { ...c, dampingNsPerM: c.dampingNsPerM * 0.3 };
    const readings = { adhesionPct: adhesionPct(worn).adhesionPct, phaseDeg: phaseShift(worn).minPhaseDeg, amplitudeM: 0.003 };
    const both = estimateFromLane(c, readings);
    const [a, p] = both.inversions;
    checkThat(a.method === 'adhesion' && p.method === 'phase', 'definition', JSON.stringify(both.inversions));
    const better = a.relSpread! < p.relSpread! ? 'adhesion' : 'phase';
    checkThat(both.method === better && both.note!.startsWith(`from ${better === 'phase' ? 'the phase shift' : 'adhesion'}`), 'definition: better conditioned', JSON.stringify(both));
    checkClose(both.dampingNsPerM!, worn.dampingNsPerM, { rel: 1e-3 }, 'computed: round trip', {});
    // a wheel that leaves the plate (0 %) says nothing about damping below a threshold; the phase still does
    const lifted = { ...c, dampingNsPerM: c.dampingNsPerM * 0.1 };
    const l = estimateFromLane(c, { adhesionPct: 0, phaseDeg: phaseShift(lifted).minPhaseDeg, amplitudeM: 0.003 });
    checkThat(l.method === 'phase', 'computed', JSON.stringify(l));
    checkClose(l.dampingNsPerM!, lifted.dampingNsPerM, { rel: 1e-3 }, 'computed', {});
    const onlyA = estimateFromLane(c, { adhesionPct: readings.adhesionPct, phaseDeg: null, amplitudeM: 0.003 });
    checkThat(onlyA.method === 'adhesion' && onlyA.inversions.length === 1, 'definition', JSON.stringify(onlyA));
    const none = estimateFromLane(c, { adhesionPct: 99, phaseDeg: null, amplitudeM: 0.003 });
    checkThat(none.dampingNsPerM === null && (none.note ?? '').includes('no damping value explains 99 %'), 'definition', JSON.stringify(none));
  });
});

/**
 * Phase of tyre force against plate displacement from the two equations of motion solved as a
 * 2×2 complex system by Cramer's rule (independent of the engine's closed-form denominator):
 * force = kt·(1 − Zu), Zu = kt·(ks + jωcs − ms·ω²) / det.
 */
function cramerPhaseDeg(c: CornerParams, f: number): number {
  const w = 2 * Math.PI * f;
  const { sprungMassKg: ms, unsprungMassKg: mu, springRateNPerM: ks, dampingNsPerM: cs, tireRateNPerM: kt } = c;
  const [a, b] = [ks - ms * w * w, w * cs]; // a11
  const [p, q] = [ks + kt - mu * w * w, w * cs]; // a22
  const [dr, di] = [a * p - b * q - (ks * ks - w * w * cs * cs), a * q + b * p - 2 * ks * w * cs];
  const d2 = dr * dr + di * di;
  const [nr, ni] = [kt * a, kt * b];
  const zu = [(nr * dr + ni * di) / d2, (ni * dr - nr * di) / d2];
  return (Math.abs(Math.atan2(-kt * zu[1], kt * (1 - zu[0]))) * 180) / Math.PI;
}

/** Lowest interior local minimum of cramerPhaseDeg between the resonances: 4000-point log scan, then ternary search. */
function cramerDip(c: CornerParams): { deg: number; hz: number } | null {
  const md = modes(c);
  const n = 4000;
  const fs = Array.from({ length: n }, (_, i) => md.bodyHz * Math.pow(md.wheelHz / md.bodyHz, i / (n - 1)));
  const ps = fs.map((f) => cramerPhaseDeg(c, f));
  let best = -1;
  for (let i = 1; i < n - 1; i++) if (ps[i] <= ps[i - 1] && ps[i] <= ps[i + 1] && (best < 0 || ps[i] < ps[best])) best = i;
  if (best < 0) return null;
  let a = fs[best - 1];
  let b = fs[best + 1];
  for (let i = 0; i < 100; i++) {
    const m1 = a + (b - a) / 3;
    const m2 = b - (b - a) / 3;
    if (cramerPhaseDeg(c, m1) > cramerPhaseDeg(c, m2)) a = m1;
    else b = m2;
  }
  return { deg: cramerPhaseDeg(c, (a + b) / 2), hz: (a + b) / 2 };
}

describe('phase-shift method against an independent solve', () => {
  it('when φ(f) is computed, then it equals the phase of a direct 2×2 solve of the equations of motion and lies within 0–180°, near 180° far below body bounce and near 0° far above wheel hop (computed; property)', () => {
    for (const c of [CAR, DEMO_CORNERS.truckFront, { ...CAR, dampingNsPerM: 300 }]) {
      for (const f of [0.3, 1, 2.2, 5, 9, 14, 40]) {
        const v = phaseDeg(c, f);
        checkClose(v, cramerPhaseDeg(c, f), { abs: 1e-9 }, 'computed: direct 2×2 solve', { c, f });
        checkRange(v, 0, 180, 'property: |arg| of a complex number', { f });
      }
      checkRange(phaseDeg(c, 0.01), 179, 180, 'docs/methods.md "Phase-shift method": 180° at low frequency', {});
      checkRange(phaseDeg(c, 500), 0, 1, 'docs/methods.md "Phase-shift method": 0° above wheel hop', {});
    }
  });

  it('when the dip is open, then the minimum and its frequency match a fine scan and ternary search of the direct solve to 1e-7° and 1e-4 Hz (computed)', () => {
    for (const c of [CAR, DEMO_CORNERS.courierVanFront, { ...DEMO_CORNERS.truckRear, dampingNsPerM: 9000 }]) {
      const ref = cramerDip(c)!;
      const r = phaseShift(c);
      checkClose(r.minPhaseDeg, ref.deg, { abs: 1e-7 }, 'computed: direct 2×2 solve, fine scan', { c });
      checkClose(r.atHz, ref.hz, { abs: 1e-4 }, 'computed: direct 2×2 solve, fine scan', { c });
    }
  });

  it('when the damper is so stiff that the dip has closed, then the reading is the curve\'s value at its flattest point in the band (computed: direct solve, least |dφ/d ln f|)', () => {
    const c = { ...DEMO_CORNERS.courierVanFront, dampingNsPerM: 5 * DEMO_CORNERS.courierVanFront.dampingNsPerM };
    checkThat(cramerDip(c) === null, 'computed: no interior minimum', '');
    const md = modes(c);
    const lo = md.bodyHz;
    const hi = Math.max(1.5 * lo, md.wheelHz);
    const r = phaseShift(c);
    checkClose(r.minPhaseDeg, cramerPhaseDeg(c, r.atHz), { abs: 1e-9 }, 'computed: a point of the curve', {});
    const n = 2000;
    const h = Math.log(hi / lo) / (n - 1);
    let flat = { slope: Infinity, f: NaN };
    for (let i = 1; i < n - 1; i++) {
      const f = lo * Math.exp(h * i);
      const slope = Math.abs(cramerPhaseDeg(c, f * Math.exp(h)) - cramerPhaseDeg(c, f / Math.exp(h)));
      if (slope < flat.slope) flat = { slope, f };
    }
    checkClose(r.atHz, flat.f, { rel: 2e-3 }, 'computed: least |dφ/d ln f| of the direct solve', { lo, hi });
  });
});

describe('dampingFromPhase bounds and errors', () => {
  /** First maximum of φmin going up in damping from 1 % of nominal, brute force on a 400-point log grid. */
  function firstMax(c: CornerParams): number {
    let prev = -1;
    for (let i = 0; i <= 400; i++) {
      const v = phaseShift({ ...c, dampingNsPerM: c.dampingNsPerM * 0.01 * Math.pow(500, i / 400) }).minPhaseDeg;
      if (v < prev) return prev;
      prev = v;
    }
    return prev;
  }

  it('when the reading is above the first maximum, then the error carries that maximum as found by brute force; just below it is explained (computed; property: inverse of the forward map)', () => {
    const c = DEMO_CORNERS.courierVanRear;
    const top = firstMax(c);
    const e = thrownBy(() => dampingFromPhase(c, top + 0.2)) as NoDampingForPhaseError;
    checkThat(e instanceof NoDampingForPhaseError && e.name === 'NoDampingForPhaseError', 'definition', String(e));
    checkClose(e.measuredDeg, top + 0.2, { abs: 0 }, 'definition', {});
    checkClose(e.maxDeg, top, { abs: 0.01 }, 'computed: brute-force first maximum', {});
    checkThat(e.message.includes(`highest minimum phase for this corner is ${e.maxDeg.toFixed(1)}°`), 'definition', e.message);
    const cs = dampingFromPhase(c, top - 0.05).dampingNsPerM;
    checkClose(phaseShift({ ...c, dampingNsPerM: cs }).minPhaseDeg, top - 0.05, { abs: 1e-6 }, 'property: forward map of the inverse', { cs });
  });

  it('when the reading is 0°, below what 1 % of nominal damping gives, or outside 0–180°, then it is refused with the reason (definition; house rule)', () => {
    const zero = thrownBy(() => dampingFromPhase(CAR, 0));
    checkThat(zero instanceof NoDampingForPhaseError && zero.message.includes('only an undamped corner reads 0°'), 'definition', String(zero));
    const floor = phaseShift({ ...CAR, dampingNsPerM: 18 }).minPhaseDeg;
    const low = thrownBy(() => dampingFromPhase(CAR, floor / 2));
    checkThat(low instanceof NoDampingForPhaseError && low.message.includes(`below the model's ${floor.toFixed(1)}° at the lowest damping searched (18 N·s/m)`), 'definition', String(low));
    checkClose(dampingFromPhase(CAR, floor * 1.5).dampingNsPerM, 18 * 1.5, { rel: 0.2 }, 'property: φmin nearly proportional to light damping', { floor });
    for (const v of [-0.1, 180.1]) {
      const e = thrownBy(() => dampingFromPhase(CAR, v));
      checkThat(e instanceof PhysicsInputError && e.message.includes('measuredDeg [°]'), 'house rule', String(e));
    }
    checkThat(thrownBy(() => dampingFromPhase(CAR, 180)) instanceof NoDampingForPhaseError, 'house rule: 180° is a valid reading no damping explains', '');
  });
});

describe('dampingFromPhase at the ends of its search', () => {
  /** First maximum of φmin going up in damping from 1 % of nominal: 400-point log grid over 1 %–5× (a 100-point grid ended 0.07° low on the example car), then ternary search on log damping. */
  function firstMaxAt(c: CornerParams): { deg: number; dampingNsPerM: number } {
    const at = (cs: number): number => phaseShift({ ...c, dampingNsPerM: cs }).minPhaseDeg;
    const lo = Math.log(0.01 * c.dampingNsPerM);
    const step = Math.log(500) / 400;
    let i = 1;
    while (i < 400 && at(Math.exp(lo + i * step)) >= at(Math.exp(lo + (i - 1) * step))) i++;
    let [a, b] = [lo + (i - 2) * step, lo + i * step];
    for (let k = 0; k < 60; k++) {
      const m1 = a + (b - a) / 3;
      const m2 = b - (b - a) / 3;
      if (at(Math.exp(m1)) < at(Math.exp(m2))) a = m1;
      else b = m2;
    }
    const x = Math.exp((a + b) / 2);
    return { deg: at(x), dampingNsPerM: x };
  }

  it('when the reading is above the first maximum, then the message gives that maximum and the damping where it lies, as a refined brute-force search finds them (computed)', () => {
    for (const c of [CAR, DEMO_CORNERS.longVanRear]) {
      const top = firstMaxAt(c);
      const e = thrownBy(() => dampingFromPhase(c, top.deg + 1)) as NoDampingForPhaseError;
      checkThat(e instanceof NoDampingForPhaseError, 'definition', String(e));
      checkClose(e.maxDeg, top.deg, { abs: 1e-6 }, 'computed: refined brute-force first maximum', { c });
      const m = /is (\d+\.\d)° \(at (\d+) N·s\/m\); check the corner's parameters and the measurement$/.exec(e.message);
      checkThat(m !== null && m[1] === top.deg.toFixed(1), 'definition', e.message);
      // φmin is flat at its maximum: the damping is only defined to about a percent
      checkClose(Number(m![2]), top.dampingNsPerM, { rel: 0.01 }, 'computed: refined brute-force first maximum', { c, message: e.message });
    }
  });

  it('when the minimum phase still rises at 5× nominal damping, then the search ends there: readings up to that value are explained and the highest is the value at 5× (computed)', () => {
    const c = { ...CAR, dampingNsPerM: 100 }; // the first maximum lies near 1800–2500 N·s/m, beyond 5 × 100
    const at500 = phaseShift({ ...c, dampingNsPerM: 500 }).minPhaseDeg;
    const e = thrownBy(() => dampingFromPhase(c, at500 + 0.5)) as NoDampingForPhaseError;
    checkThat(e instanceof NoDampingForPhaseError, 'definition', String(e));
    checkClose(e.maxDeg, at500, { abs: 1e-9 }, 'definition: the top of the searched range', {});
    checkThat(e.message.includes('(at 500 N·s/m)'), 'definition', e.message);
    const deg = phaseShift({ ...c, dampingNsPerM: 300 }).minPhaseDeg;
    checkClose(dampingFromPhase(c, deg).dampingNsPerM, 300, { rel: 1e-6 }, 'property: inverse of the forward map', {});
    checkClose(dampingFromPhase(c, at500 - 1e-6).dampingNsPerM, 500, { rel: 1e-4 }, 'property: inverse of the forward map', {});
  });

  it('when the minimum phase already falls from 1 % of nominal damping, then the highest value is the one at 1 % and every reading is refused (computed)', () => {
    const c = { ...CAR, dampingNsPerM: 1e6 }; // 1 % is 10 000 N·s/m, far beyond the first maximum
    const at1pc = phaseShift({ ...c, dampingNsPerM: 10000 }).minPhaseDeg;
    checkThat(phaseShift({ ...c, dampingNsPerM: 10000 * Math.pow(500, 1 / 48) }).minPhaseDeg < at1pc, 'computed: falling from the start', '');
    const above = thrownBy(() => dampingFromPhase(c, at1pc + 0.1)) as NoDampingForPhaseError;
    checkThat(above instanceof NoDampingForPhaseError && above.message.includes('(at 10000 N·s/m)'), 'definition', String(above));
    checkClose(above.maxDeg, at1pc, { abs: 1e-9 }, 'definition: the value at the lowest damping searched', {});
    const below = thrownBy(() => dampingFromPhase(c, at1pc - 0.1)) as NoDampingForPhaseError;
    checkThat(below instanceof NoDampingForPhaseError && below.message.includes(`below the model's ${at1pc.toFixed(1)}° at the lowest damping searched (10000 N·s/m)`), 'definition', String(below));
    checkClose(below.maxDeg, at1pc, { abs: 1e-9 }, 'definition', {});
    checkClose(below.measuredDeg, at1pc - 0.1, { abs: 0 }, 'definition', {});
  });

  it('when the reading is 0°, then the error still carries the corner\'s highest minimum phase (definition)', () => {
    const zero = thrownBy(() => dampingFromPhase(CAR, 0)) as NoDampingForPhaseError;
    checkThat(zero instanceof NoDampingForPhaseError && zero.measuredDeg === 0, 'definition', String(zero));
    checkClose(zero.maxDeg, firstMaxAt(CAR).deg, { abs: 1e-6 }, 'computed: refined brute-force first maximum', {});
  });
});
