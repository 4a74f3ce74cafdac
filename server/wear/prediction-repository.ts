/** The predictions' storage: the fitted dampers to predict, their wear summaries and recorded totals, and the prediction rows. */
import type { Sequelize } from 'sequelize';
import { fromJsonRows, inList, insertPackedRows, jsonRows, runSql } from '../db/raw';
import { sqlFor } from '../db/dialect';
import { type WearSummary } from './wear';
import { PREDICTION_COLUMNS, type PackedPredictions } from './prediction-rows';
import type { WearRepoShared } from './repository';

export function predictionRepository(sequelize: Sequelize, shared: WearRepoShared) {
  const { q } = shared;
  const { sumInOrder } = sqlFor(sequelize);
  return {
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
        `WITH t AS (${fromJsonRows(sequelize, ['id integer', 'ws date', ...['l0', 'l1', 'l2', 'l3'].map((c) => `${c} double precision`)], [], '?1')}),
         l AS (
           SELECT t.*, w.cum_km, w.cum_wear_km, w.cum_spring_damage
           FROM t JOIN damper_wear_days w ON w.damper_id = t.id
             AND w.day = (SELECT MAX(x.day) FROM damper_wear_days x WHERE x.damper_id = t.id AND x.day <= ?2)),
         s AS (
           SELECT w.damper_id, ${sumInOrder('w.wear_km', 'w.day')} AS ww, ${sumInOrder('w.distance_km', 'w.day')} AS wkm, ${sumInOrder('w.spring_damage', 'w.day')} AS wd
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

    /** Stores a chunk's predictions, packed by prediction-rows.ts, and the dampers' totals that follow them, in one transaction. */
    async storePredictions(packed: Pick<PackedPredictions, 'predictions' | 'totals' | 'count'>) {
      if (!packed.count) return;
      await sequelize.transaction(async (t) => {
        await insertPackedRows(sequelize, 'damper_predictions', PREDICTION_COLUMNS, [{ json: packed.predictions, count: packed.count }], t, { orReplace: true });
        // the damper's own totals follow its prediction
        await runSql(
          sequelize,
          `WITH p AS (${fromJsonRows(sequelize, ['id integer', ...['w', 'u', 'c'].map((c) => `${c} double precision`), 'b text'])})
           UPDATE dampers SET wear_km = p.w, life_used_fraction = p.u, damping_ns_per_m = p.c, opening_basis = p.b FROM p WHERE dampers.id = p.id`,
          [packed.totals],
          t,
        );
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
