/** The workshop: inspections and work records (lane results, attachments and work items are written by the workshop repositories in SQL). */
import { DataTypes, type CreationOptional, type ForeignKey, type Sequelize } from 'sequelize';
import { Row, optional, required, rowColumns } from './columns';

export const INSPECTION_STATUSES = ['scheduled', 'due', 'overdue', 'done', 'cancelled'] as const;
export type InspectionStatus = (typeof INSPECTION_STATUSES)[number];
export const INSPECTION_TRIGGERS = ['prediction', 'interval_km', 'interval_months', 'manual', 'follow_up'] as const;
export type InspectionTrigger = (typeof INSPECTION_TRIGGERS)[number];

export class Inspection extends Row<Inspection> {
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
}

export class WorkRecord extends Row<WorkRecord> {
  declare vehicleId: ForeignKey<number>;
  declare inspectionId: ForeignKey<number> | null;
  declare mechanicId: ForeignKey<number> | null;
  declare performedAt: Date;
  declare odometerKm: number;
  declare summary: string;
  declare partsCost: number | null;
  declare labourHours: number | null;
}

export function initWorkshopModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
  Inspection.init(
    rowColumns({
      dueDate: required(DataTypes.DATEONLY),
      status: required(DataTypes.STRING(16)),
      reason: required(DataTypes.TEXT),
      completedAt: optional(DataTypes.DATE),
      odometerKm: optional(DataTypes.DOUBLE),
      notes: optional(DataTypes.TEXT),
      trigger: optional(DataTypes.STRING(20)),
      basis: optional(DataTypes.TEXT),
      notifiedStatus: optional(DataTypes.STRING(16)),
      assigneeNotifiedId: optional(DataTypes.INTEGER),
      createdByRunId: optional(DataTypes.INTEGER),
      followUpOn: optional(DataTypes.DATEONLY),
    }),
    { ...common, tableName: 'inspections' },
  );
  WorkRecord.init(
    rowColumns({
      performedAt: required(DataTypes.DATE),
      odometerKm: required(DataTypes.DOUBLE),
      summary: required(DataTypes.TEXT),
      partsCost: optional(DataTypes.DOUBLE),
      labourHours: optional(DataTypes.DOUBLE),
    }),
    { ...common, tableName: 'work_records' },
  );
}
