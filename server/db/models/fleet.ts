/** The fleet: depots, suspension specs and their axles, vehicles and the dampers fitted to them. */
import { DataTypes, type CreationOptional, type ForeignKey, type Sequelize } from 'sequelize';
import type { VehicleStatus } from '../../contracts/fleet';
import { Row, optional, required, rowColumns } from './columns';

export { VEHICLE_STATUSES, type VehicleStatus } from '../../contracts/fleet';

export class Depot extends Row<Depot> {
  declare name: string;
  declare address: string | null;
  declare lat: number;
  declare lon: number;
}

export class SuspensionSpec extends Row<SuspensionSpec> {
  declare name: string;
  declare vehicleClass: string;
  declare description: string | null;
  /** SEAT value of the driver's seat [1], null = the vehicle class default (server/physics/seat.ts). */
  declare seatFactor: CreationOptional<number | null>;
  /** Cab suspension transmissibility [1], null = none. */
  declare cabFactor: CreationOptional<number | null>;
  declare axles?: SpecAxle[];
}

export class SpecAxle extends Row<SpecAxle> {
  declare specId: ForeignKey<number>;
  declare axleIndex: number;
  declare label: string;
  declare sprungMassKg: number;
  declare unsprungMassKg: number;
  declare springRateNPerM: number;
  declare dampingNsPerM: number;
  declare tireRateNPerM: number;
  declare ratedDamperLifeKm: CreationOptional<number>;
}

export class Vehicle extends Row<Vehicle> {
  declare fleetNumber: string;
  declare plate: string;
  declare specId: ForeignKey<number>;
  declare depotId: ForeignKey<number>;
  declare driverId: ForeignKey<number> | null;
  declare odometerKm: CreationOptional<number>;
  declare status: CreationOptional<VehicleStatus>;
  declare commissionedAt: string | null;
}

export class Damper extends Row<Damper> {
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
}

export function initFleetModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
  Depot.init(
    rowColumns({
      name: required(DataTypes.STRING(120), { unique: true }),
      address: optional(DataTypes.STRING(240)),
      lat: required(DataTypes.DOUBLE),
      lon: required(DataTypes.DOUBLE),
    }),
    { ...common, tableName: 'depots' },
  );
  SuspensionSpec.init(
    rowColumns({
      name: required(DataTypes.STRING(120), { unique: true }),
      vehicleClass: required(DataTypes.STRING(40)),
      description: optional(DataTypes.TEXT),
      seatFactor: optional(DataTypes.DOUBLE),
      cabFactor: optional(DataTypes.DOUBLE),
    }),
    { ...common, tableName: 'suspension_specs' },
  );
  SpecAxle.init(
    rowColumns({
      axleIndex: required(DataTypes.INTEGER),
      label: required(DataTypes.STRING(40)),
      sprungMassKg: required(DataTypes.DOUBLE),
      unsprungMassKg: required(DataTypes.DOUBLE),
      springRateNPerM: required(DataTypes.DOUBLE),
      dampingNsPerM: required(DataTypes.DOUBLE),
      tireRateNPerM: required(DataTypes.DOUBLE),
      ratedDamperLifeKm: required(DataTypes.DOUBLE, { defaultValue: 90000 }),
    }),
    { ...common, tableName: 'spec_axles' },
  );
  Vehicle.init(
    rowColumns({
      fleetNumber: required(DataTypes.STRING(20), { unique: true }),
      plate: required(DataTypes.STRING(20), { unique: true }),
      odometerKm: required(DataTypes.DOUBLE, { defaultValue: 0 }),
      status: required(DataTypes.STRING(16), { defaultValue: 'in_service' }),
      commissionedAt: optional(DataTypes.DATEONLY),
    }),
    { ...common, tableName: 'vehicles' },
  );
  Damper.init(
    rowColumns({
      position: required(DataTypes.STRING(4)),
      axleIndex: required(DataTypes.INTEGER),
      partNumber: optional(DataTypes.STRING(60)),
      installedAt: required(DataTypes.DATEONLY),
      installedOdometerKm: required(DataTypes.DOUBLE),
      removedAt: optional(DataTypes.DATEONLY),
      removedOdometerKm: optional(DataTypes.DOUBLE),
      removalReason: optional(DataTypes.STRING(40)),
      energyJ: required(DataTypes.DOUBLE, { defaultValue: 0 }),
      fatigueDamage: required(DataTypes.DOUBLE, { defaultValue: 0 }),
      lifeUsedFraction: required(DataTypes.DOUBLE, { defaultValue: 0 }),
      dampingNsPerM: optional(DataTypes.DOUBLE),
      wearUpdatedAt: optional(DataTypes.DATE),
      wearDirtyFrom: optional(DataTypes.DATEONLY),
      openingKm: optional(DataTypes.DOUBLE),
      wearKm: optional(DataTypes.DOUBLE),
      wearExponent: optional(DataTypes.DOUBLE),
      openingEnergyJ: optional(DataTypes.DOUBLE),
      openingSpringDamage: optional(DataTypes.DOUBLE),
      openingBasis: optional(DataTypes.TEXT),
    }),
    { ...common, tableName: 'dampers' },
  );
}
