import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import type { Sequelize } from 'sequelize';
import { idColumn, tableOptions, timestampColumns } from './columns';

export function defineStudy(sequelize: Sequelize) {
  class Study extends Model<InferAttributes<Study>, InferCreationAttributes<Study>> {
    declare id: CreationOptional<number>;
    declare title: string;
    declare description: CreationOptional<string>;
    declare createdAt: CreationOptional<Date>;
    declare updatedAt: CreationOptional<Date>;
  }
  return Study.init(
    {
      ...idColumn,
      title: { type: DataTypes.STRING, allowNull: false },
      description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      ...timestampColumns,
    },
    tableOptions(sequelize, 'studies'),
  );
}

export type Study = InstanceType<ReturnType<typeof defineStudy>>;
