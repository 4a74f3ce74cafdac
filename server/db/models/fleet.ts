/** The fleet: depots, suspension specs and their axles, vehicles and the dampers fitted to them. */
import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { VehicleStatus } from '../../contracts/fleet';
import { pk, ts } from './columns';

export { VEHICLE_STATUSES, type VehicleStatus } from '../../contracts/fleet';

type Attrs<M extends Model> = InferAttributes<M>;
type CAttrs<M extends Model> = InferCreationAttributes<M>;

export class Depot extends Model<Attrs<Depot>, CAttrs<Depot>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare address: string | null;
  declare lat: number;
  declare lon: number;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class SuspensionSpec extends Model<Attrs<SuspensionSpec>, CAttrs<SuspensionSpec>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare vehicleClass: string;
  declare description: string | null;
  /** SEAT value of the driver's seat [1], null = the vehicle class default (server/physics/seat.ts). */
  declare seatFactor: CreationOptional<number | null>;
  /** Cab suspension transmissibility [1], null = none. */
  declare cabFactor: CreationOptional<number | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare axles?: SpecAxle[];
}

export class SpecAxle extends Model<Attrs<SpecAxle>, CAttrs<SpecAxle>> {
  declare id: CreationOptional<number>;
  declare specId: ForeignKey<number>;
  declare axleIndex: number;
  declare label: string;
  declare sprungMassKg: number;
  declare unsprungMassKg: number;
  declare springRateNPerM: number;
  declare dampingNsPerM: number;
  declare tireRateNPerM: number;
  declare ratedDamperLifeKm: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class Vehicle extends Model<Attrs<Vehicle>, CAttrs<Vehicle>> {
  declare id: CreationOptional<number>;
  declare fleetNumber: string;
  declare plate: string;
  declare specId: ForeignKey<number>;
  declare depotId: ForeignKey<number>;
  declare driverId: ForeignKey<number> | null;
  declare odometerKm: CreationOptional<number>;
  declare status: CreationOptional<VehicleStatus>;
  declare commissionedAt: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class Damper extends Model<Attrs<Damper>, CAttrs<Damper>> {
  declare id: CreationOptional<number>;
  declare vehicleId: ForeignKey<number>;
  declare position: string;
  declare axleIndex: number;
  declare partNumber: string | null;
  declare installedAt: string;
  declare installedOdometerKm: number;
  declare removedAt: CreationOptional<string | null>;
  declare removedOdometerKm: CreationOptional<number | null>;
  declare removalReason: CreationOptional<string | null>;
  declare removedByWorkRecordId: ForeignKey<number> | null;
  declare energyJ: CreationOptional<number>;
  declare fatigueDamage: CreationOptional<number>;
  declare lifeUsedFraction: CreationOptional<number>;
  declare dampingNsPerM: CreationOptional<number | null>;
  declare wearUpdatedAt: CreationOptional<Date | null>;
  /** Derived wear must be recomputed from this day on (null = up to date). */
  declare wearDirtyFrom: CreationOptional<string | null>;
  /** Opening wear (distance before the trips on record), estimated once by the nightly job; null until then. */
  declare openingKm: CreationOptional<number | null>;
  declare openingEnergyJ: CreationOptional<number | null>;
  declare openingSpringDamage: CreationOptional<number | null>;
  declare openingBasis: CreationOptional<string | null>;
  /** Wear km (distance weighted by road severity, recorded and opening) and the road sensitivity its wear days were summed with. */
  declare wearKm: CreationOptional<number | null>;
  declare wearExponent: CreationOptional<number | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initFleetModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
  Depot.init(
    {
      id: pk,
      name: { type: DataTypes.STRING(120), allowNull: false, unique: true },
      address: { type: DataTypes.STRING(240), allowNull: true },
      lat: { type: DataTypes.DOUBLE, allowNull: false },
      lon: { type: DataTypes.DOUBLE, allowNull: false },
      ...ts,
    },
    { ...common, tableName: 'depots' },
  );
  SuspensionSpec.init(
    {
      id: pk,
      name: { type: DataTypes.STRING(120), allowNull: false, unique: true },
      vehicleClass: { type: DataTypes.STRING(40), allowNull: false },
      description: { type: DataTypes.TEXT, allowNull: true },
      seatFactor: { type: DataTypes.DOUBLE, allowNull: true },
      cabFactor: { type: DataTypes.DOUBLE, allowNull: true },
      ...ts,
    },
    { ...common, tableName: 'suspension_specs' },
  );
  SpecAxle.init(
    {
      id: pk,
      axleIndex: { type: DataTypes.INTEGER, allowNull: false },
      label: { type: DataTypes.STRING(40), allowNull: false },
      sprungMassKg: { type: DataTypes.DOUBLE, allowNull: false },
      unsprungMassKg: { type: DataTypes.DOUBLE, allowNull: false },
      springRateNPerM: { type: DataTypes.DOUBLE, allowNull: false },
      dampingNsPerM: { type: DataTypes.DOUBLE, allowNull: false },
      tireRateNPerM: { type: DataTypes.DOUBLE, allowNull: false },
      ratedDamperLifeKm: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 90000 },
      ...ts,
    },
    { ...common, tableName: 'spec_axles' },
  );
  Vehicle.init(
    {
      id: pk,
      fleetNumber: { type: DataTypes.STRING(20), allowNull: false, unique: true },
      plate: { type: DataTypes.STRING(20), allowNull: false, unique: true },
      odometerKm: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
      status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'in_service' },
      commissionedAt: { type: DataTypes.DATEONLY, allowNull: true },
      ...ts,
    },
    { ...common, tableName: 'vehicles' },
  );
  Damper.init(
    {
      id: pk,
      position: { type: DataTypes.STRING(4), allowNull: false },
      axleIndex: { type: DataTypes.INTEGER, allowNull: false },
      partNumber: { type: DataTypes.STRING(60), allowNull: true },
      installedAt: { type: DataTypes.DATEONLY, allowNull: false },
      installedOdometerKm: { type: DataTypes.DOUBLE, allowNull: false },
      removedAt: { type: DataTypes.DATEONLY, allowNull: true },
      removedOdometerKm: { type: DataTypes.DOUBLE, allowNull: true },
      removalReason: { type: DataTypes.STRING(40), allowNull: true },
      energyJ: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
      fatigueDamage: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
      lifeUsedFraction: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
      dampingNsPerM: { type: DataTypes.DOUBLE, allowNull: true },
      wearUpdatedAt: { type: DataTypes.DATE, allowNull: true },
      wearDirtyFrom: { type: DataTypes.DATEONLY, allowNull: true },
      openingKm: { type: DataTypes.DOUBLE, allowNull: true },
      wearKm: { type: DataTypes.DOUBLE, allowNull: true },
      wearExponent: { type: DataTypes.DOUBLE, allowNull: true },
      openingEnergyJ: { type: DataTypes.DOUBLE, allowNull: true },
      openingSpringDamage: { type: DataTypes.DOUBLE, allowNull: true },
      openingBasis: { type: DataTypes.TEXT, allowNull: true },
      ...ts,
    },
    { ...common, tableName: 'dampers' },
  );
}
