/** Trips driven and the imports they came from. */
import { DataTypes, type CreationOptional, type ForeignKey, type Sequelize } from 'sequelize';
import { Row, optional, required, rowColumns } from './columns';

export class Trip extends Row<Trip> {
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
}

/** One all-or-nothing trip import (file name, how many rows, who, when). */
export class TripImport extends Row<TripImport> {
  declare originalName: string;
  declare rowCount: number;
  /** SHA-256 of the imported file (hex); null for imports made before it was kept. */
  declare fileSha256: string | null;
  declare importedById: ForeignKey<number> | null;
  declare importedAt: Date;
}

export function initTripsModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
  Trip.init(
    rowColumns({
      startedAt: required(DataTypes.DATE),
      endedAt: required(DataTypes.DATE),
      distanceKm: required(DataTypes.DOUBLE),
      meanSpeedKmh: required(DataTypes.DOUBLE),
      payloadKg: optional(DataTypes.DOUBLE),
      processedAt: optional(DataTypes.DATE),
      importId: optional(DataTypes.INTEGER),
    }),
    { ...common, tableName: 'trips' },
  );
  TripImport.init(
    rowColumns({
      originalName: required(DataTypes.STRING(255)),
      rowCount: required(DataTypes.INTEGER),
      fileSha256: optional(DataTypes.STRING(64)),
      importedAt: required(DataTypes.DATE),
    }),
    { ...common, tableName: 'trip_imports' },
  );
}
