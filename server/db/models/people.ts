/** People who sign in: fleet managers, mechanics and drivers, with their notification preferences. */
import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Role } from '../../contracts/users';
import { pk, ts } from './columns';

export { ROLES, type Role } from '../../contracts/users';

type Attrs<M extends Model> = InferAttributes<M>;
type CAttrs<M extends Model> = InferCreationAttributes<M>;

export class User extends Model<Attrs<User>, CAttrs<User>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare email: string;
  declare role: Role;
  declare passwordHash: string;
  declare active: CreationOptional<boolean>;
  declare depotId: ForeignKey<number> | null;
  /** Set when a fleet manager chose the password (a new account, a reset): the user must choose their own before anything else. */
  declare mustChangePassword: CreationOptional<boolean>;
  /** E-mail preferences: managers' inspection digest, its ride-report section, mechanics' assignment notes. */
  declare notifyInspectionDigest: CreationOptional<boolean>;
  declare notifyRideReports: CreationOptional<boolean>;
  declare notifyAssignments: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initPeopleModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
  User.init(
    {
      id: pk,
      name: { type: DataTypes.STRING(120), allowNull: false },
      email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
      role: { type: DataTypes.STRING(16), allowNull: false },
      passwordHash: { type: DataTypes.STRING(100), allowNull: false },
      active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      depotId: { type: DataTypes.INTEGER, allowNull: true },
      mustChangePassword: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      notifyInspectionDigest: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      notifyRideReports: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      notifyAssignments: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      ...ts,
    },
    { ...common, tableName: 'users' },
  );
}
