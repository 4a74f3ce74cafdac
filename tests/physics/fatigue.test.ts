import { describe, it } from 'vitest';
import {
  rainflow, reversals, minerDamage, spectralMoments, dirlikDamage, narrowBandDamage, dirlikDensity, dirlikDensityWith, dirlikParams, rainflowDamage,
} from '../../server/physics/fatigue';
import { gamma } from '../../server/physics/gamma';
import { simulateProfile } from '../../server/physics/simulate';
import { synthesizeProfile, ISO8608_N0, seededRandom } from '../../server/physics/iso8608';
import { cornerTransfer } from '../../server/physics/quarter-car';
import { checkClose, checkThat, CAR, errorOf } from './check';

const bandSpectrum = (centre: number, width: number, points = 2001): { f: number[]; g: number[] } => {
  const f: number[] = [];
  const g: number[] = [];
  for (let i = 0; i < points; i++) {
    f.push(centre - width / 2 + (width * i) / (points - 1));
    g.push(1e-4);
  }
  return { f, g };
};

/** The ASTM E1049-85 §5.4.4 worked example (Fig. 6 / Table 4). */
/**
 * A spectrum of two Cauchy-shaped peaks, each `height / (1 + ((f − at) / width)²)` and the first of
 * height 1, at the n + 1 frequencies `freqAt(0)` … `freqAt(n)` [Hz].
 */
const twoPeaks = (n: number, freqAt: (i: number) => number, first: { at: number; width: number }, second: { height: number; at: number; width: number }) => {
  const f: number[] = [];
  const g: number[] = [];
  for (let i = 0; i <= n; i++) {
    const x = freqAt(i);
    f.push(x);
    g.push(1 / (1 + ((x - first.at) / first.width) ** 2) + second.height / (1 + ((x - second.at) / second.width) ** 2));
  }
  return { f, g };
};

const ASTM = [-2, 1, -3, 5, -1, 3, -4, 4, -2];

/** Cycles as sorted "range/mean/count" words, for comparing counts regardless of order. */
const cycleWords = (cycles: { range: number; mean: number; count: number }[]): string[] => cycles.map((c) => `${c.range}/${c.mean}/${c.count}`).sort();

