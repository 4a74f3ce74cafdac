/** Roads: routes, their segments, roughness observations and profile surveys. */
import { DataTypes, type CreationOptional, type ForeignKey, type Sequelize } from 'sequelize';
import { Row, optional, required, rowColumns } from './columns';

export { ROUGHNESS_SOURCES, type RoughnessSource } from '../../contracts/roads';
import type { RoughnessSource } from '../../contracts/roads';

export class Route extends Row<Route> {
  declare name: string;
  declare description: string | null;
  declare depotId: ForeignKey<number> | null;
  /** GeoJSON LineString, as text. */
  declare geometry: string;
  declare lengthM: number;
  declare defaultSpeedKmh: CreationOptional<number>;
  declare segmentLengthM: CreationOptional<number>;
}

export class RouteSegment extends Row<RouteSegment> {
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
}

export class RoughnessObservation extends Row<RoughnessObservation> {
  declare segmentId: ForeignKey<number>;
  declare iri: number | null;
  declare gdN0: number | null;
  declare isoClass: string | null;
  declare source: RoughnessSource;
  declare observedOn: string;
  declare recordedById: ForeignKey<number> | null;
  declare note: string | null;
  declare surveyId: CreationOptional<ForeignKey<number> | null>;
}

/** A longitudinal profile survey of (part of) a route; the profile file is kept under DATA_DIR. */
export class RoadSurvey extends Row<RoadSurvey> {
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
}

export function initRoadsModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
  Route.init(
    rowColumns({
      name: required(DataTypes.STRING(120), { unique: true }),
      description: optional(DataTypes.TEXT),
      geometry: required(DataTypes.TEXT),
      lengthM: required(DataTypes.DOUBLE),
      defaultSpeedKmh: required(DataTypes.DOUBLE, { defaultValue: 50 }),
      segmentLengthM: required(DataTypes.DOUBLE, { defaultValue: 100 }),
    }),
    { ...common, tableName: 'routes' },
  );
  RouteSegment.init(
    rowColumns({
      seq: required(DataTypes.INTEGER),
      startM: required(DataTypes.DOUBLE),
      endM: required(DataTypes.DOUBLE),
      geometry: required(DataTypes.TEXT),
      speedKmh: optional(DataTypes.DOUBLE),
      iri: optional(DataTypes.DOUBLE),
      gdN0: optional(DataTypes.DOUBLE, { field: 'gd_n0' }),
      isoClass: optional(DataTypes.STRING(1)),
      roughnessSource: optional(DataTypes.STRING(20)),
      roughnessDate: optional(DataTypes.DATEONLY),
      surveyId: optional(DataTypes.INTEGER),
    }),
    { ...common, tableName: 'route_segments' },
  );
  RoughnessObservation.init(
    rowColumns({
      iri: optional(DataTypes.DOUBLE),
      gdN0: optional(DataTypes.DOUBLE, { field: 'gd_n0' }),
      isoClass: optional(DataTypes.STRING(1)),
      source: required(DataTypes.STRING(20)),
      observedOn: required(DataTypes.DATEONLY),
      note: optional(DataTypes.STRING(240)),
      surveyId: optional(DataTypes.INTEGER),
    }),
    { ...common, tableName: 'roughness_observations' },
  );
  RoadSurvey.init(
    rowColumns({
      filePath: required(DataTypes.STRING(300)),
      originalName: required(DataTypes.STRING(255)),
      dxM: required(DataTypes.DOUBLE),
      startM: required(DataTypes.DOUBLE),
      endM: required(DataTypes.DOUBLE),
      pointCount: required(DataTypes.INTEGER),
      surveyedOn: required(DataTypes.DATEONLY),
      note: optional(DataTypes.STRING(240)),
      uploadedAt: required(DataTypes.DATE),
    }),
    { ...common, tableName: 'road_surveys' },
  );
}
