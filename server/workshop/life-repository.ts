/**
 * What the fleet's damper life is fitted from, and where the fitted models are kept: each
 * damper of a spec with its fitted and end odometer, the distance it ran per severity band (its
 * own recorded duty and its vehicle's corner mix), and the stored life model per spec.
 */
import { exec, q, stamp } from './repository';
import { inRange, rangeParams, type VehicleRange } from '../db/raw';

export type { VehicleRange };

export const lifeRepository = {
  /** The ids of a spec's vehicles, in order (the refit reads a spec in ranges of them). */
  async specVehicleIds(specId: number): Promise<number[]> {
    const rows = await q<{ id: number }>(`SELECT id FROM vehicles WHERE spec_id = ? ORDER BY id`, [specId]);
    return rows.map((r) => r.id);
  },

  /** Every damper ever fitted to a spec's vehicles (those in `range` when given), with its axle's rated life. */
  specDampers(specId: number, range?: VehicleRange) {
    return q<{ id: number; vehicle_id: number; position: string; axle_index: number; installed_at: string; removed_at: string | null; installed_odometer_km: number; end_km: number; removal_reason: string | null; rated: number }>(
      `SELECT d.id, d.vehicle_id, d.position, d.axle_index, d.installed_at, d.removed_at, d.installed_odometer_km, COALESCE(d.removed_odometer_km, v.odometer_km) AS end_km,
              d.removal_reason, a.rated_damper_life_km AS rated
       FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id JOIN spec_axles a ON a.spec_id = v.spec_id AND a.axle_index = d.axle_index
       WHERE v.spec_id = ?${inRange('v.id', range)} ORDER BY d.id`,
      [specId, ...rangeParams(range)],
    );
  },

  /**
   * Per damper of the spec and band of ln(severity) (1/8 wide, duty-summary.ts): km and
   * Σ km·ln(severity) of all its duty, from the running totals kept as the duty is stored
   * (duty-summary.ts): no history is read, and the per-trip retention window changes nothing.
   */
  damperSeverityBands(specId: number, range?: VehicleRange) {
    return q<{ damper_id: number; band: number; km: number; lns: number }>(
      `SELECT b.damper_id, b.severity_bin AS band, b.distance_km AS km, b.km_ln_severity AS lns FROM damper_severity_bins b
       WHERE b.damper_id IN (SELECT d.id FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id WHERE v.spec_id = ?${inRange('v.id', range)})
       ORDER BY b.damper_id, b.severity_bin`,
      [specId, ...rangeParams(range)],
    );
  },

  /**
   * The same per vehicle corner of the spec for the duty driven with no damper fitted there (the
   * corners' duty with a damper is the sum of their dampers' bands).
   */
  unfittedCornerSeverityBands(specId: number, range?: VehicleRange) {
    return q<{ vehicle_id: number; position: string; band: number; km: number; lns: number }>(
      `SELECT b.vehicle_id, b.position, b.severity_bin AS band, b.distance_km AS km, b.km_ln_severity AS lns FROM damper_severity_bins b
       WHERE b.damper_id = 0 AND b.vehicle_id IN (SELECT id FROM vehicles WHERE spec_id = ?${inRange('id', range)})
       ORDER BY b.vehicle_id, b.position, b.severity_bin`,
      [specId, ...rangeParams(range)],
    );
  },

  async storeModel(specId: number, modelJson: string, failures: number, suspensions: number, now: Date) {
    await exec(
      `INSERT INTO life_models (spec_id, model, failures, suspensions, fitted_at) VALUES (?, ?, ?, ?, ?)
       ON CONFLICT (spec_id) DO UPDATE SET model = excluded.model, failures = excluded.failures, suspensions = excluded.suspensions, fitted_at = excluded.fitted_at`,
      [specId, modelJson, failures, suspensions, stamp(now)],
    );
  },

  storedModels() {
    return q<{ spec_id: number; model: string }>('SELECT spec_id, model FROM life_models');
  },

  ratedLives(specId: number) {
    return q<{ axle_index: number; rated_damper_life_km: number }>('SELECT axle_index, rated_damper_life_km FROM spec_axles WHERE spec_id = ? ORDER BY axle_index', [specId]);
  },
};
