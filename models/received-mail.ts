import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { Sequelize } from 'sequelize';
import { idColumn, tableOptions, timestampColumns } from './columns';

export function defineReceivedMail(sequelize: Sequelize) {
  /** A message the local stand-in mail server received, parsed; admins read it on the Outbox page. */
  class ReceivedMail extends Model<InferAttributes<ReceivedMail>, InferCreationAttributes<ReceivedMail>> {
    declare id: CreationOptional<number>;
    declare messageId: string | null;
    declare sender: string;
    declare recipients: string[];
    declare subject: string;
    declare textBody: string;
    /** As sent; pages show it only after sanitising. */
    declare htmlBody: string | null;
    declare size: number;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
  }
  return ReceivedMail.init(
    {
      ...idColumn,
      messageId: { type: DataTypes.STRING, allowNull: true },
      sender: { type: DataTypes.STRING, allowNull: false },
      recipients: { type: DataTypes.JSON, allowNull: false },
      subject: { type: DataTypes.STRING, allowNull: false },
      textBody: { type: DataTypes.TEXT, allowNull: false },
      htmlBody: { type: DataTypes.TEXT, allowNull: true },
      size: { type: DataTypes.INTEGER, allowNull: false },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'received_mails'),
  );
}

export type ReceivedMail = InstanceType<ReturnType<typeof defineReceivedMail>>;
