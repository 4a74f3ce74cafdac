/** The nightly duty phase's storage: which trips to process, the specs, routes and dampers they need, and the batch writes of duty and wear added. */
import type { Sequelize } from 'sequelize';
import { JSON_ROWS, fromJsonRows, inList, insertPackedRows, jsonRows, runSql } from '../db/raw';
import type { CornerParams } from '../physics/types';
import { TRIP_DUTY_COLUMNS, type AxleInput, type DamperSpan, type TripInput, type WearDelta } from './duty';
import { allSegments, routeVersions, type DatedRoute, type SegmentBase } from './roughness-as-of';
import type { ObservationValue } from '../roads/current-roughness';
import type { RoughnessSource } from '../db/models';
import { sqlStamp as sqlDate, localDay } from '../lib/days';
import type { VehiclePlan, WearRepoShared } from './repository';
import { addToSeverityBins } from './duty-summary';

export function dutyRepository(sequelize: Sequelize, q: WearRepoShared['q']) {
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

    /**
     * Unprocessed trips of the vehicles before `before`, in (vehicle, start, id) order. Read from
     * the batch's vehicles, each one's trips by the (vehicle, start) index: CROSS JOIN holds
     * SQLite to that order, which left to itself takes the processed-at index and reads every
     * unprocessed trip of the fleet for each batch.
     */
    async unprocessedTrips(vehicleIds: number[], before: Date, timeZone: string): Promise<Map<number, TripInput[]>> {
      const rows = await q<{ id: number; vehicle_id: number; route_id: number; driver_id: number | null; started_at: string; ended_at: string; distance_km: number; mean_speed_kmh: number; payload_kg: number | null }>(
        `SELECT t.id, t.vehicle_id, t.route_id, t.driver_id, t.started_at, t.ended_at, t.distance_km, t.mean_speed_kmh, t.payload_kg FROM vehicles v CROSS JOIN trips t
         WHERE t.vehicle_id = v.id AND v.id IN (${inList(vehicleIds)}) AND t.processed_at IS NULL AND t.started_at < ? ORDER BY t.vehicle_id, t.started_at, t.id`,
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
     * Stores one batch in one transaction: the duty records, their sums in the running severity
     * totals (duty-summary.ts), the trips' processed mark and the dampers' "recompute from" day.
     * A crash before COMMIT leaves none of it. Resolves to the severity totals written.
     */
    async storeBatch(batch: { duties: { json: string; count: number }[]; wear: WearDelta[]; processedTripIds: number[]; now: Date; runId: number }): Promise<number> {
      const stamp = sqlDate(batch.now);
      let bins = 0;
      await sequelize.transaction(async (t) => {
        await insertPackedRows(sequelize, 'trip_duties', TRIP_DUTY_COLUMNS, batch.duties, t, { fixed: { job_run_id: null, created_at: stamp, updated_at: stamp } });
        for (let i = 0; i < batch.processedTripIds.length; i += 5000) {
          const ids = batch.processedTripIds.slice(i, i + 5000);
          bins += await addToSeverityBins(sequelize, ids, t);
          await runSql(sequelize, `UPDATE trips SET processed_at = ?, updated_at = ? WHERE id IN (${inList(ids)})`, [stamp, stamp], t);
        }
        for (let i = 0; i < batch.wear.length; i += JSON_ROWS) {
          const part = batch.wear.slice(i, i + JSON_ROWS);
          await runSql(
            sequelize,
            `WITH d AS (${fromJsonRows(sequelize, ['id integer', 'first date'])})
             UPDATE dampers SET wear_dirty_from = CASE WHEN wear_dirty_from IS NULL OR wear_dirty_from > d.first THEN d.first ELSE wear_dirty_from END
             FROM d WHERE dampers.id = d.id`,
            [jsonRows(part.map((w) => [w.damperId, w.firstDay]))],
            t,
          );
        }
      });
      return bins;
    },
  };
}
