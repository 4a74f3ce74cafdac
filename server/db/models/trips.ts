/** Trips driven and the imports they came from. */
import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { pk, ts } from './columns';

type Attrs<M extends Model> = InferAttributes<M>;
type CAttrs<M extends Model> = InferCreationAttributes<M>;

export class Trip extends Model<Attrs<Trip>, CAttrs<Trip>> {
  declare id: CreationOptional<number>;
  declare vehicleId: ForeignKey<number>;
  declare routeId: ForeignKey<number>;
  declare driverId: ForeignKey<number> | null;
  declare startedAt: Date;
  declare endedAt: Date;
  declare distanceKm: number;
  declare meanSpeedKmh: number;
  declare payloadKg: number | null;
  declare processedAt: CreationOptional<Date | null>;
  declare importId: CreationOptional<ForeignKey<number> | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** One all-or-nothing trip import (file name, how many rows, who, when). */
export class TripImport extends Model<Attrs<TripImport>, CAttrs<TripImport>> {
  declare id: CreationOptional<number>;
  declare originalName: string;
  declare rowCount: number;
  /** SHA-256 of the imported file (hex); null for imports made before it was kept. */
  declare fileSha256: string | null;
  declare importedById: ForeignKey<number> | null;
  declare importedAt: Date;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initTripsModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
  Trip.init(
    {
      id: pk,
      startedAt: { type: DataTypes.DATE, allowNull: false },
      endedAt: { type: DataTypes.DATE, allowNull: false },
      distanceKm: { type: DataTypes.DOUBLE, allowNull: false },
      meanSpeedKmh: { type: DataTypes.DOUBLE, allowNull: false },
      payloadKg: { type: DataTypes.DOUBLE, allowNull: true },
      processedAt: { type: DataTypes.DATE, allowNull: true },
      importId: { type: DataTypes.INTEGER, allowNull: true },
      ...ts,
    },
    { ...common, tableName: 'trips' },
  );
  TripImport.init(
    {
      id: pk,
      originalName: { type: DataTypes.STRING(255), allowNull: false },
      rowCount: { type: DataTypes.INTEGER, allowNull: false },
      fileSha256: { type: DataTypes.STRING(64), allowNull: true },
      importedAt: { type: DataTypes.DATE, allowNull: false },
      ...ts,
    },
    { ...common, tableName: 'trip_imports' },
  );
}
