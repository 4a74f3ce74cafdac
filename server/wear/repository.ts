/**
 * Storage of the nightly duty and wear: the only code of the wear area that touches the
 * database. Bulk paths use plain SQL (multi-row inserts, UPDATE … FROM) so a 10 000-vehicle
 * fleet fits the nightly budget; everything returns plain objects.
 */
import type { Sequelize, Transaction } from 'sequelize';
import { JSON_ROWS, fromJsonRows, inList, insertPackedRows, insertRows, jsonRows, runSql, selectRows } from '../db/raw';
import type { CornerParams } from '../physics/types';
import { TRIP_DUTY_COLUMNS, type AxleInput, type DamperSpan, type TripInput, type WearDelta } from './duty';
import { allSegments, routeVersions, type DatedRoute, type SegmentBase } from './roughness-as-of';
import type { ObservationValue } from '../roads/current-roughness';
import type { RoughnessSource } from '../db/models';
import { estimatedDamping, type Prediction, type WearDayRow, type WearSummary } from './wear';

/** Day and time helpers, from the one days module (callers here import them from this file). */
export { sqlStamp as sqlDate, localDay, startOfLocalDay } from '../lib/days';
import { sqlStamp as sqlDate, localDay } from '../lib/days';

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

export function wearRepository(sequelize: Sequelize) {
  // the spec axles, read once per repository (damperContext is called per chunk)
  let specsOnce: Promise<Map<number, AxleInput[]>> | null = null;
  const q = <T extends object>(sql: string, params: unknown[] = [], transaction?: Transaction) => selectRows<T>(sequelize, sql, params, transaction);

  return {
    /** Vehicles with unprocessed trips started before `before`, with how many, in vehicle order. */
    async planUnprocessed(before: Date): Promise<VehiclePlan[]> {
      const rows = await q<{ vehicle_id: number; n: number }>(
        `SELECT vehicle_id, COUNT(*) AS n FROM trips WHERE processed_at IS NULL AND started_at < ? GROUP BY vehicle_id ORDER BY vehicle_id`,
        [sqlDate(before)],
      );
      return rows.map((r) => ({ vehicleId: r.vehicle_id, trips: Number(r.n) }));
    },

    /** Every spec's axles (corner parameters and rated life). */
    async specAxles(): Promise<Map<number, AxleInput[]>> {
      const rows = await q<{ spec_id: number; axle_index: number; sprung_mass_kg: number; unsprung_mass_kg: number; spring_rate_n_per_m: number; damping_ns_per_m: number; tire_rate_n_per_m: number; rated_damper_life_km: number }>(
        `SELECT * FROM spec_axles ORDER BY spec_id, axle_index`,
      );
      const out = new Map<number, AxleInput[]>();
      for (const r of rows) {
        const corner: CornerParams = {
          sprungMassKg: r.sprung_mass_kg,
          unsprungMassKg: r.unsprung_mass_kg,
          springRateNPerM: r.spring_rate_n_per_m,
          dampingNsPerM: r.damping_ns_per_m,
          tireRateNPerM: r.tire_rate_n_per_m,
        };
        if (!out.has(r.spec_id)) out.set(r.spec_id, []);
        out.get(r.spec_id)!.push({ axleIndex: r.axle_index, corner, ratedDamperLifeKm: r.rated_damper_life_km });
      }
      return out;
    },

    /**
     * Routes driven by unprocessed trips before `before`, with their segments in order as they
     * stood on each day those trips were driven (roughness-as-of.ts: the observation in force on
     * the trip's day, not the current value), and the surveys whose profiles those versions use.
     * Each segment's observation history is read once per run.
     */
    async routesForUnprocessed(before: Date): Promise<{ routes: Map<number, DatedRoute>; surveyIds: number[] }> {
      const routeRows = await q<{ id: number; length_m: number }>(
        `SELECT id, length_m FROM routes WHERE id IN (SELECT DISTINCT route_id FROM trips WHERE processed_at IS NULL AND started_at < ?)`,
        [sqlDate(before)],
      );
      const routes = new Map<number, DatedRoute>();
      if (!routeRows.length) return { routes, surveyIds: [] };
      const ids = inList(routeRows.map((r) => r.id));
      const [span] = await q<{ first: string; last: string }>(
        `SELECT MIN(started_at) AS first, MAX(started_at) AS last FROM trips WHERE processed_at IS NULL AND started_at < ?`,
        [sqlDate(before)],
      );
      // a day either side of the UTC dates covers the trips' local days in any time zone
      const utcDay = (s: string, days: number) => new Date(new Date(s).getTime() + days * 86_400_000).toISOString().slice(0, 10);
      const fromDay = utcDay(span.first, -1);
      const toDay = utcDay(span.last, 1);
      const [segs, obs] = await Promise.all([
        q<{ id: number; route_id: number; start_m: number; end_m: number; speed_kmh: number | null; gd_n0: number | null; survey_id: number | null; roughness_source: string | null }>(
          `SELECT id, route_id, start_m, end_m, speed_kmh, gd_n0, survey_id, roughness_source FROM route_segments WHERE route_id IN (${ids}) ORDER BY route_id, seq`,
        ),
        q<{ id: number; segment_id: number; source: RoughnessSource; observed_on: string; gd_n0: number | null; iri: number | null; iso_class: string | null; survey_id: number | null }>(
          `SELECT o.id, o.segment_id, o.source, o.observed_on, o.gd_n0, o.iri, o.iso_class, o.survey_id FROM roughness_observations o
           JOIN route_segments s ON s.id = o.segment_id WHERE s.route_id IN (${ids})`,
        ),
      ]);
      const history = new Map<number, ObservationValue[]>();
      for (const o of obs) {
        let h = history.get(o.segment_id);
        if (!h) history.set(o.segment_id, (h = []));
        h.push({ id: o.id, source: o.source, observedOn: String(o.observed_on).slice(0, 10), gdN0: o.gd_n0, iri: o.iri, isoClass: o.iso_class, surveyId: o.survey_id });
      }
      const byRoute = new Map<number, SegmentBase[]>();
      for (const s of segs) {
        let list = byRoute.get(s.route_id);
        if (!list) byRoute.set(s.route_id, (list = []));
        list.push({ id: s.id, startM: s.start_m, endM: s.end_m, speedKmh: s.speed_kmh, gdN0: s.gd_n0, surveyId: s.roughness_source === 'survey' ? s.survey_id : null });
      }
      const surveyIds = new Set<number>();
      for (const r of routeRows) {
        const v = routeVersions(byRoute.get(r.id) ?? [], history, fromDay, toDay);
        const route: DatedRoute = { id: r.id, lengthM: r.length_m, segments: v.segments, ...(v.later.length ? { later: v.later } : {}) };
        for (const s of allSegments(route)) if (s.surveyId) surveyIds.add(s.surveyId);
        routes.set(r.id, route);
      }
      return { routes, surveyIds: [...surveyIds].sort((a, b) => a - b) };
    },

    /** Vehicles' spec ids. */
    async vehicleSpecs(vehicleIds: number[]): Promise<Map<number, number>> {
      const rows = await q<{ id: number; spec_id: number }>(`SELECT id, spec_id FROM vehicles WHERE id IN (${inList(vehicleIds)})`);
      return new Map(rows.map((r) => [r.id, r.spec_id]));
    },

    /** Every damper (fitted or removed) of the vehicles. */
    async dampersOf(vehicleIds: number[]): Promise<Map<number, DamperSpan[]>> {
      const rows = await q<{ id: number; vehicle_id: number; position: string; axle_index: number; installed_at: string; removed_at: string | null }>(
        `SELECT id, vehicle_id, position, axle_index, installed_at, removed_at FROM dampers WHERE vehicle_id IN (${inList(vehicleIds)}) ORDER BY vehicle_id, id`,
      );
      const out = new Map<number, DamperSpan[]>();
      for (const r of rows) {
        if (!out.has(r.vehicle_id)) out.set(r.vehicle_id, []);
        out.get(r.vehicle_id)!.push({ id: r.id, position: r.position, axleIndex: r.axle_index, installedAt: r.installed_at, removedAt: r.removed_at });
      }
      return out;
    },

    /** Unprocessed trips of the vehicles before `before`, in (vehicle, start, id) order. */
    async unprocessedTrips(vehicleIds: number[], before: Date, timeZone: string): Promise<Map<number, TripInput[]>> {
      const rows = await q<{ id: number; vehicle_id: number; route_id: number; driver_id: number | null; started_at: string; ended_at: string; distance_km: number; mean_speed_kmh: number; payload_kg: number | null }>(
        `SELECT id, vehicle_id, route_id, driver_id, started_at, ended_at, distance_km, mean_speed_kmh, payload_kg FROM trips
         WHERE processed_at IS NULL AND started_at < ? AND vehicle_id IN (${inList(vehicleIds)}) ORDER BY vehicle_id, started_at, id`,
        [sqlDate(before)],
      );
      const out = new Map<number, TripInput[]>();
      for (const r of rows) {
        const start = new Date(r.started_at);
        const end = new Date(r.ended_at);
        if (!out.has(r.vehicle_id)) out.set(r.vehicle_id, []);
        out.get(r.vehicle_id)!.push({
          id: r.id,
          routeId: r.route_id,
          driverId: r.driver_id,
          tripDate: localDay(start, timeZone),
          durationS: Math.max(0, (end.getTime() - start.getTime()) / 1000),
          distanceKm: r.distance_km,
          meanSpeedKmh: r.mean_speed_kmh,
          payloadKg: r.payload_kg,
        });
      }
      return out;
    },

    /**
     * Stores one batch in one transaction: the duty records, the trips' processed mark and
     * the dampers' "recompute from" day. A crash before COMMIT leaves none of it.
     */
    async storeBatch(batch: { duties: { json: string; count: number }[]; wear: WearDelta[]; processedTripIds: number[]; now: Date; runId: number }) {
      const stamp = sqlDate(batch.now);
      await sequelize.transaction(async (t) => {
        await insertPackedRows(sequelize, 'trip_duties', TRIP_DUTY_COLUMNS, batch.duties, t, { fixed: { job_run_id: null, created_at: stamp, updated_at: stamp } });
        for (let i = 0; i < batch.processedTripIds.length; i += 5000) {
          const ids = batch.processedTripIds.slice(i, i + 5000);
          await runSql(sequelize, `UPDATE trips SET processed_at = ?, updated_at = ? WHERE id IN (${inList(ids)})`, [stamp, stamp], t);
        }
        for (let i = 0; i < batch.wear.length; i += JSON_ROWS) {
          const part = batch.wear.slice(i, i + JSON_ROWS);
          await runSql(
            sequelize,
            `WITH d AS (${fromJsonRows(['id', 'first'])})
             UPDATE dampers SET wear_dirty_from = CASE WHEN wear_dirty_from IS NULL OR wear_dirty_from > d.first THEN d.first ELSE wear_dirty_from END
             FROM d WHERE dampers.id = d.id`,
            [jsonRows(part.map((w) => [w.damperId, w.firstDay]))],
            t,
          );
        }
      });
    },

    /** Marks every damper without an untracked-distance estimate for a recompute from its fitting day. */
    async markOpeningsDue() {
      await runSql(
        sequelize,
        `UPDATE dampers SET wear_dirty_from = installed_at WHERE opening_km IS NULL AND (wear_dirty_from IS NULL OR wear_dirty_from > installed_at)`,
      );
    },

    /**
     * Marks a spec's dampers whose wear days were summed with another road sensitivity for a
     * recompute from their fitting day (the fitted b changed).
     */
    async markExponentChanged(specId: number, b: number) {
      await runSql(
        sequelize,
        `UPDATE dampers SET wear_dirty_from = installed_at
         WHERE vehicle_id IN (SELECT id FROM vehicles WHERE spec_id = ?) AND (wear_exponent IS NULL OR ABS(wear_exponent - ?) > 1e-9)`,
        [specId, b],
      );
    },

    /**
     * Each damper's untracked distance: odometer now (or at removal) less odometer at fitting
     * less the vehicle's trips on record since fitting (started before `before`); never below 0.
     */
    async untrackedKm(ids: number[], before: Date) {
      return q<{ id: number; untracked_km: number }>(
        `SELECT d.id, MAX(0, COALESCE(d.removed_odometer_km, v.odometer_km) - d.installed_odometer_km -
                (SELECT COALESCE(SUM(t.distance_km), 0) FROM trips t
                 WHERE t.vehicle_id = d.vehicle_id AND t.started_at >= d.installed_at AND t.started_at < ? AND (d.removed_at IS NULL OR t.started_at < d.removed_at))) AS untracked_km
         FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id
         WHERE d.id IN (${inList(ids)}) ORDER BY d.id`,
        [sqlDate(before)],
      );
    },

    /** Ids of dampers whose derived wear must be recomputed, in id order. */
    async dirtyDampers(): Promise<number[]> {
      const rows = await q<{ id: number }>(`SELECT id FROM dampers WHERE wear_dirty_from IS NOT NULL ORDER BY id`);
      return rows.map((r) => r.id);
    },

    /** What the wear recomputation needs for each damper. */
    async damperContext(ids: number[]): Promise<DamperContext[]> {
      specsOnce ??= this.specAxles();
      const [specs, rows] = await Promise.all([
        specsOnce,
        q<{ id: number; vehicle_id: number; installed_at: string; spec_id: number; axle_index: number; opening_km: number | null }>(
          `SELECT d.id, d.vehicle_id, d.installed_at, v.spec_id, d.axle_index, d.opening_km
           FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id WHERE d.id IN (${inList(ids)}) ORDER BY d.id`,
        ),
      ]);
      const out: DamperContext[] = [];
      for (const r of rows) {
        const axle = specs.get(r.spec_id)?.find((a) => a.axleIndex === r.axle_index);
        if (!axle) continue;
        out.push({ id: r.id, vehicleId: r.vehicle_id, specId: r.spec_id, axleIndex: r.axle_index, installedAt: r.installed_at, corner: axle.corner, ratedDamperLifeKm: axle.ratedDamperLifeKm, untrackedKm: r.opening_km });
      }
      return out;
    },

    /** The last stored wear day before each dirty damper's dirty day. */
    async wearBeforeDirty(ids: number[]) {
      return q<{ damper_id: number; cum_km: number; cum_energy_j: number; cum_wear_km: number; cum_spring_damage: number }>(
        `SELECT w.damper_id, w.cum_km, w.cum_energy_j, w.cum_wear_km, w.cum_spring_damage FROM damper_wear_days w JOIN dampers d ON d.id = w.damper_id
         WHERE d.id IN (${inList(ids)}) AND w.day = (SELECT MAX(day) FROM damper_wear_days x WHERE x.damper_id = d.id AND x.day < d.wear_dirty_from)`,
      );
    },

    /**
     * Replaces dirty dampers' wear days from their dirty day on and updates their totals, clearing
     * the mark; stores their untracked distance first. Each damper's daily duty sums — distance,
     * energy, spring damage and wear km Σ km·severity^b — are accumulated in SQL onto its starting
     * wear (the last day kept, or zero): the same sums as {@link accumulateDays} in wear.ts,
     * without carrying every damper-day through this thread and back (a test checks the two agree).
     */
    async storeWear(dampers: WearStart[], now: Date, untracked: { damperId: number; km: number }[] = []) {
      const stamp = sqlDate(now);
      const ids = inList(dampers.map((d) => d.damperId));
      const start = jsonRows(dampers.map((d) => [d.damperId, d.vehicleId, d.cumKm, d.cumEnergyJ, d.cumWearKm, d.springDamage, d.b]));
      const startCols = ['id', 'vehicle_id', 'k0', 'e0', 'w0', 'f0', 'b'];
      let wearDays = 0;
      await sequelize.transaction(async (t) => {
        for (let i = 0; i < untracked.length; i += JSON_ROWS) {
          const part = untracked.slice(i, i + JSON_ROWS);
          await runSql(
            sequelize,
            `WITH o AS (${fromJsonRows(['id', 'km'])}) UPDATE dampers SET opening_km = o.km FROM o WHERE dampers.id = o.id`,
            [jsonRows(part.map((x) => [x.damperId, x.km]))],
            t,
          );
        }
        await runSql(
          sequelize,
          `DELETE FROM damper_wear_days WHERE rowid IN (SELECT w.rowid FROM damper_wear_days w JOIN dampers d ON d.id = w.damper_id WHERE d.id IN (${ids}) AND w.day >= d.wear_dirty_from)`,
          [],
          t,
        );
        wearDays = await runSql(
          sequelize,
          `INSERT INTO damper_wear_days (damper_id, day, vehicle_id, distance_km, energy_j, spring_damage, wear_km, cum_km, cum_energy_j, cum_wear_km, cum_spring_damage)
           WITH p AS (${fromJsonRows(startCols)}),
           daily AS (
             SELECT td.damper_id, td.trip_date AS day, SUM(td.distance_km) AS km, SUM(td.energy_j) AS e, SUM(td.spring_damage) AS f,
                    SUM(td.distance_km * pow(td.severity, p.b)) AS w
             FROM trip_duties td JOIN dampers d ON d.id = td.damper_id JOIN p ON p.id = td.damper_id
             WHERE td.damper_id IN (${ids}) AND td.trip_date >= d.wear_dirty_from
             GROUP BY td.damper_id, td.trip_date),
           cum AS (
             SELECT daily.*, p.k0 + SUM(daily.km) OVER w AS ck, p.e0 + SUM(daily.e) OVER w AS ce, p.w0 + SUM(daily.w) OVER w AS cw, p.f0 + SUM(daily.f) OVER w AS cf
             FROM daily JOIN p ON p.id = daily.damper_id
             WINDOW w AS (PARTITION BY daily.damper_id ORDER BY daily.day ROWS UNBOUNDED PRECEDING))
           SELECT cum.damper_id, cum.day, p.vehicle_id, cum.km, cum.e, cum.f, cum.w, cum.ck, cum.ce, cum.cw, cum.cf
           FROM cum JOIN p ON p.id = cum.damper_id`,
          [start],
          t,
        );
        // totals: the last wear day (recomputed or kept), else the starting wear
        await runSql(
          sequelize,
          `WITH p AS (${fromJsonRows(startCols)}),
           tot AS (
             SELECT p.id, COALESCE(l.cum_energy_j, p.e0) AS e, COALESCE(l.cum_spring_damage, p.f0) AS f, p.b
             FROM p LEFT JOIN damper_wear_days l ON l.damper_id = p.id AND l.day = (SELECT MAX(day) FROM damper_wear_days x WHERE x.damper_id = p.id))
           UPDATE dampers SET energy_j = tot.e, fatigue_damage = tot.f, wear_exponent = tot.b, wear_updated_at = ?, updated_at = ?, wear_dirty_from = NULL
           FROM tot WHERE dampers.id = tot.id`,
          [start, stamp, stamp],
          t,
        );
      });
      return wearDays;
    },

    /** Installed dampers (on non-retired vehicles) in id order, from `afterId`. */
    /** Fitted dampers of vehicles in service, by id after `afterId`; only those of `vehicleIds` when given. */
    async installedDamperIds(afterId: number, limit: number, vehicleIds?: number[]): Promise<number[]> {
      const only = vehicleIds ? `AND d.vehicle_id IN (${vehicleIds.map(() => '?').join(', ') || 'NULL'})` : '';
      const rows = await q<{ id: number }>(
        `SELECT d.id FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id WHERE d.removed_at IS NULL AND v.status != 'retired' AND d.id > ? ${only} ORDER BY d.id LIMIT ?`,
        [afterId, ...(vehicleIds ?? []), limit],
      );
      return rows.map((r) => r.id);
    },

    /**
     * Per damper, what its prediction rests on ({@link WearSummary}), from its wear days up to
     * `asOf`: window sums from the damper's own window start, the cumulative recorded wear on
     * its last day, and the first days its recorded wear km reached each of its four levels
     * (and its spring damage reached `springLevel`). One query per call that reads each damper's
     * window and last day through the (damper, day) key; the first days are looked up only for
     * dampers whose last day has reached the level (cumulative wear never falls), so the
     * nightly cost does not grow with the length of the history.
     */
    async wearSummaries(targets: { damperId: number; windowStart: string; levels: number[] }[], springLevel: number, asOf: string) {
      const out = new Map<number, WearSummary>();
      if (!targets.length) return out;
      const rows = await q<{
        damper_id: number; ww: number; wkm: number; wd: number; d0: string | null; d1: string | null; d2: string | null; d3: string | null; sp_day: string | null;
        cum_km: number; cum_wear_km: number; cum_spring_damage: number;
      }>(
        `WITH t AS (${fromJsonRows(['id', 'ws', 'l0', 'l1', 'l2', 'l3'], [], '?1')}),
         l AS (
           SELECT t.*, w.cum_km, w.cum_wear_km, w.cum_spring_damage
           FROM t JOIN damper_wear_days w ON w.damper_id = t.id
             AND w.day = (SELECT MAX(x.day) FROM damper_wear_days x WHERE x.damper_id = t.id AND x.day <= ?2)),
         s AS (
           SELECT w.damper_id, SUM(w.wear_km) AS ww, SUM(w.distance_km) AS wkm, SUM(w.spring_damage) AS wd
           FROM t JOIN damper_wear_days w ON w.damper_id = t.id AND w.day >= t.ws AND w.day <= ?2
           GROUP BY w.damper_id)
         SELECT l.id AS damper_id, COALESCE(s.ww, 0) AS ww, COALESCE(s.wkm, 0) AS wkm, COALESCE(s.wd, 0) AS wd,
                ${[0, 1, 2, 3]
                  .map(
                    (k) => `CASE WHEN l.cum_wear_km >= l.l${k}
                  THEN (SELECT MIN(x.day) FROM damper_wear_days x WHERE x.damper_id = l.id AND x.day <= ?2 AND x.cum_wear_km >= l.l${k}) END AS d${k},`,
                  )
                  .join('\n')}
                CASE WHEN l.cum_spring_damage >= ?3
                  THEN (SELECT MIN(x.day) FROM damper_wear_days x WHERE x.damper_id = l.id AND x.day <= ?2 AND x.cum_spring_damage >= ?3) END AS sp_day,
                l.cum_km, l.cum_wear_km, l.cum_spring_damage
         FROM l LEFT JOIN s ON s.damper_id = l.id`,
        [jsonRows(targets.map((t) => [t.damperId, t.windowStart, ...t.levels])), asOf, springLevel],
      );
      for (const r of rows) {
        out.set(r.damper_id, {
          windowWearKm: r.ww,
          windowKm: r.wkm,
          windowSpringDamage: r.wd,
          cumKm: r.cum_km,
          cumWearKm: r.cum_wear_km,
          springDamage: r.cum_spring_damage,
          levelDays: [r.d0, r.d1, r.d2, r.d3],
          springThresholdDay: r.sp_day,
        });
      }
      return out;
    },

    /** Per damper, its recorded distance and wear km up to `asOf` (the last wear day's sums). */
    async recordedTotals(ids: number[], asOf: string) {
      if (!ids.length) return new Map<number, { cumKm: number; cumWearKm: number }>();
      const rows = await q<{ damper_id: number; cum_km: number; cum_wear_km: number }>(
        `SELECT w.damper_id, w.cum_km, w.cum_wear_km FROM damper_wear_days w
         WHERE w.damper_id IN (${inList(ids)}) AND w.day = (SELECT MAX(x.day) FROM damper_wear_days x WHERE x.damper_id = w.damper_id AND x.day <= ?)`,
        [asOf],
      );
      return new Map(rows.map((r) => [r.damper_id, { cumKm: r.cum_km, cumWearKm: r.cum_wear_km }]));
    },

    async storePredictions(rows: (Prediction & { damperId: number; vehicleId: number })[]) {
      await sequelize.transaction(async (t) => {
        await insertRows(
          sequelize,
          'damper_predictions',
          [
            'damper_id', 'vehicle_id', 'as_of', 'window_days', 'window_km', 'window_wear_km', 'wear_km_per_day', 'km_per_day', 'life_wear_km', 'life_p10_wear_km',
            'life_p90_wear_km', 'road_sensitivity', 'life_source', 'wear_km', 'life_used_fraction', 'distance_life_used', 'calendar_life_used', 'opening_km',
            'opening_share', 'opening_share_low', 'opening_share_high', 'damping_ns_per_m', 'threshold_fraction', 'schedule_quantile', 'threshold_date',
            'end_of_life_date', 'end_of_life_p10_date', 'end_of_life_p90_date', 'governed_by', 'spring_damage', 'spring_rate_per_day', 'spring_threshold_date', 'basis',
          ],
          rows.map((p) => [
            p.damperId, p.vehicleId, p.asOf, p.windowDays, p.windowKm, p.windowWearKm, p.wearKmPerDay, p.kmPerDay, p.life.medianWearKm, p.life.p10WearKm,
            p.life.p90WearKm, p.life.b, p.life.source, p.wearKm, p.lifeUsedFraction, p.distanceLifeUsed, p.calendarLifeUsed, p.opening.km,
            p.openingShare, p.openingShareLow, p.openingShareHigh, p.dampingNsPerM, p.thresholdFraction, p.scheduleQuantile, p.thresholdDate,
            p.endOfLifeDate, p.endOfLifeP10Date, p.endOfLifeP90Date, p.governedBy, p.springDamage, p.springRatePerDay, p.springThresholdDate, JSON.stringify(p.basis),
          ]),
          t,
          { orReplace: true },
        );
        // the damper's own totals follow its prediction
        for (let i = 0; i < rows.length; i += JSON_ROWS) {
          const part = rows.slice(i, i + JSON_ROWS);
          await runSql(
            sequelize,
            `WITH p AS (${fromJsonRows(['id', 'w', 'u', 'c', 'b'])})
             UPDATE dampers SET wear_km = p.w, life_used_fraction = p.u, damping_ns_per_m = p.c, opening_basis = p.b FROM p WHERE dampers.id = p.id`,
            [jsonRows(part.map((p) => [p.damperId, p.wearKm, p.lifeUsedFraction, p.dampingNsPerM, p.opening.basis]))],
            t,
          );
        }
      });
    },

    /** Removes predictions of dampers no longer fitted (or on retired vehicles). */
    async dropStalePredictions() {
      await runSql(
        sequelize,
        `DELETE FROM damper_predictions WHERE damper_id IN (SELECT d.id FROM dampers d JOIN vehicles v ON v.id = d.vehicle_id WHERE d.removed_at IS NOT NULL OR v.status = 'retired')`,
      );
    },
  };
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
