import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { Sequelize } from 'sequelize';
import { idColumn, tableOptions, timestampColumns } from './columns';

export function defineActivityRead(sequelize: Sequelize) {
  /** Until when a person has read a study's activity feed: later items are unread for them. */
  class ActivityRead extends Model<InferAttributes<ActivityRead>, InferCreationAttributes<ActivityRead>> {
    declare id: CreationOptional<number>;
    declare studyId: number;
    declare userId: number;
    declare seenAt: Date;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
  }
  return ActivityRead.init(
    {
      ...idColumn,
      studyId: { type: DataTypes.INTEGER, allowNull: false },
      userId: { type: DataTypes.INTEGER, allowNull: false },
      seenAt: { type: DataTypes.DATE, allowNull: false },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'activity_reads'),
  );
}
