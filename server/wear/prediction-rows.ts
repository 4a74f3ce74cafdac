/**
 * The prediction phase's per-damper work, packed for the database: each damper's prediction
 * from its wear summary (`predictFromSummary`, pure) and its `damper_predictions` row and
 * `dampers` totals as JSON texts for `jsonb_each` (db/json-rows.ts). No database here, so a
 * worker thread can do it while the job's thread reads the next chunk and writes the last one
 * (prediction-pool.ts; docs/methods.md "The nightly job on one machine").
 */
import { jsonRows } from '../db/json-rows';
import { predictFromSummary, type LifeBasis, type Prediction, type PredictOptions, type WearSummary } from './wear';

/** The columns of a `damper_predictions` row, in the order {@link predictionRow} gives them. */
export const PREDICTION_COLUMNS = [
  'damper_id', 'vehicle_id', 'as_of', 'window_days', 'window_km', 'window_wear_km', 'wear_km_per_day', 'km_per_day', 'life_wear_km', 'life_p10_wear_km',
  'life_p90_wear_km', 'road_sensitivity', 'life_source', 'wear_km', 'life_used_fraction', 'distance_life_used', 'calendar_life_used', 'opening_km',
  'opening_share', 'opening_share_low', 'opening_share_high', 'damping_ns_per_m', 'threshold_fraction', 'schedule_quantile', 'threshold_date',
  'end_of_life_date', 'end_of_life_p10_date', 'end_of_life_p90_date', 'governed_by', 'spring_damage', 'spring_rate_per_day', 'spring_threshold_date', 'basis',
];

/** A damper's prediction as its `damper_predictions` row. */
export const predictionRow = (p: Prediction & { damperId: number; vehicleId: number }) => [
  p.damperId, p.vehicleId, p.asOf, p.windowDays, p.windowKm, p.windowWearKm, p.wearKmPerDay, p.kmPerDay, p.life.medianWearKm, p.life.p10WearKm,
  p.life.p90WearKm, p.life.b, p.life.source, p.wearKm, p.lifeUsedFraction, p.distanceLifeUsed, p.calendarLifeUsed, p.opening.km,
  p.openingShare, p.openingShareLow, p.openingShareHigh, p.dampingNsPerM, p.thresholdFraction, p.scheduleQuantile, p.thresholdDate,
  p.endOfLifeDate, p.endOfLifeP10Date, p.endOfLifeP90Date, p.governedBy, p.springDamage, p.springRatePerDay, p.springThresholdDate, JSON.stringify(p.basis),
];

/** The damper's own totals that follow its prediction: id, wear km, life used, damping, opening basis. */
export const damperTotalsRow = (p: Prediction & { damperId: number }) => [p.damperId, p.wearKm, p.lifeUsedFraction, p.dampingNsPerM, p.opening.basis];

/** One damper to predict: its options with the life as an index into the chunk's {@link PredictionChunk.lives}. */
export interface PredictionJob {
  damperId: number;
  vehicleId: number;
  opts: Omit<PredictOptions, 'life'>;
  life: number;
  /** Its wear summary; null when it has no wear day yet. */
  summary: WearSummary | null;
}

/** A chunk's dampers, with each distinct life once (most dampers of a spec share one). */
export interface PredictionChunk {
  jobs: PredictionJob[];
  lives: LifeBasis[];
}

/** A chunk's predictions as JSON rows of {@link PREDICTION_COLUMNS} and of {@link damperTotalsRow}, and the dampers that failed. */
export interface PackedPredictions {
  predictions: string;
  totals: string;
  count: number;
  errors: { item: string; message: string }[];
}

const NO_WEAR: WearSummary = Object.freeze({ windowWearKm: 0, windowKm: 0, windowSpringDamage: 0, cumKm: 0, cumWearKm: 0, springDamage: 0, levelDays: [null, null, null, null], springThresholdDay: null });

/** Predicts every damper of a chunk, in order; a damper whose prediction throws is reported and left out. */
export function packPredictions(chunk: PredictionChunk): PackedPredictions {
  const rows: unknown[][] = [];
  const totals: unknown[][] = [];
  const errors: { item: string; message: string }[] = [];
  for (const j of chunk.jobs) {
    try {
      const p = { ...predictFromSummary(j.summary ?? NO_WEAR, { ...j.opts, life: chunk.lives[j.life] }), damperId: j.damperId, vehicleId: j.vehicleId };
      rows.push(predictionRow(p));
      totals.push(damperTotalsRow(p));
    } catch (err) {
      errors.push({ item: `damper ${j.damperId}`, message: (err as Error).message });
    }
  }
  return { predictions: jsonRows(rows), totals: jsonRows(totals), count: rows.length, errors };
}
