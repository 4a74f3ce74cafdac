import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * The phase-shift method beside adhesion: a corner's measured minimum phase angle [°] (either or
 * both may be recorded), and which reading the damping estimate came from ('adhesion' or 'phase',
 * the better conditioned; docs/methods.md "Phase-shift method"). Earlier estimates came from
 * adhesion, the only reading there was.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('inspection_corners', 'phase_deg', { type: DataTypes.DOUBLE, allowNull: true });
  await qi.addColumn('inspection_corners', 'estimate_method', { type: DataTypes.STRING(10), allowNull: true });
  await qi.sequelize.query(`UPDATE inspection_corners SET estimate_method = 'adhesion' WHERE measured_damping_ns_per_m IS NOT NULL`);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeColumn('inspection_corners', 'estimate_method');
  await qi.removeColumn('inspection_corners', 'phase_deg');
}