describe('rainflow (ASTM E1049)', () => {
  it('when counting the worked example, then each cycle has its range, the mean of its two extremes and its count (ASTM E1049-85 §5.4.4 Table 4; means computed from the extremes)', () => {
    // −2→1 ½, 1→−3 ½, −1→3 full, −3→5 ½, 5→−4 ½, −4→4 ½, 4→−2 ½
    const exp = ['3/-0.5/0.5', '4/-1/0.5', '4/1/1', '8/1/0.5', '9/0.5/0.5', '8/0/0.5', '6/1/0.5'].sort();
    checkThat(JSON.stringify(cycleWords(rainflow(ASTM))) === JSON.stringify(exp), 'ASTM E1049-85 §5.4.4', JSON.stringify(rainflow(ASTM)));
  });

  it('when the repeating worked example is rotated to start and end at its largest peak or at its deepest valley, then both give the same full cycles 3, 4, 7 and 9 (ASTM E1049-85 §5.4.4 on repeating histories, from memory; counted by hand)', () => {
    const fromPeak = [5, -1, 3, -4, 4, -2, 1, -3, 5];
    const fromValley = [-4, 4, -2, 1, -3, 5, -1, 3, -4];
    const total = (cycles: { range: number; count: number }[], r: number): number => cycles.filter((c) => c.range === r).reduce((t, c) => t + c.count, 0);
    for (const seq of [fromPeak, fromValley]) {
      const cycles = rainflow(seq);
      for (const r of [3, 4, 7, 9]) checkClose(total(cycles, r), 1, { abs: 0 }, 'ASTM E1049-85, repeating history: one full cycle each', { seq, range: r });
      checkClose(cycles.reduce((t, c) => t + c.count, 0), 4, { abs: 0 }, 'counted by hand', { seq });
      checkClose(rainflowDamage(Float64Array.from(seq), seq.length, 2, 1), 9 + 16 + 49 + 81, { rel: 1e-15 }, 'computed: Σ S² of the four full cycles', { seq });
    }
  });

  it('when a series holds a non-finite value, then the error names its index', () => {
    checkThat(errorOf(() => reversals([0, 1, NaN, 2])).includes('series[2]'), 'house rule', errorOf(() => reversals([0, 1, NaN, 2])));
    checkThat(JSON.stringify(reversals([1, 1, 2, 0, 0])) === JSON.stringify([1, 2, 0]), 'definition of reversals: plateaus at both ends', JSON.stringify(reversals([1, 1, 2, 0, 0])));
  });

  it('when counting the worked example −2, 1, −3, 5, −1, 3, −4, 4, −2, then ranges 3: 0.5, 4: 1.5, 6: 0.5, 8: 1.0, 9: 0.5 (ASTM E1049-85 §5.4.4)', () => {
    const cycles = rainflow([-2, 1, -3, 5, -1, 3, -4, 4, -2]);
    const byRange = new Map<number, number>();
    for (const c of cycles) {
      checkThat(c.count === 0.5 || c.count === 1, 'ASTM E1049 §5.4.4', `count ${c.count}`);
      byRange.set(c.range, (byRange.get(c.range) ?? 0) + c.count);
    }
    const exp: [number, number][] = [[3, 0.5], [4, 1.5], [6, 0.5], [8, 1.0], [9, 0.5]];
    checkClose(byRange.size, exp.length, { abs: 0 }, 'ASTM E1049-85 §5.4.4 worked example', { ranges: [...byRange.keys()] });
    for (const [r, n] of exp) checkClose(byRange.get(r) ?? 0, n, { abs: 0 }, 'ASTM E1049-85 §5.4.4 worked example', { range: r });
    checkClose(cycles.reduce((s, c) => s + c.count, 0), 4.0, { abs: 0 }, 'ASTM E1049-85 §5.4.4 worked example: total 4.0', {});
  });

  it('when two consecutive ranges are equal (0, 3, 1, 3, 2.5), then the inner one is a full cycle of range 2 (ASTM E1049-85 §5.4.4: count when X ≥ Y)', () => {
    const cycles = rainflow([0, 3, 1, 3, 2.5]);
    const full = cycles.filter((c) => c.count === 1);
    checkThat(full.length === 1 && full[0].range === 2 && full[0].mean === 2, 'ASTM E1049-85 §5.4.4, X ≥ Y', JSON.stringify(cycles));
    checkClose(cycles.filter((c) => c.count === 0.5).length, 2, { abs: 0 }, 'ASTM E1049-85 §5.4.4: the rest as half cycles (3 and 0.5)', {});
  });

  it('when the series has plateaus and monotone runs, then only reversals remain (definition)', () => {
    const r = reversals([0, 1, 2, 2, 1, 1, 3, 4]);
    checkThat(JSON.stringify(r) === JSON.stringify([0, 2, 1, 4]), 'definition of reversals', `got ${JSON.stringify(r)}`);
  });

  it('when the series is constant or a single ramp, then there are no cycles or one half cycle (limits)', () => {
    checkClose(rainflow([1, 1, 1]).length, 0, { abs: 0 }, 'limit', {});
    const one = rainflow([0, 1, 2, 3]);
    checkThat(one.length === 1 && one[0].range === 3 && one[0].count === 0.5, 'limit', JSON.stringify(one));
  });

  it('when 20 periods of a sinusoid of amplitude a are counted, then about 20 cycles of range 2a result (analytic)', () => {
    const s = Array.from({ length: 2001 }, (_, i) => 3 * Math.sin((2 * Math.PI * i) / 100 + 0.3));
    const cycles = rainflow(s);
    const interior = cycles.filter((c) => c.range > 4.5); // the partial ramps at both ends are shorter
    for (const c of interior) checkClose(c.range, 6, { rel: 1e-3 }, 'analytic: sampled sinusoid', { range: c.range });
    checkClose(interior.reduce((t, c) => t + c.count, 0), 20, { abs: 0.5 }, 'analytic: 20 periods', {});
  });
});

