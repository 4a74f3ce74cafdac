import { describe, it, beforeAll, afterAll } from 'vitest';
import { join } from 'node:path';
import { prepareDuty, dutyOnRoad } from '../../server/physics/closed-form';
import { adhesionPct } from '../../server/physics/adhesion';
import { iriFromGd } from '../../server/physics/iri';
import { phaseShift } from '../../server/physics/phase-shift';
import { synthesizeProfile } from '../../server/physics/iso8608';
import { runCli as cli, runCliProcess, scratchFolder } from '../support/cli';
import { checkClose, checkThat, CAR } from './check';

let scratch: ReturnType<typeof scratchFolder>;
let dir = '';
const file = (name: string, text: string): string => scratch.put(name, text);

beforeAll(() => {
  scratch = scratchFolder('reboundry-cli-');
  dir = scratch.dir;
  file('spec.json', JSON.stringify(CAR));
  file('bad-spec.json', JSON.stringify({ ...CAR, sprungMassKg: -3 }));
});
afterAll(() => scratch.remove());

describe('cli', () => {
  it('when run as the user runs it (node with the tsx loader), then its exit code and both streams are those of the entry point the other checks call', () => {
    const spec = join(dir, 'spec.json');
    for (const args of [['modes', '--spec', spec], ['modes', '--spec', join(dir, 'bad-spec.json')], ['frobnicate']]) {
      const proc = runCliProcess(...args);
      const inProc = cli(...args);
      checkThat(
        proc.code === inProc.code && proc.stdout === inProc.stdout && proc.stderr === inProc.stderr,
        'cli contract: the process prints what main() prints',
        `${args.join(' ')}: exit ${proc.code} vs ${inProc.code}, stdout "${proc.stdout}" vs "${inProc.stdout}", stderr "${proc.stderr}" vs "${inProc.stderr}"`,
      );
    }
  });

  it('when rainflow reads the ASTM E1049 example (plain and with a value column), then it prints the published cycles as JSON', () => {
    const plain = file('astm.csv', '-2\n1\n-3\n5\n-1\n3\n-4\n4\n-2\n');
    const withHeader = file('astm-col.csv', 't,value\n0,-2\n1,1\n2,-3\n3,5\n4,-1\n5,3\n6,-4\n7,4\n8,-2\n');
    for (const p of [plain, withHeader]) {
      const r = cli('rainflow', p);
      checkThat(r.code === 0 && r.stderr === '', 'cli contract', `exit ${r.code}, stderr "${r.stderr}"`);
      const cycles = (r.json?.cycles ?? []) as { range: number; count: number }[];
      const total = new Map<number, number>();
      for (const c of cycles) total.set(c.range, (total.get(c.range) ?? 0) + c.count);
      for (const [range, count] of [[3, 0.5], [4, 1.5], [6, 0.5], [8, 1], [9, 0.5]] as const) {
        checkClose(total.get(range) ?? 0, count, { abs: 0 }, 'ASTM E1049-85 §5.4.4 worked example', { file: p, range });
      }
    }
  });

  it('when iri reads a 5 mm, 5 m sinusoid in elevation_mm, then IRI ≈ 4.65 m/km and 100 m segments start at the first distance (computed, docs/methods.md "Road roughness")', () => {
    const lines = ['distance_m,elevation_mm'];
    for (let i = 0; i <= 4000; i++) lines.push(`${(500 + i * 0.25).toFixed(2)},${(5 * Math.sin((2 * Math.PI * i * 0.25) / 5)).toFixed(6)}`);
    const r = cli('iri', file('sine.csv', lines.join('\n')), '--segment-m', '100');
    checkThat(r.code === 0, 'cli contract', `exit ${r.code}, stderr "${r.stderr}"`);
    checkClose(r.json?.iri as number, 4.65, { abs: 0.01 }, 'computed (docs/methods.md "Road roughness")', { wavelengthM: 5, amplitudeMm: 5 });
    const segs = r.json?.segments as { startM: number; endM: number; iri: number }[];
    checkClose(segs.length, 10, { abs: 0 }, 'definition: 1000 m / 100 m', {});
    checkClose(segs[0].startM, 500, { abs: 1e-9 }, 'definition', {});
    checkClose(segs[9].endM, 1500, { abs: 1e-6 }, 'definition', {});
  });

  it('when duty runs closed-form and time methods, then the closed form equals the library and the time method agrees within 3 % (computed)', () => {
    const spec = join(dir, 'spec.json');
    const a = cli('duty', '--spec', spec, '--class', 'C', '--speed-kmh', '60');
    checkThat(a.code === 0, 'cli contract', `exit ${a.code}, stderr "${a.stderr}"`);
    const exp = dutyOnRoad(prepareDuty(CAR, 60 / 3.6), 256e-6);
    for (const [k, v] of Object.entries(exp)) checkClose(a.json?.[k] as number, v, { rel: 1e-12 }, 'computed: library', { k });
    const t = cli('duty', '--spec', spec, '--gd', '256e-6', '--speed-kmh', '60', '--method', 'time', '--distance-km', '3', '--seed', '4');
    checkThat(t.code === 0, 'cli contract', `exit ${t.code}, stderr "${t.stderr}"`);
    for (const k of ['rmsBodyAccel', 'rmsWeightedAccel', 'rmsSuspensionTravel', 'rmsRelativeVelocity', 'rmsTireLoadRatio'] as const) {
      checkClose(t.json?.[k] as number, exp[k], { rel: 0.03 }, 'computed: time domain vs closed form', { k });
    }
  });

  it('when modes, adhesion, damping-from-adhesion and exposure run, then each prints its documented keys', () => {
    const spec = join(dir, 'spec.json');
    const m = cli('modes', '--spec', spec);
    checkThat(m.code === 0 && ['bodyHz', 'bodyDampingRatio', 'wheelHz', 'wheelDampingRatio'].every((k) => typeof m.json?.[k] === 'number'), 'physics CLI', m.stdout + m.stderr);
    const ad = cli('adhesion', '--spec', spec, '--amplitude-mm', '6');
    checkClose(ad.json?.adhesionPct as number, adhesionPct(CAR, { amplitudeM: 0.006 }).adhesionPct, { rel: 1e-12 }, 'computed: library', {});
    const worn = adhesionPct({ ...CAR, dampingNsPerM: 1200 }).adhesionPct;
    const inv = cli('damping-from-adhesion', '--spec', spec, '--adhesion', String(worn));
    checkClose(inv.json?.dampingNsPerM as number, 1200, { rel: 1e-4 }, 'computed: round trip', { worn });
    const trips = file('trips.json', JSON.stringify([{ weightedAccel: 0.6, hours: 3 }, { weightedAccel: 0.5, hours: 4 }]));
    const ex = cli('exposure', '--trips', trips);
    checkClose(ex.json?.a8 as number, Math.sqrt((0.36 * 3 + 0.25 * 4) / 8), { rel: 1e-12 }, 'Directive 2002/44/EC Annex B', {});
    checkThat(ex.json?.actionValue === 0.5 && ex.json?.limitValue === 1.15 && ex.json?.status === 'exceeds-action-value', 'Directive 2002/44/EC Art. 3', ex.stdout);
  });

  it('when duty runs over a measured profile, then it prints the same keys as the closed form and agrees with it at the profile Gd(n0) within 6 % (computed)', () => {
    const gd = 256e-6;
    const z = synthesizeProfile({ gdN0: gd, lengthM: 4000, dxM: 0.25, seed: 9 });
    const lines = ['distance_m,elevation_m'];
    for (let i = 0; i < z.length; i++) lines.push(`${(i * 0.25).toFixed(2)},${z[i].toFixed(7)}`);
    const prof = file('survey.csv', lines.join('\n'));
    const spec = join(dir, 'spec.json');
    const r = cli('duty', '--spec', spec, '--profile', prof, '--speed-kmh', '50');
    checkThat(r.code === 0, 'cli contract', `exit ${r.code}, stderr "${r.stderr}"`);
    const exp = dutyOnRoad(prepareDuty(CAR, 50 / 3.6), gd);
    checkThat(JSON.stringify(Object.keys(r.json ?? {}).sort()) === JSON.stringify(Object.keys(exp).sort()), 'cli contract: same keys as duty', r.stdout);
    for (const k of Object.keys(exp) as (keyof typeof exp)[]) {
      checkClose(r.json?.[k] as number, exp[k], { rel: 0.06 }, 'computed: measured-segment path vs closed form', { k });
    }
    const both = cli('duty', '--spec', spec, '--profile', prof, '--speed-kmh', '50', '--class', 'C');
    checkThat(both.code === 2 && both.stderr.includes('--profile'), 'cli contract', both.stderr);
  });

  it('when phase-shift and damping-from-phase run, then they print the library figures and a clear error when no damping explains a phase (computed)', () => {
    const spec = join(dir, 'spec.json');
    const r = cli('phase-shift', '--spec', spec);
    checkThat(r.code === 0, 'cli contract', `exit ${r.code}, stderr "${r.stderr}"`);
    checkClose(r.json?.minPhaseDeg as number, phaseShift(CAR).minPhaseDeg, { rel: 1e-12 }, 'computed: library', {});
    checkClose(r.json?.atHz as number, phaseShift(CAR).atHz, { rel: 1e-12 }, 'computed: library', {});
    const worn = phaseShift({ ...CAR, dampingNsPerM: 900 }).minPhaseDeg;
    const inv = cli('damping-from-phase', '--spec', spec, '--phase-deg', String(worn));
    checkClose(inv.json?.dampingNsPerM as number, 900, { rel: 1e-4 }, 'computed: round trip', { worn });
    const bad = cli('damping-from-phase', '--spec', spec, '--phase-deg', '150');
    checkThat(bad.code === 1 && bad.stdout === '' && bad.stderr.includes('no damping value explains a minimum phase of 150°'), 'cli contract', `exit ${bad.code} "${bad.stderr}"`);
    const miss = cli('damping-from-phase', '--spec', spec);
    checkThat(miss.code === 2 && miss.stderr.includes('--phase-deg'), 'cli contract', miss.stderr);
  });

  it('when roughness converts an IRI or a Gd(n0), then it prints iri, gdN0 and class consistent with the golden car (computed, docs/methods.md "Road roughness") and refuses both or neither', () => {
    const a = cli('roughness', '--gd', '256e-6');
    checkThat(a.code === 0, 'cli contract', `exit ${a.code}, stderr "${a.stderr}"`);
    checkClose(a.json?.iri as number, iriFromGd(256e-6), { rel: 1e-12 }, 'computed', {});
    checkThat(a.json?.class === 'C' && a.json?.gdN0 === 256e-6, 'ISO 8608 class C mean', JSON.stringify(a.json));
    const b = cli('roughness', '--iri', String(a.json?.iri));
    checkClose(b.json?.gdN0 as number, 256e-6, { rel: 1e-9 }, 'property: inverse', {});
    checkThat(b.json?.class === 'C', 'ISO 8608 class C', JSON.stringify(b.json));
    // 12 m/km: √(12/542.7)² ≈ 489e-6 m³, upper class C (computed)
    const c = cli('roughness', '--iri', '12');
    checkThat(c.json?.class === 'C', 'computed', JSON.stringify(c.json));
    const d = cli('roughness', '--iri', '12', '--gd', '1e-4');
    checkThat(d.code === 2 && d.stdout === '' && d.stderr.includes('exactly one'), 'cli contract', `exit ${d.code} "${d.stderr}"`);
    const e = cli('roughness', '--iri', 'x');
    checkThat(e.code === 1 && e.stderr.includes('iri'), 'cli contract', `exit ${e.code} "${e.stderr}"`);
  });

  it('when the spec is invalid, the profile uneven or the command unknown, then stdout is empty and stderr explains with a non-zero exit', () => {
    const bad = cli('modes', '--spec', join(dir, 'bad-spec.json'));
    checkThat(bad.code === 1 && bad.stdout === '' && bad.stderr.includes('sprungMassKg') && bad.stderr.includes('[kg]'), 'cli contract', `exit ${bad.code}, stdout "${bad.stdout}", stderr "${bad.stderr}"`);
    const uneven = cli('iri', file('uneven.csv', 'distance_m,elevation_m\n0,0\n0.25,0\n0.6,0\n0.75,0\n'));
    checkThat(uneven.code === 1 && uneven.stdout === '' && uneven.stderr.includes('evenly spaced'), 'cli contract', `exit ${uneven.code}, stderr "${uneven.stderr}"`);
    const unknown = cli('frobnicate');
    checkThat(unknown.code === 2 && unknown.stdout === '' && unknown.stderr.includes('unknown command'), 'cli contract', `exit ${unknown.code}, stderr "${unknown.stderr}"`);
    const none = cli('damping-from-adhesion', '--spec', join(dir, 'spec.json'), '--adhesion', '95');
    checkThat(none.code === 1 && none.stderr.includes('no damping value explains 95 %'), 'cli contract', `exit ${none.code}, stderr "${none.stderr}"`);
  });
});
