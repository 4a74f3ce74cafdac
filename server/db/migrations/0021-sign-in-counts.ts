import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * Failed sign-ins counted per address and per account-and-address pair, in the database rather
 * than in each app instance's memory, so that several instances behind a proxy enforce one limit
 * between them. One row per limited key: the failures in its current window and when that window
 * ends (milliseconds since the epoch).
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('sign_in_counts', {
    limit_key: { type: DataTypes.STRING(400), primaryKey: true },
    hits: { type: DataTypes.INTEGER, allowNull: false },
    reset_at_ms: { type: DataTypes.BIGINT, allowNull: false },
  });
  await qi.addIndex('sign_in_counts', ['reset_at_ms']);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('sign_in_counts');
}
