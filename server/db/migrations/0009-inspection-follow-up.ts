import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * The day a mechanic asked to check a vehicle again ("check again soon" on a corner): the
 * nightly scheduling books the follow-up inspection for it (docs/methods.md, "Scheduling that
 * follows the wear"). Null when no corner was given that verdict.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('inspections', 'follow_up_on', { type: DataTypes.DATEONLY, allowNull: true });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeColumn('inspections', 'follow_up_on');
}
