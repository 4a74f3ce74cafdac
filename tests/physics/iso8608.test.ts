import { describe, it } from 'vitest';
import { ISO8608_CLASSES, gdForClass, classifyGd, synthesizeProfile, classBounds, seededRandom } from '../../server/physics/iso8608';
import { checkClose, checkThat, errorOf } from './check';

/**
 * mulberry32 in 32-bit unsigned arithmetic done with BigInt, written from the C reference
 * (T. Ettinger, public domain; from memory): z = (state += 0x6D2B79F5); z = (z ^ z >> 15) * (z | 1);
 * z ^= z + (z ^ z >> 7) * (z | 61); return z ^ z >> 14.
 */
const mulberry32Reference = (seed: number): (() => number) => {
  const M = (1n << 32n) - 1n;
  let state = BigInt(seed >>> 0);
  return () => {
    state = (state + 0x6d2b79f5n) & M;
    let z = state;
    z = ((z ^ (z >> 15n)) * (z | 1n)) & M;
    z = (z ^ ((z + (((z ^ (z >> 7n)) * (z | 61n)) & M)) & M)) & M;
    return Number(z ^ (z >> 14n)) / 2 ** 32;
  };
};

/** Σ amp_k²/2 over the harmonics k·dn in [nMin, nMax], amp_k² = 2·Gd(n0)·(n_k/n0)^−w·dn: the mean square over one period (Parseval, computed). */
const harmonicPower = (gd: number, w: number, dn: number, size: number, nMin = 0, nMax = Infinity): number => {
  let p = 0;
  for (let k = 1; k < size / 2; k++) {
    const n = k * dn;
    if (n >= nMin && n <= nMax) p += gd * (n / 0.1) ** -w * dn; // n0 = 0.1 cycles/m (ISO 8608)
  }
  return p;
};

describe('ISO 8608 classes', () => {
  // ISO 8608 class table, Gd(n0) in 1e-6 m³ (docs/methods.md "Road roughness")
  const table: [string, number | null, number, number | null][] = [
    ['A', null, 16, 32], ['B', 32, 64, 128], ['C', 128, 256, 512], ['D', 512, 1024, 2048],
    ['E', 2048, 4096, 8192], ['F', 8192, 16384, 32768], ['G', 32768, 65536, 131072], ['H', 131072, 262144, null],
  ];
  it('when the class table is read, then lower/mean/upper match ISO 8608 (docs/methods.md "Road roughness")', () => {
    checkClose(ISO8608_CLASSES.length, 8, { abs: 0 }, 'ISO 8608', {});
    for (const [cls, lo, mean, hi] of table) {
      checkClose(gdForClass(cls), mean * 1e-6, { rel: 1e-15 }, 'ISO 8608 class table', { cls });
      const b = classBounds(cls);
      if (lo !== null) checkClose(b.lower, lo * 1e-6, { rel: 1e-15 }, 'ISO 8608 class table', { cls, bound: 'lower' });
      if (hi !== null) checkClose(b.upper, hi * 1e-6, { rel: 1e-15 }, 'ISO 8608 class table', { cls, bound: 'upper' });
    }
  });

  it('when a Gd(n0) is classified, then the class interval contains it (ISO 8608 bounds)', () => {
    for (const [cls, lo, mean, hi] of table) {
      checkThat(classifyGd(mean * 1e-6) === cls, 'ISO 8608', `mean of ${cls} → ${classifyGd(mean * 1e-6)}`);
      if (lo !== null) checkThat(classifyGd(lo * 1e-6 * 1.0001) === cls, 'ISO 8608', `just above lower of ${cls}`);
      if (hi !== null) checkThat(classifyGd(hi * 1e-6 * 0.9999) === cls, 'ISO 8608', `just below upper of ${cls}`);
    }
  });

  it('when the open ends of the table are read, then A starts at 0 and H has no upper bound (ISO 8608: A < 32, H > 131 072 ×10⁻⁶ m³)', () => {
    const a = classBounds('A');
    const h = classBounds('H');
    checkThat(a.lower === 0 && a.cls === 'A', 'ISO 8608 class table', JSON.stringify(a));
    checkThat(h.upper === Infinity && h.lower === 131072e-6 && h.cls === 'H', 'ISO 8608 class table', JSON.stringify(h));
    checkThat(classifyGd(1) === 'H' && classifyGd(1e-12) === 'A', 'ISO 8608: everything above 131 072 ×10⁻⁶ m³ is H, everything below 32 ×10⁻⁶ m³ is A', '');
  });

  it('when a Gd(n0) lies exactly on a class bound, then it belongs to the rougher class (docs/methods.md "Road roughness")', () => {
    for (let k = 1; k < table.length; k++) {
      const [cls, lo] = table[k];
      checkThat(classifyGd((lo as number) * 1e-6) === cls, 'ISO 8608 bounds, [lower, upper)', `${lo}e-6 → ${classifyGd((lo as number) * 1e-6)}, expected ${cls}`);
    }
  });

  it('when a class letter is given in lower case or with spaces, then it is read as the letter (definition)', () => {
    checkClose(gdForClass(' c '), 256e-6, { rel: 1e-15 }, 'ISO 8608 class C mean', {});
    checkThat(classBounds('b ').cls === 'B', 'definition', classBounds('b ').cls);
    checkThat(errorOf(() => gdForClass(3 as unknown as string)).startsWith('physics: cls'), 'house rule: not a letter', '');
    checkThat(errorOf(() => classBounds('I')).startsWith('physics: cls'), 'house rule', '');
  });

  it('when Gd(n0) is not positive or above 1 m³, then classifying it names gdN0', () => {
    for (const v of [0, -1e-6, 1.5]) checkThat(errorOf(() => classifyGd(v)).startsWith('physics: gdN0'), 'house rule', `value ${v}`);
  });

  it('when a class letter is unknown, then the error names cls', () => {
    const msg = errorOf(() => gdForClass('Z'));
    checkThat(msg.startsWith('physics: cls'), 'house rule', `message "${msg}"`);
  });
});

