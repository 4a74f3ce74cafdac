/** The nightly duty of each trip and corner. */
import { DataTypes, type CreationOptional, type ForeignKey, type Sequelize } from 'sequelize';
import { Row, optional, required, rowColumns } from './columns';

/**
 * Duty of one corner over one trip, SI units. `rmsWeightedAccel` is the ISO 2631-1 Wk-weighted
 * RMS body acceleration [m/s²] of that corner's sprung mass (a floor-level screening value);
 * the front axle (`axleIndex` 0) is the one nearest the driver — see
 * `wearRepository.frontAxleByTrip` for driver exposure.
 */
export class TripDuty extends Row<TripDuty> {
  declare tripId: ForeignKey<number>;
  declare vehicleId: ForeignKey<number>;
  declare damperId: ForeignKey<number> | null;
  declare routeId: ForeignKey<number>;
  declare driverId: ForeignKey<number> | null;
  declare position: string;
  declare axleIndex: number;
  declare tripDate: string;
  declare distanceKm: number;
  declare durationS: number;
  declare sprungMassKg: number;
  declare energyJ: number;
  declare meanPowerW: number;
  declare rmsRelativeVelocity: number;
  declare rmsSuspensionTravel: number;
  declare rmsTireLoadRatio: number;
  declare rmsBodyAccel: number;
  declare rmsWeightedAccel: number;
  declare springDamage: number;
  declare segments: number;
  declare profiledSegments: number;
  declare unratedSegments: number;
  /** Rod sliding distance [m] and road severity [1] of the damper's duty measure (server/wear/life-law.ts). */
  declare slidingM: CreationOptional<number>;
  declare severity: CreationOptional<number>;
  declare jobRunId: number | null;
}

export function initWearModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
  TripDuty.init(
    rowColumns({
      position: required(DataTypes.STRING(4)),
      axleIndex: required(DataTypes.INTEGER),
      tripDate: required(DataTypes.DATEONLY),
      distanceKm: required(DataTypes.DOUBLE),
      durationS: required(DataTypes.DOUBLE),
      sprungMassKg: required(DataTypes.DOUBLE),
      energyJ: required(DataTypes.DOUBLE),
      meanPowerW: required(DataTypes.DOUBLE),
      rmsRelativeVelocity: required(DataTypes.DOUBLE),
      rmsSuspensionTravel: required(DataTypes.DOUBLE),
      rmsTireLoadRatio: required(DataTypes.DOUBLE),
      rmsBodyAccel: required(DataTypes.DOUBLE),
      rmsWeightedAccel: required(DataTypes.DOUBLE),
      springDamage: required(DataTypes.DOUBLE),
      segments: required(DataTypes.INTEGER),
      profiledSegments: required(DataTypes.INTEGER),
      unratedSegments: required(DataTypes.INTEGER),
      slidingM: required(DataTypes.DOUBLE, { defaultValue: 0 }),
      severity: required(DataTypes.DOUBLE, { defaultValue: 1 }),
      jobRunId: optional(DataTypes.INTEGER),
    }),
    { ...common, tableName: 'trip_duties' },
  );
}
