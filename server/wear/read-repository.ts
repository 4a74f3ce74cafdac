/**
 * Reads for the vehicle wear view and for other areas (driver exposure).
 */
import { QueryTypes, type Sequelize } from 'sequelize';

export function wearReadRepository(sequelize: Sequelize) {
  const q = <T extends object>(sql: string, replacements: unknown[] = []) => sequelize.query<T>(sql, { replacements: replacements as never, type: QueryTypes.SELECT });
  return {
    async vehicle(id: number) {
      const rows = await q<{ id: number; fleet_number: string; driver_id: number | null; spec_id: number }>(`SELECT id, fleet_number, driver_id, spec_id FROM vehicles WHERE id = ?`, [id]);
      return rows[0] ?? null;
    },

    async fittedDampers(vehicleId: number) {
      return q<{
        id: number; position: string; axle_index: number; installed_at: string; installed_odometer_km: number; part_number: string | null; energy_j: number; fatigue_damage: number; life_used_fraction: number;
        damping_ns_per_m: number | null; nominal_damping: number; rated_damper_life_km: number; wear_updated_at: string | null; opening_basis: string | null;
        p_as_of: string | null; window_days: number | null; window_km: number | null; window_wear_km: number | null; wear_km_per_day: number | null; km_per_day: number | null;
        life_wear_km: number | null; life_p10_wear_km: number | null; life_p90_wear_km: number | null; road_sensitivity: number | null; life_source: string | null; wear_km: number | null;
        distance_life_used: number | null; calendar_life_used: number | null; opening_km: number | null; opening_share: number | null; opening_share_low: number | null; opening_share_high: number | null;
        threshold_fraction: number | null; schedule_quantile: number | null; threshold_date: string | null; end_of_life_date: string | null; end_of_life_p10_date: string | null; end_of_life_p90_date: string | null;
        governed_by: string | null; spring_rate_per_day: number | null; spring_threshold_date: string | null; basis: string | null;
      }>(
        `SELECT d.id, d.position, d.axle_index, d.installed_at, d.installed_odometer_km, d.part_number, d.energy_j, d.fatigue_damage, d.life_used_fraction, d.damping_ns_per_m,
                a.damping_ns_per_m AS nominal_damping, a.rated_damper_life_km, d.wear_updated_at, d.opening_basis,
                p.as_of AS p_as_of, p.window_days, p.window_km, p.window_wear_km, p.wear_km_per_day, p.km_per_day, p.life_wear_km, p.life_p10_wear_km, p.life_p90_wear_km,
                p.road_sensitivity, p.life_source, p.wear_km, p.distance_life_used, p.calendar_life_used, p.opening_km, p.opening_share, p.opening_share_low, p.opening_share_high,
                p.threshold_fraction, p.schedule_quantile, p.threshold_date, p.end_of_life_date, p.end_of_life_p10_date, p.end_of_life_p90_date, p.governed_by,
                p.spring_rate_per_day, p.spring_threshold_date, p.basis
         FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id JOIN spec_axles a ON a.spec_id = v.spec_id AND a.axle_index = d.axle_index
         LEFT JOIN damper_predictions p ON p.damper_id = d.id
         WHERE d.vehicle_id = ? AND d.removed_at IS NULL ORDER BY d.axle_index, d.position`,
        [vehicleId],
      );
    },

    async history(damperIds: number[]) {
      if (!damperIds.length) return [];
      return q<{ damper_id: number; day: string; distance_km: number; energy_j: number; wear_km: number; cum_wear_km: number; cum_spring_damage: number }>(
        `SELECT damper_id, day, distance_km, energy_j, wear_km, cum_wear_km, cum_spring_damage FROM damper_wear_days
         WHERE damper_id IN (${damperIds.map(Number).join(',')}) ORDER BY damper_id, day`,
      );
    },

    /**
     * Duty of the fitted dampers by route: trips, km, energy per axle, over the per-trip duty kept
     * and the route totals of the duty folded beyond the retention window (duty-summary.ts). A
     * damper's records are one per trip it was fitted for, so the trips of an axle are those of
     * its longest-fitted damper (both corners' dampers being fitted now, their trips nest).
     */
    async dutyByRoute(damperIds: number[]) {
      if (!damperIds.length) return [];
      const ids = damperIds.map(Number).join(',');
      return q<{ route_id: number; route_name: string; axle_index: number; trips: number; km: number; severity: number; energy_j: number; spring_damage: number; avg_weighted_accel: number }>(
        `WITH u AS (
           SELECT td.damper_id, td.route_id, td.axle_index, 1 AS records, td.distance_km AS km, td.distance_km * td.severity AS kms, td.energy_j, td.spring_damage, td.rms_weighted_accel AS aw
           FROM trip_duties td WHERE td.damper_id IN (${ids})
           UNION ALL
           SELECT t.damper_id, t.route_id, t.axle_index, t.records, t.distance_km, t.km_severity, t.energy_j, t.spring_damage, t.weighted_accel_sum
           FROM damper_route_totals t WHERE t.damper_id IN (${ids})),
         per AS (
           SELECT route_id, axle_index, damper_id, SUM(records) AS records, SUM(km) AS km, SUM(kms) AS kms, SUM(energy_j) AS energy_j, SUM(spring_damage) AS spring_damage, SUM(aw) AS aw
           FROM u GROUP BY route_id, axle_index, damper_id)
         SELECT per.route_id, r.name AS route_name, per.axle_index, MAX(per.records) AS trips, SUM(per.km) / SUM(per.records) * MAX(per.records) AS km,
                SUM(per.kms) / SUM(per.km) AS severity, SUM(per.energy_j) AS energy_j, SUM(per.spring_damage) AS spring_damage, SUM(per.aw) / SUM(per.records) AS avg_weighted_accel
         FROM per JOIN routes r ON r.id = per.route_id
         GROUP BY per.route_id, r.name, per.axle_index ORDER BY energy_j DESC`,
      );
    },

    /**
     * Front-axle duty per trip (driver exposure): the Wk-weighted RMS body acceleration
     * on the front axle [m/s²] and the trip's duration [s]. Left and right front corners are
     * equal by construction; the left one is returned.
     */
    async frontAxleByTrip(tripIds: number[]) {
      if (!tripIds.length) return new Map<number, { rmsWeightedAccel: number; durationS: number; driverId: number | null; tripDate: string }>();
      const rows = await q<{ trip_id: number; rms_weighted_accel: number; duration_s: number; driver_id: number | null; trip_date: string }>(
        `SELECT trip_id, rms_weighted_accel, duration_s, driver_id, trip_date FROM trip_duties WHERE axle_index = 0 AND position IN ('FL') AND trip_id IN (${tripIds.map(Number).join(',')})`,
      );
      return new Map(rows.map((r) => [r.trip_id, { rmsWeightedAccel: r.rms_weighted_accel, durationS: r.duration_s, driverId: r.driver_id, tripDate: r.trip_date }]));
    },
  };
}
