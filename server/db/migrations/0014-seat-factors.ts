import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * A spec's floor-to-seat factors for drivers' exposure (docs/methods.md "Exposure at the seat"):
 * the SEAT value of its driver's seat (null = the default of its vehicle class) and, for trucks,
 * an optional cab suspension transmissibility (null = none).
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('suspension_specs', 'seat_factor', { type: DataTypes.DOUBLE, allowNull: true });
  await qi.addColumn('suspension_specs', 'cab_factor', { type: DataTypes.DOUBLE, allowNull: true });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeColumn('suspension_specs', 'cab_factor');
  await qi.removeColumn('suspension_specs', 'seat_factor');
}
