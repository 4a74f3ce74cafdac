/**
 * Plausibility of an odometer reading written by the workshop (inspection results, work records).
 * See docs/methods.md, "Workshop odometer readings".
 *
 * - It cannot go backwards: it must be at least the vehicle's recorded odometer.
 * - It cannot jump: at most {@link MAX_KM_PER_DAY} km for each day since the vehicle's latest
 *   dated reading (a work record, inspection result, damper fit or commissioning; one day at least).
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { AppError } from '../errors';
import { sqlFor } from '../db/dialect';

/**
 * The most a goods vehicle plausibly covers in a day [km]: about 24 h at 80 km/h. An upper bound
 * for typing errors (an extra zero), not a driving-hours rule (common practice, not a regulation).
 */
export const MAX_KM_PER_DAY = 2000;

const DAY_MS = 86_400_000;

/** The vehicle's recorded odometer and the day of its latest dated reading. */
async function readings(sequelize: Sequelize, vehicleId: number, transaction?: Transaction) {
  const { dayOf: day, greatest } = sqlFor(sequelize);
  const [r] = await sequelize.query<{ odometer_km: number; last_day: string | null }>(
    `SELECT v.odometer_km, ${greatest}(
        COALESCE((SELECT MAX(${day('w.performed_at')}) FROM work_records w WHERE w.vehicle_id = v.id), ''),
        COALESCE((SELECT MAX(${day('i.results_at')}) FROM inspections i WHERE i.vehicle_id = v.id AND i.results_at IS NOT NULL), ''),
        COALESCE((SELECT MAX(${day('d.installed_at')}) FROM dampers d WHERE d.vehicle_id = v.id), ''),
        COALESCE(${day('v.commissioned_at')}, '')) AS last_day
     FROM vehicles v WHERE v.id = ?`,
    { replacements: [vehicleId], type: QueryTypes.SELECT, transaction },
  );
  return r ? { odometerKm: Number(r.odometer_km), lastDay: r.last_day || null } : null;
}

/** The allowed range for a reading taken on `day` (YYYY-MM-DD). */
export function odometerRange(recordedKm: number, lastDay: string | null, day: string) {
  const days = lastDay ? Math.max(1, Math.round((Date.parse(`${day}T00:00:00Z`) - Date.parse(`${lastDay}T00:00:00Z`)) / DAY_MS)) : 1;
  // readings are typed in whole km, so the recorded odometer's fraction is not a step back
  return { min: Math.floor(recordedKm), max: recordedKm + MAX_KM_PER_DAY * days, days };
}

/** Throws a 400 naming `field` when `km` is outside the plausible range for the vehicle on `day`. */
export async function checkOdometer(sequelize: Sequelize, vehicleId: number, km: number, day: string, field = 'odometerKm', transaction?: Transaction) {
  const r = await readings(sequelize, vehicleId, transaction);
  if (!r) return;
  const range = odometerRange(r.odometerKm, r.lastDay, day);
  const fmt = (n: number) => Math.round(n).toLocaleString('en-GB');
  if (km < range.min) {
    throw AppError.badRequest('The odometer reading is below the vehicle’s recorded odometer.', {
      [field]: `must be at least ${fmt(range.min)} km (the vehicle's recorded odometer); odometers do not go backwards`,
    });
  }
  if (km > range.max) {
    throw AppError.badRequest('The odometer reading is implausibly high.', {
      [field]: `must be at most ${fmt(range.max)} km (${fmt(MAX_KM_PER_DAY)} km a day for ${range.days} day(s) since the last reading at ${fmt(range.min)} km)`,
    });
  }
}
