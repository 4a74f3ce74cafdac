/** Drivers' ride reports and daily vibration exposure. */
import { DataTypes, Model, type CreationOptional, type ForeignKey, type Sequelize } from 'sequelize';
import { Row, optional, required, rowColumns, type Attrs, type CAttrs } from './columns';

export { RIDE_REPORT_STATUSES, type RideReportStatus } from '../../contracts/drivers';
import type { RideReportStatus } from '../../contracts/drivers';

export class RideReport extends Row<RideReport> {
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
    rowColumns({
      lat: required(DataTypes.DOUBLE),
      lon: required(DataTypes.DOUBLE),
      positionSource: required(DataTypes.STRING(8)),
      accuracyM: optional(DataTypes.DOUBLE),
      snappedLat: required(DataTypes.DOUBLE),
      snappedLon: required(DataTypes.DOUBLE),
      snapDistanceM: required(DataTypes.DOUBLE),
      severity: required(DataTypes.INTEGER),
      felt: required(DataTypes.TEXT, { defaultValue: '[]' }),
      note: optional(DataTypes.STRING(1000)),
      photoPath: optional(DataTypes.STRING(200)),
      photoType: optional(DataTypes.STRING(40)),
      photoBytes: optional(DataTypes.INTEGER),
      reportedAt: required(DataTypes.DATE),
      status: required(DataTypes.STRING(12), { defaultValue: 'new' }),
      decidedAt: optional(DataTypes.DATE),
      dismissReason: optional(DataTypes.STRING(500)),
      classBefore: optional(DataTypes.STRING(1)),
      estimatedClass: optional(DataTypes.STRING(1)),
      estimatedGdN0: optional(DataTypes.DOUBLE, { field: 'estimated_gd_n0' }),
      classAfter: optional(DataTypes.STRING(1)),
      gdN0After: optional(DataTypes.DOUBLE, { field: 'gd_n0_after' }),
      digestNotifiedAt: optional(DataTypes.DATE),
    }),
    { ...common, tableName: 'ride_reports' },
  );
  DriverExposureDay.init(
    {
      driverId: { type: DataTypes.INTEGER, primaryKey: true },
      day: { type: DataTypes.DATEONLY, primaryKey: true },
      a8: required(DataTypes.DOUBLE),
      hours: required(DataTypes.DOUBLE),
      trips: required(DataTypes.INTEGER),
      maxWeightedAccel: required(DataTypes.DOUBLE),
      status: required(DataTypes.STRING(24)),
      parts: required(DataTypes.TEXT, { defaultValue: '[]' }),
      computedAt: required(DataTypes.DATE),
      notifiedAt: optional(DataTypes.DATE),
    },
    { ...common, tableName: 'driver_exposure_days', timestamps: false },
  );
}
