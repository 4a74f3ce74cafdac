// Day arithmetic of the wear prediction (computed by hand from the rules in docs/methods.md,
// "Damper wear and prediction"): a level is predicted on the first whole day the projected wear
// reaches it, and the rate comes from a trailing window that starts no earlier than the fitting day.
import { describe, expect, it } from 'vitest';
import { DUTY_WINDOW_DAYS, levelsOf, predictFromSummary, predictionWindow, summarizeWear, type PredictOptions, type WearSummary } from '../../../server/wear/wear';
import { packPredictions, PREDICTION_COLUMNS } from '../../../server/wear/prediction-rows';
import { createPredictionRunner, predictionThreads } from '../../../server/wear/prediction-pool';

const life = { b: 1, medianWearKm: 100_000, p10WearKm: 60_000, p90WearKm: 140_000, source: 'prior', note: 'test basis' };
const opts = (over: Partial<PredictOptions> = {}): PredictOptions => ({
  asOf: '2026-11-30',
  installedAt: '2025-11-30',
  life,
  thresholdFraction: 0.8,
  nominalDampingNsPerM: 3000,
  untrackedKm: 0,
  ...over,
});

describe('the day a level is predicted', () => {
  it('when the wear needs 50.5 more days at the recent rate, then the threshold falls on day 51, not day 50', () => {
    const o = opts();
    const [threshold] = levelsOf(o, 0);
    const perDay = 100; // wear km a day over the window
    const s: WearSummary = {
      windowWearKm: perDay * DUTY_WINDOW_DAYS,
      windowKm: perDay * DUTY_WINDOW_DAYS,
      windowSpringDamage: 0,
      cumKm: threshold - 50.5 * perDay,
      cumWearKm: threshold - 50.5 * perDay,
      springDamage: 0,
      levelDays: [null, null, null, null],
      springThresholdDay: null,
    };
    const p = predictFromSummary(s, o);
    expect(p.wearKmPerDay).toBe(perDay);
    // 2026-11-30 + 51 days = 2027-01-20 (30 days to 12-30, 21 more into January)
    expect(p.thresholdDate).toBe('2027-01-20');
  });
});

describe('the prediction window', () => {
  it('when a damper was fitted 10 days before the as-of day, then the window is the 11 days since fitting, both ends counted', () => {
    expect(predictionWindow({ asOf: '2026-11-30', installedAt: '2026-11-20' })).toEqual({ windowDays: 11, windowStart: '2026-11-20' });
    expect(predictionWindow({ asOf: '2026-11-30', installedAt: '2026-11-30' })).toEqual({ windowDays: 1, windowStart: '2026-11-30' });
    expect(predictionWindow({ asOf: '2026-11-30', installedAt: '2026-10-01' })).toEqual({ windowDays: DUTY_WINDOW_DAYS, windowStart: '2026-11-01' });
  });

  it('when a damper fitted 10 days ago drove on its first day, then that day is in the window and the rate is over 11 days', () => {
    const o = opts({ installedAt: '2026-11-20' });
    const day = (d: string, km: number, cum: number) => ({ day: d, distanceKm: km, wearKm: km, energyJ: 0, springDamage: 0, cumKm: cum, cumWearKm: cum, cumEnergyJ: 0, cumSpringDamage: 0, lifeWearKm: 100_000, lifeUsedFraction: cum / 100_000, dampingNsPerM: 3000 });
    const history = [day('2026-11-20', 110, 110), day('2026-11-25', 0, 110), day('2026-11-30', 0, 110)];
    const s = summarizeWear(history as never, o, 0);
    expect(s.windowWearKm).toBe(110);
    expect(predictFromSummary(s, o).wearKmPerDay).toBeCloseTo(10, 12);
  });
});

describe('predictions packed for the database', () => {
  const summary: WearSummary = { windowWearKm: 900, windowKm: 1000, windowSpringDamage: 1e-4, cumKm: 20_000, cumWearKm: 18_000, springDamage: 2e-3, levelDays: [null, null, null, null], springThresholdDay: null };
  const lane = { ...life, medianWearKm: 80_000, source: 'test-lane', offsetWearKm: 1500 };
  const base: Omit<PredictOptions, 'life'> = { asOf: '2026-11-30', installedAt: '2025-11-30', thresholdFraction: 0.8, nominalDampingNsPerM: 3000, untrackedKm: 2500 };
  const chunk = {
    lives: [life, lane],
    jobs: [
      { damperId: 11, vehicleId: 1, opts: base, life: 0, summary },
      { damperId: 12, vehicleId: 1, opts: { ...base, installedAt: '2026-11-20' }, life: 1, summary: null },
      // an as-of day that is no day: its prediction throws, and it alone is left out
      { damperId: 13, vehicleId: 2, opts: { ...base, asOf: 'not a day' }, life: 0, summary },
      { damperId: 14, vehicleId: 2, opts: base, life: 1, summary },
    ],
  };

  it('when a chunk is packed, then each row is the prediction of predictFromSummary in the table\'s column order, and a damper whose prediction throws is reported and left out', () => {
    const packed = packPredictions(chunk);
    const rows = JSON.parse(packed.predictions) as unknown[][];
    expect(packed.count).toBe(3);
    expect(rows.map((r) => r[0])).toEqual([11, 12, 14]);
    expect(packed.errors.map((e) => e.item)).toEqual(['damper 13']);
    const p = predictFromSummary(summary, { ...base, life: lane });
    const row = rows[2];
    expect(row).toHaveLength(PREDICTION_COLUMNS.length);
    const col = (name: string) => row[PREDICTION_COLUMNS.indexOf(name)];
    expect(col('life_wear_km')).toBe(80_000);
    expect(col('life_source')).toBe('test-lane');
    expect(col('wear_km')).toBe(p.wearKm);
    expect(col('threshold_date')).toBe(p.thresholdDate);
    expect(JSON.parse(col('basis') as string)).toEqual(p.basis);
    // the damper's own totals: id, wear km, life used, present damping, opening basis
    expect(JSON.parse(packed.totals)[2]).toEqual([14, p.wearKm, p.lifeUsedFraction, p.dampingNsPerM, p.opening.basis]);
  });

  it('when a chunk is packed on the worker thread, then the texts equal those packed in this thread', async () => {
    const { runner, fallback } = await createPredictionRunner(1);
    try {
      expect(fallback).toBeNull();
      expect(runner.workers).toBe(1);
      expect(await runner.pack(chunk)).toEqual(packPredictions(chunk));
    } finally {
      await runner.close();
    }
  }, 60_000);

  it('when the duty has threads, then the predictions take one fewer, at least one, and none when the duty has none', () => {
    expect([0, 1, 2, 4].map(predictionThreads)).toEqual([0, 1, 1, 3]);
  });

  it('when several chunks are packed at once on two threads, then each answer is its own chunk\'s', async () => {
    const { runner, fallback } = await createPredictionRunner(2);
    try {
      expect(fallback).toBeNull();
      expect(runner.workers).toBe(2);
      const chunks = [0, 1, 2, 3].map((k) => ({ ...chunk, jobs: chunk.jobs.map((j) => ({ ...j, damperId: j.damperId + 100 * k, opts: { ...j.opts, untrackedKm: 1000 * k } })) }));
      const packed = await Promise.all(chunks.map((c) => runner.pack(c)));
      expect(packed).toEqual(chunks.map((c) => packPredictions(c)));
      expect(new Set(packed.map((p) => p.predictions)).size).toBe(4);
    } finally {
      await runner.close();
    }
  }, 60_000);
});