describe('rainflowDamage (the nightly job\'s form)', () => {
  it('when the worked example is counted with k = 1, 2 and 3, then D = Σ n·Sᵏ / C of its cycles 3 ½, 4 1½, 6 ½, 8 1, 9 ½ (ASTM E1049-85 §5.4.4, computed)', () => {
    const x = Float64Array.from(ASTM);
    const counts: [number, number][] = [[3, 0.5], [4, 1.5], [6, 0.5], [8, 1], [9, 0.5]];
    for (const k of [1, 2, 3]) {
      const exp = counts.reduce((t, [r, n]) => t + n * r ** k, 0) / 5;
      checkClose(rainflowDamage(x, x.length, k, 5), exp, { rel: 1e-14 }, 'ASTM E1049-85 §5.4.4 worked example', { k });
    }
  });

  it('when a converging series of 3000 reversals is counted, then every range stays on the stack and ends as a half cycle: D = ½·Σ (5999 − 2i)ᵏ / C (ASTM E1049-85 §5.4.4 residue, computed)', () => {
    const len = 3000;
    const x = Float64Array.from({ length: len }, (_, i) => (i % 2 ? -1 : 1) * (len - i));
    let exp = 0;
    for (let i = 0; i + 1 < len; i++) exp += 0.5 * (5999 - 2 * i) ** 2;
    checkClose(rainflowDamage(x, len, 2, 10), exp / 10, { rel: 1e-12 }, 'computed: ranges 5999, 5997, … 3 as half cycles', { len });
    checkClose(minerDamage(rainflow(x), { k: 2, C: 10 }), exp / 10, { rel: 1e-12 }, 'computed: the same with the cycle list', { len });
  });

  it('when only the first len samples are to be used, then the samples after them are ignored (definition)', () => {
    const x = Float64Array.from([...ASTM, 100, -100, 100]);
    checkClose(rainflowDamage(x, ASTM.length, 1, 1), 23, { rel: 1e-15 }, 'ASTM E1049-85 §5.4.4: Σ n·S = 23', {});
    checkClose(rainflowDamage(x, 0, 1, 1), 0, { abs: 0 }, 'definition: no samples, no damage', {});
    checkClose(rainflowDamage(x, 1, 1, 1), 0, { abs: 0 }, 'definition: one sample, no range', {});
  });

  it('when the series ends on a monotone run or a plateau, then the last point closes a half cycle (ASTM E1049-85 §5.4.4: remaining ranges count as half cycles)', () => {
    for (const seq of [[0, 1, 2, 3], [0, 1, 2, 3, 3, 3], [0, 0, 2, 1, 1, 3]]) {
      const x = Float64Array.from(seq);
      const exp = rainflow(seq).reduce((t, c) => t + c.count * c.range ** 3, 0);
      checkClose(rainflowDamage(x, x.length, 3, 1), exp, { rel: 1e-15 }, 'ASTM E1049-85 §5.4.4', { seq });
    }
    checkClose(rainflowDamage(Float64Array.from([0, 1, 2, 3]), 4, 3, 1), 0.5 * 27, { rel: 1e-15 }, 'computed: one half cycle of range 3', {});
    checkClose(rainflowDamage(Float64Array.from([2, 2, 2]), 3, 3, 1), 0, { abs: 0 }, 'definition: a constant series has no cycles', {});
  });

  it('when a long series with plateaus and monotone runs is counted, then the damage is that of the cycle list (computed: rainflow + Miner, held to ASTM E1049 above)', () => {
    const rand = seededRandom(5);
    for (const len of [3000, 5000]) {
      const x = Float64Array.from({ length: len }, () => Math.round((rand() - 0.5) * 12) / 2);
      for (const k of [2, 3.5]) {
        const exp = minerDamage(rainflow(x), { k, C: 3 });
        checkClose(rainflowDamage(x, len, k, 3), exp, { rel: 1e-12 }, 'computed: cycle list', { len, k });
      }
    }
  });
});

