/**
 * The back-test replay (server/workshop/life.ts replayRemovals) on a synthetic fleet whose true
 * life law is known and differs from the prior (computed checks): once the model has learned
 * from earlier removals, about 80 % of later removals fall inside its P10–P90 interval, and its
 * median error is near what the true scatter alone allows.
 */
import { describe, expect, it } from 'vitest';
import { seededRandom } from '../../../server/physics/iso8608';
import { replayRemovals, summarizeBacktest, type DamperLife } from '../../../server/workshop/life';

const RATED = 90_000;
const DAY = 86_400_000;

function fleet(n: number, seed: number, truth = { b: 1.0, c: 0.8, k: 3.0 }): DamperLife[] {
  const rand = seededRandom(seed);
  const sev = [0.7, 1, 2, 3];
  const out: DamperLife[] = [];
  const t0 = Date.UTC(2020, 0, 1);
  for (let i = 0; i < n; i++) {
    const s = sev[Math.floor(rand() * sev.length)];
    const kmPerDay = 60 + 80 * rand();
    const life = (RATED * truth.c * Math.pow(-Math.log(1 - rand()), 1 / truth.k)) / Math.pow(s, truth.b);
    const installed = t0 + Math.floor(rand() * 1500) * DAY;
    const now = Date.UTC(2026, 10, 30);
    const runKm = ((now - installed) / DAY) * kmPerDay;
    const failed = life < runKm;
    const km = failed ? life : runKm;
    const removedAt = failed ? new Date(installed + (life / kmPerDay) * DAY).toISOString().slice(0, 10) : null;
    out.push({
      id: i + 1, vehicleId: i + 1, axleIndex: 0, ratedKm: RATED, installedAt: new Date(installed).toISOString().slice(0, 10), removedAt,
      lifeKm: km, failed, reason: failed ? 'leaking' : null, rows: [{ km, severity: s }], recordedKm: km,
    });
  }
  return out;
}

describe('back-test replay on a fleet with a known true law (computed)', () => {
  const lives = fleet(300, 21);
  const { points, priorPoints } = replayRemovals(lives, '2026-11-30');
  const late = points.filter((p) => p.trainedOn >= 40);

  it('predicts every removal for wear from what was known before it', () => {
    expect(points.length).toBe(lives.filter((d) => d.failed).length);
    for (let i = 1; i < points.length; i++) expect(points[i].trainedOn).toBeGreaterThanOrEqual(points[i - 1].trainedOn);
    expect(points[0].trainedOn).toBe(0);
  });

  it('once trained on 40 removals, about 80 % of removals fall inside P10–P90 (the interval’s nominal coverage)', () => {
    expect(late.length).toBeGreaterThan(40);
    const inside = summarizeBacktest(late).insideShare!;
    expect(inside).toBeGreaterThan(0.65);
    expect(inside).toBeLessThan(0.95);
  });

  it('learns: its error once trained is below the prior’s on the same removals (the true law is not the prior)', () => {
    const ids = new Set(late.map((p) => p.damperId));
    const prior = priorPoints.filter((p) => ids.has(p.damperId));
    expect(summarizeBacktest(late).mdape!).toBeLessThan(summarizeBacktest(prior).mdape!);
  });

  it('its median error is near the floor the true scatter sets (shape 3: about 20–30 %)', () => {
    expect(summarizeBacktest(late).mdape!).toBeLessThan(40);
  });
});
