/**
 * The `life` and `life-fit` commands through the command line's entry point (tests/physics/cli.test.ts
 * checks that the process prints what it prints).
 * Expectations: the prior's stated convention (rated km on class B at 80 km/h, 1.5× per ISO
 * class step) and a synthetic fleet whose true life law differs from it (computed).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { gdForClass, seededRandom } from '../../../server/physics/iso8608';
import { roadSeverity } from '../../../server/wear/life-law';
import { runCli, scratchFolder } from '../../support/cli';

const VAN = { sprungMassKg: 450, unsprungMassKg: 50, springRateNPerM: 30000, dampingNsPerM: 2200, tireRateNPerM: 250000 };
const cli = (...args: string[]) => runCli<Record<string, number | string>>(...args);
let scratch: ReturnType<typeof scratchFolder>;
let dir = '';
const file = (name: string, text: string) => scratch.put(name, text);

beforeAll(() => {
  scratch = scratchFolder('reboundry-life-cli-');
  dir = scratch.dir;
  file('van.json', JSON.stringify(VAN));
});
afterAll(() => scratch.remove());

describe('cli life', () => {
  it('gives the rated km as the median on class B at 80 km/h and 2.25× less on class D under the prior (stated convention)', () => {
    const b = cli('life', '--spec', join(dir, 'van.json'), '--rated-km', '90000', '--class', 'B', '--speed-kmh', '80');
    expect(b.code, b.stderr).toBe(0);
    expect(Object.keys(b.json!)).toEqual(expect.arrayContaining(['medianLifeKm', 'meanLifeKm', 'p10LifeKm', 'p90LifeKm']));
    expect(b.json!.medianLifeKm as number).toBeCloseTo(90000, 3);
    expect(b.json!.p10LifeKm as number).toBeLessThan(b.json!.medianLifeKm as number);
    const d = cli('life', '--spec', join(dir, 'van.json'), '--rated-km', '90000', '--gd', String(gdForClass('D')), '--speed-kmh', '80');
    expect((b.json!.medianLifeKm as number) / (d.json!.medianLifeKm as number)).toBeCloseTo(2.25, 4);
  });

  it('refuses bad input with a message on stderr and a non-zero exit', () => {
    const r = cli('life', '--spec', join(dir, 'van.json'), '--rated-km', '-5', '--class', 'B', '--speed-kmh', '80');
    expect(r.code).not.toBe(0);
    expect(r.stderr).toMatch(/rated-km/);
    const u = cli('life', '--spec', join(dir, 'van.json'), '--rated-km', '90000', '--speed-kmh', '80');
    expect(u.code).toBe(2);
    expect(u.stderr).toMatch(/--class/);
  });
});

describe('cli life-fit', () => {
  it('fits a CSV of dampers from a true law other than the prior, and `life --model` reads the fit', () => {
    // truth: life ∝ s^−1 (2× per class step), scale 1.2 × rated, Weibull shape 3.5
    const rand = seededRandom(7);
    const roads = [{ cls: 'B', v: 80 }, { cls: 'C', v: 60 }, { cls: 'D', v: 50 }];
    const lines = ['damper,km,gd,speed_kmh,failed'];
    let failures = 0;
    for (let i = 0; i < 300; i++) {
      const r = roads[i % 3];
      const gd = gdForClass(r.cls);
      const s = roadSeverity(VAN, gd, r.v);
      const life = (90000 * 1.2 * Math.pow(-Math.log(1 - rand()), 1 / 3.5)) / s;
      const censor = 200000 * rand();
      const failed = life <= censor;
      if (failed) failures++;
      lines.push(`d${i},${Math.min(life, censor).toFixed(1)},${gd},${r.v},${failed ? 1 : 0}`);
    }
    const fit = cli('life-fit', file('dampers.csv', `${lines.join('\n')}\n`), '--spec', join(dir, 'van.json'), '--rated-km', '90000');
    expect(fit.code, fit.stderr).toBe(0);
    expect(fit.json!.failures).toBe(failures);
    expect(fit.json!.suspensions).toBe(300 - failures);
    // moved from the prior's 0.58 toward the true 1.0
    expect(fit.json!.roadSensitivity as number).toBeGreaterThan(0.75);
    file('fit.json', JSON.stringify(fit.json));
    const c = cli('life', '--spec', join(dir, 'van.json'), '--rated-km', '90000', '--class', 'C', '--speed-kmh', '60', '--model', join(dir, 'fit.json'));
    expect(c.code, c.stderr).toBe(0);
    const trueMedian = (90000 * 1.2 * Math.pow(Math.log(2), 1 / 3.5)) / roadSeverity(VAN, gdForClass('C'), 60);
    expect(Math.abs((c.json!.medianLifeKm as number) / trueMedian - 1)).toBeLessThan(0.25);
  });

  it('names the row and column of bad data', () => {
    const r = cli('life-fit', file('bad.csv', 'damper,km,gd,speed_kmh,failed\nd1,1000,64e-6,80,1\nd2,abc,64e-6,80,0\n'), '--spec', join(dir, 'van.json'), '--rated-km', '90000');
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/row 3, km/);
  });
});
