import { DataTypes, type QueryInterface } from 'sequelize';
import { fk, id, num, ts } from './columns';

/**
 * The workshop: test-lane results per corner (with the model's predicted and the
 * estimated present damping), photos and printouts, the parts of a work record, and who an
 * inspection is assigned to (a mechanic or a whole depot).
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('inspections', 'assigned_depot_id', fk('depots', true, 'SET NULL'));
  await qi.addColumn('inspections', 'results_at', { type: DataTypes.DATE, allowNull: true });
  await qi.addColumn('inspections', 'results_by_id', fk('users', true, 'SET NULL'));
  await qi.addIndex('inspections', ['assigned_depot_id']);

  // One row per corner of an inspection: what the mechanic measured and found, and what the
  // model predicted for the fitted damper at that moment.
  await qi.createTable('inspection_corners', {
    id,
    inspection_id: fk('inspections', false, 'CASCADE'),
    damper_id: fk('dampers', true, 'SET NULL'),
    position: { type: DataTypes.STRING(4), allowNull: false },
    axle_index: { type: DataTypes.INTEGER, allowNull: false },
    adhesion_pct: num(true),
    findings: { type: DataTypes.TEXT, allowNull: false, defaultValue: '[]' },
    verdict: { type: DataTypes.STRING(12), allowNull: false },
    nominal_damping_ns_per_m: num(),
    predicted_damping_ns_per_m: num(true),
    predicted_basis: { type: DataTypes.STRING(20), allowNull: true },
    measured_damping_ns_per_m: num(true),
    estimate_note: { type: DataTypes.TEXT, allowNull: true },
    energy_j_at_test: num(true),
    life_used_at_test: num(true),
    ...ts,
  });
  await qi.addIndex('inspection_corners', ['inspection_id', 'position'], { unique: true });
  await qi.addIndex('inspection_corners', ['damper_id']);

  await qi.createTable('inspection_attachments', {
    id,
    inspection_id: fk('inspections', false, 'CASCADE'),
    kind: { type: DataTypes.STRING(12), allowNull: false },
    mime_type: { type: DataTypes.STRING(40), allowNull: false },
    size_bytes: { type: DataTypes.INTEGER, allowNull: false },
    stored_name: { type: DataTypes.STRING(80), allowNull: false, unique: true },
    original_name: { type: DataTypes.STRING(200), allowNull: false },
    uploaded_by_id: fk('users', true, 'SET NULL'),
    ...ts,
  });
  await qi.addIndex('inspection_attachments', ['inspection_id']);

  await qi.addColumn('work_records', 'notes', { type: DataTypes.TEXT, allowNull: true });
  await qi.createTable('work_record_items', {
    id,
    work_record_id: fk('work_records', false, 'CASCADE'),
    position: { type: DataTypes.STRING(4), allowNull: false },
    axle_index: { type: DataTypes.INTEGER, allowNull: false },
    component: { type: DataTypes.STRING(12), allowNull: false },
    part_description: { type: DataTypes.STRING(160), allowNull: false },
    part_number: { type: DataTypes.STRING(60), allowNull: true },
    cost: num(true),
    removal_reason: { type: DataTypes.STRING(40), allowNull: false },
    removed_damper_id: fk('dampers', true, 'SET NULL'),
    installed_damper_id: fk('dampers', true, 'SET NULL'),
    ...ts,
  });
  await qi.addIndex('work_record_items', ['work_record_id']);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('work_record_items');
  await qi.removeColumn('work_records', 'notes');
  await qi.dropTable('inspection_attachments');
  await qi.dropTable('inspection_corners');
  await qi.removeIndex('inspections', ['assigned_depot_id']);
  for (const c of ['assigned_depot_id', 'results_at', 'results_by_id']) await qi.removeColumn('inspections', c);
}