describe('Miner and Basquin', () => {
  it('when the damage sum overflows or C is not positive, then the error says so', () => {
    checkThat(/damage sum/.test(errorOf(() => minerDamage([{ range: 1e200, count: 1 }], { k: 3, C: 1 }))), 'house rule', '');
    checkThat(errorOf(() => minerDamage([], { k: 3, C: 0 })).startsWith('physics: C'), 'house rule', '');
    checkThat(errorOf(() => minerDamage([], { k: 51, C: 1 })).startsWith('physics: k [1]'), 'house rule: k ≤ 50', '');
    checkThat(errorOf(() => minerDamage([], { k: 3, C: -1 })).startsWith('physics: C [unit^k]'), 'house rule', '');
    checkThat(errorOf(() => minerDamage([], undefined as unknown as { k: number; C: number })).startsWith('physics: k [1]'), 'house rule: no curve', '');
    checkThat(errorOf(() => minerDamage([], { k: 3 } as unknown as { k: number; C: number })).startsWith('physics: C [unit^k]'), 'house rule: no constant', '');
    checkClose(minerDamage([], { k: 3, C: 1 }), 0, { abs: 0 }, 'definition: no cycles', {});
  });

  it('when Γ is evaluated at 10⁻⁶, then it follows Γ(ε) = 1/ε − γ + (γ²/2 + π²/12)·ε (Laurent series about 0, computed)', () => {
    const eps = 1e-6;
    const euler = 0.5772156649015329;
    checkClose(gamma(eps), 1 / eps - euler + (euler ** 2 / 2 + Math.PI ** 2 / 12) * eps, { rel: 1e-14 }, 'Laurent series of Γ about 0; Euler–Mascheroni γ', { eps });
  });

  it('when Γ is evaluated below ½, then Γ(0.25) = 3.6256099082 and Γ(0.1) = 9.5135076987, and Γ(x + 1) = x·Γ(x) holds across ½ (from memory; property)', () => {
    checkClose(gamma(0.25), 3.625609908221908, { rel: 1e-12 }, 'Γ(1/4), from memory', {});
    checkClose(gamma(0.1), 9.513507698668732, { rel: 1e-12 }, 'Γ(0.1), from memory', {});
    for (const x of [0.1, 0.3, 0.49]) checkClose(gamma(x + 1), x * gamma(x), { rel: 1e-13 }, 'property: Γ(x + 1) = x·Γ(x)', { x });
  });

  it('when cycles are summed, then D = Σ n·Sᵏ/C (Palmgren–Miner with Basquin)', () => {
    const d = minerDamage([{ range: 100, count: 1 }, { range: 200, count: 0.5 }], { k: 3, C: 1e12 });
    checkClose(d, (1e6 + 0.5 * 8e6) / 1e12, { rel: 1e-15 }, 'Palmgren–Miner, analytic', {});
  });

  it('when k is not positive, then the error names k', () => {
    const msg = errorOf(() => minerDamage([], { k: 0, C: 1 }));
    checkThat(msg.startsWith('physics: k'), 'house rule', `message "${msg}"`);
  });

  it('when Γ is evaluated, then Γ(1) = 1, Γ(5) = 24, Γ(10) = 9!, Γ(½) = √π, Γ(2.5) = 0.75√π, Γ(3.5) = 15√π/8 (analytic)', () => {
    checkClose(gamma(1), 1, { rel: 1e-13 }, 'analytic', {});
    checkClose(gamma(5), 24, { rel: 1e-13 }, 'analytic', {});
    checkClose(gamma(10), 362880, { rel: 1e-12 }, 'analytic: 9!', {});
    checkClose(gamma(0.5), Math.sqrt(Math.PI), { rel: 1e-13 }, 'analytic', {});
    checkClose(gamma(2.5), 0.75 * Math.sqrt(Math.PI), { rel: 1e-13 }, 'analytic', {});
    checkClose(gamma(3.5), (15 * Math.sqrt(Math.PI)) / 8, { rel: 1e-12 }, 'analytic', {});
  });
});

