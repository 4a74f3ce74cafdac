/** The wear history's storage: which dampers to recompute, from where, and the daily wear rows written for them. */
import type { Sequelize } from 'sequelize';
import { JSON_ROWS, fromJsonRows, inList, jsonRows, runSql, selectRows } from '../db/raw';
import { sqlFor } from '../db/dialect';
import { sqlStamp as sqlDate } from '../lib/days';
import type { DamperContext, WearRepoShared, WearStart } from './repository';
import { summaryWearSql } from './duty-summary';

export function historyRepository(sequelize: Sequelize, shared: WearRepoShared) {
  const { q } = shared;
  const words = sqlFor(sequelize);
  return {
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
        `SELECT d.id, ${words.greatest}(0, COALESCE(d.removed_odometer_km, v.odometer_km) - d.installed_odometer_km -
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
      const [specs, rows] = await Promise.all([
        shared.specAxles(),
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
     * the mark; stores their untracked distance first. The duty is the per-trip rows still kept
     * and the daily summary of those folded (duty-summary.ts). Each damper's daily duty sums — distance,
     * energy, spring damage and wear km Σ km·severity^b — are accumulated in SQL onto its starting
     * wear (the last day kept, or zero): the same sums as {@link accumulateDays} in wear.ts,
     * without carrying every damper-day through this thread and back (a test checks the two agree).
     * Returns the wear days written and the duty rows (per-trip and summary) they were summed
     * from, the work a night's wear phase does.
     */
    async storeWear(dampers: WearStart[], now: Date, untracked: { damperId: number; km: number }[] = []): Promise<{ wearDays: number; dutyRowsRead: number }> {
      const stamp = sqlDate(now);
      const ids = inList(dampers.map((d) => d.damperId));
      const start = jsonRows(dampers.map((d) => [d.damperId, d.vehicleId, d.cumKm, d.cumEnergyJ, d.cumWearKm, d.springDamage, d.b]));
      const startCols = ['id integer', 'vehicle_id integer', ...['k0', 'e0', 'w0', 'f0', 'b'].map((c) => `${c} double precision`)];
      let wearDays = 0;
      let dutyRowsRead = 0;
      await sequelize.transaction(async (t) => {
        for (let i = 0; i < untracked.length; i += JSON_ROWS) {
          const part = untracked.slice(i, i + JSON_ROWS);
          await runSql(
            sequelize,
            `WITH o AS (${fromJsonRows(sequelize, ['id integer', 'km double precision'])}) UPDATE dampers SET opening_km = o.km FROM o WHERE dampers.id = o.id`,
            [jsonRows(part.map((x) => [x.damperId, x.km]))],
            t,
          );
        }
        await runSql(
          sequelize,
          `DELETE FROM damper_wear_days WHERE ${words.rowId} IN (SELECT w.${words.rowId} FROM damper_wear_days w JOIN dampers d ON d.id = w.damper_id WHERE d.id IN (${ids}) AND w.day >= d.wear_dirty_from)`,
          [],
          t,
        );
        const [read] = await selectRows<{ n: number }>(
          sequelize,
          `SELECT (SELECT COUNT(*) FROM trip_duties td JOIN dampers d ON d.id = td.damper_id WHERE d.id IN (${ids}) AND td.trip_date >= d.wear_dirty_from)
                + (SELECT COUNT(*) FROM trip_duty_days s JOIN dampers d ON d.id = s.damper_id WHERE d.id IN (${ids}) AND s.day >= d.wear_dirty_from) AS n`,
          [],
          t,
        );
        dutyRowsRead = Number(read?.n ?? 0);
        wearDays = await runSql(
          sequelize,
          `INSERT INTO damper_wear_days (damper_id, day, vehicle_id, distance_km, energy_j, spring_damage, wear_km, cum_km, cum_energy_j, cum_wear_km, cum_spring_damage)
           WITH p AS (${fromJsonRows(sequelize, startCols)}),
           daily AS (
             SELECT u.damper_id, u.day, ${words.sumInOrder('u.km')} AS km, ${words.sumInOrder('u.e')} AS e, ${words.sumInOrder('u.f')} AS f, ${words.sumInOrder('u.w')} AS w
             FROM (
               SELECT td.damper_id, td.trip_date AS day, td.distance_km AS km, td.energy_j AS e, td.spring_damage AS f, td.distance_km * pow(td.severity, p.b) AS w
               FROM trip_duties td JOIN dampers d ON d.id = td.damper_id JOIN p ON p.id = td.damper_id
               WHERE td.damper_id IN (${ids}) AND td.trip_date >= d.wear_dirty_from
               UNION ALL
               SELECT s.damper_id, s.day, s.distance_km, s.energy_j, s.spring_damage, ${summaryWearSql('s', 'p.b')}
               FROM trip_duty_days s JOIN dampers d ON d.id = s.damper_id JOIN p ON p.id = s.damper_id
               WHERE s.damper_id IN (${ids}) AND s.day >= d.wear_dirty_from) u
             GROUP BY u.damper_id, u.day),
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
          `WITH p AS (${fromJsonRows(sequelize, startCols)}),
           tot AS (
             SELECT p.id, COALESCE(l.cum_energy_j, p.e0) AS e, COALESCE(l.cum_spring_damage, p.f0) AS f, p.b
             FROM p LEFT JOIN damper_wear_days l ON l.damper_id = p.id AND l.day = (SELECT MAX(day) FROM damper_wear_days x WHERE x.damper_id = p.id))
           UPDATE dampers SET energy_j = tot.e, fatigue_damage = tot.f, wear_exponent = tot.b, wear_updated_at = ?, updated_at = ?, wear_dirty_from = NULL
           FROM tot WHERE dampers.id = tot.id`,
          [start, stamp, stamp],
          t,
        );
      });
      return { wearDays, dutyRowsRead };
    },
  };
}
