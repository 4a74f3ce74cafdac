import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * The per-account spacing of sign-in attempts, in the database rather than in each app
 * instance's memory, so that an account's failures count on every instance behind a proxy and
 * its attempts take turns across them. One row per account with recent failures: how many in its
 * current window, when that window ends, and the earliest moment the next attempt may be checked
 * (milliseconds since the epoch).
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('sign_in_delays', {
    account_key: { type: DataTypes.STRING(400), primaryKey: true },
    failures: { type: DataTypes.INTEGER, allowNull: false },
    window_ends_ms: { type: DataTypes.BIGINT, allowNull: false },
    next_slot_ms: { type: DataTypes.BIGINT, allowNull: false },
  });
  await qi.addIndex('sign_in_delays', ['window_ends_ms']);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('sign_in_delays');
}
