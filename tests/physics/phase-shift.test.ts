import { describe, it } from 'vitest';
import { phaseShift, dampingFromPhase, NoDampingForPhaseError, PHASE_FAIL_BELOW_DEG } from '../../server/physics/phase-shift';
import { estimateFromLane } from '../../server/physics/lane-estimate';
import { adhesionPct } from '../../server/physics/adhesion';
import { stateSpace, modes } from '../../server/physics/quarter-car';
import { solveLinear } from '../../server/physics/linalg';
import type { CornerParams } from '../../server/physics/types';
import { checkClose, checkRange, checkThat, CAR, DEMO_CORNERS } from './check';

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
    let err: unknown = null;
    try {
      dampingFromPhase(DEMO_CORNERS.courierVanFront, 120);
    } catch (e) {
      err = e;
    }
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
