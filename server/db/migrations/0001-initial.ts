import { DataTypes, type QueryInterface } from 'sequelize';
import { fk, id, ts } from './columns';

/** The foundation schema: people, depots, suspension specs, vehicles, dampers, roads, trips. */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('depots', {
    id,
    name: { type: DataTypes.STRING(120), allowNull: false, unique: true },
    address: { type: DataTypes.STRING(240), allowNull: true },
    lat: { type: DataTypes.DOUBLE, allowNull: false },
    lon: { type: DataTypes.DOUBLE, allowNull: false },
    ...ts,
  });

  await qi.createTable('users', {
    id,
    name: { type: DataTypes.STRING(120), allowNull: false },
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    role: { type: DataTypes.STRING(16), allowNull: false },
    password_hash: { type: DataTypes.STRING(100), allowNull: false },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    depot_id: fk('depots', true, 'SET NULL'),
    ...ts,
  });
  await qi.addIndex('users', ['role']);

  await qi.createTable('suspension_specs', {
    id,
    name: { type: DataTypes.STRING(120), allowNull: false, unique: true },
    vehicle_class: { type: DataTypes.STRING(40), allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: true },
    ...ts,
  });

  await qi.createTable('spec_axles', {
    id,
    spec_id: fk('suspension_specs', false, 'CASCADE'),
    axle_index: { type: DataTypes.INTEGER, allowNull: false },
    label: { type: DataTypes.STRING(40), allowNull: false },
    sprung_mass_kg: { type: DataTypes.DOUBLE, allowNull: false },
    unsprung_mass_kg: { type: DataTypes.DOUBLE, allowNull: false },
    spring_rate_n_per_m: { type: DataTypes.DOUBLE, allowNull: false },
    damping_ns_per_m: { type: DataTypes.DOUBLE, allowNull: false },
    tire_rate_n_per_m: { type: DataTypes.DOUBLE, allowNull: false },
    rated_damper_life_km: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 90000 },
    ...ts,
  });
  await qi.addIndex('spec_axles', ['spec_id', 'axle_index'], { unique: true });

  await qi.createTable('vehicles', {
    id,
    fleet_number: { type: DataTypes.STRING(20), allowNull: false, unique: true },
    plate: { type: DataTypes.STRING(20), allowNull: false, unique: true },
    spec_id: fk('suspension_specs'),
    depot_id: fk('depots'),
    driver_id: fk('users', true, 'SET NULL'),
    odometer_km: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
    status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'in_service' },
    commissioned_at: { type: DataTypes.DATEONLY, allowNull: true },
    ...ts,
  });
  await qi.addIndex('vehicles', ['spec_id']);
  await qi.addIndex('vehicles', ['depot_id']);
  await qi.addIndex('vehicles', ['driver_id']);
  await qi.addIndex('vehicles', ['status']);

  await qi.createTable('routes', {
    id,
    name: { type: DataTypes.STRING(120), allowNull: false, unique: true },
    description: { type: DataTypes.TEXT, allowNull: true },
    depot_id: fk('depots', true, 'SET NULL'),
    geometry: { type: DataTypes.TEXT, allowNull: false },
    length_m: { type: DataTypes.DOUBLE, allowNull: false },
    default_speed_kmh: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 50 },
    segment_length_m: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 100 },
    ...ts,
  });

  await qi.createTable('route_segments', {
    id,
    route_id: fk('routes', false, 'CASCADE'),
    seq: { type: DataTypes.INTEGER, allowNull: false },
    start_m: { type: DataTypes.DOUBLE, allowNull: false },
    end_m: { type: DataTypes.DOUBLE, allowNull: false },
    geometry: { type: DataTypes.TEXT, allowNull: false },
    speed_kmh: { type: DataTypes.DOUBLE, allowNull: true },
    iri: { type: DataTypes.DOUBLE, allowNull: true },
    gd_n0: { type: DataTypes.DOUBLE, allowNull: true },
    iso_class: { type: DataTypes.STRING(1), allowNull: true },
    roughness_source: { type: DataTypes.STRING(20), allowNull: true },
    roughness_date: { type: DataTypes.DATEONLY, allowNull: true },
    ...ts,
  });
  await qi.addIndex('route_segments', ['route_id', 'seq'], { unique: true });
  await qi.addIndex('route_segments', ['iso_class']);

  await qi.createTable('roughness_observations', {
    id,
    segment_id: fk('route_segments', false, 'CASCADE'),
    iri: { type: DataTypes.DOUBLE, allowNull: true },
    gd_n0: { type: DataTypes.DOUBLE, allowNull: true },
    iso_class: { type: DataTypes.STRING(1), allowNull: true },
    source: { type: DataTypes.STRING(20), allowNull: false },
    observed_on: { type: DataTypes.DATEONLY, allowNull: false },
    recorded_by_id: fk('users', true, 'SET NULL'),
    note: { type: DataTypes.STRING(240), allowNull: true },
    ...ts,
  });
  await qi.addIndex('roughness_observations', ['segment_id', 'observed_on']);

  await qi.createTable('trips', {
    id,
    vehicle_id: fk('vehicles'),
    route_id: fk('routes'),
    driver_id: fk('users', true, 'SET NULL'),
    started_at: { type: DataTypes.DATE, allowNull: false },
    ended_at: { type: DataTypes.DATE, allowNull: false },
    distance_km: { type: DataTypes.DOUBLE, allowNull: false },
    mean_speed_kmh: { type: DataTypes.DOUBLE, allowNull: false },
    payload_kg: { type: DataTypes.DOUBLE, allowNull: true },
    processed_at: { type: DataTypes.DATE, allowNull: true },
    ...ts,
  });
  await qi.addIndex('trips', ['vehicle_id', 'started_at']);
  await qi.addIndex('trips', ['route_id']);
  await qi.addIndex('trips', ['driver_id', 'started_at']);
  await qi.addIndex('trips', ['processed_at']);

  await qi.createTable('inspections', {
    id,
    vehicle_id: fk('vehicles', false, 'CASCADE'),
    due_date: { type: DataTypes.DATEONLY, allowNull: false },
    status: { type: DataTypes.STRING(16), allowNull: false },
    reason: { type: DataTypes.TEXT, allowNull: false },
    assignee_id: fk('users', true, 'SET NULL'),
    completed_at: { type: DataTypes.DATE, allowNull: true },
    odometer_km: { type: DataTypes.DOUBLE, allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: true },
    ...ts,
  });
  await qi.addIndex('inspections', ['vehicle_id', 'status']);
  await qi.addIndex('inspections', ['status', 'due_date']);
  await qi.addIndex('inspections', ['assignee_id']);

  await qi.createTable('work_records', {
    id,
    vehicle_id: fk('vehicles', false, 'CASCADE'),
    inspection_id: fk('inspections', true, 'SET NULL'),
    mechanic_id: fk('users', true, 'SET NULL'),
    performed_at: { type: DataTypes.DATE, allowNull: false },
    odometer_km: { type: DataTypes.DOUBLE, allowNull: false },
    summary: { type: DataTypes.TEXT, allowNull: false },
    parts_cost: { type: DataTypes.DOUBLE, allowNull: true },
    labour_hours: { type: DataTypes.DOUBLE, allowNull: true },
    ...ts,
  });
  await qi.addIndex('work_records', ['vehicle_id', 'performed_at']);
  await qi.createTable('dampers', {
    id,
    vehicle_id: fk('vehicles', false, 'CASCADE'),
    position: { type: DataTypes.STRING(4), allowNull: false },
    axle_index: { type: DataTypes.INTEGER, allowNull: false },
    part_number: { type: DataTypes.STRING(60), allowNull: true },
    installed_at: { type: DataTypes.DATEONLY, allowNull: false },
    installed_odometer_km: { type: DataTypes.DOUBLE, allowNull: false },
    removed_at: { type: DataTypes.DATEONLY, allowNull: true },
    removed_odometer_km: { type: DataTypes.DOUBLE, allowNull: true },
    removal_reason: { type: DataTypes.STRING(40), allowNull: true },
    energy_j: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
    fatigue_damage: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
    life_used_fraction: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
    damping_ns_per_m: { type: DataTypes.DOUBLE, allowNull: true },
    removed_by_work_record_id: fk('work_records', true, 'SET NULL'),
    wear_updated_at: { type: DataTypes.DATE, allowNull: true },
    ...ts,
  });
  await qi.addIndex('dampers', ['vehicle_id', 'removed_at']);


  // Session store of connect-session-sequelize (its own column names).
  await qi.createTable('sessions', {
    sid: { type: DataTypes.STRING(36), primaryKey: true },
    expires: { type: DataTypes.DATE, allowNull: true },
    data: { type: DataTypes.TEXT, allowNull: true },
    ...ts,
  });
  await qi.addIndex('sessions', ['expires']);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  for (const t of [
    'sessions',
    'dampers',
    'work_records',
    'inspections',
    'trips',
    'roughness_observations',
    'route_segments',
    'routes',
    'vehicles',
    'spec_axles',
    'suspension_specs',
    'depots',
    'users',
  ]) {
    await qi.dropTable(t);
  }
}
