/** People who sign in: fleet managers, mechanics and drivers, with their notification preferences. */
import { DataTypes, type CreationOptional, type ForeignKey, type Sequelize } from 'sequelize';
import type { Role } from '../../contracts/users';
import { Row, optional, required, rowColumns } from './columns';

export { ROLES, type Role } from '../../contracts/users';

export class User extends Row<User> {
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
}

export function initPeopleModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
  User.init(
    rowColumns({
      name: required(DataTypes.STRING(120)),
      email: required(DataTypes.STRING(254), { unique: true }),
      role: required(DataTypes.STRING(16)),
      passwordHash: required(DataTypes.STRING(100)),
      active: required(DataTypes.BOOLEAN, { defaultValue: true }),
      depotId: optional(DataTypes.INTEGER),
      mustChangePassword: required(DataTypes.BOOLEAN, { defaultValue: false }),
      notifyInspectionDigest: required(DataTypes.BOOLEAN, { defaultValue: true }),
      notifyRideReports: required(DataTypes.BOOLEAN, { defaultValue: true }),
      notifyAssignments: required(DataTypes.BOOLEAN, { defaultValue: true }),
    }),
    { ...common, tableName: 'users' },
  );
}
