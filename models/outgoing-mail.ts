import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { Sequelize } from 'sequelize';
import { idColumn, tableOptions, timestampColumns } from './columns';
import { MAIL_PURPOSES, OUTGOING_MAIL_STATES, type MailPurpose, type OutgoingMailState } from './vocabulary';

export function defineOutgoingMail(sequelize: Sequelize) {
  /** One mail in the outgoing queue, stored in the transaction of the action that wanted it. */
  class OutgoingMail extends Model<InferAttributes<OutgoingMail>, InferCreationAttributes<OutgoingMail>> {
    declare id: CreationOptional<number>;
    /** The recipient's account, when they have one. */
    declare userId: number | null;
    declare toAddress: string;
    declare purpose: MailPurpose;
    declare subject: string;
    declare textBody: string;
    declare htmlBody: string;
    declare state: CreationOptional<OutgoingMailState>;
    declare attempts: CreationOptional<number>;
    /** When the mailer tries (again); null once sent or given up. */
    declare nextAttemptAt: CreationOptional<Date | null>;
    declare lastError: CreationOptional<string | null>;
    declare sentAt: CreationOptional<Date | null>;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
  }
  return OutgoingMail.init(
    {
      ...idColumn,
      userId: { type: DataTypes.INTEGER, allowNull: true },
      toAddress: { type: DataTypes.STRING, allowNull: false },
      purpose: { type: DataTypes.STRING, allowNull: false, validate: { isIn: [[...MAIL_PURPOSES]] } },
      subject: { type: DataTypes.STRING, allowNull: false },
      textBody: { type: DataTypes.TEXT, allowNull: false },
      htmlBody: { type: DataTypes.TEXT, allowNull: false },
      state: { type: DataTypes.STRING, allowNull: false, defaultValue: 'queued', validate: { isIn: [[...OUTGOING_MAIL_STATES]] } },
      attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      nextAttemptAt: { type: DataTypes.DATE, allowNull: true },
      lastError: { type: DataTypes.TEXT, allowNull: true },
      sentAt: { type: DataTypes.DATE, allowNull: true },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'outgoing_mails'),
  );
}

export type OutgoingMail = InstanceType<ReturnType<typeof defineOutgoingMail>>;
