/** The nightly duty of each trip and corner. */
import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { dbl, pk, ts } from './columns';

type Attrs<M extends Model> = InferAttributes<M>;
type CAttrs<M extends Model> = InferCreationAttributes<M>;

/**
 * Duty of one corner over one trip, SI units. `rmsWeightedAccel` is the ISO 2631-1 Wk-weighted
 * RMS body acceleration [m/s²] of that corner's sprung mass (a floor-level screening value);
 * the front axle (`axleIndex` 0) is the one nearest the driver — see
 * `wearRepository.frontAxleByTrip` for driver exposure.
 */
export class TripDuty extends Model<Attrs<TripDuty>, CAttrs<TripDuty>> {
  declare id: CreationOptional<number>;
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
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initWearModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
  TripDuty.init(
    {
      id: pk,
      position: { type: DataTypes.STRING(4), allowNull: false },
      axleIndex: { type: DataTypes.INTEGER, allowNull: false },
      tripDate: { type: DataTypes.DATEONLY, allowNull: false },
      distanceKm: dbl(),
      durationS: dbl(),
      sprungMassKg: dbl(),
      energyJ: dbl(),
      meanPowerW: dbl(),
      rmsRelativeVelocity: dbl(),
      rmsSuspensionTravel: dbl(),
      rmsTireLoadRatio: dbl(),
      rmsBodyAccel: dbl(),
      rmsWeightedAccel: dbl(),
      springDamage: dbl(),
      segments: { type: DataTypes.INTEGER, allowNull: false },
      profiledSegments: { type: DataTypes.INTEGER, allowNull: false },
      unratedSegments: { type: DataTypes.INTEGER, allowNull: false },
      slidingM: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
      severity: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 1 },
      jobRunId: { type: DataTypes.INTEGER, allowNull: true },
      ...ts,
    },
    { ...common, tableName: 'trip_duties' },
  );
}
