/** Outgoing mail with its de-duplication key, and what the built-in mail catcher received. */
import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { pk, ts } from './columns';

export const MAIL_KINDS = ['digest', 'assignment', 'note'] as const;
export type MailKind = (typeof MAIL_KINDS)[number];

type Attrs<M extends Model> = InferAttributes<M>;
type CAttrs<M extends Model> = InferCreationAttributes<M>;

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

export function initMailModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
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
}
