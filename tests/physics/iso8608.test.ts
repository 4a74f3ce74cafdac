import { describe, it } from 'vitest';
import { ISO8608_CLASSES, gdForClass, classifyGd, synthesizeProfile, classBounds } from '../../server/physics/iso8608';
import { checkClose, checkThat } from './check';

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

  it('when a class letter is unknown, then the error names cls', () => {
    let msg = '';
    try {
      gdForClass('Z');
    } catch (e) {
      msg = (e as Error).message;
    }
    checkThat(msg.startsWith('physics: cls'), 'house rule', `message "${msg}"`);
  });
});

describe('synthesizeProfile', () => {
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
