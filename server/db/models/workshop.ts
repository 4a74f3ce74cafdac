/** The workshop: inspections and work records (lane results, attachments and work items are written by the workshop repositories in SQL). */
import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { pk, ts } from './columns';

export const INSPECTION_STATUSES = ['scheduled', 'due', 'overdue', 'done', 'cancelled'] as const;
export type InspectionStatus = (typeof INSPECTION_STATUSES)[number];
export const INSPECTION_TRIGGERS = ['prediction', 'interval_km', 'interval_months', 'manual', 'follow_up'] as const;
export type InspectionTrigger = (typeof INSPECTION_TRIGGERS)[number];

type Attrs<M extends Model> = InferAttributes<M>;
type CAttrs<M extends Model> = InferCreationAttributes<M>;

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

export function initWorkshopModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
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
}
