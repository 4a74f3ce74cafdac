import { describe, it } from 'vitest';
import {
  wkWeight, wkStateSpace, weightedRms, dailyA8, exposureStatus, appendWk, EXPOSURE_ACTION_VALUE, EXPOSURE_LIMIT_VALUE,
} from '../../server/physics/exposure';
import { solveLinear } from '../../server/physics/linalg';
import { checkClose, checkThat, errorOf } from './check';

/** |C·(jωI − A)⁻¹·B| of a strictly proper state-space system, by a real 2n×2n solve (computed). */
const gainAt = (A: Float64Array, B: Float64Array, C: Float64Array, n: number, fHz: number): number => {
  const w = 2 * Math.PI * fHz;
  const N = 2 * n;
  const m = new Float64Array(N * N);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      m[i * N + j] = -A[i * n + j];
      m[(i + n) * N + j + n] = -A[i * n + j];
    }
    m[i * N + i + n] = -w;
    m[(i + n) * N + i] = w;
  }
  const x = solveLinear(m, Float64Array.from([...B, ...new Array<number>(n).fill(0)]), N);
  let re = 0;
  let im = 0;
  for (let i = 0; i < n; i++) {
    re += C[i] * x[i];
    im += C[i] * x[i + n];
  }
  return Math.hypot(re, im);
};

describe('ISO 2631-1 Wk weighting', () => {
  it('when evaluated at the nominal band frequencies, then it reproduces ISO 2631-1:1997 Table 3 (Wk ×1000)', () => {
    const table: [number, number][] = [
      [0.5, 418], [1, 482], [2, 531], [4, 967], [5, 1039], [6.3, 1054], [8, 1036], [10, 988], [16, 768], [20, 636], [31.5, 405],
    ];
    // table values are rounded to the last digit; our filter parameters are from memory (docs/methods.md "Whole-body vibration"):
    // allow 1 unit of the last digit (16 Hz computes 768.7)
    for (const [f, w] of table) checkClose(wkWeight(f) * 1000, w, { abs: 1.0 }, 'ISO 2631-1:1997 Table 3', { fHz: f });
  });

  it('when evaluated over the whole table from 0.1 to 315 Hz, then it reproduces ISO 2631-1:1997 Table 3 within the rounding of its three digits (Wk ×1000, table values from memory)', () => {
    // ISO 2631-1:1997 Table 3, Wk ×1000 (from memory; the middle band is also in the test above)
    const table: [number, number][] = [
      [0.1, 31.2], [0.125, 48.6], [0.16, 79.0], [0.2, 121], [0.25, 182], [0.315, 263], [0.4, 352], [0.63, 459], [0.8, 477],
      [1.25, 484], [1.6, 494], [2.5, 631], [3.15, 804], [12.5, 902], [25, 513], [40, 314], [50, 246], [63, 186], [80, 132],
      [100, 88.7], [125, 54.0], [160, 28.5], [200, 15.2], [250, 7.9], [315, 4.0],
    ];
    for (const [f, w] of table) checkClose(wkWeight(f) * 1000, w, { rel: 0.005 }, 'ISO 2631-1:1997 Table 3, from memory', { fHz: f });
    checkClose(wkWeight(0), 0, { abs: 0 }, 'ISO 2631-1 Annex A: the 0.4 Hz high-pass passes no steady acceleration', {});
  });

  it('when the Wk filter is appended to a system whose output is the body acceleration, then the weighted output\'s gain is the system\'s gain times |Wk| (computed: series connection)', () => {
    // x1' = x2, x2' = −ω0²·x1 − 2ζω0·x2 + u, body acceleration a = ω0²·x1: |H(jω)| = ω0²/|ω0² − ω² + j·2ζω0ω|
    const w0 = 2 * Math.PI * 1.3;
    const zeta = 0.3;
    const a = new Float64Array([0, 1, -w0 * w0, -2 * zeta * w0]);
    const b = new Float64Array([0, 1]);
    const out = new Float64Array([w0 * w0, 0]);
    const aug = appendWk(a, b, 2, out);
    checkClose(aug.n, 10, { abs: 0 }, 'definition: order 2 + 8', {});
    for (const f of [0.3, 1.3, 4, 12.5, 60]) {
      const w = 2 * Math.PI * f;
      const h = (w0 * w0) / Math.hypot(w0 * w0 - w * w, 2 * zeta * w0 * w);
      checkClose(gainAt(aug.A, aug.B, aug.weighted, aug.n, f), h * wkWeight(f), { rel: 1e-9 }, 'computed: |H·Wk| = |H|·|Wk|', { fHz: f });
      checkClose(gainAt(aug.A, aug.B, Float64Array.from([...out, ...new Array<number>(8).fill(0)]), aug.n, f), h, { rel: 1e-9 }, 'computed: the system itself is unchanged', { fHz: f });
    }
  });

  it('when the state-space realisation is evaluated, then C(jωI − A)⁻¹B + D equals the transfer-function magnitude (computed)', () => {
    const ss = wkStateSpace();
    const n = ss.n;
    for (const f of [0.2, 1, 5, 12.5, 40, 150]) {
      const w = 2 * Math.PI * f;
      const m = new Float64Array(4 * n * n);
      const N = 2 * n;
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          m[i * N + j] = -ss.A[i * n + j];
          m[(i + n) * N + j + n] = -ss.A[i * n + j];
        }
        m[i * N + i + n] = -w;
        m[(i + n) * N + i] = w;
      }
      const x = solveLinear(m, Float64Array.from([...ss.B, ...new Array(n).fill(0)]), N);
      let re = ss.D;
      let im = 0;
      for (let i = 0; i < n; i++) {
        re += ss.C[i] * x[i];
        im += ss.C[i] * x[i + n];
      }
      checkClose(Math.hypot(re, im), wkWeight(f), { rel: 1e-9 }, 'computed: realisation = transfer function', { fHz: f });
    }
  });

  it('when a sinusoid sampled at 1 kHz is weighted, then a_w = |Wk(f)|·A/√2 (computed)', () => {
    for (const f of [1, 4, 8, 16]) {
      const fs = 1000;
      const s = Float64Array.from({ length: 40 * fs }, (_, i) => 2 * Math.sin((2 * Math.PI * f * i) / fs));
      const aw = weightedRms(s, fs, 10);
      checkClose(aw, (wkWeight(f) * 2) / Math.SQRT2, { rel: 0.005 }, 'computed: steady-state gain, ZOH error (πf/fs)²/6', { fHz: f, fs, amplitude: 2 });
    }
  });
});

