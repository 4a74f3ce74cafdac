/** Outgoing mail with its de-duplication key, and what the built-in mail catcher received. */
import { DataTypes, type CreationOptional, type ForeignKey, type Sequelize } from 'sequelize';
import { Row, optional, required, rowColumns } from './columns';
import type { MailStatus } from '../../contracts/mail';

export { MAIL_STATUSES, type MailStatus } from '../../contracts/mail';

export const MAIL_KINDS = ['digest', 'assignment', 'note'] as const;
export type MailKind = (typeof MAIL_KINDS)[number];

export class MailMessage extends Row<MailMessage> {
  declare dedupeKey: string;
  declare kind: MailKind;
  declare userId: ForeignKey<number> | null;
  declare toAddress: string;
  declare subject: string;
  declare textBody: string;
  declare htmlBody: string;
  declare status: MailStatus;
  declare messageId: string | null;
  declare error: string | null;
  declare attempts: CreationOptional<number>;
  declare jobRunId: number | null;
  declare sentAt: Date | null;
  /** When the instance sending it claimed it (wall clock); null outside a claim. */
  declare claimedAt: Date | null;
  /** Which sending call holds the claim; null outside a claim. */
  declare claimedBy: string | null;
}

export class CaughtMail extends Row<CaughtMail> {
  declare messageId: string | null;
  declare dedupeKey: string | null;
  declare mailFrom: string | null;
  declare rcptTo: string;
  declare subject: string;
  declare textBody: string | null;
  declare htmlBody: string | null;
  declare sizeBytes: number;
  declare receivedAt: Date;
}

export function initMailModels(sequelize: Sequelize) {
  const common = { sequelize, underscored: true };
  MailMessage.init(
    rowColumns({
      dedupeKey: required(DataTypes.STRING(200), { unique: true }),
      kind: required(DataTypes.STRING(24)),
      toAddress: required(DataTypes.STRING(254)),
      subject: required(DataTypes.STRING(250)),
      textBody: required(DataTypes.TEXT),
      htmlBody: required(DataTypes.TEXT),
      status: required(DataTypes.STRING(12)),
      messageId: optional(DataTypes.STRING(250)),
      error: optional(DataTypes.TEXT),
      attempts: required(DataTypes.INTEGER, { defaultValue: 0 }),
      jobRunId: optional(DataTypes.INTEGER),
      sentAt: optional(DataTypes.DATE),
      claimedAt: optional(DataTypes.DATE),
      claimedBy: optional(DataTypes.STRING(120)),
    }),
    { ...common, tableName: 'mail_messages' },
  );
  CaughtMail.init(
    rowColumns({
      messageId: optional(DataTypes.STRING(250)),
      dedupeKey: optional(DataTypes.STRING(200)),
      mailFrom: optional(DataTypes.STRING(254)),
      rcptTo: required(DataTypes.TEXT),
      subject: required(DataTypes.STRING(250)),
      textBody: optional(DataTypes.TEXT),
      htmlBody: optional(DataTypes.TEXT),
      sizeBytes: required(DataTypes.INTEGER),
      receivedAt: required(DataTypes.DATE),
    }),
    { ...common, tableName: 'caught_mail' },
  );
}