describe('spectral fatigue (Dirlik, narrow band)', () => {
  it('when two points are integrated, then m0, m1, m2, m4 are the trapezoids of G, f·G, f²·G, f⁴·G (computed)', () => {
    const m = spectralMoments([9, 11], [1, 3]);
    checkClose(m.m0, 4, { rel: 1e-15 }, 'computed: ½·2·(1 + 3)', {});
    checkClose(m.m1, 9 + 33, { rel: 1e-15 }, 'computed: ½·2·(9 + 33)', {});
    checkClose(m.m2, 81 + 363, { rel: 1e-15 }, 'computed: ½·2·(81 + 363)', {});
    checkClose(m.m4, 6561 + 3 * 14641, { rel: 1e-15 }, 'computed: ½·2·(6561 + 43923)', {});
  });

  it('when the grid is short, mismatched or not increasing, or a PSD value is negative, then the error names it', () => {
    checkThat(errorOf(() => spectralMoments([1], [1])).startsWith('physics: psd [unit²/Hz] needs the same length'), 'house rule', '');
    checkThat(errorOf(() => spectralMoments([1, 2, 3], [1, 1])).startsWith('physics: psd [unit²/Hz] needs the same length'), 'house rule', errorOf(() => spectralMoments([1, 2, 3], [1, 1])));
    checkThat(errorOf(() => spectralMoments([1, 2, 2], [1, 1, 1])).startsWith('physics: freqsHz[2] [Hz] must be strictly increasing'), 'house rule', '');
    checkThat(errorOf(() => spectralMoments([1, -2], [1, 1])).startsWith('physics: freqsHz[1] [Hz]'), 'house rule', '');
    checkThat(errorOf(() => spectralMoments([1, 2], [1, -1])).startsWith('physics: psd[1] [unit²/Hz]'), 'house rule', '');
    checkClose(spectralMoments([0, 1], [0, 2]).m0, 1, { rel: 1e-15 }, 'computed: 0 Hz and a zero PSD value are allowed', {});
  });

  it('when a PSD is scaled in level or stretched in frequency, then γ, xm, D1, D2, D3, Q, R stay and the peak rate scales with the frequency (property: Dirlik parameters are dimensionless)', () => {
    const { f, g } = twoPeaks(400, (i) => 0.5 + i * 0.05, { at: 2, width: 0.5 }, { height: 0.3, at: 12, width: 2 });
    const base = dirlikParams(spectralMoments(f, g));
    const level = dirlikParams(spectralMoments(f, g.map((v) => 7 * v)));
    const stretched = dirlikParams(spectralMoments(f.map((v) => 3 * v), g.map((v) => v / 3)));
    for (const key of ['gamma', 'xm', 'D1', 'D2', 'D3', 'Q', 'R'] as const) {
      checkClose(level[key], base[key], { rel: 1e-9 }, 'property: level', { key });
      checkClose(stretched[key], base[key], { rel: 1e-9 }, 'property: frequency', { key });
    }
    checkClose(level.peakRateHz, base.peakRateHz, { rel: 1e-12 }, 'property: level', {});
    checkClose(stretched.peakRateHz, 3 * base.peakRateHz, { rel: 1e-12 }, 'property: frequency', {});
    checkClose(base.D1 + base.D2 + base.D3, 1, { rel: 1e-12 }, 'Dirlik 1985: the weights sum to 1', {});
    checkThat(base.gamma > 0 && base.gamma < 1 && base.xm > 0 && base.xm < 1, 'Dirlik 1985: 0 < γ, xm < 1', JSON.stringify(base));
  });

  it('when the Dirlik damage is computed for k = 2, then it is ν_p·T/C·E[S²] with the density\'s second moment (computed numerically)', () => {
    const { f, g } = twoPeaks(800, (i) => 0.1 + i * 0.025, { at: 1.5, width: 0.4 }, { height: 0.5, at: 15, width: 1 });
    const m = spectralMoments(f, g);
    const p = dirlikParams(m);
    const sMax = 30 * Math.sqrt(m.m0);
    const n = 20000;
    const h = sMax / n;
    let mom = 0;
    for (let i = 0; i <= n; i++) {
      const w = i === 0 || i === n ? 1 : i % 2 ? 4 : 2;
      const s = i * h;
      mom += w * dirlikDensityWith(p, m.m0, s) * s * s;
    }
    mom *= h / 3;
    checkClose(dirlikDamage(m, { k: 2, C: 4, durationS: 10 }), (p.peakRateHz * 10 * mom) / 4, { rel: 1e-6 }, 'computed: Simpson moment of the density', { gamma: p.gamma });
    checkClose(p.peakRateHz, Math.sqrt(m.m4 / m.m2), { rel: 1e-15 }, 'definition: rate of peaks √(m4/m2)', {});
  });

  it('when a narrow-band process has m0 = 1, m2 = 100, then D = ν0·T·E[Sᵏ]/C with Rayleigh amplitudes: E[S²] = 8·m0, E[S⁴] = 128·m0² (computed: E[A²] = 2σ², E[A⁴] = 8σ⁴)', () => {
    const m = { m0: 1, m1: 10, m2: 100, m4: 10000 };
    checkClose(narrowBandDamage(m, { k: 2, C: 1, durationS: 1 }), 10 * 8, { rel: 1e-13 }, 'computed: Rayleigh second moment', {});
    checkClose(narrowBandDamage(m, { k: 4, C: 2, durationS: 3 }), (10 * 3 * 128) / 2, { rel: 1e-13 }, 'computed: Rayleigh fourth moment', {});
    const m2 = { m0: 4, m1: 10, m2: 100, m4: 10000 };
    checkClose(narrowBandDamage(m2, { k: 2, C: 1, durationS: 1 }), 5 * 8 * 4, { rel: 1e-13 }, 'computed: ν0 = √(m2/m0) = 5', {});
  });

  it('when a moment is zero, a duration negative, a range negative or the spectrum a pure tone, then the error names it', () => {
    const m = { m0: 1, m1: 10, m2: 100, m4: 10000 };
    checkThat(errorOf(() => narrowBandDamage({ ...m, m0: 0 }, { k: 2, C: 1, durationS: 1 })).startsWith('physics: m0 [unit²]'), 'house rule', '');
    checkThat(errorOf(() => narrowBandDamage({ ...m, m2: 0 }, { k: 2, C: 1, durationS: 1 })).startsWith('physics: m2 [unit²·Hz²]'), 'house rule', '');
    checkThat(errorOf(() => narrowBandDamage(m, { k: 2, C: 1, durationS: -1 })).startsWith('physics: durationS [s]'), 'house rule', '');
    checkThat(errorOf(() => dirlikDamage(m, { k: 2, C: 1, durationS: -1 })).startsWith('physics: durationS [s]'), 'house rule', '');
    checkThat(errorOf(() => dirlikDamage(m, { k: 0, C: 1, durationS: 1 })).startsWith('physics: k'), 'house rule', '');
    checkThat(errorOf(() => dirlikParams({ ...m, m4: 0 })).startsWith('physics: m4 [unit²·Hzⁱ]'), 'house rule', '');
    checkClose(narrowBandDamage(m, { k: 2, C: 1, durationS: 0 }), 0, { abs: 0 }, 'definition: no time, no damage', {});
    // a pure tone at 10 Hz: γ = 1, Dirlik's R is 0/0
    checkThat(/Dirlik parameter/.test(errorOf(() => dirlikParams(m))), 'Dirlik 1985: degenerate for γ = 1', errorOf(() => dirlikParams(m)));
    const { f, g } = bandSpectrum(10, 2, 11);
    const broad = spectralMoments(f, g);
    checkThat(errorOf(() => dirlikDensity(broad, -1)).startsWith('physics: rangeS [unit]'), 'house rule', '');
    checkClose(dirlikDamage(broad, { k: 2, C: 1, durationS: 0 }), 0, { abs: 0 }, 'definition: no time, no damage', {});
  });

  it('when a flat band is integrated, then the moments are analytic (computed)', () => {
    const { f, g } = bandSpectrum(10, 2);
    const m = spectralMoments(f, g);
    checkClose(m.m0, 2e-4, { rel: 1e-12 }, 'analytic ∫ over 9–11 Hz', {});
    checkClose(m.m2, (1e-4 * (11 ** 3 - 9 ** 3)) / 3, { rel: 1e-6 }, 'analytic', {});
  });

  it('when the Dirlik density of a broad two-peak spectrum is integrated, then it integrates to 1 and its k-th moment matches the closed form (computed, docs/methods.md "Duty, cycles and fatigue")', () => {
    const { f, g } = twoPeaks(4000, (i) => 0.05 + (i * 20) / 4000, { at: 1.2, width: 0.3 }, { height: 0.2, at: 11, width: 1.5 });
    const m = spectralMoments(f, g);
    const p = dirlikParams(m);
    checkThat(p.gamma < 0.8, 'computed', `broad-band spectrum expected, γ = ${p.gamma}`);
    const sMax = 30 * Math.sqrt(m.m0);
    const n = 200000;
    const h = sMax / n;
    let area = 0;
    let mom = 0;
    for (let i = 0; i <= n; i++) {
      const s = i * h;
      const w = i === 0 || i === n ? 1 : i % 2 ? 4 : 2;
      const d = dirlikDensity(m, s);
      area += w * d;
      mom += w * d * s ** 3;
    }
    area *= h / 3;
    mom *= h / 3;
    checkClose(area, 1, { abs: 1e-6 }, 'Dirlik 1985: density integrates to 1 (docs/methods.md "Duty, cycles and fatigue")', { gamma: p.gamma });
    const damage = dirlikDamage(m, { k: 3, C: 1, durationS: 1 });
    checkClose(damage, p.peakRateHz * mom, { rel: 1e-6 }, 'computed: closed-form moment vs numerical', { k: 3 });
  });

  it('when the spectrum is narrow, then Dirlik damage tends to the narrow-band (Rayleigh) result (docs/methods.md "Duty, cycles and fatigue")', () => {
    let prevGap = Infinity;
    for (const width of [2, 0.5, 0.1]) {
      const { f, g } = bandSpectrum(10, width);
      const m = spectralMoments(f, g);
      for (const k of [3, 5]) {
        const ratio = dirlikDamage(m, { k, C: 1, durationS: 100 }) / narrowBandDamage(m, { k, C: 1, durationS: 100 });
        checkClose(ratio, 1, { abs: 0.01 }, 'Dirlik → narrow band (docs/methods.md "Duty, cycles and fatigue")', { width, k });
      }
      const gap = Math.abs(dirlikDamage(m, { k: 3, C: 1, durationS: 1 }) / narrowBandDamage(m, { k: 3, C: 1, durationS: 1 }) - 1);
      checkThat(gap < prevGap, 'property: converges as the band narrows', `gap ${gap} not below ${prevGap} at width ${width}`);
      prevGap = gap;
    }
  });

  it('when a corner runs a synthesised road, then Dirlik damage of the travel PSD matches time-domain rainflow within 10 % (computed, docs/methods.md "Duty, cycles and fatigue")', () => {
    const v = 60 / 3.6;
    const gd = 256e-6;
    const dx = 0.05;
    const z = synthesizeProfile({ gdN0: gd, lengthM: 20000, dxM: dx, seed: 8 });
    const sim = simulateProfile(CAR, z, dx, v, { series: true });
    const warm = 2000;
    const travel = sim.series!.suspensionTravel.subarray(warm);
    const durationS = (travel.length - 1) * sim.dtS;
    const sn = { k: 3, C: 1e-3 };
    const td = minerDamage(rainflow(travel), sn) / durationS;
    const f: number[] = [];
    const g: number[] = [];
    for (let i = 0; i <= 20000; i++) {
      const x = 0.01 + i * 0.0025; // up to 50 Hz
      f.push(x);
      const h = cornerTransfer(CAR, x).suspensionTravel;
      g.push((h[0] ** 2 + h[1] ** 2) * ((gd * ISO8608_N0 ** 2 * v) / (x * x)));
    }
    const m = spectralMoments(f, g);
    const dk = dirlikDamage(m, { ...sn, durationS: 1 });
    checkClose(dk, td, { rel: 0.1 }, 'computed: Dirlik vs rainflow of simulated travel', { gd, v, k: sn.k, gamma: dirlikParams(m).gamma });
  });
});
