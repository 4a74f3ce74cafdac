import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * The plate amplitude (zero-to-peak, mm) of the test lane that measured an inspection's
 * adhesion values: each measured value is turned into a damping at the amplitude that measured
 * it (docs/methods.md "Test-lane plate amplitude"). Results recorded before this column existed
 * were inverted at 6 mm and keep that figure, so they are marked 6.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('inspections', 'plate_amplitude_mm', { type: DataTypes.DOUBLE, allowNull: true });
  await qi.sequelize.query('UPDATE inspections SET plate_amplitude_mm = 6 WHERE results_at IS NOT NULL');
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeColumn('inspections', 'plate_amplitude_mm');
}
