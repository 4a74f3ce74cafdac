/**
 * The Sequelize models, one file per area of the data (the schema itself comes from the
 * migrations), and the associations between them. They stay together under db/ rather than in
 * each area's folder: an association joins two areas, and registering them all in one place keeps
 * db/ from importing any area.
 */
import type { Sequelize } from 'sequelize';
import { User, initPeopleModels } from './people';
import { Depot, SuspensionSpec, SpecAxle, Vehicle, Damper, initFleetModels } from './fleet';
import { Route, RouteSegment, RoughnessObservation, RoadSurvey, initRoadsModels } from './roads';
import { Trip, TripImport, initTripsModels } from './trips';
import { Inspection, WorkRecord, initWorkshopModels } from './workshop';
import { TripDuty, initWearModels } from './wear';
import { JobRun, initJobsModels } from './jobs';
import { MailMessage, initMailModels } from './mail';
import { RideReport, DriverExposureDay, initDriversModels } from './drivers';

export * from './people';
export * from './fleet';
export * from './roads';
export * from './trips';
export * from './workshop';
export * from './wear';
export * from './jobs';
export * from './mail';
export * from './drivers';
export { pk, ts } from './columns';

/** Registers every model and association on a Sequelize instance. */
export function initModels(sequelize: Sequelize) {
  initPeopleModels(sequelize);
  initFleetModels(sequelize);
  initRoadsModels(sequelize);
  initTripsModels(sequelize);
  initWorkshopModels(sequelize);
  initWearModels(sequelize);
  initJobsModels(sequelize);
  initMailModels(sequelize);
  initDriversModels(sequelize);
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
  TripDuty.belongsTo(Trip, { as: 'trip', foreignKey: 'tripId' });
  TripDuty.belongsTo(Vehicle, { as: 'vehicle', foreignKey: 'vehicleId' });
  TripDuty.belongsTo(Damper, { as: 'damper', foreignKey: 'damperId' });
  TripDuty.belongsTo(Route, { as: 'route', foreignKey: 'routeId' });
  TripDuty.belongsTo(User, { as: 'driver', foreignKey: 'driverId' });
  Trip.hasMany(TripDuty, { as: 'duties', foreignKey: 'tripId' });
  JobRun.belongsTo(User, { as: 'requestedBy', foreignKey: 'requestedById' });
  MailMessage.belongsTo(User, { as: 'user', foreignKey: 'userId' });
  RideReport.belongsTo(User, { as: 'driver', foreignKey: 'driverId' });
  RideReport.belongsTo(User, { as: 'decidedBy', foreignKey: 'decidedById' });
  RideReport.belongsTo(Vehicle, { as: 'vehicle', foreignKey: 'vehicleId' });
  RideReport.belongsTo(Route, { as: 'route', foreignKey: 'routeId' });
  RideReport.belongsTo(RouteSegment, { as: 'segment', foreignKey: 'segmentId' });
  RideReport.belongsTo(RoughnessObservation, { as: 'observation', foreignKey: 'observationId' });
  DriverExposureDay.belongsTo(User, { as: 'driver', foreignKey: 'driverId' });
}
