import { DataTypes, type QueryInterface } from 'sequelize';

const fk = (table: string, allowNull = false, onDelete = 'CASCADE') => ({
  type: DataTypes.INTEGER,
  allowNull,
  references: { model: table, key: 'id' },
  onUpdate: 'CASCADE',
  onDelete,
});
const num = () => ({ type: DataTypes.DOUBLE, allowNull: false });

/**
 * Per-trip duty is kept for a window of days (TRIP_DUTY_RETENTION_DAYS); the nightly job folds
 * older rows into a daily summary and deletes them, so `trip_duties` stops growing with the
 * history:
 *
 * - `trip_duty_days`: per damper (or corner without one), day and severity band, the records
 *   folded and their sums (distance, energy, spring damage) and `km_dev1…7` = Σ km·δʲ with δ = ln(severity) − band/8, the deviation from the band's centre
 *   (|δ| ≤ 1/16). Wear km Σ km·s^b for any road sensitivity b is then
 *   e^(b·band/8)·(km + Σⱼ bʲ/j!·km_devⱼ), to about 1e-14 of the per-trip sum for b ≤ 1.25: the
 *   wear recompute after the life model changes b reads these instead of the trips.
 * - `damper_route_totals`: per damper and route, the records folded and their sums (distance,
 *   Σ km·severity, energy, spring damage, Σ Wk-weighted RMS): the vehicle page's duty by route.
 * - `damper_severity_bins`: per corner and damper (0 where none was fitted) and severity band,
 *   Σ km and Σ km·ln(severity) over all duty ever stored, added to as each batch of duty is
 *   stored: what the life models' refit and the back-test sum, so the refit reads no history.
 *   Filled here from the duty already stored.
 *
 * The bands are those of the life fit (ln(severity) in steps of 1/8). The index on
 * (driver, day, axle) becomes one on (day, axle): the exposure step reads a range of days, and
 * the fold finds the oldest day, with the same number of indexes written per duty row.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('trip_duty_days', {
    damper_id: fk('dampers', true, 'SET NULL'),
    vehicle_id: fk('vehicles'),
    position: { type: DataTypes.STRING(4), allowNull: false },
    axle_index: { type: DataTypes.INTEGER, allowNull: false },
    day: { type: DataTypes.DATEONLY, allowNull: false },
    severity_bin: { type: DataTypes.INTEGER, allowNull: true },
    records: { type: DataTypes.INTEGER, allowNull: false },
    distance_km: num(),
    energy_j: num(),
    spring_damage: num(),
    km_dev1: num(),
    km_dev2: num(),
    km_dev3: num(),
    km_dev4: num(),
    km_dev5: num(),
    km_dev6: num(),
    km_dev7: num(),
  });
  await qi.addIndex('trip_duty_days', ['damper_id', 'day']);
  await qi.addIndex('trip_duty_days', ['vehicle_id']);

  await qi.createTable('damper_route_totals', {
    damper_id: { ...fk('dampers'), primaryKey: true },
    route_id: { ...fk('routes'), primaryKey: true },
    axle_index: { type: DataTypes.INTEGER, allowNull: false },
    records: { type: DataTypes.INTEGER, allowNull: false },
    distance_km: num(),
    km_severity: num(),
    energy_j: num(),
    spring_damage: num(),
    weighted_accel_sum: num(),
  });
  await qi.addIndex('damper_route_totals', ['route_id']);

  await qi.createTable('damper_severity_bins', {
    vehicle_id: { ...fk('vehicles'), primaryKey: true },
    position: { type: DataTypes.STRING(4), allowNull: false, primaryKey: true },
    damper_id: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true },
    severity_bin: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true },
    distance_km: num(),
    km_ln_severity: num(),
  });
  await qi.addIndex('damper_severity_bins', ['damper_id']);
  await qi.sequelize.query(
    `INSERT INTO damper_severity_bins (vehicle_id, position, damper_id, severity_bin, distance_km, km_ln_severity)
     SELECT vehicle_id, position, COALESCE(damper_id, 0), CAST(ROUND(ln(severity) * 8) AS INTEGER), SUM(distance_km), SUM(distance_km * ln(severity))
     FROM trip_duties WHERE severity > 0
     GROUP BY vehicle_id, position, COALESCE(damper_id, 0), CAST(ROUND(ln(severity) * 8) AS INTEGER)`,
  );

  await qi.removeIndex('trip_duties', ['driver_id', 'trip_date', 'axle_index']);
  await qi.addIndex('trip_duties', ['trip_date', 'axle_index']);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeIndex('trip_duties', ['trip_date', 'axle_index']);
  await qi.addIndex('trip_duties', ['driver_id', 'trip_date', 'axle_index']);
  await qi.dropTable('damper_severity_bins');
  await qi.dropTable('damper_route_totals');
  await qi.dropTable('trip_duty_days');
}
