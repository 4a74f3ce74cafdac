import { DataTypes, type QueryInterface } from 'sequelize';
import { num } from './columns';

/**
 * Damper life model: the duty records gain the damper's duty measure (rod sliding distance
 * and road severity); the wear days and predictions are rebuilt in wear km (distance weighted
 * by road severity) against a life fitted per spec (`life_models`); dampers keep the road
 * sensitivity their wear days were summed with and their untracked distance. The derived
 * tables are emptied and every trip is marked for processing, so the next nightly run
 * recomputes everything under the new measure.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.sequelize.query('DELETE FROM trip_duties');
  await qi.addColumn('trip_duties', 'sliding_m', { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 });
  await qi.addColumn('trip_duties', 'severity', { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 1 });
  await qi.sequelize.query('UPDATE trips SET processed_at = NULL');

  await qi.dropTable('damper_wear_days');
  await qi.createTable('damper_wear_days', {
    damper_id: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true, references: { model: 'dampers', key: 'id' }, onDelete: 'CASCADE' },
    day: { type: DataTypes.DATEONLY, allowNull: false, primaryKey: true },
    vehicle_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'vehicles', key: 'id' }, onDelete: 'CASCADE' },
    distance_km: num(),
    energy_j: num(),
    spring_damage: num(),
    wear_km: num(),
    cum_km: num(),
    cum_energy_j: num(),
    cum_wear_km: num(),
    cum_spring_damage: num(),
  });

  await qi.dropTable('damper_predictions');
  await qi.createTable('damper_predictions', {
    damper_id: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true, references: { model: 'dampers', key: 'id' }, onDelete: 'CASCADE' },
    vehicle_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'vehicles', key: 'id' }, onDelete: 'CASCADE' },
    as_of: { type: DataTypes.DATEONLY, allowNull: false },
    window_days: { type: DataTypes.INTEGER, allowNull: false },
    window_km: num(),
    window_wear_km: num(),
    wear_km_per_day: num(),
    km_per_day: num(),
    life_wear_km: num(),
    life_p10_wear_km: num(),
    life_p90_wear_km: num(),
    road_sensitivity: num(),
    life_source: { type: DataTypes.STRING(20), allowNull: false },
    wear_km: num(),
    life_used_fraction: num(),
    distance_life_used: num(),
    calendar_life_used: num(),
    opening_km: num(),
    opening_share: num(),
    opening_share_low: num(),
    opening_share_high: num(),
    damping_ns_per_m: num(),
    threshold_fraction: num(),
    schedule_quantile: num(),
    threshold_date: { type: DataTypes.DATEONLY, allowNull: true },
    end_of_life_date: { type: DataTypes.DATEONLY, allowNull: true },
    end_of_life_p10_date: { type: DataTypes.DATEONLY, allowNull: true },
    end_of_life_p90_date: { type: DataTypes.DATEONLY, allowNull: true },
    governed_by: { type: DataTypes.STRING(12), allowNull: false },
    spring_damage: num(),
    spring_rate_per_day: num(),
    spring_threshold_date: { type: DataTypes.DATEONLY, allowNull: true },
    basis: { type: DataTypes.TEXT, allowNull: false },
  });
  await qi.addIndex('damper_predictions', ['vehicle_id']);
  await qi.addIndex('damper_predictions', ['threshold_date']);

  await qi.addColumn('dampers', 'wear_km', { type: DataTypes.DOUBLE, allowNull: true });
  await qi.addColumn('dampers', 'wear_exponent', { type: DataTypes.DOUBLE, allowNull: true });
  await qi.sequelize.query('UPDATE dampers SET wear_dirty_from = installed_at, opening_km = NULL, energy_j = 0, fatigue_damage = 0, life_used_fraction = 0');

  // the damper's wear km when a test-lane result was recorded: its calibration rests on it
  await qi.addColumn('inspection_corners', 'wear_km_at_test', { type: DataTypes.DOUBLE, allowNull: true });

  await qi.createTable('life_models', {
    spec_id: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true, references: { model: 'suspension_specs', key: 'id' }, onDelete: 'CASCADE' },
    model: { type: DataTypes.TEXT, allowNull: false },
    failures: { type: DataTypes.INTEGER, allowNull: false },
    suspensions: { type: DataTypes.INTEGER, allowNull: false },
    fitted_at: { type: DataTypes.DATE, allowNull: false },
  });
}

export async function down() {
  throw new Error('the damper life model migration cannot be undone: restore the database from a backup taken before it');
}