describe('seededRandom', () => {
  it('when seeded, then it returns the mulberry32 sequence of the C reference (computed with BigInt from T. Ettinger\'s mulberry32, from memory)', () => {
    for (const seed of [1, 0, 123456789, -7, 2 ** 32 + 5]) {
      const a = seededRandom(seed);
      const b = mulberry32Reference(seed);
      for (let i = 0; i < 50; i++) {
        const [x, y] = [a(), b()];
        checkThat(x === y, 'mulberry32 C reference', `seed ${seed}, draw ${i}: ${x} vs ${y}`);
      }
    }
    checkClose(seededRandom(1)(), 0.6270739405881613, { abs: 0 }, 'mulberry32, seed 1 (docs of seededRandom)', {});
  });

  it('when 20 000 numbers are drawn, then they lie in [0, 1) with mean ½ and variance 1/12 (uniform law, 5 standard errors)', () => {
    const r = seededRandom(42);
    const n = 20000;
    let s = 0;
    let s2 = 0;
    let lo = 1;
    let hi = 0;
    for (let i = 0; i < n; i++) {
      const x = r();
      s += x;
      s2 += x * x;
      lo = Math.min(lo, x);
      hi = Math.max(hi, x);
    }
    checkThat(lo >= 0 && hi < 1, 'definition: [0, 1)', `${lo} … ${hi}`);
    checkClose(s / n, 0.5, { abs: 5 * Math.sqrt(1 / 12 / n) }, 'uniform law: mean ½', { n });
    checkClose(s2 / n - (s / n) ** 2, 1 / 12, { abs: 5 * Math.sqrt(1 / 180 / n) }, 'uniform law: variance 1/12 (4th central moment 1/80)', { n });
  });
});

