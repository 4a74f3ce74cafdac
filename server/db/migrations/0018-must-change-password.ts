import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * A user whose password a fleet manager set (a new account, or a reset) must choose their own at
 * the next sign-in: until they do, the API answers only the account's own password change, who is
 * signed in, the form token and sign-out. Accounts made before this column choose nothing (false).
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('users', 'must_change_password', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeColumn('users', 'must_change_password');
}
