/**
 * The column pieces the migrations build their tables with (not a migration itself: MIGRATIONS in
 * server/db/index.ts lists those). Shipped migrations stand on them, so what each returns must never
 * change: tests/server/db/schema.test.ts holds every migration to the schema it made. A migration
 * that needs another kind of column writes it out, or adds a new piece here.
 */
import { DataTypes } from 'sequelize';

/** The created/updated stamps Sequelize keeps on a row. */
export const ts = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};
/** The integer key the database assigns. */
export const id = { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true };
/** An integer column referring to the key of `table`; updates follow the key, deletes are refused unless told. */
export const fk = (table: string, allowNull = false, onDelete = 'RESTRICT') => ({
  type: DataTypes.INTEGER,
  allowNull,
  references: { model: table, key: 'id' },
  onUpdate: 'CASCADE',
  onDelete,
});
/** A double column, NOT NULL unless told. */
export const num = (allowNull = false) => ({ type: DataTypes.DOUBLE, allowNull });
