import { describe, it } from 'vitest';
import { estimateFromLane, LANE_REPEATABILITY } from '../../server/physics/lane-estimate';
import { adhesionPct } from '../../server/physics/adhesion';
import { phaseShift } from '../../server/physics/phase-shift';
import { checkClose, checkThat, DEMO_CORNERS } from './check';

const van = DEMO_CORNERS.courierVanRear;

/** rep / |d reading / d ln cs| by a central difference with a step (0.5 %) other than the engine's. */
function refSpread(reading: (cs: number) => number, cs: number, rep: number): number {
  const h = 0.005;
  return rep / Math.abs((reading(cs * Math.exp(h)) - reading(cs * Math.exp(-h))) / (2 * h));
}

describe('estimateFromLane', () => {
  it('when both readings of a worn damper are given, then each inversion returns the true damping with the spread its repeatability gives, and the note names the better one first and the other with its figure (computed: finite difference of the forward maps)', () => {
    const cs = van.dampingNsPerM * 0.6;
    const worn = { ...van, dampingNsPerM: cs };
    const r = estimateFromLane(van, { adhesionPct: adhesionPct(worn).adhesionPct, phaseDeg: phaseShift(worn).minPhaseDeg, amplitudeM: 0.003 });
    checkThat(LANE_REPEATABILITY.adhesionPoints === 3 && LANE_REPEATABILITY.phaseDeg === 3, 'definition: ±3 points, ±3°', JSON.stringify(LANE_REPEATABILITY));
    const [a, p] = r.inversions;
    checkClose(a.dampingNsPerM!, cs, { rel: 1e-4 }, 'property: inverse of the forward map', {});
    checkClose(p.dampingNsPerM!, cs, { rel: 1e-4 }, 'property: inverse of the forward map', {});
    const aRef = refSpread((x) => adhesionPct({ ...van, dampingNsPerM: x }).adhesionPct, cs, 3);
    const pRef = refSpread((x) => phaseShift({ ...van, dampingNsPerM: x }).minPhaseDeg, cs, 3);
    checkClose(a.relSpread!, aRef, { rel: 0.01 }, 'computed: central difference, 0.5 % step', {});
    checkClose(p.relSpread!, pRef, { rel: 0.01 }, 'computed: central difference, 0.5 % step', {});
    checkThat(a.note === null && p.note === null, 'definition', JSON.stringify(r.inversions));
    const [best, other] = aRef < pRef ? [a, p] : [p, a];
    const label = (m: string) => (m === 'phase' ? 'the phase shift' : 'adhesion');
    const rep = best.method === 'phase' ? '±3°' : '±3 points';
    const expected = `from ${label(best.method)} (±${Math.round(best.relSpread! * 100)} % for ${rep}); ${label(other.method)} gives ${Math.round(other.dampingNsPerM!)} N·s/m (±${Math.round(other.relSpread! * 100)} %), less well conditioned`;
    checkThat(r.method === best.method && r.dampingNsPerM === best.dampingNsPerM && r.note === expected, 'definition: better conditioned first', `${r.note} / ${expected}`);
  });

  it('when only the phase is read, then the estimate is the phase inversion and the note says so alone (definition)', () => {
    const worn = { ...van, dampingNsPerM: 1500 };
    const r = estimateFromLane(van, { adhesionPct: null, phaseDeg: phaseShift(worn).minPhaseDeg, amplitudeM: 0.003 });
    checkThat(r.inversions.length === 1 && r.method === 'phase' && /^from the phase shift \(±\d+ % for ±3°\)$/.test(r.note!), 'definition', JSON.stringify(r));
    checkClose(r.dampingNsPerM!, 1500, { rel: 1e-4 }, 'property: inverse of the forward map', {});
  });

  it('when nothing is read, then there is no estimate and no note (definition)', () => {
    const r = estimateFromLane(van, { adhesionPct: null, phaseDeg: null, amplitudeM: 0.003 });
    checkThat(r.dampingNsPerM === null && r.method === null && r.note === null && r.inversions.length === 0, 'definition', JSON.stringify(r));
  });

  it('when neither reading can be explained, then each says why, in the order adhesion then phase shift, without the "physics:" prefix (definition)', () => {
    const r = estimateFromLane(van, { adhesionPct: 99, phaseDeg: 179, amplitudeM: 0.003 });
    checkThat(r.dampingNsPerM === null && r.method === null, 'definition', JSON.stringify(r));
    checkThat(r.inversions.every((i) => i.dampingNsPerM === null && i.relSpread === null), 'definition', JSON.stringify(r.inversions));
    checkThat(/^adhesion: no damping value explains 99 % adhesion: .*; phase shift: no damping value explains a minimum phase of 179°: /.test(r.note!), 'definition', r.note!);
  });

  it('when one reading is refused as bad input, then its note says "no estimate" and the other reading is used, naming the refused one (definition)', () => {
    const worn = { ...van, dampingNsPerM: 1500 };
    const r = estimateFromLane(van, { adhesionPct: 50, phaseDeg: phaseShift(worn).minPhaseDeg, amplitudeM: 0.05 });
    const a = r.inversions[0];
    checkThat(a.method === 'adhesion' && a.dampingNsPerM === null && a.note!.startsWith('no estimate: amplitudeM [m]'), 'definition', JSON.stringify(a));
    checkThat(r.method === 'phase' && r.note!.endsWith(`; adhesion: ${a.note}`), 'definition', r.note!);
    const bad = estimateFromLane(van, { adhesionPct: null, phaseDeg: 200, amplitudeM: 0.003 });
    checkThat(bad.note!.startsWith('phase shift: no estimate: measuredDeg [°]'), 'definition', bad.note!);
  });
});

