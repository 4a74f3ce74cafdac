/**
 * Models of the nightly damper-duty job (migration 0003): duty per trip × corner,
 * daily wear history, latest prediction per damper, job runs and locks, outgoing and caught
 * mail. Registered by `initModels`.
 */
import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import { Damper, Route, Trip, User, Vehicle, pk, ts } from './models';

type Attrs<M extends Model> = InferAttributes<M>;
type CAttrs<M extends Model> = InferCreationAttributes<M>;

export const JOB_RUN_STATUSES = ['running', 'succeeded', 'completed_with_errors', 'failed', 'cancelled'] as const;
export type JobRunStatus = (typeof JOB_RUN_STATUSES)[number];
export const JOB_TRIGGERS = ['schedule', 'cli', 'manual', 'test', 'seed'] as const;
export type JobTrigger = (typeof JOB_TRIGGERS)[number];
export const MAIL_KINDS = ['digest', 'assignment', 'note'] as const;
export type MailKind = (typeof MAIL_KINDS)[number];
export const INSPECTION_TRIGGERS = ['prediction', 'interval_km', 'interval_months', 'manual', 'follow_up'] as const;
export type InspectionTrigger = (typeof INSPECTION_TRIGGERS)[number];

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


export class JobRun extends Model<Attrs<JobRun>, CAttrs<JobRun>> {
  declare id: CreationOptional<number>;
  declare job: string;
  declare status: JobRunStatus;
  declare trigger: JobTrigger;
  declare asOf: string;
  declare requestedById: ForeignKey<number> | null;
  declare startedAt: Date;
  declare endedAt: Date | null;
  declare heartbeatAt: Date | null;
  declare phase: string | null;
  declare progressDone: CreationOptional<number>;
  declare progressTotal: CreationOptional<number>;
  /** JSON text of counts. */
  declare counts: CreationOptional<string>;
  /** JSON text of `{ item, message }[]`. */
  declare errors: CreationOptional<string>;
  declare message: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class JobLock extends Model<Attrs<JobLock>, CAttrs<JobLock>> {
  declare name: string;
  declare runId: number | null;
  declare holder: string;
  declare acquiredAt: Date;
  declare heartbeatAt: Date;
}

export class MailMessage extends Model<Attrs<MailMessage>, CAttrs<MailMessage>> {
  declare id: CreationOptional<number>;
  declare dedupeKey: string;
  declare kind: MailKind;
  declare userId: ForeignKey<number> | null;
  declare toAddress: string;
  declare subject: string;
  declare textBody: string;
  declare htmlBody: string;
  declare status: 'pending' | 'sent' | 'failed';
  declare messageId: string | null;
  declare error: string | null;
  declare attempts: CreationOptional<number>;
  declare jobRunId: number | null;
  declare sentAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class CaughtMail extends Model<Attrs<CaughtMail>, CAttrs<CaughtMail>> {
  declare id: CreationOptional<number>;
  declare messageId: string | null;
  declare dedupeKey: string | null;
  declare mailFrom: string | null;
  declare rcptTo: string;
  declare subject: string;
  declare textBody: string | null;
  declare htmlBody: string | null;
  declare sizeBytes: number;
  declare receivedAt: Date;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

const dbl = { type: DataTypes.DOUBLE, allowNull: false };

export function initNightlyModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
  TripDuty.init(
    {
      id: pk,
      position: { type: DataTypes.STRING(4), allowNull: false },
      axleIndex: { type: DataTypes.INTEGER, allowNull: false },
      tripDate: { type: DataTypes.DATEONLY, allowNull: false },
      distanceKm: dbl,
      durationS: dbl,
      sprungMassKg: dbl,
      energyJ: dbl,
      meanPowerW: dbl,
      rmsRelativeVelocity: dbl,
      rmsSuspensionTravel: dbl,
      rmsTireLoadRatio: dbl,
      rmsBodyAccel: dbl,
      rmsWeightedAccel: dbl,
      springDamage: dbl,
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
  JobRun.init(
    {
      id: pk,
      job: { type: DataTypes.STRING(40), allowNull: false },
      status: { type: DataTypes.STRING(24), allowNull: false },
      trigger: { type: DataTypes.STRING(16), allowNull: false },
      asOf: { type: DataTypes.DATEONLY, allowNull: false },
      requestedById: { type: DataTypes.INTEGER, allowNull: true },
      startedAt: { type: DataTypes.DATE, allowNull: false },
      endedAt: { type: DataTypes.DATE, allowNull: true },
      heartbeatAt: { type: DataTypes.DATE, allowNull: true },
      phase: { type: DataTypes.STRING(40), allowNull: true },
      progressDone: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      progressTotal: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      counts: { type: DataTypes.TEXT, allowNull: false, defaultValue: '{}' },
      errors: { type: DataTypes.TEXT, allowNull: false, defaultValue: '[]' },
      message: { type: DataTypes.TEXT, allowNull: true },
      ...ts,
    },
    { ...common, tableName: 'job_runs' },
  );
  JobLock.init(
    {
      name: { type: DataTypes.STRING(40), primaryKey: true },
      runId: { type: DataTypes.INTEGER, allowNull: true },
      holder: { type: DataTypes.STRING(120), allowNull: false },
      acquiredAt: { type: DataTypes.DATE, allowNull: false },
      heartbeatAt: { type: DataTypes.DATE, allowNull: false },
    },
    { ...common, tableName: 'job_locks', timestamps: false },
  );
  MailMessage.init(
    {
      id: pk,
      dedupeKey: { type: DataTypes.STRING(200), allowNull: false, unique: true },
      kind: { type: DataTypes.STRING(24), allowNull: false },
      toAddress: { type: DataTypes.STRING(254), allowNull: false },
      subject: { type: DataTypes.STRING(250), allowNull: false },
      textBody: { type: DataTypes.TEXT, allowNull: false },
      htmlBody: { type: DataTypes.TEXT, allowNull: false },
      status: { type: DataTypes.STRING(12), allowNull: false },
      messageId: { type: DataTypes.STRING(250), allowNull: true },
      error: { type: DataTypes.TEXT, allowNull: true },
      attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      jobRunId: { type: DataTypes.INTEGER, allowNull: true },
      sentAt: { type: DataTypes.DATE, allowNull: true },
      ...ts,
    },
    { ...common, tableName: 'mail_messages' },
  );
  CaughtMail.init(
    {
      id: pk,
      messageId: { type: DataTypes.STRING(250), allowNull: true },
      dedupeKey: { type: DataTypes.STRING(200), allowNull: true },
      mailFrom: { type: DataTypes.STRING(254), allowNull: true },
      rcptTo: { type: DataTypes.TEXT, allowNull: false },
      subject: { type: DataTypes.STRING(250), allowNull: false },
      textBody: { type: DataTypes.TEXT, allowNull: true },
      htmlBody: { type: DataTypes.TEXT, allowNull: true },
      sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
      receivedAt: { type: DataTypes.DATE, allowNull: false },
      ...ts,
    },
    { ...common, tableName: 'caught_mail' },
  );

  TripDuty.belongsTo(Trip, { as: 'trip', foreignKey: 'tripId' });
  TripDuty.belongsTo(Vehicle, { as: 'vehicle', foreignKey: 'vehicleId' });
  TripDuty.belongsTo(Damper, { as: 'damper', foreignKey: 'damperId' });
  TripDuty.belongsTo(Route, { as: 'route', foreignKey: 'routeId' });
  TripDuty.belongsTo(User, { as: 'driver', foreignKey: 'driverId' });
  Trip.hasMany(TripDuty, { as: 'duties', foreignKey: 'tripId' });
  JobRun.belongsTo(User, { as: 'requestedBy', foreignKey: 'requestedById' });
  MailMessage.belongsTo(User, { as: 'user', foreignKey: 'userId' });
}
