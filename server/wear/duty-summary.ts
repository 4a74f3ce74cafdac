/**
 * The duty history past the per-trip window (TRIP_DUTY_RETENTION_DAYS), in two summaries;
 * migration 0019 says what each column holds:
 *
 * - `trip_duty_days`, per damper (or corner without one), day and severity band, and
 *   `damper_route_totals`, per damper and route over all days folded: the per-trip rows of a day
 *   older than the window are folded into both and deleted. The wear recompute reads the rows
 *   still in `trip_duties` with the first, the vehicle page's duty by route with the second, so
 *   what they compute does not depend on the window.
 * - `damper_severity_bins`, per corner, damper and severity band, Σ km and Σ km·ln(severity) over
 *   all duty ever stored: added to in the same transaction as each batch of duty records
 *   ({@link addToSeverityBins}), never by the fold, so the life models' refit and the back-test
 *   read the same numbers whatever the window, and read no history.
 *
 * The fold runs one day at a time, oldest first, in transactions of at most a batch's worth of
 * rows (NIGHTLY_BATCH_TRIPS trips' four corners) that add the rows to the summaries and delete
 * them: a run killed in the middle leaves each row either folded or in place, never both, and
 * the next run carries on (a run with nothing older than the window changes nothing). Duty
 * folded is no longer per trip: a trip of a folded day must not be processed again (its duty
 * would count twice).
 */
import type { Sequelize, Transaction } from 'sequelize';
import { inList, runSql, selectRows } from '../db/raw';
import { plusDays } from '../lib/days';

/** Severity bands of the summaries and of the life fit: ln(severity) rounded to steps of 1/this. */
export const SEVERITY_BANDS_PER_LN = 8;

/** The band of a per-trip severity, as SQL (NULL for a severity that is not positive). */
export const severityBandSql = (s: string) => `CASE WHEN ${s} > 0 THEN CAST(ROUND(ln(${s}) * ${SEVERITY_BANDS_PER_LN}) AS INTEGER) END`;

/** Powers of the deviation from the band centre kept per summary row (km_dev1 … km_dev7). */
const DEVIATION_POWERS = [1, 2, 3, 4, 5, 6, 7];

/**
 * Wear km Σ km·s^b of a `trip_duty_days` row (alias `s`) for the road sensitivity given as SQL:
 * e^(b·c)·(km + Σⱼ bʲ/j!·km_devⱼ) with c the band centre, by Horner's rule. The series is cut after
 * j = 7: with |δ| ≤ 1/16 and b ≤ 1.25 the rest is below 4e-14 of the sum. Rows of non-positive
 * severity (band NULL) wear as pow(0, b): nothing, or their distance when b = 0.
 */
export function summaryWearSql(s: string, b: string): string {
  let horner = `${s}.km_dev7`;
  for (let j = 6; j >= 1; j--) horner = `${s}.km_dev${j} + ${b} / ${j + 1}.0 * (${horner})`;
  return `CASE WHEN ${s}.severity_bin IS NULL THEN (CASE WHEN ${b} = 0 THEN ${s}.distance_km ELSE 0 END)
    ELSE exp(${b} * ${s}.severity_bin / ${SEVERITY_BANDS_PER_LN}.0) * (${s}.distance_km + ${b} * (${horner})) END`;
}

/** The first day whose per-trip duty is kept on the run's day `asOf` with a window of `days` days. */
export const retentionStart = (asOf: string, days: number) => plusDays(asOf, -(days - 1));

