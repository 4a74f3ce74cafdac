import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * Each trip import keeps the SHA-256 of its file, unique, so the same file sent again (twice at
 * once, or a week later) is recognised and refused instead of importing its trips a second time.
 * Imports made before this column have none (NULL, which the unique index allows many times).
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('trip_imports', 'file_sha256', { type: DataTypes.STRING(64), allowNull: true });
  await qi.addIndex('trip_imports', ['file_sha256'], { unique: true, name: 'trip_imports_file_sha256' });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeIndex('trip_imports', 'trip_imports_file_sha256');
  await qi.removeColumn('trip_imports', 'file_sha256');
}