describe('weightedRms settling and input', () => {
  const fs = 100;
  const pulseAt = (len: number, at: number): Float64Array => {
    const s = new Float64Array(len);
    s[at] = 1;
    return s;
  };

  it('when the input starts only at the end of the settling time, then the RMS is that of the whole record rescaled by its length (definition: RMS over the samples after settleS; causality)', () => {
    const len = 1000;
    const settleS = 3;
    const skip = settleS * fs;
    const s = pulseAt(len, skip - 1);
    const whole = weightedRms(s, fs, 0);
    const settled = weightedRms(s, fs, settleS);
    checkThat(whole > 0, 'definition', `RMS ${whole}`);
    checkClose(settled * settled * (len - skip), whole * whole * len, { rel: 1e-12 }, 'definition: same sum of squares, fewer samples', { len, skip });
  });

  it('when settleS is left out, then 2 s are discarded; when it exceeds half the record, then half is (docs of weightedRms)', () => {
    const s = Float64Array.from({ length: 900 }, (_, i) => Math.sin((2 * Math.PI * 3 * i) / fs) + (i === 50 ? 5 : 0));
    checkThat(weightedRms(s, fs) === weightedRms(s, fs, 2), 'definition: default settleS 2 s', `${weightedRms(s, fs)} vs ${weightedRms(s, fs, 2)}`);
    checkThat(weightedRms(s, fs) !== weightedRms(s, fs, 0), 'definition: settling changes the figure here', '');
    checkThat(weightedRms(s, fs, 1e6) === weightedRms(s, fs, 4.5), 'definition: at most half the record', `${weightedRms(s, fs, 1e6)} vs ${weightedRms(s, fs, 4.5)}`);
  });

  it('when the series has fewer than 2 samples or a non-finite value, then the error names the series', () => {
    checkThat(errorOf(() => weightedRms([1], fs)).startsWith('physics: series'), 'house rule', errorOf(() => weightedRms([1], fs)));
    checkThat(weightedRms([0, 0], fs, 0) === 0, 'definition: two samples are enough', '');
    checkThat(/weightedRms/.test(errorOf(() => weightedRms([0, NaN, 0, 0], fs, 0))), 'house rule', errorOf(() => weightedRms([0, NaN, 0, 0], fs, 0)));
    checkThat(errorOf(() => weightedRms([0, 0, 0], 9, 0)).startsWith('physics: sampleRateHz'), 'house rule: 10 Hz – 100 kHz', '');
    checkThat(errorOf(() => weightedRms([0, 0, 0], fs, -1)).startsWith('physics: settleS'), 'house rule', '');
  });
});

