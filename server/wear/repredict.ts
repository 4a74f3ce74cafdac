/**
 * One vehicle's damper predictions recomputed at once (after test-lane results or a work
 * record), by the nightly prediction phase restricted to that vehicle's dampers: a test-lane
 * result recalibrates a damper's life, a replacement fits a new damper, and the vehicle page
 * would otherwise show last night's end-of-life date next to the life used just measured.
 * The wear history itself is recomputed by the next nightly run (its dampers are marked for
 * it); see docs/methods.md, "Scheduling that follows the wear".
 */
import type { Sequelize } from 'sequelize';
import type { Config } from '../config';
import { createWorkshopLifeResolver } from '../workshop/life';
import { localDay, startOfLocalDay } from './repository';
import { predictAll, type ItemError, type PhaseContext } from './service';
import { plusDays, type LifeResolver } from './wear';

export interface RepredictOptions {
  /** Logical time (stamps rows); its day in `timeZone` is the prediction's as-of day unless `asOf` is given. */
  now: Date;
  asOf?: string;
  timeZone: string;
  /** Inspection threshold as a fraction of life [1]. */
  thresholdFraction: number;
  /** The life per damper; default: each spec's stored life model with test-lane calibration, as the nightly job. */
  lifeResolver?: LifeResolver;
  /** Needed for the default life resolver. */
  workshop?: Config['workshop'];
}

/** Recomputes the predictions of every damper fitted to `vehicleId`; returns how many and any per-damper errors. */
export async function repredictVehicle(sequelize: Sequelize, vehicleId: number, opts: RepredictOptions): Promise<{ predictions: number; errors: ItemError[] }> {
  const asOf = opts.asOf ?? localDay(opts.now, opts.timeZone);
  const lifeResolver = opts.lifeResolver ?? (opts.workshop ? await createWorkshopLifeResolver(opts.workshop.life.prior) : undefined);
  const errors: ItemError[] = [];
  const counts: Record<string, number> = {};
  const ctx: PhaseContext = {
    sequelize,
    now: opts.now,
    asOf,
    before: startOfLocalDay(plusDays(asOf, 1), opts.timeZone),
    timeZone: opts.timeZone,
    // the prediction phase reads no trips, profiles or batches
    dataDir: '',
    batchTrips: 1,
    thresholdFraction: opts.thresholdFraction,
    calendarYears: opts.workshop?.life.calendarYears,
    scheduleQuantile: opts.workshop?.life.scheduleQuantile,
    lifeResolver,
    vehicleIds: [vehicleId],
    loadProfile: () => Promise.reject(new Error('not used by the prediction phase')),
    progress: () => {},
    errors,
    counts,
  };
  await predictAll(ctx);
  return { predictions: counts.predictions ?? 0, errors };
}
