import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * Several app instances may send the outbox of one database at once. Each claims a message
 * before sending it, by one UPDATE that only one of them can win: the message's status becomes
 * 'sending', with when (`claimed_at`) and by whom (`claimed_by`, the sending call's own name) it
 * was claimed. A claim older than a few minutes belonged to an instance that died and may be
 * taken over. Both columns are empty outside a claim; messages made before them have none.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('mail_messages', 'claimed_at', { type: DataTypes.DATE, allowNull: true });
  await qi.addColumn('mail_messages', 'claimed_by', { type: DataTypes.STRING(120), allowNull: true });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeColumn('mail_messages', 'claimed_by');
  await qi.removeColumn('mail_messages', 'claimed_at');
}
