/**
 * What the models share: the row with an integer key and the two stamps, and one builder per
 * kind of column (NOT NULL or NULL), so that each column is one line with its type and options.
 */
import { DataTypes, Model, type CreationOptional, type DataType, type InferAttributes, type InferCreationAttributes, type ModelAttributeColumnOptions } from 'sequelize';

/** The attributes of a model as its declared fields give them, and those a create() takes. */
export type Attrs<M extends Model> = InferAttributes<M>;
export type CAttrs<M extends Model> = InferCreationAttributes<M>;

/** A table row with the integer key the database assigns and the created/updated stamps Sequelize keeps. */
export abstract class Row<M extends Model> extends Model<Attrs<M>, CAttrs<M>> {
  declare id: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export const ts = {
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
};
/** Integer primary key column. */
export const pk = { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true };

/** The columns of a {@link Row}: its key first, then the given ones in order, then the stamps. */
export const rowColumns = <C extends object>(columns: C) => ({ id: pk, ...columns, ...ts });

type MoreOptions = Omit<ModelAttributeColumnOptions, 'type' | 'allowNull'>;
/** A column that always holds a value (NOT NULL). */
export const required = (type: DataType, more: MoreOptions = {}) => ({ type, allowNull: false, ...more });
/** A column that may be empty (NULL). */
export const optional = (type: DataType, more: MoreOptions = {}) => ({ type, allowNull: true, ...more });
