import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export const ROLES = ['manager', 'mechanic', 'driver'] as const;
export type Role = (typeof ROLES)[number];
export const VEHICLE_STATUSES = ['in_service', 'workshop', 'retired'] as const;
export type VehicleStatus = (typeof VEHICLE_STATUSES)[number];
export const ROUGHNESS_SOURCES = ['survey', 'stated', 'driver_report'] as const;
export type RoughnessSource = (typeof ROUGHNESS_SOURCES)[number];
export const INSPECTION_STATUSES = ['scheduled', 'due', 'overdue', 'done', 'cancelled'] as const;
export type InspectionStatus = (typeof INSPECTION_STATUSES)[number];

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

export class Route extends Model<Attrs<Route>, CAttrs<Route>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare description: string | null;
  declare depotId: ForeignKey<number> | null;
  /** GeoJSON LineString, as text. */
  declare geometry: string;
  declare lengthM: number;
  declare defaultSpeedKmh: CreationOptional<number>;
  declare segmentLengthM: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class RouteSegment extends Model<Attrs<RouteSegment>, CAttrs<RouteSegment>> {
  declare id: CreationOptional<number>;
  declare routeId: ForeignKey<number>;
  declare seq: number;
  declare startM: number;
  declare endM: number;
  /** `[[lon, lat], ...]` as JSON text. */
  declare geometry: string;
  declare speedKmh: number | null;
  declare iri: CreationOptional<number | null>;
  declare gdN0: CreationOptional<number | null>;
  declare isoClass: CreationOptional<string | null>;
  declare roughnessSource: CreationOptional<RoughnessSource | null>;
  declare roughnessDate: CreationOptional<string | null>;
  /** The survey behind the current roughness (null unless the current value is a survey). */
  declare surveyId: CreationOptional<ForeignKey<number> | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class RoughnessObservation extends Model<Attrs<RoughnessObservation>, CAttrs<RoughnessObservation>> {
  declare id: CreationOptional<number>;
  declare segmentId: ForeignKey<number>;
  declare iri: number | null;
  declare gdN0: number | null;
  declare isoClass: string | null;
  declare source: RoughnessSource;
  declare observedOn: string;
  declare recordedById: ForeignKey<number> | null;
  declare note: string | null;
  declare surveyId: CreationOptional<ForeignKey<number> | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

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

export class Inspection extends Model<Attrs<Inspection>, CAttrs<Inspection>> {
  declare id: CreationOptional<number>;
  declare vehicleId: ForeignKey<number>;
  declare dueDate: string;
  declare status: InspectionStatus;
  declare reason: string;
  declare assigneeId: ForeignKey<number> | null;
  declare completedAt: Date | null;
  declare odometerKm: number | null;
  declare notes: string | null;
  /** The rule that scheduled it (prediction | interval_km | interval_months | manual | follow_up), null for older rows. */
  declare trigger: CreationOptional<string | null>;
  /** JSON text of the numbers the schedule rests on. */
  declare basis: CreationOptional<string | null>;
  /** The last status managers were e-mailed about. */
  declare notifiedStatus: CreationOptional<string | null>;
  /** The assignee who was e-mailed about it. */
  declare assigneeNotifiedId: CreationOptional<number | null>;
  declare createdByRunId: CreationOptional<number | null>;
  /** The day the mechanic asked to check again ("check again soon"), or null. */
  declare followUpOn: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class WorkRecord extends Model<Attrs<WorkRecord>, CAttrs<WorkRecord>> {
  declare id: CreationOptional<number>;
  declare vehicleId: ForeignKey<number>;
  declare inspectionId: ForeignKey<number> | null;
  declare mechanicId: ForeignKey<number> | null;
  declare performedAt: Date;
  declare odometerKm: number;
  declare summary: string;
  declare partsCost: number | null;
  declare labourHours: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** A longitudinal profile survey of (part of) a route; the profile file is kept under DATA_DIR. */
export class RoadSurvey extends Model<Attrs<RoadSurvey>, CAttrs<RoadSurvey>> {
  declare id: CreationOptional<number>;
  declare routeId: ForeignKey<number>;
  /** Path of the stored profile CSV relative to DATA_DIR. */
  declare filePath: string;
  declare originalName: string;
  declare dxM: number;
  declare startM: number;
  declare endM: number;
  declare pointCount: number;
  declare surveyedOn: string;
  declare note: string | null;
  declare uploadedById: ForeignKey<number> | null;
  declare uploadedAt: Date;
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

/** Timestamp columns every model has. */
export const ts = {
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
};
/** Integer primary key column. */
export const pk = { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true };

/** Registers every model and association on a Sequelize instance (the schema itself comes from migrations). */
export function initModels(sequelize: Sequelize) {
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
  Route.init(
    {
      id: pk,
      name: { type: DataTypes.STRING(120), allowNull: false, unique: true },
      description: { type: DataTypes.TEXT, allowNull: true },
      geometry: { type: DataTypes.TEXT, allowNull: false },
      lengthM: { type: DataTypes.DOUBLE, allowNull: false },
      defaultSpeedKmh: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 50 },
      segmentLengthM: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 100 },
      ...ts,
    },
    { ...common, tableName: 'routes' },
  );
  RouteSegment.init(
    {
      id: pk,
      seq: { type: DataTypes.INTEGER, allowNull: false },
      startM: { type: DataTypes.DOUBLE, allowNull: false },
      endM: { type: DataTypes.DOUBLE, allowNull: false },
      geometry: { type: DataTypes.TEXT, allowNull: false },
      speedKmh: { type: DataTypes.DOUBLE, allowNull: true },
      iri: { type: DataTypes.DOUBLE, allowNull: true },
      gdN0: { type: DataTypes.DOUBLE, allowNull: true, field: 'gd_n0' },
      isoClass: { type: DataTypes.STRING(1), allowNull: true },
      roughnessSource: { type: DataTypes.STRING(20), allowNull: true },
      roughnessDate: { type: DataTypes.DATEONLY, allowNull: true },
      surveyId: { type: DataTypes.INTEGER, allowNull: true },
      ...ts,
    },
    { ...common, tableName: 'route_segments' },
  );
  RoughnessObservation.init(
    {
      id: pk,
      iri: { type: DataTypes.DOUBLE, allowNull: true },
      gdN0: { type: DataTypes.DOUBLE, allowNull: true, field: 'gd_n0' },
      isoClass: { type: DataTypes.STRING(1), allowNull: true },
      source: { type: DataTypes.STRING(20), allowNull: false },
      observedOn: { type: DataTypes.DATEONLY, allowNull: false },
      note: { type: DataTypes.STRING(240), allowNull: true },
      surveyId: { type: DataTypes.INTEGER, allowNull: true },
      ...ts,
    },
    { ...common, tableName: 'roughness_observations' },
  );
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
  RoadSurvey.init(
    {
      id: pk,
      filePath: { type: DataTypes.STRING(300), allowNull: false },
      originalName: { type: DataTypes.STRING(255), allowNull: false },
      dxM: { type: DataTypes.DOUBLE, allowNull: false },
      startM: { type: DataTypes.DOUBLE, allowNull: false },
      endM: { type: DataTypes.DOUBLE, allowNull: false },
      pointCount: { type: DataTypes.INTEGER, allowNull: false },
      surveyedOn: { type: DataTypes.DATEONLY, allowNull: false },
      note: { type: DataTypes.STRING(240), allowNull: true },
      uploadedAt: { type: DataTypes.DATE, allowNull: false },
      ...ts,
    },
    { ...common, tableName: 'road_surveys' },
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
  Inspection.init(
    {
      id: pk,
      dueDate: { type: DataTypes.DATEONLY, allowNull: false },
      status: { type: DataTypes.STRING(16), allowNull: false },
      reason: { type: DataTypes.TEXT, allowNull: false },
      completedAt: { type: DataTypes.DATE, allowNull: true },
      odometerKm: { type: DataTypes.DOUBLE, allowNull: true },
      notes: { type: DataTypes.TEXT, allowNull: true },
      trigger: { type: DataTypes.STRING(20), allowNull: true },
      basis: { type: DataTypes.TEXT, allowNull: true },
      notifiedStatus: { type: DataTypes.STRING(16), allowNull: true },
      assigneeNotifiedId: { type: DataTypes.INTEGER, allowNull: true },
      createdByRunId: { type: DataTypes.INTEGER, allowNull: true },
      followUpOn: { type: DataTypes.DATEONLY, allowNull: true },
      ...ts,
    },
    { ...common, tableName: 'inspections' },
  );
  WorkRecord.init(
    {
      id: pk,
      performedAt: { type: DataTypes.DATE, allowNull: false },
      odometerKm: { type: DataTypes.DOUBLE, allowNull: false },
      summary: { type: DataTypes.TEXT, allowNull: false },
      partsCost: { type: DataTypes.DOUBLE, allowNull: true },
      labourHours: { type: DataTypes.DOUBLE, allowNull: true },
      ...ts,
    },
    { ...common, tableName: 'work_records' },
  );

  User.belongsTo(Depot, { as: 'depot', foreignKey: 'depotId' });
  SuspensionSpec.hasMany(SpecAxle, { as: 'axles', foreignKey: 'specId' });
  SpecAxle.belongsTo(SuspensionSpec, { as: 'spec', foreignKey: 'specId' });
  Vehicle.belongsTo(SuspensionSpec, { as: 'spec', foreignKey: 'specId' });
  Vehicle.belongsTo(Depot, { as: 'depot', foreignKey: 'depotId' });
  Vehicle.belongsTo(User, { as: 'driver', foreignKey: 'driverId' });
  SuspensionSpec.hasMany(Vehicle, { as: 'vehicles', foreignKey: 'specId' });
  Depot.hasMany(Vehicle, { as: 'vehicles', foreignKey: 'depotId' });
  Vehicle.hasMany(Damper, { as: 'dampers', foreignKey: 'vehicleId' });
  Damper.belongsTo(Vehicle, { as: 'vehicle', foreignKey: 'vehicleId' });
  Damper.belongsTo(WorkRecord, { as: 'removedBy', foreignKey: 'removedByWorkRecordId' });
  Route.belongsTo(Depot, { as: 'depot', foreignKey: 'depotId' });
  Route.hasMany(RouteSegment, { as: 'segments', foreignKey: 'routeId' });
  RouteSegment.belongsTo(Route, { as: 'route', foreignKey: 'routeId' });
  RouteSegment.hasMany(RoughnessObservation, { as: 'observations', foreignKey: 'segmentId' });
  RoughnessObservation.belongsTo(RouteSegment, { as: 'segment', foreignKey: 'segmentId' });
  RoughnessObservation.belongsTo(User, { as: 'recordedBy', foreignKey: 'recordedById' });
  RoadSurvey.belongsTo(Route, { as: 'route', foreignKey: 'routeId' });
  RoadSurvey.belongsTo(User, { as: 'uploadedBy', foreignKey: 'uploadedById' });
  Route.hasMany(RoadSurvey, { as: 'surveys', foreignKey: 'routeId' });
  RoughnessObservation.belongsTo(RoadSurvey, { as: 'survey', foreignKey: 'surveyId' });
  RouteSegment.belongsTo(RoadSurvey, { as: 'survey', foreignKey: 'surveyId' });
  TripImport.belongsTo(User, { as: 'importedBy', foreignKey: 'importedById' });
  Trip.belongsTo(TripImport, { as: 'import', foreignKey: 'importId' });
  Trip.belongsTo(Vehicle, { as: 'vehicle', foreignKey: 'vehicleId' });
  Trip.belongsTo(Route, { as: 'route', foreignKey: 'routeId' });
  Trip.belongsTo(User, { as: 'driver', foreignKey: 'driverId' });
  Vehicle.hasMany(Trip, { as: 'trips', foreignKey: 'vehicleId' });
  Inspection.belongsTo(Vehicle, { as: 'vehicle', foreignKey: 'vehicleId' });
  Inspection.belongsTo(User, { as: 'assignee', foreignKey: 'assigneeId' });
  Vehicle.hasMany(Inspection, { as: 'inspections', foreignKey: 'vehicleId' });
  WorkRecord.belongsTo(Vehicle, { as: 'vehicle', foreignKey: 'vehicleId' });
  WorkRecord.belongsTo(Inspection, { as: 'inspection', foreignKey: 'inspectionId' });
  WorkRecord.belongsTo(User, { as: 'mechanic', foreignKey: 'mechanicId' });
}
