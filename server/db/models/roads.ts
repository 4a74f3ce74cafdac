/** Roads: routes, their segments, roughness observations and profile surveys. */
import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { pk, ts } from './columns';

export { ROUGHNESS_SOURCES, type RoughnessSource } from '../../contracts/roads';
import type { RoughnessSource } from '../../contracts/roads';

type Attrs<M extends Model> = InferAttributes<M>;
type CAttrs<M extends Model> = InferCreationAttributes<M>;

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

export function initRoadsModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
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
}
