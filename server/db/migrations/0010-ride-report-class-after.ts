import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * An accepted ride report keeps the segment's class and Gd(n0) just after it was blended in,
 * beside the class before and the report's own estimate, so every place that tells of the
 * decision (the notice on accepting, the decisions table, the driver's note) names the same
 * classes. Reports accepted before this column existed keep it empty.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('ride_reports', 'class_after', { type: DataTypes.STRING(1), allowNull: true });
  await qi.addColumn('ride_reports', 'gd_n0_after', { type: DataTypes.DOUBLE, allowNull: true });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeColumn('ride_reports', 'gd_n0_after');
  await qi.removeColumn('ride_reports', 'class_after');
}
