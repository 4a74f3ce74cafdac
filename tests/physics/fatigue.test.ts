import { describe, it } from 'vitest';
import {
  rainflow, reversals, minerDamage, spectralMoments, dirlikDamage, narrowBandDamage, dirlikDensity, dirlikParams, gamma,
} from '../../server/physics/fatigue';
import { simulateProfile } from '../../server/physics/simulate';
import { synthesizeProfile, ISO8608_N0 } from '../../server/physics/iso8608';
import { cornerTransfer } from '../../server/physics/quarter-car';
import { checkClose, checkThat, CAR } from './check';

const bandSpectrum = (centre: number, width: number, points = 2001): { f: number[]; g: number[] } => {
  const f: number[] = [];
  const g: number[] = [];
  for (let i = 0; i < points; i++) {
    f.push(centre - width / 2 + (width * i) / (points - 1));
    g.push(1e-4);
  }
  return { f, g };
};

describe('rainflow (ASTM E1049)', () => {
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

describe('Miner and Basquin', () => {
  it('when cycles are summed, then D = Σ n·Sᵏ/C (Palmgren–Miner with Basquin)', () => {
    const d = minerDamage([{ range: 100, count: 1 }, { range: 200, count: 0.5 }], { k: 3, C: 1e12 });
    checkClose(d, (1e6 + 0.5 * 8e6) / 1e12, { rel: 1e-15 }, 'Palmgren–Miner, analytic', {});
  });

  it('when k is not positive, then the error names k', () => {
    let msg = '';
    try {
      minerDamage([], { k: 0, C: 1 });
    } catch (e) {
      msg = (e as Error).message;
    }
    checkThat(msg.startsWith('physics: k'), 'house rule', `message "${msg}"`);
  });

  it('when Γ is evaluated, then Γ(5) = 24, Γ(½) = √π, Γ(2.5) = 0.75√π (analytic)', () => {
    checkClose(gamma(5), 24, { rel: 1e-13 }, 'analytic', {});
    checkClose(gamma(0.5), Math.sqrt(Math.PI), { rel: 1e-13 }, 'analytic', {});
    checkClose(gamma(2.5), 0.75 * Math.sqrt(Math.PI), { rel: 1e-13 }, 'analytic', {});
  });
});

describe('spectral fatigue (Dirlik, narrow band)', () => {
  it('when a flat band is integrated, then the moments are analytic (computed)', () => {
    const { f, g } = bandSpectrum(10, 2);
    const m = spectralMoments(f, g);
    checkClose(m.m0, 2e-4, { rel: 1e-12 }, 'analytic ∫ over 9–11 Hz', {});
    checkClose(m.m2, (1e-4 * (11 ** 3 - 9 ** 3)) / 3, { rel: 1e-6 }, 'analytic', {});
  });

  it('when the Dirlik density of a broad two-peak spectrum is integrated, then it integrates to 1 and its k-th moment matches the closed form (computed, docs/methods.md "Duty, cycles and fatigue")', () => {
    const f: number[] = [];
    const g: number[] = [];
    for (let i = 0; i <= 4000; i++) {
      const x = 0.05 + (i * 20) / 4000;
      f.push(x);
      g.push(1 / (1 + ((x - 1.2) / 0.3) ** 2) + 0.2 / (1 + ((x - 11) / 1.5) ** 2));
    }
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
