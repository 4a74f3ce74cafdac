/** Scheduled job runs and the lock that keeps one run at a time. */
import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { pk, ts } from './columns';
import type { JobRunStatus, JobTrigger } from '../../contracts/jobs';

export { JOB_RUN_STATUSES, JOB_TRIGGERS, type JobRunStatus, type JobTrigger } from '../../contracts/jobs';

type Attrs<M extends Model> = InferAttributes<M>;
type CAttrs<M extends Model> = InferCreationAttributes<M>;

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

export function initJobsModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
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
}
