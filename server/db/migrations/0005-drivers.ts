import { DataTypes, type QueryInterface } from 'sequelize';
import { fk, id, ts } from './columns';

/**
 * Drivers: harsh-ride reports filed from the road (snapped to a route segment, with a
 * photo kept under DATA_DIR) and the manager's decision on each; each driver's daily vibration
 * exposure A(8), computed by the nightly job from the front-axle duty of their trips.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('ride_reports', {
    id,
    driver_id: fk('users', false, 'CASCADE'),
    vehicle_id: fk('vehicles', true, 'SET NULL'),
    route_id: fk('routes', false, 'CASCADE'),
    segment_id: fk('route_segments', false, 'CASCADE'),
    /** Where the driver was (WGS 84 degrees) and how it was given: gps | map. */
    lat: { type: DataTypes.DOUBLE, allowNull: false },
    lon: { type: DataTypes.DOUBLE, allowNull: false },
    position_source: { type: DataTypes.STRING(8), allowNull: false },
    accuracy_m: { type: DataTypes.DOUBLE, allowNull: true },
    /** The nearest point on the segment and how far the report was moved to it [m]. */
    snapped_lat: { type: DataTypes.DOUBLE, allowNull: false },
    snapped_lon: { type: DataTypes.DOUBLE, allowNull: false },
    snap_distance_m: { type: DataTypes.DOUBLE, allowNull: false },
    /** 1 uneven, 2 harsh, 3 severe (server/drivers/ride-scale.ts). */
    severity: { type: DataTypes.INTEGER, allowNull: false },
    /** JSON array of what the driver felt (codes from ride-scale.ts). */
    felt: { type: DataTypes.TEXT, allowNull: false, defaultValue: '[]' },
    note: { type: DataTypes.STRING(1000), allowNull: true },
    /** Photo path relative to DATA_DIR, its detected type and size. */
    photo_path: { type: DataTypes.STRING(200), allowNull: true },
    photo_type: { type: DataTypes.STRING(40), allowNull: true },
    photo_bytes: { type: DataTypes.INTEGER, allowNull: true },
    reported_at: { type: DataTypes.DATE, allowNull: false },
    status: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'new' },
    decided_by_id: fk('users', true, 'SET NULL'),
    decided_at: { type: DataTypes.DATE, allowNull: true },
    dismiss_reason: { type: DataTypes.STRING(500), allowNull: true },
    /** Class before the decision and the estimate the accepted report stands for. */
    class_before: { type: DataTypes.STRING(1), allowNull: true },
    estimated_class: { type: DataTypes.STRING(1), allowNull: true },
    estimated_gd_n0: { type: DataTypes.DOUBLE, allowNull: true },
    observation_id: fk('roughness_observations', true, 'SET NULL'),
    /** When the severe report went into a manager digest. */
    digest_notified_at: { type: DataTypes.DATE, allowNull: true },
    ...ts,
  });
  await qi.addIndex('ride_reports', ['driver_id', 'reported_at']);
  await qi.addIndex('ride_reports', ['status', 'segment_id']);
  await qi.addIndex('ride_reports', ['segment_id']);

  // One row per driver and day with driving; recomputed deterministically from trip_duties.
  await qi.createTable('driver_exposure_days', {
    driver_id: { ...fk('users', false, 'CASCADE'), primaryKey: true },
    day: { type: DataTypes.DATEONLY, allowNull: false, primaryKey: true },
    /** Daily exposure A(8) [m/s²], Directive 2002/44/EC, vertical (k = 1). */
    a8: { type: DataTypes.DOUBLE, allowNull: false },
    hours: { type: DataTypes.DOUBLE, allowNull: false },
    trips: { type: DataTypes.INTEGER, allowNull: false },
    max_weighted_accel: { type: DataTypes.DOUBLE, allowNull: false },
    status: { type: DataTypes.STRING(24), allowNull: false },
    /** JSON: per trip { tripId, vehicleId, routeId, aw, hours } — what the day is made of. */
    parts: { type: DataTypes.TEXT, allowNull: false, defaultValue: '[]' },
    computed_at: { type: DataTypes.DATE, allowNull: false },
    /** When managers were told that this day exceeded the action value. */
    notified_at: { type: DataTypes.DATE, allowNull: true },
  });
  await qi.addIndex('driver_exposure_days', ['day', 'a8']);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('driver_exposure_days');
  await qi.dropTable('ride_reports');
}
