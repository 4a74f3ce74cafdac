import { DataTypes, type QueryInterface } from 'sequelize';
import { fk, id, ts } from './columns';

/**
 * Road profile surveys (the uploaded file is kept under DATA_DIR), the link from a
 * roughness observation — and from a segment's current roughness — to the survey it came from,
 * and a record of each trip import.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('road_surveys', {
    id,
    route_id: fk('routes', false, 'CASCADE'),
    /** Path of the stored profile CSV, relative to DATA_DIR (e.g. `surveys/3f…9a.csv`). */
    file_path: { type: DataTypes.STRING(300), allowNull: false },
    original_name: { type: DataTypes.STRING(255), allowNull: false },
    dx_m: { type: DataTypes.DOUBLE, allowNull: false },
    start_m: { type: DataTypes.DOUBLE, allowNull: false },
    end_m: { type: DataTypes.DOUBLE, allowNull: false },
    point_count: { type: DataTypes.INTEGER, allowNull: false },
    surveyed_on: { type: DataTypes.DATEONLY, allowNull: false },
    note: { type: DataTypes.STRING(240), allowNull: true },
    uploaded_by_id: fk('users', true, 'SET NULL'),
    uploaded_at: { type: DataTypes.DATE, allowNull: false },
    ...ts,
  });
  await qi.addIndex('road_surveys', ['route_id', 'uploaded_at']);

  await qi.addColumn('roughness_observations', 'survey_id', fk('road_surveys', true, 'SET NULL'));
  await qi.addIndex('roughness_observations', ['survey_id']);
  // The survey behind a segment's current roughness (null when the current value is stated or
  // estimated from drivers' reports): the nightly job simulates such segments over the profile.
  await qi.addColumn('route_segments', 'survey_id', fk('road_surveys', true, 'SET NULL'));

  await qi.createTable('trip_imports', {
    id,
    original_name: { type: DataTypes.STRING(255), allowNull: false },
    row_count: { type: DataTypes.INTEGER, allowNull: false },
    imported_by_id: fk('users', true, 'SET NULL'),
    imported_at: { type: DataTypes.DATE, allowNull: false },
    ...ts,
  });
  await qi.addColumn('trips', 'import_id', fk('trip_imports', true, 'SET NULL'));
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeColumn('trips', 'import_id');
  await qi.dropTable('trip_imports');
  await qi.removeColumn('route_segments', 'survey_id');
  await qi.removeColumn('roughness_observations', 'survey_id');
  await qi.dropTable('road_surveys');
}
