/**
 * What the fleet's damper life is fitted from, and where the fitted models are kept: each
 * damper of a spec with its fitted and end odometer, the distance it ran per severity band (its
 * own recorded duty and its vehicle's corner mix), and the stored life model per spec.
 */
import { exec, q, stamp } from './repository';

export const lifeRepository = {
  /** Every damper ever fitted to a spec's vehicles, with its axle's rated life. */
  specDampers(specId: number) {
    return q<{ id: number; vehicle_id: number; position: string; axle_index: number; installed_at: string; removed_at: string | null; installed_odometer_km: number; end_km: number; removal_reason: string | null; rated: number }>(
      `SELECT d.id, d.vehicle_id, d.position, d.axle_index, d.installed_at, d.removed_at, d.installed_odometer_km, COALESCE(d.removed_odometer_km, v.odometer_km) AS end_km,
              d.removal_reason, a.rated_damper_life_km AS rated
       FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id JOIN spec_axles a ON a.spec_id = v.spec_id AND a.axle_index = d.axle_index
       WHERE v.spec_id = ? ORDER BY d.id`,
      [specId],
    );
  },

  /** Per damper of the spec: km and Σ km·ln(severity) in bands of ln(severity) `1/bin` wide. */
  damperSeverityBands(specId: number, bin: number) {
    return q<{ damper_id: number; km: number; lns: number }>(
      `SELECT td.damper_id, SUM(td.distance_km) AS km, SUM(td.distance_km * ln(td.severity)) AS lns FROM trip_duties td
       WHERE td.damper_id IN (SELECT d.id FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id WHERE v.spec_id = ?) AND td.severity > 0
       GROUP BY td.damper_id, CAST(ROUND(ln(td.severity) * ${Number(bin)}) AS INTEGER)`,
      [specId],
    );
  },

  /** The same per vehicle corner of the spec, over every damper it has had. */
  cornerSeverityBands(specId: number, bin: number) {
    return q<{ vehicle_id: number; position: string; km: number; lns: number }>(
      `SELECT td.vehicle_id, td.position, SUM(td.distance_km) AS km, SUM(td.distance_km * ln(td.severity)) AS lns FROM trip_duties td
       WHERE td.vehicle_id IN (SELECT id FROM vehicles WHERE spec_id = ?) AND td.severity > 0
       GROUP BY td.vehicle_id, td.position, CAST(ROUND(ln(td.severity) * ${Number(bin)}) AS INTEGER)`,
      [specId],
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