describe('estimateFromLane when adhesion is the better reading', () => {
  it('when a new rear courier-van damper is read on a 6 mm plate, then adhesion moves damping least: the estimate takes it at that amplitude, its spread is the finite-difference one, and the phase shift is named second (computed: finite difference of the forward maps)', () => {
    const amp = 0.006; // not the 3 mm default, so the amplitude has to reach both the inversion and the spread
    const reading = adhesionPct(van, { amplitudeM: amp }).adhesionPct;
    const r = estimateFromLane(van, { adhesionPct: reading, phaseDeg: phaseShift(van).minPhaseDeg, amplitudeM: amp });
    const [a, p] = r.inversions;
    checkThat(a.method === 'adhesion' && p.method === 'phase', 'definition: adhesion first', JSON.stringify(r.inversions));
    checkClose(a.dampingNsPerM!, van.dampingNsPerM, { rel: 1e-4 }, 'property: inverse of the forward map at the plate amplitude', {});
    const aRef = refSpread((x) => adhesionPct({ ...van, dampingNsPerM: x }, { amplitudeM: amp }).adhesionPct, van.dampingNsPerM, 3);
    checkClose(a.relSpread!, aRef, { rel: 0.01 }, 'computed: central difference, 0.5 % step, at the plate amplitude', {});
    checkThat(a.relSpread! < p.relSpread!, 'computed: adhesion better conditioned here', `${a.relSpread} ${p.relSpread}`);
    const expected = `from adhesion (±${Math.round(a.relSpread! * 100)} % for ±3 points); the phase shift gives ${Math.round(p.dampingNsPerM!)} N·s/m (±${Math.round(p.relSpread! * 100)} %), less well conditioned`;
    checkThat(r.method === 'adhesion' && r.dampingNsPerM === a.dampingNsPerM && r.note === expected, 'definition: better conditioned first', `${r.note} / ${expected}`);
  });

  it('when only adhesion is read, then the estimate is the adhesion inversion and the note says so alone (definition)', () => {
    const worn = { ...van, dampingNsPerM: 1500 };
    const r = estimateFromLane(van, { adhesionPct: adhesionPct(worn).adhesionPct, phaseDeg: null, amplitudeM: 0.003 });
    checkThat(r.inversions.length === 1 && r.method === 'adhesion' && /^from adhesion \(±\d+ % for ±3 points\)$/.test(r.note!), 'definition', JSON.stringify(r));
    checkClose(r.dampingNsPerM!, 1500, { rel: 1e-4 }, 'property: inverse of the forward map', {});
  });
});
