/** Scheduled job runs and the lock that keeps one run at a time. */
import { DataTypes, Model, type CreationOptional, type ForeignKey, type Sequelize } from 'sequelize';
import { Row, optional, required, rowColumns, type Attrs, type CAttrs } from './columns';
import type { JobRunStatus, JobTrigger } from '../../contracts/jobs';

export { JOB_RUN_STATUSES, JOB_TRIGGERS, type JobRunStatus, type JobTrigger } from '../../contracts/jobs';

export class JobRun extends Row<JobRun> {
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
    rowColumns({
      job: required(DataTypes.STRING(40)),
      status: required(DataTypes.STRING(24)),
      trigger: required(DataTypes.STRING(16)),
      asOf: required(DataTypes.DATEONLY),
      requestedById: optional(DataTypes.INTEGER),
      startedAt: required(DataTypes.DATE),
      endedAt: optional(DataTypes.DATE),
      heartbeatAt: optional(DataTypes.DATE),
      phase: optional(DataTypes.STRING(40)),
      progressDone: required(DataTypes.INTEGER, { defaultValue: 0 }),
      progressTotal: required(DataTypes.INTEGER, { defaultValue: 0 }),
      counts: { type: DataTypes.TEXT, allowNull: false, defaultValue: '{}' },
      errors: required(DataTypes.TEXT, { defaultValue: '[]' }),
      message: optional(DataTypes.TEXT),
    }),
    { ...common, tableName: 'job_runs' },
  );
  JobLock.init(
    {
      name: { type: DataTypes.STRING(40), primaryKey: true },
      runId: optional(DataTypes.INTEGER),
      holder: required(DataTypes.STRING(120)),
      acquiredAt: required(DataTypes.DATE),
      heartbeatAt: required(DataTypes.DATE),
    },
    { ...common, tableName: 'job_locks', timestamps: false },
  );
}