export function dutySummaryRepository(sequelize: Sequelize) {
  const dev = `CASE WHEN td.severity > 0 THEN ln(td.severity) - ROUND(ln(td.severity) * ${SEVERITY_BANDS_PER_LN}) / ${SEVERITY_BANDS_PER_LN}.0 ELSE 0 END`;
  // the rows of one chunk: `rows` is a list of trip_duties ids
  const foldDays = (rows: string) => `INSERT INTO trip_duty_days (damper_id, vehicle_id, position, axle_index, day, severity_bin, records, distance_km, energy_j, spring_damage, ${DEVIATION_POWERS.map((j) => `km_dev${j}`).join(', ')})
    SELECT damper_id, vehicle_id, position, axle_index, trip_date, band, COUNT(*), SUM(distance_km), SUM(energy_j), SUM(spring_damage),
           ${DEVIATION_POWERS.map((j) => `SUM(distance_km${' * dv'.repeat(j)})`).join(', ')}
    FROM (SELECT td.damper_id, td.vehicle_id, td.position, td.axle_index, td.trip_date, td.distance_km, td.energy_j, td.spring_damage,
                 ${severityBandSql('td.severity')} AS band, ${dev} AS dv
          FROM trip_duties td WHERE td.id IN (${rows})) x
    GROUP BY damper_id, vehicle_id, position, axle_index, trip_date, band`;
  const foldRoutes = (rows: string) => `INSERT INTO damper_route_totals (damper_id, route_id, axle_index, records, distance_km, km_severity, energy_j, spring_damage, weighted_accel_sum)
    SELECT td.damper_id, td.route_id, MIN(td.axle_index), COUNT(*), SUM(td.distance_km), SUM(td.distance_km * td.severity), SUM(td.energy_j), SUM(td.spring_damage), SUM(td.rms_weighted_accel)
    FROM trip_duties td WHERE td.id IN (${rows}) AND td.damper_id IS NOT NULL
    GROUP BY td.damper_id, td.route_id
    ON CONFLICT (damper_id, route_id) DO UPDATE SET records = damper_route_totals.records + excluded.records,
      distance_km = damper_route_totals.distance_km + excluded.distance_km, km_severity = damper_route_totals.km_severity + excluded.km_severity,
      energy_j = damper_route_totals.energy_j + excluded.energy_j, spring_damage = damper_route_totals.spring_damage + excluded.spring_damage,
      weighted_accel_sum = damper_route_totals.weighted_accel_sum + excluded.weighted_accel_sum`;
  return {
    /** The oldest day with per-trip duty (null when there is none). */
    async oldestDutyDay(): Promise<string | null> {
      const [r] = await selectRows<{ d: string | null }>(sequelize, `SELECT MIN(trip_date) AS d FROM trip_duties`);
      return r?.d ? String(r.d).slice(0, 10) : null;
    },

    /**
     * Folds up to `maxRows` per-trip rows of a day into `trip_duty_days` and
     * `damper_route_totals` and deletes them, in one transaction: the per-trip rows folded (fewer
     * than `maxRows` when the day is done) and the summary rows written. Every reader sums the
     * per-trip rows and the summaries together, so a day folded in part reads as a whole.
     */
    async foldChunk(day: string, maxRows: number): Promise<{ folded: number; summaryRows: number }> {
      return sequelize.transaction(async (t) => {
        const ids = (await selectRows<{ id: number }>(sequelize, `SELECT id FROM trip_duties WHERE trip_date = ? LIMIT ?`, [day, maxRows], t)).map((r) => r.id);
        if (!ids.length) return { folded: 0, summaryRows: 0 };
        const rows = inList(ids);
        const summaryRows = (await runSql(sequelize, foldDays(rows), [], t)) + (await runSql(sequelize, foldRoutes(rows), [], t));
        const folded = await runSql(sequelize, `DELETE FROM trip_duties WHERE id IN (${rows})`, [], t);
        return { folded, summaryRows };
      });
    },
  };
}

/**
 * Adds the duty records of these trips (just stored, in the caller's transaction) to the
 * running severity totals: per corner, damper (0 where none was fitted) and band, Σ km and
 * Σ km·ln(severity) of the records of positive severity. Resolves to the totals written.
 */
export async function addToSeverityBins(sequelize: Sequelize, tripIds: readonly number[], transaction: Transaction): Promise<number> {
  if (!tripIds.length) return 0;
  return runSql(
    sequelize,
    `INSERT INTO damper_severity_bins (vehicle_id, position, damper_id, severity_bin, distance_km, km_ln_severity)
     SELECT td.vehicle_id, td.position, COALESCE(td.damper_id, 0), ${severityBandSql('td.severity')}, SUM(td.distance_km), SUM(td.distance_km * ln(td.severity))
     FROM trip_duties td WHERE td.trip_id IN (${inList(tripIds)}) AND td.severity > 0
     GROUP BY td.vehicle_id, td.position, COALESCE(td.damper_id, 0), ${severityBandSql('td.severity')}
     ON CONFLICT (vehicle_id, position, damper_id, severity_bin)
     DO UPDATE SET distance_km = damper_severity_bins.distance_km + excluded.distance_km, km_ln_severity = damper_severity_bins.km_ln_severity + excluded.km_ln_severity`,
    [],
    transaction,
  );
}
