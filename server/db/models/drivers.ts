/** Drivers' ride reports and daily vibration exposure. */
import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { dbl } from './columns';

export const RIDE_REPORT_STATUSES = ['new', 'accepted', 'dismissed'] as const;
export type RideReportStatus = (typeof RIDE_REPORT_STATUSES)[number];

type Attrs<M extends Model> = InferAttributes<M>;
type CAttrs<M extends Model> = InferCreationAttributes<M>;

export class RideReport extends Model<Attrs<RideReport>, CAttrs<RideReport>> {
  declare id: CreationOptional<number>;
  declare driverId: ForeignKey<number>;
  declare vehicleId: ForeignKey<number> | null;
  declare routeId: ForeignKey<number>;
  declare segmentId: ForeignKey<number>;
  declare lat: number;
  declare lon: number;
  declare positionSource: 'gps' | 'map';
  declare accuracyM: number | null;
  declare snappedLat: number;
  declare snappedLon: number;
  declare snapDistanceM: number;
  declare severity: number;
  /** JSON array text. */
  declare felt: string;
  declare note: string | null;
  declare photoPath: string | null;
  declare photoType: string | null;
  declare photoBytes: number | null;
  declare reportedAt: Date;
  declare status: CreationOptional<RideReportStatus>;
  declare decidedById: ForeignKey<number> | null;
  declare decidedAt: Date | null;
  declare dismissReason: string | null;
  declare classBefore: string | null;
  declare estimatedClass: string | null;
  declare estimatedGdN0: number | null;
  /** The segment's class and Gd(n0) just after the report was blended in (null before 0010). */
  declare classAfter: CreationOptional<string | null>;
  declare gdN0After: CreationOptional<number | null>;
  declare observationId: ForeignKey<number> | null;
  declare digestNotifiedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class DriverExposureDay extends Model<Attrs<DriverExposureDay>, CAttrs<DriverExposureDay>> {
  declare driverId: number;
  declare day: string;
  declare a8: number;
  declare hours: number;
  declare trips: number;
  declare maxWeightedAccel: number;
  declare status: string;
  /** JSON text of `{ tripId, vehicleId, routeId, aw, hours }[]`. */
  declare parts: string;
  declare computedAt: Date;
  declare notifiedAt: Date | null;
}

export function initDriversModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
  RideReport.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      lat: dbl(),
      lon: dbl(),
      positionSource: { type: DataTypes.STRING(8), allowNull: false },
      accuracyM: dbl(true),
      snappedLat: dbl(),
      snappedLon: dbl(),
      snapDistanceM: dbl(),
      severity: { type: DataTypes.INTEGER, allowNull: false },
      felt: { type: DataTypes.TEXT, allowNull: false, defaultValue: '[]' },
      note: { type: DataTypes.STRING(1000), allowNull: true },
      photoPath: { type: DataTypes.STRING(200), allowNull: true },
      photoType: { type: DataTypes.STRING(40), allowNull: true },
      photoBytes: { type: DataTypes.INTEGER, allowNull: true },
      reportedAt: { type: DataTypes.DATE, allowNull: false },
      status: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'new' },
      decidedAt: { type: DataTypes.DATE, allowNull: true },
      dismissReason: { type: DataTypes.STRING(500), allowNull: true },
      classBefore: { type: DataTypes.STRING(1), allowNull: true },
      estimatedClass: { type: DataTypes.STRING(1), allowNull: true },
      estimatedGdN0: { type: DataTypes.DOUBLE, allowNull: true, field: 'estimated_gd_n0' },
      classAfter: { type: DataTypes.STRING(1), allowNull: true },
      gdN0After: { type: DataTypes.DOUBLE, allowNull: true, field: 'gd_n0_after' },
      digestNotifiedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: { type: DataTypes.DATE, allowNull: false },
      updatedAt: { type: DataTypes.DATE, allowNull: false },
    },
    { ...common, tableName: 'ride_reports' },
  );
  DriverExposureDay.init(
    {
      driverId: { type: DataTypes.INTEGER, primaryKey: true },
      day: { type: DataTypes.DATEONLY, primaryKey: true },
      a8: dbl(),
      hours: dbl(),
      trips: { type: DataTypes.INTEGER, allowNull: false },
      maxWeightedAccel: dbl(),
      status: { type: DataTypes.STRING(24), allowNull: false },
      parts: { type: DataTypes.TEXT, allowNull: false, defaultValue: '[]' },
      computedAt: { type: DataTypes.DATE, allowNull: false },
      notifiedAt: { type: DataTypes.DATE, allowNull: true },
    },
    { ...common, tableName: 'driver_exposure_days', timestamps: false },
  );
}