describe('Directive 2002/44/EC exposure', () => {
  it('when the exposure time doubles at the same a_w, then A(8) grows by √2, and 8 h at a_w gives a_w (property: A(8) = a_w·√(T/8 h))', () => {
    for (const aw of [0.3, 0.9]) {
      checkClose(dailyA8([{ weightedAccel: aw, hours: 3 }, { weightedAccel: aw, hours: 3 }]), Math.SQRT2 * dailyA8([{ weightedAccel: aw, hours: 3 }]), { rel: 1e-15 }, 'property: doubling T multiplies A(8) by √2', { aw });
      checkClose(dailyA8([{ weightedAccel: aw, hours: 8 }]), aw, { rel: 1e-15 }, 'property: A(8) of 8 h at a_w is a_w', { aw });
    }
  });

  it('when a value is refused, then the error gives its name and unit; zero exposure, zero a_w and 10 Hz sampling are accepted (house rule; bounds of the inputs)', () => {
    const cases: [() => unknown, string][] = [
      [() => wkWeight(-1), 'physics: fHz [Hz]'],
      [() => weightedRms([0, 0, 0], 9, 0), 'physics: sampleRateHz [Hz]'],
      [() => weightedRms([0, 0, 0], 100, -1), 'physics: settleS [s]'],
      [() => weightedRms([1], 100), 'physics: series [m/s²] needs at least 2 samples'],
      [() => dailyA8(null as unknown as []), 'physics: trips [-] must be an array'],
      [() => dailyA8([{ weightedAccel: -1, hours: 1 }]), 'physics: trips[0].weightedAccel [m/s²]'],
      [() => exposureStatus(-1), 'physics: a8 [m/s²]'],
    ];
    for (const [f, start] of cases) checkThat(errorOf(f).startsWith(start), 'house rule', `"${errorOf(f)}" should start with "${start}"`);
    checkClose(dailyA8([{ weightedAccel: 0, hours: 0 }, { weightedAccel: 0.5, hours: 8 }]), 0.5, { rel: 1e-15 }, 'property: a zero trip adds nothing', {});
    checkClose(weightedRms(new Float64Array(40), 10, 0), 0, { abs: 0 }, 'definition: no input, no output; 10 Hz is the lowest rate', {});
  });

  it('when the trips are not an array or a value is out of range, then the error names it', () => {
    checkThat(errorOf(() => dailyA8(null as unknown as [])).startsWith('physics: trips'), 'house rule', '');
    checkThat(errorOf(() => dailyA8([{ weightedAccel: 101, hours: 1 }])).startsWith('physics: trips[0].weightedAccel'), 'house rule', '');
    checkThat(errorOf(() => dailyA8([{ weightedAccel: 0.5, hours: 1 }, { weightedAccel: 0.5, hours: 25 }])).startsWith('physics: trips[1].hours'), 'house rule', '');
    checkThat(errorOf(() => dailyA8([null as unknown as { weightedAccel: number; hours: number }])).startsWith('physics: trips[0].weightedAccel'), 'house rule', '');
    checkThat(errorOf(() => exposureStatus(-0.1)).startsWith('physics: a8'), 'house rule', '');
    checkThat(exposureStatus(0) === 'within-action-value' && exposureStatus(1.16) === 'exceeds-limit-value', 'Directive 2002/44/EC Art. 3', '');
  });

  it('when the constants are read, then action 0.5 m/s² and limit 1.15 m/s² (Directive 2002/44/EC Art. 3(2))', () => {
    checkClose(EXPOSURE_ACTION_VALUE, 0.5, { abs: 0 }, 'Directive 2002/44/EC Art. 3(2)(b)', {});
    checkClose(EXPOSURE_LIMIT_VALUE, 1.15, { abs: 0 }, 'Directive 2002/44/EC Art. 3(2)(a)', {});
  });

  it('when several trips are combined, then A(8) = √(Σ a²T / 8 h) (Directive 2002/44/EC Annex B, docs/methods.md "Whole-body vibration")', () => {
    checkClose(dailyA8([{ weightedAccel: 0.8, hours: 8 }]), 0.8, { rel: 1e-15 }, 'Directive 2002/44/EC Annex B', {});
    checkClose(dailyA8([{ weightedAccel: 1.0, hours: 2 }]), 0.5, { rel: 1e-15 }, 'Directive 2002/44/EC Annex B: √(2/8)', {});
    const trips = [{ weightedAccel: 0.6, hours: 2 }, { weightedAccel: 0.4, hours: 4 }];
    checkClose(dailyA8(trips), Math.sqrt((0.36 * 2 + 0.16 * 4) / 8), { rel: 1e-15 }, 'Directive 2002/44/EC Annex B', { trips });
    checkClose(dailyA8([]), 0, { abs: 0 }, 'definition: no exposure', {});
  });

  it('when A(8) is compared, then values at a threshold do not exceed it (Directive 2002/44/EC Art. 3)', () => {
    const cases: [number, string][] = [[0.3, 'within-action-value'], [0.5, 'within-action-value'], [0.51, 'exceeds-action-value'], [1.15, 'exceeds-action-value'], [1.2, 'exceeds-limit-value']];
    for (const [a8, s] of cases) checkThat(exposureStatus(a8) === s, 'Directive 2002/44/EC Art. 3', `a8 ${a8} → ${exposureStatus(a8)}, expected ${s}`);
  });

  it('when a trip has negative hours, then the error names trips[0].hours and h', () => {
    const msg = errorOf(() => dailyA8([{ weightedAccel: 0.5, hours: -1 }]));
    checkThat(msg.includes('trips[0].hours') && msg.includes('[h]'), 'house rule', `message "${msg}"`);
  });
});
