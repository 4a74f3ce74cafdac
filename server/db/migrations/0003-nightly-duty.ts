import { DataTypes, type QueryInterface } from 'sequelize';
import { fk, id, num, ts } from './columns';

/**
 * The nightly damper-duty job: duty per trip and corner, each damper's daily wear
 * history and latest prediction, job runs and the run lock, outgoing and caught mail, the
 * scheduling columns of inspections and users' notification preferences.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  // One row per trip × corner. Everything in SI units; `rms_weighted_accel` is the ISO 2631-1
  // Wk-weighted RMS body acceleration on that corner (axle_index 0 = front axle, the one nearest
  // the driver: the exposure step reads it).
  await qi.createTable('trip_duties', {
    id,
    trip_id: fk('trips', false, 'CASCADE'),
    vehicle_id: fk('vehicles', false, 'CASCADE'),
    damper_id: fk('dampers', true, 'SET NULL'),
    route_id: fk('routes', false, 'CASCADE'),
    driver_id: fk('users', true, 'SET NULL'),
    position: { type: DataTypes.STRING(4), allowNull: false },
    axle_index: { type: DataTypes.INTEGER, allowNull: false },
    trip_date: { type: DataTypes.DATEONLY, allowNull: false },
    distance_km: num(),
    duration_s: num(),
    sprung_mass_kg: num(),
    energy_j: num(),
    mean_power_w: num(),
    rms_relative_velocity: num(),
    rms_suspension_travel: num(),
    rms_tire_load_ratio: num(),
    rms_body_accel: num(),
    rms_weighted_accel: num(),
    spring_damage: num(),
    segments: { type: DataTypes.INTEGER, allowNull: false },
    profiled_segments: { type: DataTypes.INTEGER, allowNull: false },
    unrated_segments: { type: DataTypes.INTEGER, allowNull: false },
    job_run_id: { type: DataTypes.INTEGER, allowNull: true },
    ...ts,
  });
  await qi.addIndex('trip_duties', ['trip_id', 'position'], { unique: true });
  await qi.addIndex('trip_duties', ['damper_id', 'trip_date']);
  await qi.addIndex('trip_duties', ['vehicle_id', 'trip_date']);
  await qi.addIndex('trip_duties', ['route_id']);
  await qi.addIndex('trip_duties', ['driver_id', 'trip_date', 'axle_index']);

  // Daily wear history of each damper (only days with duty). Derived from trip_duties and
  // recomputed deterministically, so it has a natural key and no timestamps.
  await qi.createTable('damper_wear_days', {
    damper_id: { ...fk('dampers', false, 'CASCADE'), primaryKey: true },
    day: { type: DataTypes.DATEONLY, allowNull: false, primaryKey: true },
    vehicle_id: fk('vehicles', false, 'CASCADE'),
    distance_km: num(),
    energy_j: num(),
    spring_damage: num(),
    cum_energy_j: num(),
    cum_spring_damage: num(),
    life_energy_j: num(),
    life_used_fraction: num(),
    damping_ns_per_m: num(),
  });
  await qi.addIndex('damper_wear_days', ['vehicle_id', 'day']);

  // The latest prediction per damper with what it rests on.
  await qi.createTable('damper_predictions', {
    damper_id: { ...fk('dampers', false, 'CASCADE'), primaryKey: true },
    vehicle_id: fk('vehicles', false, 'CASCADE'),
    as_of: { type: DataTypes.DATEONLY, allowNull: false },
    window_days: { type: DataTypes.INTEGER, allowNull: false },
    window_energy_j: num(),
    window_km: num(),
    rate_j_per_day: num(),
    life_energy_j: num(),
    life_source: { type: DataTypes.STRING(20), allowNull: false },
    energy_j: num(),
    life_used_fraction: num(),
    damping_ns_per_m: num(),
    threshold_fraction: num(),
    threshold_date: { type: DataTypes.DATEONLY, allowNull: true },
    end_of_life_date: { type: DataTypes.DATEONLY, allowNull: true },
    spring_damage: num(),
    spring_rate_per_day: num(),
    spring_threshold_date: { type: DataTypes.DATEONLY, allowNull: true },
    basis: { type: DataTypes.TEXT, allowNull: false },
  });
  await qi.addIndex('damper_predictions', ['vehicle_id']);
  await qi.addIndex('damper_predictions', ['threshold_date']);

  await qi.createTable('job_runs', {
    id,
    job: { type: DataTypes.STRING(40), allowNull: false },
    status: { type: DataTypes.STRING(24), allowNull: false },
    trigger: { type: DataTypes.STRING(16), allowNull: false },
    as_of: { type: DataTypes.DATEONLY, allowNull: false },
    requested_by_id: fk('users', true, 'SET NULL'),
    started_at: { type: DataTypes.DATE, allowNull: false },
    ended_at: { type: DataTypes.DATE, allowNull: true },
    heartbeat_at: { type: DataTypes.DATE, allowNull: true },
    phase: { type: DataTypes.STRING(40), allowNull: true },
    progress_done: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    progress_total: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    counts: { type: DataTypes.TEXT, allowNull: false, defaultValue: '{}' },
    errors: { type: DataTypes.TEXT, allowNull: false, defaultValue: '[]' },
    message: { type: DataTypes.TEXT, allowNull: true },
    ...ts,
  });
  await qi.addIndex('job_runs', ['job', 'started_at']);

  // One row per job name while a run holds it; a stale row (no heartbeat) can be taken over.
  await qi.createTable('job_locks', {
    name: { type: DataTypes.STRING(40), primaryKey: true },
    run_id: { type: DataTypes.INTEGER, allowNull: true },
    holder: { type: DataTypes.STRING(120), allowNull: false },
    acquired_at: { type: DataTypes.DATE, allowNull: false },
    heartbeat_at: { type: DataTypes.DATE, allowNull: false },
  });

  // Every message the app sends, with the key that keeps it from being sent twice.
  await qi.createTable('mail_messages', {
    id,
    dedupe_key: { type: DataTypes.STRING(200), allowNull: false, unique: true },
    kind: { type: DataTypes.STRING(24), allowNull: false },
    user_id: fk('users', true, 'SET NULL'),
    to_address: { type: DataTypes.STRING(254), allowNull: false },
    subject: { type: DataTypes.STRING(250), allowNull: false },
    text_body: { type: DataTypes.TEXT, allowNull: false },
    html_body: { type: DataTypes.TEXT, allowNull: false },
    status: { type: DataTypes.STRING(12), allowNull: false },
    message_id: { type: DataTypes.STRING(250), allowNull: true },
    error: { type: DataTypes.TEXT, allowNull: true },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    job_run_id: { type: DataTypes.INTEGER, allowNull: true },
    sent_at: { type: DataTypes.DATE, allowNull: true },
    ...ts,
  });
  await qi.addIndex('mail_messages', ['status']);
  await qi.addIndex('mail_messages', ['user_id', 'created_at']);

  // What the built-in mail catcher (fake SMTP server) received: the Outbox page.
  await qi.createTable('caught_mail', {
    id,
    message_id: { type: DataTypes.STRING(250), allowNull: true },
    dedupe_key: { type: DataTypes.STRING(200), allowNull: true },
    mail_from: { type: DataTypes.STRING(254), allowNull: true },
    rcpt_to: { type: DataTypes.TEXT, allowNull: false },
    subject: { type: DataTypes.STRING(250), allowNull: false },
    text_body: { type: DataTypes.TEXT, allowNull: true },
    html_body: { type: DataTypes.TEXT, allowNull: true },
    size_bytes: { type: DataTypes.INTEGER, allowNull: false },
    received_at: { type: DataTypes.DATE, allowNull: false },
    ...ts,
  });
  await qi.addIndex('caught_mail', ['received_at']);

  // Scheduling columns: which rule created the inspection, the numbers it rests on, the last
  // status managers were told about (digest de-duplication) and when the assignee was told.
  await qi.addColumn('inspections', 'trigger', { type: DataTypes.STRING(20), allowNull: true });
  await qi.addColumn('inspections', 'basis', { type: DataTypes.TEXT, allowNull: true });
  await qi.addColumn('inspections', 'notified_status', { type: DataTypes.STRING(16), allowNull: true });
  await qi.addColumn('inspections', 'assignee_notified_id', { type: DataTypes.INTEGER, allowNull: true });
  await qi.addColumn('inspections', 'created_by_run_id', { type: DataTypes.INTEGER, allowNull: true });
  // At most one open inspection per vehicle, enforced by the database as well as the job.
  await qi.sequelize.query(
    `CREATE UNIQUE INDEX inspections_one_open_per_vehicle ON inspections (vehicle_id) WHERE status IN ('scheduled', 'due', 'overdue')`,
  );

  // Each damper's derived wear is recomputed from this day on when its duty changes.
  await qi.addColumn('dampers', 'wear_dirty_from', { type: DataTypes.DATEONLY, allowNull: true });

  // Notification preferences (each kind can be turned off).
  await qi.addColumn('users', 'notify_inspection_digest', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true });
  await qi.addColumn('users', 'notify_ride_reports', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true });
  await qi.addColumn('users', 'notify_assignments', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  for (const c of ['notify_inspection_digest', 'notify_ride_reports', 'notify_assignments']) await qi.removeColumn('users', c);
  await qi.removeColumn('dampers', 'wear_dirty_from');
  await qi.sequelize.query('DROP INDEX IF EXISTS inspections_one_open_per_vehicle');
  for (const c of ['trigger', 'basis', 'notified_status', 'assignee_notified_id', 'created_by_run_id']) await qi.removeColumn('inspections', c);
  for (const t of ['caught_mail', 'mail_messages', 'job_locks', 'job_runs', 'damper_predictions', 'damper_wear_days', 'trip_duties']) await qi.dropTable(t);
}
