/** Columns every model shares. */
import { DataTypes } from 'sequelize';

export const ts = {
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
};
/** Integer primary key column. */
export const pk = { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true };
/** A double column, not null unless asked. */
export const dbl = (allowNull = false) => ({ type: DataTypes.DOUBLE, allowNull });
