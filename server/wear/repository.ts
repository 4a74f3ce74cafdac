/**
 * Storage of the nightly duty and wear: the only code of the wear area that touches the
 * database. Bulk paths use plain SQL (multi-row inserts, UPDATE … FROM) so a 10 000-vehicle
 * fleet fits the nightly budget; everything returns plain objects.
 */
import type { Sequelize, Transaction } from 'sequelize';
import { selectRows } from '../db/raw';
import type { CornerParams } from '../physics/types';
import { type AxleInput } from './duty';
import { estimatedDamping, type WearDayRow } from './wear';

/** Day and time helpers, from the one days module (callers here import them from this file). */
export { sqlStamp as sqlDate, localDay, startOfLocalDay } from '../lib/days';
import { dutyRepository } from './duty-repository';
import { historyRepository } from './history-repository';
import { predictionRepository } from './prediction-repository';

export interface VehiclePlan {
  vehicleId: number;
  trips: number;
}

export interface SpecAxles {
  specId: number;
  axles: AxleInput[];
}

/** Where a dirty damper's wear is accumulated from, and with what road sensitivity. */
export interface WearStart {
  damperId: number;
  vehicleId: number;
  /** Cumulative recorded wear on the last day kept (or none). */
  cumKm: number;
  cumEnergyJ: number;
  cumWearKm: number;
  springDamage: number;
  /** Road sensitivity b of the spec's life model: wear km = Σ km·severity^b. */
  b: number;
}

/** What the wear and prediction phases need of a damper. */
export interface DamperContext {
  id: number;
  vehicleId: number;
  specId: number;
  axleIndex: number;
  installedAt: string;
  corner: CornerParams;
  ratedDamperLifeKm: number;
  /** Distance since fitting no trip on record covers [km] (null before the first estimate). */
  untrackedKm: number | null;
}

/** What the wear repository's parts share: the query helper and the spec axles, read once per repository. */
export interface WearRepoShared {
  q: <T extends object>(sql: string, params?: unknown[], transaction?: Transaction) => Promise<T[]>;
  specAxles: () => Promise<Map<number, AxleInput[]>>;
}

/**
 * The wear area's storage in three parts, each a file: the duty phase's inputs and its batch
 * writes (duty-repository.ts), the wear history (history-repository.ts) and the predictions
 * (prediction-repository.ts).
 */
export function wearRepository(sequelize: Sequelize) {
  const q = <T extends object>(sql: string, params: unknown[] = [], transaction?: Transaction) => selectRows<T>(sequelize, sql, params, transaction);
  const duty = dutyRepository(sequelize, q);
  // the spec axles, read once per repository (damperContext is called per chunk)
  let specsOnce: Promise<Map<number, AxleInput[]>> | null = null;
  const shared: WearRepoShared = { q, specAxles: () => (specsOnce ??= duty.specAxles()) };
  return { ...duty, ...historyRepository(sequelize, shared), ...predictionRepository(sequelize, shared) };
}

/** A `damper_wear_days` row as stored. */
export interface WearDayDb {
  damper_id: number;
  day: string;
  vehicle_id: number;
  distance_km: number;
  energy_j: number;
  spring_damage: number;
  wear_km: number;
  cum_km: number;
  cum_energy_j: number;
  cum_wear_km: number;
  cum_spring_damage: number;
}

/** A stored wear day as the wear functions take it, against a life (median wear km) and opening wear. */
export const wearDayFromDb = (r: WearDayDb, lifeWearKm: number, nominalDampingNsPerM: number, openingWearKm = 0): WearDayRow => {
  const u = (r.cum_wear_km + openingWearKm) / lifeWearKm;
  return {
    damperId: r.damper_id,
    vehicleId: r.vehicle_id,
    day: r.day,
    distanceKm: r.distance_km,
    energyJ: r.energy_j,
    springDamage: r.spring_damage,
    wearKm: r.wear_km,
    cumKm: r.cum_km,
    cumEnergyJ: r.cum_energy_j,
    cumWearKm: r.cum_wear_km,
    cumSpringDamage: r.cum_spring_damage,
    lifeWearKm,
    lifeUsedFraction: u,
    dampingNsPerM: estimatedDamping(nominalDampingNsPerM, u),
  };
};

export type WearRepository = ReturnType<typeof wearRepository>;
