import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * Opening wear: what a damper had already used when it entered the records (distance on its
 * vehicle's odometer since fitting that no trip on record covers), estimated once by the
 * nightly job. Every damper is marked for a recompute from its fitting day, so the next run
 * estimates each one's opening and carries it through its history.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('dampers', 'opening_km', { type: DataTypes.DOUBLE, allowNull: true });
  await qi.addColumn('dampers', 'opening_energy_j', { type: DataTypes.DOUBLE, allowNull: true });
  await qi.addColumn('dampers', 'opening_spring_damage', { type: DataTypes.DOUBLE, allowNull: true });
  await qi.addColumn('dampers', 'opening_basis', { type: DataTypes.TEXT, allowNull: true });
  await qi.sequelize.query(`UPDATE dampers SET wear_dirty_from = installed_at`);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  for (const c of ['opening_basis', 'opening_spring_damage', 'opening_energy_j', 'opening_km']) await qi.removeColumn('dampers', c);
}