describe('synthesizeProfile', () => {
  it('when the profile spans exactly one period, then its mean square is Σ amp²/2 of the harmonics whatever the phases, and its mean is 0 (computed, Parseval)', () => {
    const dx = 0.25;
    const size = 1024;
    const dn = 1 / (size * dx);
    for (const [gd, w, seed] of [[64e-6, 2, 4], [1024e-6, 3, 5], [16e-6, 1.5, 6]]) {
      const z = synthesizeProfile({ gdN0: gd, lengthM: (size - 1) * dx, dxM: dx, seed, waviness: w });
      checkClose(z.length, size, { abs: 0 }, 'definition: round(L/dx) + 1 samples', {});
      let s = 0;
      let s2 = 0;
      for (const v of z) {
        s += v;
        s2 += v * v;
      }
      const exp = harmonicPower(gd, w, dn, size);
      checkClose(s2 / size, exp, { rel: 1e-9 }, 'computed: Parseval over one period, ISO 8608 PSD Gd(n0)·(n/n0)^−w', { gd, w });
      checkClose(s / size, 0, { abs: 1e-12 * Math.sqrt(exp) }, 'computed: no harmonic at n = 0', { gd, w });
    }
  });

  it('when a band of many harmonics is synthesised, then the elevations are Gaussian: 68.3 % within ±σ and 95.4 % within ±2σ (central limit theorem over independent random phases)', () => {
    const dx = 0.05;
    const size = 8192;
    const z = synthesizeProfile({ gdN0: 256e-6, lengthM: (size - 1) * dx, dxM: dx, seed: 13, nMinCyclesPerM: 0.5, nMaxCyclesPerM: 3 });
    const sigma = Math.sqrt(z.reduce((t, v) => t + v * v, 0) / size);
    const within = (m: number): number => z.filter((v) => Math.abs(v) < m * sigma).length / size;
    checkClose(within(1), 0.6827, { abs: 0.02 }, 'normal law: P(|Z| < 1)', { harmonics: Math.round((3 - 0.5) * size * dx) });
    checkClose(within(2), 0.9545, { abs: 0.01 }, 'normal law: P(|Z| < 2)', {});
  });

  it('when the band is limited to [10·Δn, 100·Δn], then both edge harmonics are kept (computed, Parseval)', () => {
    const dx = 0.25;
    const size = 1024;
    const dn = 1 / (size * dx);
    const z = synthesizeProfile({ gdN0: 256e-6, lengthM: (size - 1) * dx, dxM: dx, seed: 2, nMinCyclesPerM: 10 * dn, nMaxCyclesPerM: 100 * dn });
    const s2 = z.reduce((t, v) => t + v * v, 0);
    checkClose(s2 / size, harmonicPower(256e-6, 2, dn, size, 10 * dn, 100 * dn), { rel: 1e-9 }, 'computed: harmonics k = 10 … 100 inclusive', {});
  });

  it('when a profile is split at one spatial frequency into a low and a high band, then the two bands add up to the full profile (property: the phases do not depend on the band)', () => {
    const dx = 0.1;
    const opts = { gdN0: 64e-6, lengthM: 300, dxM: dx, seed: 11 };
    const full = synthesizeProfile(opts);
    const low = synthesizeProfile({ ...opts, nMaxCyclesPerM: 0.3 });
    const high = synthesizeProfile({ ...opts, nMinCyclesPerM: 0.3 + 1e-9 });
    let rms = 0;
    for (const v of full) rms += v * v;
    rms = Math.sqrt(rms / full.length);
    full.forEach((v, i) => checkClose(low[i] + high[i], v, { abs: 1e-12 * rms }, 'property: superposition of bands', { i }));
    checkThat(low.some((v) => v !== 0) && high.some((v) => v !== 0), 'property', 'both bands carry harmonics');
  });

  it('when the band holds one harmonic k, then the profile is amp·cos(2π·k·i/M + 2π·u_k) with amp = √(2·Gd(n_k)·Δn) and u_k the k-th draw of the seeded generator (definition of the random-phase method, docs of synthesizeProfile)', () => {
    const dx = 0.25;
    const size = 256;
    const dn = 1 / (size * dx);
    for (const [k, seed] of [[5, 3], [17, 8]]) {
      const gd = 64e-6;
      const z = synthesizeProfile({ gdN0: gd, lengthM: (size - 1) * dx, dxM: dx, seed, nMinCyclesPerM: (k - 0.5) * dn, nMaxCyclesPerM: (k + 0.5) * dn });
      const r = seededRandom(seed);
      let u = 0;
      for (let j = 1; j <= k; j++) u = r();
      const amp = Math.sqrt(2 * gd * ((k * dn) / 0.1) ** -2 * dn); // n0 = 0.1 cycles/m (ISO 8608)
      z.forEach((v, i) => checkClose(v, amp * Math.cos((2 * Math.PI * k * i) / size + 2 * Math.PI * u), { abs: 1e-12 * amp }, 'definition: one harmonic with its seeded phase', { k, seed, i }));
    }
  });

  it('when an option is refused, then the error gives its name and unit; Gd(n0) = 0, the lowest seed and waviness 0.5 are accepted (house rule; bounds of the inputs)', () => {
    const ok = { gdN0: 64e-6, lengthM: 10, dxM: 0.25, seed: 1 };
    const cases: [() => unknown, string][] = [
      [() => synthesizeProfile({ ...ok, gdN0: -1e-6 }), 'physics: gdN0 [m³]'],
      [() => synthesizeProfile({ ...ok, lengthM: 0 }), 'physics: lengthM [m] must be > 0'],
      [() => synthesizeProfile({ ...ok, lengthM: 0.1 }), 'physics: lengthM [m] must cover'],
      [() => synthesizeProfile({ ...ok, lengthM: 1e6, dxM: 0.001 }), 'physics: lengthM [m] gives'],
      [() => synthesizeProfile({ ...ok, dxM: 0.0005 }), 'physics: dxM [m]'],
      [() => synthesizeProfile({ ...ok, seed: 2 ** 54 }), 'physics: seed [1]'],
      [() => synthesizeProfile({ ...ok, waviness: 4.5 }), 'physics: waviness [1]'],
      [() => classifyGd(0), 'physics: gdN0 [m³]'],
      [() => gdForClass('Z'), 'physics: cls [ISO 8608 class] must be one of A–H'],
    ];
    for (const [f, start] of cases) checkThat(errorOf(f).startsWith(start), 'house rule', `"${errorOf(f)}" should start with "${start}"`);
    checkThat(synthesizeProfile({ ...ok, gdN0: 0 }).every((v) => v === 0), 'definition: a perfectly smooth road', '');
    checkClose(synthesizeProfile({ ...ok, seed: -(2 ** 53) }).length, 41, { abs: 0 }, 'definition: lowest seed accepted', {});
    checkClose(synthesizeProfile({ ...ok, waviness: 0.5 }).length, 41, { abs: 0 }, 'definition: waviness 0.5 accepted', {});
  });

  it('when the profile is one sample interval or less, or more than 2^26 samples, then the error names lengthM', () => {
    checkThat(errorOf(() => synthesizeProfile({ gdN0: 64e-6, lengthM: 0.1, dxM: 0.25, seed: 1 })).startsWith('physics: lengthM'), 'house rule', '');
    checkThat(errorOf(() => synthesizeProfile({ gdN0: 64e-6, lengthM: 1e6, dxM: 0.001, seed: 1 })).startsWith('physics: lengthM'), 'house rule: 10⁹ samples', '');
    checkClose(synthesizeProfile({ gdN0: 64e-6, lengthM: 0.25, dxM: 0.25, seed: 1 }).length, 2, { abs: 0 }, 'definition: one interval is two samples', {});
    checkThat(errorOf(() => synthesizeProfile({ gdN0: 64e-6, lengthM: 10, dxM: 0.25, seed: 1, waviness: 5 })).startsWith('physics: waviness'), 'house rule', '');
  });


  it('when the same seed is used twice, then the profile is identical; another seed differs (property)', () => {
    const a = synthesizeProfile({ gdN0: 64e-6, lengthM: 200, dxM: 0.1, seed: 9 });
    const b = synthesizeProfile({ gdN0: 64e-6, lengthM: 200, dxM: 0.1, seed: 9 });
    const c = synthesizeProfile({ gdN0: 64e-6, lengthM: 200, dxM: 0.1, seed: 10 });
    checkThat(a.every((v, i) => v === b[i]), 'property: seeded', 'same seed must reproduce');
    checkThat(a.some((v, i) => v !== c[i]), 'property: seeded', 'different seed must differ');
    checkClose(a.length, 2001, { abs: 0 }, 'definition: round(L/dx) + 1 samples', {});
  });

  it('when a band-limited profile covers one full period, then its variance equals ∫Gd(n)dn = Gd·n0²·(1/n1 − 1/n2) (computed, Parseval)', () => {
    const gd = 256e-6;
    const dx = 0.05;
    const count = 2 ** 17;
    const [n1, n2] = [0.05, 2];
    const z = synthesizeProfile({ gdN0: gd, lengthM: (count - 1) * dx, dxM: dx, seed: 1, nMinCyclesPerM: n1, nMaxCyclesPerM: n2 });
    let s = 0;
    for (const v of z) s += v * v;
    const exp = gd * 0.01 * (1 / n1 - 1 / n2);
    checkClose(s / z.length, exp, { rel: 0.01 }, 'computed: ISO 8608 PSD integral', { gd, n1, n2, dx });
  });

  it('when Gd(n0) is multiplied by 4, then the profile doubles (property)', () => {
    const a = synthesizeProfile({ gdN0: 16e-6, lengthM: 100, dxM: 0.25, seed: 3 });
    const b = synthesizeProfile({ gdN0: 64e-6, lengthM: 100, dxM: 0.25, seed: 3 });
    a.forEach((v, i) => checkClose(b[i], 2 * v, { abs: 1e-15, rel: 1e-12 }, 'property', { i }));
  });
});
