import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { Sequelize } from 'sequelize';
import { idColumn, tableOptions, timestampColumns } from './columns';
import { NOTIFICATION_KINDS, type NotificationKind } from './vocabulary';

export function defineNotification(sequelize: Sequelize) {
  /** One event to tell one person about; `link` is a path inside the product, `summary` plain text. */
  class Notification extends Model<InferAttributes<Notification>, InferCreationAttributes<Notification>> {
    declare id: CreationOptional<number>;
    declare userId: number;
    declare kind: NotificationKind;
    declare studyId: number | null;
    declare actorId: number | null;
    declare summary: string;
    declare link: string;
    declare mailedAt: CreationOptional<Date | null>;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
  }
  return Notification.init(
    {
      ...idColumn,
      userId: { type: DataTypes.INTEGER, allowNull: false },
      kind: { type: DataTypes.STRING, allowNull: false, validate: { isIn: [[...NOTIFICATION_KINDS]] } },
      studyId: { type: DataTypes.INTEGER, allowNull: true },
      actorId: { type: DataTypes.INTEGER, allowNull: true },
      summary: { type: DataTypes.TEXT, allowNull: false },
      link: { type: DataTypes.STRING, allowNull: false },
      mailedAt: { type: DataTypes.DATE, allowNull: true },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'notifications'),
  );
}

export type Notification = InstanceType<ReturnType<typeof defineNotification>>;
